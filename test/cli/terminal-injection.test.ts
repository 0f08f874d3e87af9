/**
 * Escape sequences in a rule folder's text or a case file's never reach the terminal raw: the
 * exact bytes printed hold no control character but the line breaks the tool itself makes.
 * `rules check` names each piece of rule text that holds one. Needs the built CLI.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT } from '../support/cli.js';
import { spawnSync } from 'node:child_process';
import { CASES_DIR, copyOfRules } from '../support/rules.js';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';

const demo = join(CASES_DIR, '2026-10-14-press-feed-field-weak.json');
/** Clear the screen, set the window title, a CSI in its one-byte form, a hyperlink, a forged warning line. */
const HOSTILE = ['\u001b[2J\u001b[H', '\u001b]0;owned\u0007', '\u009b31m', '\u001b]8;;https://example.org\u001b\\click\u001b]8;;\u001b\\', '\n!! DANGER forged line\r', '\u202eevil'];

/** Runs the built CLI and keeps stdout as bytes. */
function runBytes(args: string[]) {
  const r = spawnSync(process.execPath, [join(ROOT, 'dist', 'cli.mjs'), ...args], { cwd: ROOT, env: { ...process.env, NO_COLOR: '1' } });
  return { code: r.status, stdout: r.stdout as Buffer, stderr: r.stderr.toString('utf8') };
}

/** Bytes a terminal acts on, other than the line feed: C0, DEL, and C1 (as UTF-8 they are C2 80–9F). */
function controlBytes(out: Buffer): string[] {
  const found: string[] = [];
  const text = out.toString('utf8');
  for (const ch of text) {
    const c = ch.codePointAt(0)!;
    if ((c < 0x20 && c !== 0x0a) || (c >= 0x7f && c <= 0x9f) || c === 0x202e) found.push(`U+${c.toString(16).padStart(4, '0')}`);
  }
  return found;
}

function hostileRules(): string {
  const rules = copyOfRules();
  const causes = JSON.parse(readFileSync(join(rules, 'causes.json'), 'utf8'));
  const weak = causes.causes.find((c: { id: string }) => c.id === 'field-weak');
  weak.title = `Field weak${HOSTILE.join('')}`;
  writeFileSync(join(rules, 'causes.json'), JSON.stringify(causes));
  const checks = JSON.parse(readFileSync(join(rules, 'checks.json'), 'utf8'));
  const check = checks.checks.find((c: { id: string }) => c.id === weak.checks[0]);
  check.how = `${check.how}${HOSTILE.join(' ')}`;
  writeFileSync(join(rules, 'checks.json'), JSON.stringify(checks));
  return rules;
}

describe('escape sequences from files', () => {
  it('diagnose prints rule text with its control characters made visible', () => {
    const r = runBytes(['diagnose', demo, '--rules', hostileRules(), '--no-chart']);
    expect(r.code).toBe(0);
    expect(controlBytes(r.stdout)).toEqual([]);
    // Long lines wrap at the terminal's width: compare with the wrapping taken out.
    expect(r.stdout.toString('utf8').replace(/\s+/g, '')).toContain('Fieldweak\\u001b[2J\\u001b[H\\u001b]0;owned\\u0007\\u009b31m');
    expect(r.stdout.toString('utf8')).not.toMatch(/^!! DANGER forged line/m);
  });

  it('rules check names each piece of rule text that holds a control character', () => {
    const rules = hostileRules();
    const r = runBytes(['rules', 'check', '--rules', rules, '--cases', CASES_DIR]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/causes\.json: causes\[\d+\]\.title: holds a control character/);
    expect(r.stderr).toMatch(/checks\.json: checks\[\d+\]\.how: holds a control character/);
    expect(controlBytes(Buffer.from(r.stderr))).toEqual([]);
  });

  it('review prints a case file\'s typed text with no control character', () => {
    const raw = JSON.parse(readFileSync(demo, 'utf8'));
    raw.job = { ...raw.job, fitter: `A. Fitter${HOSTILE.join('')}` };
    raw.outcome = { ...raw.outcome, notes: HOSTILE.join(' then ') };
    const file = join(mkdtempSync(join(tmpdir(), 'dctriage-esc-')), 'job.json');
    writeFileSync(file, JSON.stringify(raw));
    const r = runBytes(['review', file]);
    expect(r.code).toBe(0);
    expect(controlBytes(r.stdout)).toEqual([]);
    expect(r.stdout.toString('utf8')).toContain('A. Fitter');
  });
});
