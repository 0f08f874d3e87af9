/** A job survives Ctrl-C, a kill and a closed terminal: resume restores every answer. */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { CLI, ROOT } from '../support/cli.js';

function drive(state: string, signal: 'INT' | 'TERM' | 'HUP' | 'NONE', lines: string[], args: string[] = []) {
  const out = execFileSync('python3', [join(ROOT, 'test', 'support', 'pty-drive.py'), state, signal, ...lines], {
    env: { ...process.env, DCTRIAGE_CLI: CLI, DCTRIAGE_ARGS: JSON.stringify(args) },
    encoding: 'utf8',
    timeout: 30000,
  });
  return JSON.parse(out) as { code: number; screen: string };
}

const opening = ['', 'running', '1', 'shunt', 'fixed', 'shaft fan', '220 V'];

describe.each([
  ['Ctrl-C', 'INT', 130],
  ['SIGTERM', 'TERM', 143],
  ['a closed terminal (SIGHUP)', 'HUP', 129],
] as const)('after %s', (_name, signal, code) => {
  it('exits with its code and resume restores every answer', () => {
    const state = mkdtempSync(join(tmpdir(), 'dctriage-state-'));
    const first = drive(state, signal, opening);
    expect(first.code).toBe(code);
    // It says where the session is and how to carry on.
    expect(first.screen.replace(/\s+/g, ' ')).toContain(`The session is kept in ${join(state, 'dctriage', 'session.json')}; to carry on where you were, run: dctriage resume`);
    const session = JSON.parse(readFileSync(join(state, 'dctriage', 'session.json'), 'utf8'));
    expect(session.answers.map((a: { shown: string }) => a.shown)).toEqual(['running', 'no fault shown', 'shunt', 'fixed DC supply with starter or contactor', 'shaft fan', '220 V']);
    const again = drive(state, 'INT', [], ['resume']);
    expect(again.screen).toContain('Nameplate: rated armature voltage?  → 220 V');
    expect(again.screen).toContain('? Nameplate: rated armature current?');
  }, 40000);
});
