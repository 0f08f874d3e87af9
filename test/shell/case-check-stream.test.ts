/**
 * cases check at scale: results stream in file order whatever the number of threads, the JSON
 * keeps total, top1, top3 and cases[], and a terminal sees a count on stderr.
 */
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it, vi } from 'vitest';
import { checkCases, type CaseRank } from '../../src/engine/check-cases.js';
import { caseCheckPrinter } from '../../src/shell/stream-case-check.js';
import { ok } from '../../src/knowledge/result.js';
import { spawnSync } from 'node:child_process';
import { CLI, runCli } from '../support/cli.js';
import { builtInRules, CASES_DIR } from '../support/rules.js';

/** The recorded cases again and again under new ids: enough files for the worker threads to start. */
function manyCases(n: number): string {
  const dir = mkdtempSync(join(tmpdir(), 'dctriage-many-'));
  const recorded = readdirSync(CASES_DIR).filter((f) => f.endsWith('.json')).map((f) => JSON.parse(readFileSync(join(CASES_DIR, f), 'utf8')));
  for (let k = 0; k < n; k++) writeFileSync(join(dir, `${String(k).padStart(5, '0')}.json`), JSON.stringify({ ...recorded[k % recorded.length], id: `case-${k}` }));
  return dir;
}

describe('cases check over many files', () => {
  it('gives the same report, in file order, on one thread and on worker threads', async () => {
    const dir = manyCases(240);
    const one = runCli(['cases', 'check', dir, '--json'], { env: { DCTRIAGE_THREADS: '1' } });
    const two = runCli(['cases', 'check', dir, '--json'], { env: { DCTRIAGE_THREADS: '2' } });
    expect(two.stderr).toBe('');
    expect(two.code).toBe(one.code);
    expect(JSON.parse(two.stdout)).toEqual(JSON.parse(one.stdout));
    // And the same as the report made whole in this process.
    const files = readdirSync(dir).sort().map((f) => join(dir, f));
    const whole = await checkCases(files, builtInRules());
    expect(whole.ok).toBe(true);
    if (whole.ok) expect(JSON.parse(two.stdout)).toEqual({ format: 'dctriage-case-check/1', cases: whole.value.cases.map((c) => ({ ...c })), total: whole.value.total, top1: whole.value.top1, top3: whole.value.top3, skipped: [] });
  }, 120_000);

  it('finishes in this thread what a failed worker left, with the same report', () => {
    const dir = manyCases(220);
    const one = runCli(['cases', 'check', dir, '--json'], { env: { DCTRIAGE_THREADS: '1' } });
    // 2 MB of heap: every worker runs out of memory at start.
    const starved = runCli(['cases', 'check', dir, '--json'], { env: { DCTRIAGE_THREADS: '2', DCTRIAGE_WORKER_HEAP_MB: '2' } });
    expect(starved.code).toBe(one.code);
    expect(JSON.parse(starved.stdout)).toEqual(JSON.parse(one.stdout));
  }, 120_000);

  it('in a thread of its own, keeps the exit code, names a broken file, and stops quietly for a reader that stops early', () => {
    const dir = manyCases(230);
    writeFileSync(join(dir, '99999-broken.json'), '{"format":"dc-case/1","machine":{"connection":"shunt"},"readings":{"speed":"fast"}}');
    const broken = runCli(['cases', 'check', dir], { env: { DCTRIAGE_THREADS: '2' } });
    expect(broken.code).toBe(2);
    expect(broken.stderr).toContain(`${join(dir, '99999-broken.json')}: at readings.speed:`);
    // A reader that takes one line and goes: no error, the exit status of a finished command.
    const clean = manyCases(230);
    const head = spawnSync('bash', ['-c', `"${process.execPath}" "${CLI}" cases check "${clean}" --json | head -1; echo "status \${PIPESTATUS[0]}" >&2`], { encoding: 'utf8', env: { ...process.env, DCTRIAGE_THREADS: '2' } });
    expect(head.stdout).toBe('{\n');
    expect(head.stderr).toBe('status 0\n');
  }, 120_000);

  it('writes a valid report with no cases', () => {
    const dir = mkdtempSync(join(tmpdir(), 'dctriage-none-'));
    const r = runCli(['cases', 'check', dir, '--json']);
    expect(JSON.parse(r.stdout)).toEqual({ format: 'dctriage-case-check/1', cases: [], total: 0, top1: 0, top3: 0, skipped: [] });
    expect(r.code).toBe(0);
  });
});

describe('the printer', () => {
  const c = (id: string, rank: number): CaseRank => ({ id, file: `${id}.json`, expected: 'field-weak', rank, ranked: ['field-weak'] });

  it('prints the cases as they come (held at most a moment, and before each count), a count for a terminal, and clears the count at the end', () => {
    const out: string[] = [];
    const progress: string[] = [];
    const p = caseCheckPrinter('text', (t) => out.push(t), (t) => progress.push(t));
    p.stream.onCase!(c('a', 1));
    // Held for one write with the next ones; a count shows what is held first.
    expect(out).toEqual([]);
    p.stream.onProgress!(2, 2);
    expect(out.join('')).toMatch(/^ {2}rank {6}case/);
    expect(out.join('')).toContain('a');
    p.stream.onCase!(c('b', 5));
    const someOut = p.end(ok({ total: 2, top1: 1, top3: 1, cases: [], skipped: [] }));
    expect(someOut).toBe(true);
    expect(progress).toEqual(['\r2 of 2 case files', '\r\u001b[K']);
    expect(out.join('')).toMatch(/ {5}5 OUT {2}b/);
    expect(out.join('')).toMatch(/2 cases: 1 ranked first \(50 %\), 1 in the top 3 \(50 %\)\.\n$/);
  });

  it('writes what it holds once a tenth of a second has passed, with no count to show', () => {
    vi.useFakeTimers();
    try {
      const out: string[] = [];
      const p = caseCheckPrinter('json', (t) => out.push(t));
      p.stream.onCase!(c('a', 1));
      expect(out).toEqual([]);
      vi.advanceTimersByTime(150);
      p.stream.onCase!(c('b', 1));
      expect(out.join('')).toContain('"id": "b"');
    } finally {
      vi.useRealTimers();
    }
  });

  it('keeps no case in memory', async () => {
    const seen: string[] = [];
    const r = await checkCases([join(CASES_DIR, readdirSync(CASES_DIR)[0]!)], builtInRules(), undefined, { onCase: (x) => seen.push(x.id), keep: false });
    expect(seen).toHaveLength(1);
    expect(r.ok && r.value.cases).toEqual([]);
  });
});
