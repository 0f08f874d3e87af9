/**
 * The dialogue's session on disk: written after every answer, synchronously and atomically
 * (write a temporary file, fsync, rename), so a killed process or a closed terminal loses nothing.
 */
import { mkdirSync } from 'node:fs';
import { replaceFile } from './safe-write.js';
import { homedir } from 'node:os';
import { dirname, join } from 'node:path';
import * as z from 'zod';
import { readValidated } from '../knowledge/read-json.js';
import { failed, ok, type Result } from '../knowledge/result.js';
import type { Flow } from '../dialogue/flow.js';
import { workEntrySchema, type WorkEntry } from '../dialogue/work.js';
import type { Answer } from '../dialogue/job.js';

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

export const sessionSchema = z.strictObject({
  format: z.literal(SESSION_FORMAT),
  savedAt: z.string(),
  rules: z.string(),
  machineFile: z.unknown().optional(),
  answers: z.array(answerSchema),
  /** Checks started and done, with authorisations and sign-offs. */
  work: z.array(workEntrySchema).optional(),
});
export type Session = z.infer<typeof sessionSchema>;

/** $XDG_STATE_HOME/dctriage/session.json, or ~/.local/state/dctriage/session.json. */
export function defaultSessionFile(env = process.env): string {
  const base = env.XDG_STATE_HOME || join(homedir(), '.local', 'state');
  return join(base, 'dctriage', 'session.json');
}

export function writeSession(file: string, s: { rules: string; machineFile?: unknown; answers: readonly Answer[]; work?: readonly WorkEntry[] }): void {
  mkdirSync(dirname(file), { recursive: true });
  const answers = s.answers.map(({ questionId, value, shown, at }) => ({ questionId, value, shown, at }));
  replaceFile(file, JSON.stringify({ format: SESSION_FORMAT, savedAt: new Date().toISOString(), rules: s.rules, machineFile: s.machineFile, answers, work: s.work ?? [] }, null, 2) + '\n', 0o600);
}

export function readSession(file: string): Result<Session> {
  return readValidated(file, sessionSchema);
}

/** The saved answers against the questions of this flow; a question the rule folder no longer has is an issue. */
export function sessionAnswers(file: string, s: Session, flow: Flow): Result<Answer[]> {
  const answers: Answer[] = [];
  for (const [k, a] of s.answers.entries()) {
    const q = flow.all.get(a.questionId);
    if (!q) return failed({ code: 'invalid', file, path: `answers[${k}].questionId`, message: `"${a.questionId}" is not a question of the rule folder in use` });
    answers.push({ ...a, target: q.target });
  }
  return ok(answers);
}
