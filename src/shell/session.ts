/**
 * The dialogue's session on disk: written after every answer, synchronously and atomically
 * (write a temporary file, fsync, rename), so a killed process or a closed terminal loses nothing.
 * One dialogue at a time holds a session (a lock file beside it); a session that cannot be read,
 * or whose values do not make a job, is kept aside under another name, never replaced.
 */
import { existsSync, renameSync, statSync } from 'node:fs';
import { makeFolder, replaceFile, writeProblem } from './safe-write.js';
import { Locked, takeLock, type Lock } from './lock.js';
import { homedir } from 'node:os';
import { dirname, join } from 'node:path';
import * as z from 'zod';
import { readValidated, validate } from '../knowledge/read-json.js';
import { failed, ok, type Issue, type Result } from '../knowledge/result.js';
import { machineSchema } from '../knowledge/case-schema.js';
import type { Flow } from '../dialogue/flow.js';
import { workEntrySchema, type WorkEntry } from '../dialogue/work.js';
import { jobFromAnswers, parseDraft, type Answer } from '../dialogue/job.js';
import { parseAnswer, type AnswerValue } from '../dialogue/answers.js';
import type { DialogueQuestion } from '../dialogue/questions.js';
import type { SavedProgress } from '../dialogue/reducer.js';

export const SESSION_FORMAT = 'dctriage-session/1';

const answerSchema = z.strictObject({
  questionId: z.string(),
  value: z.union([
    z.strictObject({ kind: z.literal('unknown') }),
    z.strictObject({ kind: z.literal('one'), value: z.string() }),
    z.strictObject({ kind: z.literal('many'), values: z.array(z.string()) }),
    z.strictObject({ kind: z.literal('text'), value: z.string() }),
  ]),
  shown: z.string(),
  at: z.string(),
});

const WORK_PROMPT_IDS = ['authorised-by', 'authorisation', 'finding', 'signed-off-by', 'isolation-points', 'locks', 'proved-dead-by', 'tester'] as const;

export const sessionSchema = z.strictObject({
  format: z.literal(SESSION_FORMAT),
  savedAt: z.string(),
  rules: z.string(),
  machineFile: z.unknown().optional(),
  answers: z.array(answerSchema),
  /** Checks started and done, with authorisations and sign-offs. */
  work: z.array(workEntrySchema).optional(),
  /** The prompts open when it was saved: a check's (the isolation record) and the outcome's. */
  progress: z
    .strictObject({
      endedBecause: z.string().optional(),
      pendingWork: z.strictObject({ kind: z.enum(['started', 'done']), check: z.string(), got: z.partialRecord(z.enum(WORK_PROMPT_IDS), z.string()), firstIsolated: z.boolean() }).optional(),
      outcome: z.array(answerSchema).optional(),
    })
    .optional(),
});
export type Session = z.infer<typeof sessionSchema>;

/** $XDG_STATE_HOME/dctriage/session.json, or ~/.local/state/dctriage/session.json. */
export function defaultSessionFile(env = process.env): string {
  const base = env.XDG_STATE_HOME || join(homedir(), '.local', 'state');
  return join(base, 'dctriage', 'session.json');
}

const bare = ({ questionId, value, shown, at }: Answer) => ({ questionId, value, shown, at });

/** Throws WriteFailed when the session cannot be written; the previous one is then as it was. */
export function writeSession(file: string, s: { rules: string; machineFile?: unknown; answers: readonly Answer[]; work?: readonly WorkEntry[]; progress?: SavedProgress }): void {
  const p = s.progress ?? {};
  const progress = { ...p, ...(p.outcome ? { outcome: p.outcome.map(bare) } : {}) };
  replaceFile(file, JSON.stringify({ format: SESSION_FORMAT, savedAt: new Date().toISOString(), rules: s.rules, machineFile: s.machineFile, answers: s.answers.map(bare), work: s.work ?? [], progress }, null, 2) + '\n', 0o600);
}

export function readSession(file: string): Result<Session> {
  return readValidated(file, sessionSchema);
}

/**
 * Claims the session for this dialogue: its folder made and writable, no other dialogue on it.
 * Checked before the first question, so no answer is typed that cannot be kept.
 */
export function claimSession(file: string): Result<Lock> {
  const elsewhere = 'give the dialogue a session it can write with --session FILE, or set XDG_STATE_HOME to a folder you can write to';
  try {
    if (existsSync(file) && !statSync(file).isFile()) return failed({ code: 'invalid', file, path: '', message: `the session must be a file, and this is ${statSync(file).isDirectory() ? 'a folder' : 'not a regular file'}: ${elsewhere}` });
    makeFolder(dirname(file));
    return ok(takeLock(`${file}.lock`));
  } catch (e) {
    if (e instanceof Locked) return failed({ code: 'invalid', file, path: '', message: `another dctriage dialogue (process ${e.pid}) is using this session: finish that one first, or start this one with its own --session FILE` });
    return failed({ code: 'unwritable', file, path: '', message: `the session cannot be kept here (${writeProblem(e)}): ${elsewhere}` });
  }
}

/**
 * Moves a session out of the way under a name of its own beside it (`session.json.unreadable-…`),
 * so that nothing in it is lost; returns the new name.
 */
export function keepAside(file: string, why: 'unreadable' | 'kept', now = new Date()): string {
  const stamp = now.toISOString().replace(/[:.]/g, '-');
  let aside = `${file}.${why}-${stamp}`;
  for (let n = 2; existsSync(aside); n++) aside = `${file}.${why}-${stamp}-${n}`;
  renameSync(file, aside);
  return aside;
}

export interface Restored {
  answers: Answer[];
  progress: SavedProgress;
}

/**
 * A stored answer against its question, read again as if typed: a value the question would refuse
 * is refused. Returns what the transcript shows, worked out again (the file's own words are not printed).
 */
function reread(q: DialogueQuestion, v: Session['answers'][number]['value']): { value: AnswerValue; shown: string } | { problem: string } {
  if (v.kind === 'unknown') return { value: v, shown: 'unknown' };
  const typed = v.kind === 'many' ? v.values.join(' ') : v.value;
  const again = parseAnswer(q, typed);
  if (!again.ok) return { problem: again.reason };
  const same = again.value.kind === v.kind && (again.value.kind !== 'one' || (v.kind === 'one' && again.value.value === v.value));
  // The value as the dialogue would have taken it: typed text without its control characters.
  return same ? { value: again.value, shown: again.shown } : { problem: `a ${v.kind} answer does not fit this question` };
}

/**
 * The saved answers against the questions of this flow, checked as strictly as a case file: each
 * answer one its question accepts, the machine valid, and the job they make readable.
 */
export function restoreSession(file: string, s: Session, flow: Flow): Result<Restored> {
  const issues: Issue[] = [];
  const bad = (path: string, message: string) => issues.push({ code: 'invalid', file, path, message });
  const answers: Answer[] = [];
  const seen = new Set<string>();
  for (const [k, a] of s.answers.entries()) {
    const q = flow.all.get(a.questionId);
    if (!q) bad(`answers[${k}].questionId`, `"${a.questionId}" is not a question of the rule folder in use`);
    else if (seen.has(a.questionId)) bad(`answers[${k}].questionId`, `"${a.questionId}" is answered twice`);
    else {
      const r = reread(q, a.value);
      if ('problem' in r) bad(`answers[${k}].value`, r.problem);
      else answers.push({ ...a, value: r.value, shown: r.shown, target: q.target });
    }
    seen.add(a.questionId);
  }
  if (s.machineFile !== undefined) {
    const m = validate(file, s.machineFile, machineSchema, 'machineFile');
    if (!m.ok) issues.push(...m.issues);
  }
  if (issues.length === 0) {
    const draft = jobFromAnswers(answers, s.machineFile);
    const parsed = draft.machine.connection === undefined ? undefined : parseDraft(draft);
    if (parsed && !parsed.ok) bad('answers', `the answers do not make a job the engine can read: ${parsed.reason}`);
  }
  if (issues.length) return failed(...issues.slice(0, 20));
  const p = s.progress ?? {};
  const outcome = (p.outcome ?? []).map((a) => ({ ...a, target: { section: 'outcome' as const, name: a.questionId } }));
  const progress: SavedProgress = {
    ...(p.endedBecause !== undefined ? { endedBecause: p.endedBecause } : {}),
    ...(p.pendingWork ? { pendingWork: p.pendingWork } : {}),
    ...(outcome.length ? { outcome } : {}),
  };
  return ok({ answers, progress });
}

export interface Opened {
  lock: Lock;
  /** The session to resume (`resume`). */
  saved?: Session;
  /** A session with answers found when a new dialogue starts: the fitter is asked what to do with it. */
  existing?: Session;
  /** Said before the dialogue starts (a session kept aside, and why). */
  notes: string[];
}

/** Claims the session file and reads what it holds; an unreadable one is kept aside, never replaced. */
export function openSession(file: string, resume: boolean): Result<Opened> {
  const claimed = claimSession(file);
  if (!claimed.ok) return claimed;
  const lock = claimed.value;
  const refuse = (...issues: Issue[]): Result<Opened> => {
    lock.release();
    return failed(...issues);
  };
  if (!existsSync(file)) return resume ? refuse({ code: 'unreadable', file, path: '', message: 'no session to resume here: run dctriage to start a job' }) : ok({ lock, notes: [] });
  const s = readSession(file);
  if (!s.ok) {
    let aside: string;
    try {
      aside = keepAside(file, 'unreadable');
    } catch (e) {
      return refuse(...s.issues, { code: 'unwritable', file, path: '', message: `the session cannot be read and could not be kept aside (${writeProblem(e)}): move it away by hand` });
    }
    const kept = { code: 'invalid' as const, file, path: '', message: `this session cannot be read, so it was kept as ${aside} and nothing in it is lost${resume ? '; run dctriage to start a new job' : '; a new job starts'}` };
    return resume ? refuse(...s.issues.slice(0, 20), kept) : ok({ lock, notes: [`${s.issues[0]!.file}: ${s.issues[0]!.message}`, `${kept.file}: ${kept.message}`] });
  }
  if (resume) return ok({ lock, saved: s.value, notes: [] });
  const started = s.value.answers.length > 0 || (s.value.work?.length ?? 0) > 0;
  return ok({ lock, notes: [], ...(started ? { existing: s.value } : {}) });
}
