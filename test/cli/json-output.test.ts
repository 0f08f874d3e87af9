/**
 * Every --json output: a "format" key first, every key documented in docs/json-output.md, and no
 * absolute path of the install (run from another folder, so nothing is relative to it by chance).
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { JSON_FORMATS } from '../../src/shell/json-formats.js';
import { ROOT, runCli } from '../support/cli.js';
import { copyOfRules } from '../support/rules.js';

const DOC = readFileSync(join(ROOT, 'docs', 'json-output.md'), 'utf8');
const demo = join(ROOT, 'cases', '2026-10-14-press-feed-field-weak.json');
const elsewhere = () => mkdtempSync(join(tmpdir(), 'dctriage-elsewhere-'));

/** Every key in the output, except the names of quantities (data) and a draft's own content (a rule file). */
function keysOf(v: unknown, into = new Set<string>(), parent = ''): Set<string> {
  if (Array.isArray(v)) for (const x of v) keysOf(x, into, parent);
  else if (v !== null && typeof v === 'object') {
    for (const [k, x] of Object.entries(v)) {
      if (parent === 'draft') continue;
      if (parent !== 'quantities') into.add(k);
      keysOf(x, into, k);
    }
  }
  return into;
}

const outputs = () => {
  const cwd = elsewhere();
  const rules = copyOfRules();
  return [
    { format: JSON_FORMATS.expectation, run: runCli(['expect', demo, '--json'], { cwd }) },
    { format: JSON_FORMATS.diagnosis, run: runCli(['diagnose', demo, '--json', '--adaptive'], { cwd }) },
    { format: JSON_FORMATS.caseCheck, run: runCli(['cases', 'check', '--json'], { cwd }) },
    { format: JSON_FORMATS.ruleCheck, run: runCli(['rules', 'check', '--json'], { cwd }) },
    { format: JSON_FORMATS.ruleDraft, run: runCli(['rules', 'draft', '--from-case', demo, '--rules', rules, '--cases', join(ROOT, 'cases'), '--json'], { cwd }) },
  ];
};

describe('--json output', () => {
  const all = outputs();

  it.each(all.map((o) => [o.format, o] as const))('%s: names its format first, documents every key, hides the install path', (_f, { format, run }) => {
    expect(run.stderr).toBe('');
    const j = JSON.parse(run.stdout) as Record<string, unknown>;
    expect(Object.keys(j)[0]).toBe('format');
    expect(j.format).toBe(format);
    const undocumented = [...keysOf(j)].filter((k) => !DOC.includes(`\`${k}\``));
    expect(undocumented).toEqual([]);
    expect(run.stdout).not.toContain(ROOT);
    expect(run.stdout).not.toContain(ROOT.replace(/\/$/, ''));
  });

  it('the documentation names each format the tool writes', () => {
    for (const f of Object.values(JSON_FORMATS)) expect(DOC).toContain(`\`${f}\``);
  });

  it('shows the built-in cases relative to the install folder', () => {
    const j = JSON.parse(all[2]!.run.stdout) as { cases: { file: string }[] };
    expect(j.cases[0]!.file).toMatch(/^cases\/\d{4}-\d{2}-\d{2}-[\w-]+\.json$/);
  });
});
