/**
 * Under a file-size limit (ulimit -f, the way a full disk looks to a process: a short write, then
 * EFBIG) every command that writes says so with exit 74 and publishes nothing; what was there
 * before is left as it was. Needs the built CLI and bash.
 */
import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../support/cli.js';
import { CASES_DIR, copyOfRules } from '../support/rules.js';

const demo = join(CASES_DIR, '2026-10-14-press-feed-field-weak.json');
const emptyDir = () => mkdtempSync(join(tmpdir(), 'dctriage-full-'));
/** 1 KiB: smaller than a case file, the rule catalogue or a report. */
const FULL = { fileSizeLimitKiB: 1 };

describe('on a full disk', () => {
  it('cases add says the case could not be written, with exit 74, and files nothing', () => {
    const dir = emptyDir();
    const r = runCli(['cases', 'add', demo, '--cases', dir, '--rules', copyOfRules()], FULL);
    expect(r.code).toBe(74);
    expect(r.stderr).toMatch(/could not write the case: the file is larger than this process may write/);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('rules adopt leaves causes.json, checks.json and the draft as they were', () => {
    const rules = copyOfRules();
    const draft = join(emptyDir(), 'bearing-seized.json');
    writeFileSync(
      draft,
      JSON.stringify({
        family: 'bearing',
        rules: [{ name: 'seized-when-stalled', kind: 'evidence', cause: 'bearing-seized-test', weight: 0.4, conditions: { fact: 'symptoms', operator: 'contains', value: 'will-not-start' } }],
        causes: [{ id: 'bearing-seized-test', title: 'Bearing seized', description: 'The shaft will not turn by hand.', checks: ['obs-commutator-running'] }],
        checks: [{ id: 'turn-shaft-by-hand-test', title: 'Turn the shaft by hand', how: 'Isolated, turn the shaft.', instrument: 'none', state: 'isolated', hazards: [], minutes: 5 }],
      }),
    );
    const before = (name: string) => readFileSync(join(rules, name), 'utf8');
    const causes = before('causes.json');
    const checks = before('checks.json');
    const filesBefore = readdirSync(rules).sort();
    const r = runCli(['rules', 'adopt', draft, '--rules', rules, '--cases', CASES_DIR], FULL);
    expect(r.stderr).toMatch(/could not adopt the draft: .*the rule folder and the draft are as they were/);
    expect(r.code).toBe(74);
    expect(before('causes.json')).toBe(causes);
    expect(before('checks.json')).toBe(checks);
    expect(readdirSync(rules).sort()).toEqual(filesBefore);
    expect(existsSync(draft)).toBe(true);
  });

  it('review --close leaves the job file as it was', () => {
    const file = join(emptyDir(), 'job.json');
    const text = readFileSync(demo, 'utf8');
    writeFileSync(file, text);
    const r = runCli(['review', file, '--close', 'R. Lead'], FULL);
    expect(r.code).toBe(74);
    expect(r.stderr).toMatch(/could not mark the job closed/);
    expect(readFileSync(file, 'utf8')).toBe(text);
    expect(readdirSync(join(file, '..'))).toEqual(['job.json']);
  });

  it('diagnose --report writes neither the report nor its drawing', () => {
    const dir = emptyDir();
    const r = runCli(['diagnose', demo, '--report', join(dir, 'report.md')], FULL);
    expect(r.code).toBe(74);
    expect(r.stderr).toMatch(/report\.md: could not write the report/);
    expect(readdirSync(dir)).toEqual([]);
  });

});
