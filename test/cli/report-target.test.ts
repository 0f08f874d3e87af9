/**
 * --report never overwrites without being asked: an existing file needs --force, a device, a
 * folder or a link is refused outright, and the file being read is never written over.
 */
import { existsSync, lstatSync, mkdtempSync, readdirSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../support/cli.js';
import { CASES_DIR } from '../support/rules.js';

const demo = join(CASES_DIR, '2026-10-14-press-feed-field-weak.json');
const emptyDir = () => mkdtempSync(join(tmpdir(), 'dctriage-report-'));

function jobIn(dir: string): string {
  const file = join(dir, 'job.json');
  writeFileSync(file, readFileSync(demo, 'utf8'));
  return file;
}

describe('diagnose --report', () => {
  it('writes a new report and its drawing', () => {
    const dir = emptyDir();
    const r = runCli(['diagnose', jobIn(dir), '--report', join(dir, 'report.md')]);
    expect(r.code).toBe(0);
    expect(readdirSync(dir).sort()).toEqual(['job.json', 'report.md', 'report.svg']);
  });

  it('refuses to write over the case file it reads, even with --force', () => {
    const dir = emptyDir();
    const job = jobIn(dir);
    const before = readFileSync(job, 'utf8');
    for (const extra of [[], ['--force']]) {
      const r = runCli(['diagnose', job, '--report', job, ...extra]);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/job\.json: not writing the report there: it is a file this job reads/);
      expect(readFileSync(job, 'utf8')).toBe(before);
    }
  });

  it('refuses an existing report, and its drawing, unless --force is given', () => {
    const dir = emptyDir();
    const job = jobIn(dir);
    writeFileSync(join(dir, 'report.md'), 'kept');
    const r = runCli(['diagnose', job, '--report', join(dir, 'report.md')]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/report\.md: not writing the report there: it already exists: name a new file, or add --force/);
    expect(readFileSync(join(dir, 'report.md'), 'utf8')).toBe('kept');
    expect(existsSync(join(dir, 'report.svg'))).toBe(false);

    writeFileSync(join(dir, 'other.svg'), 'drawing kept');
    const svg = runCli(['diagnose', job, '--report', join(dir, 'other.md')]);
    expect(svg.code).toBe(2);
    expect(svg.stderr).toMatch(/other\.svg: not writing the report there: it already exists/);
    expect(readFileSync(join(dir, 'other.svg'), 'utf8')).toBe('drawing kept');
    expect(existsSync(join(dir, 'other.md'))).toBe(false);

    const forced = runCli(['diagnose', job, '--report', join(dir, 'report.md'), '--force']);
    expect(forced.code).toBe(0);
    expect(readFileSync(join(dir, 'report.md'), 'utf8')).toMatch(/^# Job report/);
  });

  it('refuses a device, a folder and a link, even with --force', () => {
    const dir = emptyDir();
    const job = jobIn(dir);
    symlinkSync(job, join(dir, 'link.md'));
    for (const target of ['/dev/null', dir, join(dir, 'link.md')]) {
      const r = runCli(['diagnose', job, '--report', target, '--force']);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/not writing the report there: it (is not a regular file|is a file this job reads)/);
    }
    expect(lstatSync(join(dir, 'link.md')).isSymbolicLink()).toBe(true);
    expect(readdirSync(dir).sort()).toEqual(['job.json', 'link.md']);
  });
});

describe('the dialogue writing its report again', () => {
  it('replaces the report (and drawing) it wrote itself, and nothing else', async () => {
    const { writeReport } = await import('../../src/shell/write-report.js');
    const { caseSchema } = await import('../../src/knowledge/case-schema.js');
    const { diagnose } = await import('../../src/engine/diagnose.js');
    const { buildEngine } = await import('../../src/engine/run-rules.js');
    const { builtInRules } = await import('../support/rules.js');
    const base = builtInRules();
    const raw = JSON.parse(readFileSync(demo, 'utf8'));
    const job = caseSchema.parse(raw);
    const input = { job, raw, diagnosis: await diagnose(job, base, buildEngine(base)), safety: base.safety, generatedAt: '2026-12-01T21:00:00Z' };
    const dir = emptyDir();
    const ours = new Set<string>();
    await writeReport(join(dir, 'job.md'), input, dir, { ours });
    await writeReport(join(dir, 'job.md'), { ...input, generatedAt: '2026-12-01T22:00:00Z' }, dir, { ours });
    expect(readFileSync(join(dir, 'job.md'), 'utf8')).toContain('22:00');
    writeFileSync(join(dir, 'theirs.md'), 'kept');
    await expect(writeReport(join(dir, 'theirs.md'), input, dir, { ours })).rejects.toThrow(/already exists/);
    expect(readdirSync(dir).sort()).toEqual(['job.md', 'job.svg', 'theirs.md']);
  });
});
