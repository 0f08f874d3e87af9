/**
 * Starting the dialogue over a kept session, in a real pseudo-terminal: the fitter chooses to
 * resume it or start anew (the old one kept aside); an unreadable session is kept aside, never
 * replaced; a second dialogue on a held session, or a session that cannot be written, is refused
 * before the first question. Needs python3.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { CLI, ROOT } from '../support/cli.js';

function drive(state: string, signal: 'INT' | 'NONE', lines: string[], args: string[] = []) {
  const out = execFileSync('python3', [join(ROOT, 'test', 'support', 'pty-drive.py'), state, signal, ...lines], {
    env: { ...process.env, DCTRIAGE_CLI: CLI, DCTRIAGE_ARGS: JSON.stringify(args) },
    encoding: 'utf8',
    timeout: 30000,
  });
  const r = JSON.parse(out) as { code: number; screen: string };
  // eslint-disable-next-line no-control-regex -- the terminal's own escape sequences are taken out
  return { ...r, flat: r.screen.replace(/\x1b\[[0-9;?]*[A-Za-z]/g, '').replace(/\s+/g, ' ') };
}

function stateWithSession(): { state: string; folder: string; file: string } {
  const state = mkdtempSync(join(tmpdir(), 'dctriage-state-'));
  drive(state, 'INT', ['', 'running', '1']);
  const folder = join(state, 'dctriage');
  return { state, folder, file: join(folder, 'session.json') };
}
const shownIn = (file: string) => JSON.parse(readFileSync(file, 'utf8')).answers.map((a: { shown: string }) => a.shown);

describe('a dialogue started over a kept session', () => {
  it('asks, and with "new" keeps the old session aside and starts a new one', () => {
    const { state, folder, file } = stateWithSession();
    const r = drive(state, 'INT', ['new', '', 'stopped']);
    expect(r.flat).toContain('A job is kept in the session');
    expect(r.flat).toContain('Type resume to go on with it, or new to start a new job');
    const kept = readdirSync(folder).find((f) => f.startsWith('session.json.kept-'))!;
    expect(shownIn(join(folder, kept))).toEqual(['running', 'no fault shown']);
    expect(shownIn(file)).toEqual(['stopped']);
  }, 40000);

  it('with "resume" goes on from the kept answers', () => {
    const { state, file } = stateWithSession();
    const r = drive(state, 'INT', ['resume']);
    expect(r.flat).toContain('What does the drive or protection display? → no fault shown');
    expect(r.flat).toContain('? How is the machine connected?');
    expect(shownIn(file)).toEqual(['running', 'no fault shown']);
  }, 40000);

  it('keeps an unreadable session aside, byte for byte, and says so', () => {
    const { state, folder, file } = stateWithSession();
    writeFileSync(file, '{"format":"dctriage-session/1","answers":[{"questio');
    const r = drive(state, 'INT', ['']);
    expect(r.flat).toMatch(/this session cannot be read, so it was kept as .*session\.json\.unreadable-/);
    const kept = readdirSync(folder).find((f) => f.startsWith('session.json.unreadable-'))!;
    expect(readFileSync(join(folder, kept), 'utf8')).toBe('{"format":"dctriage-session/1","answers":[{"questio');
  }, 40000);

  it('refuses to resume a session whose values are wrong, and keeps it aside', () => {
    const { state, folder, file } = stateWithSession();
    const s = JSON.parse(readFileSync(file, 'utf8'));
    s.answers[0].value.value = 'exploded';
    writeFileSync(file, JSON.stringify(s));
    const r = drive(state, 'NONE', [], ['resume']);
    expect(r.code).toBe(2);
    expect(r.flat).toMatch(/answers\[0\]\.value: "exploded" is not one of the choices/);
    expect(r.flat).toMatch(/this session cannot be resumed, so it was kept as .*session\.json\.unreadable-/);
    expect(existsSync(file)).toBe(false);
    expect(readdirSync(folder).some((f) => f.startsWith('session.json.unreadable-'))).toBe(true);
  }, 40000);

  it('refuses a second dialogue on a session another one holds', () => {
    const { state, file } = stateWithSession();
    writeFileSync(`${file}.lock`, `${process.pid}\n`);
    const r = drive(state, 'NONE', []);
    expect(r.code).toBe(2);
    expect(r.flat).toContain(`another dctriage dialogue (process ${process.pid}) is using this session`);
    expect(shownIn(file)).toEqual(['running', 'no fault shown']);
  }, 40000);

  it('refuses a session that is a folder, before the first question', () => {
    const state = mkdtempSync(join(tmpdir(), 'dctriage-state-'));
    mkdirSync(join(state, 'here'));
    const r = drive(state, 'NONE', [], ['--session', join(state, 'here')]);
    expect(r.code).toBe(2);
    expect(r.flat).toContain('the session must be a file, and this is a folder');
    expect(r.flat).not.toContain('What is the machine doing now?');
  }, 40000);
});
