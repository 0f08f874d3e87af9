import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openSession, readSession, restoreSession, writeSession } from '../../src/shell/session.js';
import { buildFlow } from '../../src/dialogue/flow.js';
import type { Answer } from '../../src/dialogue/job.js';
import type { WorkEntry } from '../../src/dialogue/work.js';
import { builtInRules } from '../support/rules.js';

const sessionIn = () => join(mkdtempSync(join(tmpdir(), 'dctriage-session-')), 'session.json');
const flow = buildFlow(builtInRules());
const answer = (questionId: string, value: Answer['value'], shown = ''): Answer => ({ questionId, target: flow.all.get(questionId)!.target, value, shown, at: 't1' });

describe('the session file', () => {
  it('keeps the answers and the checks worked, with their authorisations, across a restart', () => {
    const file = sessionIn();
    const answers: Answer[] = [answer('present-state', { kind: 'one', value: 'running' }, 'running')];
    const work: WorkEntry[] = [{ check: 'iso-connections', kind: 'started', at: 't2', by: 'A. Fitter', authorisedBy: 'R. Lead', authorisation: 'remote', isolation: { points: 'Q4', locks: 'L-1', provedDeadBy: 'R. Lead' } }];
    writeSession(file, { rules: 'rules', answers, work });
    const back = readSession(file);
    expect(back.ok).toBe(true);
    if (!back.ok) return;
    expect(back.value.work).toEqual(work);
    const restored = restoreSession(file, back.value, flow);
    expect(restored.ok && restored.value.answers).toEqual(answers);
  });

  it('refuses saved values its questions would refuse, naming the answer', () => {
    const file = sessionIn();
    // Each passes the session's schema; none is an answer the dialogue would have taken.
    const cases: [Answer, RegExp][] = [
      [answer('present-state', { kind: 'one', value: 'exploded' }), /answers\[0\]\.value: "exploded" is not one of the choices/],
      [answer('connection', { kind: 'text', value: 'shunt' }), /answers\[0\]\.value: a text answer does not fit/],
      [answer('nameplate-armatureVoltage', { kind: 'text', value: '12 furlongs' }), /answers\[0\]\.value: /],
      [answer('symptoms', { kind: 'many', values: ['smoking'] }), /answers\[0\]\.value: "smoking" is not one of the choices/],
    ];
    for (const [a, says] of cases) {
      writeSession(file, { rules: 'rules', answers: [a] });
      const s = readSession(file);
      expect(s.ok).toBe(true);
      if (!s.ok) continue;
      const r = restoreSession(file, s.value, flow);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(`${r.issues[0]!.path}: ${r.issues[0]!.message}`).toMatch(says);
    }
  });

  it('refuses a saved machine that is not a valid machine', () => {
    const file = sessionIn();
    writeSession(file, { rules: 'rules', machineFile: { connection: 'triple-wound' }, answers: [] });
    const s = readSession(file);
    const r = s.ok ? restoreSession(file, s.value, flow) : s;
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]!.path).toBe('machineFile.connection');
  });
});

describe('opening a session', () => {
  it('keeps an unreadable session aside, byte for byte, and says where', () => {
    const file = sessionIn();
    writeFileSync(file, '{"format": "dctriage-session/1", "answers": [');
    const r = openSession(file, false);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    r.value.lock.release();
    expect(existsSync(file)).toBe(false);
    const aside = readdirSync(join(file, '..')).find((f) => f.startsWith('session.json.unreadable-'))!;
    expect(readFileSync(join(file, '..', aside), 'utf8')).toBe('{"format": "dctriage-session/1", "answers": [');
    expect(r.value.notes.join('\n')).toContain(`kept as ${join(file, '..', aside)}`);
  });

  it('refuses to resume an unreadable session, and keeps it aside', () => {
    const file = sessionIn();
    writeFileSync(file, 'not json');
    const r = openSession(file, true);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues.map((i) => i.message).join('\n')).toMatch(/not valid JSON[\s\S]*kept as .*session\.json\.unreadable-/);
    expect(existsSync(join(file, '..', 'session.json.lock'))).toBe(false);
  });

  it('hands back a session with answers, for the fitter to choose', () => {
    const file = sessionIn();
    writeSession(file, { rules: 'rules', answers: [answer('present-state', { kind: 'one', value: 'running' }, 'running')] });
    const r = openSession(file, false);
    expect(r.ok && r.value.existing?.answers.length).toBe(1);
    if (r.ok) r.value.lock.release();
  });

  it('refuses a second dialogue on the same session while the first holds it', () => {
    const file = sessionIn();
    writeFileSync(`${file}.lock`, `${process.ppid}\n`);
    const r = openSession(file, false);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]!.message).toBe(`another dctriage dialogue (process ${process.ppid}) is using this session: finish that one first, or start this one with its own --session FILE`);
  });

  it('says what to do when the session is a folder or cannot be written', () => {
    const dir = sessionIn();
    mkdirSync(dir);
    const folder = openSession(dir, false);
    expect(folder.ok).toBe(false);
    if (!folder.ok) expect(folder.issues[0]!.message).toMatch(/the session must be a file, and this is a folder: give the dialogue a session it can write with --session FILE/);
    // /proc refuses new folders even to root.
    const unwritable = openSession('/proc/dctriage-state/session.json', false);
    expect(unwritable.ok).toBe(false);
    if (!unwritable.ok) {
      expect(unwritable.issues[0]!.code).toBe('unwritable');
      expect(unwritable.issues[0]!.message).toMatch(/the session cannot be kept here \(.+\): give the dialogue a session it can write with --session FILE, or set XDG_STATE_HOME/);
    }
  });
});

describe('a resumed session', () => {
  it('shows each answer in words worked out again, not the words the file holds', () => {
    const file = sessionIn();
    writeSession(file, { rules: 'rules', answers: [answer('present-state', { kind: 'one', value: 'running' }, 'running\u001b[2J\u001b]0;owned\u0007')] });
    const s = readSession(file);
    const r = s.ok ? restoreSession(file, s.value, flow) : s;
    expect(r.ok && r.value.answers[0]!.shown).toBe('running');
  });
});
