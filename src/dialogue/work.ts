/**
 * Working the checks after the result: who started and finished each one, when, and for an
 * apprentice the supervisor who authorised a live or isolated check and signed it off. Names
 * are recorded as stated; nothing here verifies them.
 */
import * as z from 'zod';
import type { CheckResult } from '../engine/diagnose.js';

export const ROLES = ['fitter', 'apprentice', 'lead'] as const;
export type Role = (typeof ROLES)[number];

export interface WorkRules {
  role: Role;
  /** Site setting: may an apprentice do live tests at all (under authorisation)? */
  apprenticesMayTestLive: boolean;
  /** Site setting: may a supervisor authorise a live or isolated check without being there? Off unless the site says so. */
  remoteAuthorisationAllowed?: boolean;
}

export const workEntrySchema = z.strictObject({
  check: z.string(),
  kind: z.enum(['started', 'done']),
  at: z.string(),
  by: z.string(),
  authorisedBy: z.string().optional(),
  authorisation: z.enum(['present', 'remote']).optional(),
  signedOffBy: z.string().optional(),
  finding: z.string().optional(),
  /** Recorded when the first isolated check starts: how the machine was made safe. */
  isolation: z.strictObject({ points: z.string().optional(), locks: z.string().optional(), provedDeadBy: z.string().optional(), tester: z.string().optional() }).optional(),
});
export type WorkEntry = z.infer<typeof workEntrySchema>;

/** An apprentice needs a supervisor for anything beyond looking. */
export function needsSupervisor(rules: WorkRules, check: Pick<CheckResult, 'state'>): boolean {
  return rules.role === 'apprentice' && check.state !== 'observe';
}

/** Why this person may not start this check at all, if they may not. */
export function forbidden(rules: WorkRules, check: Pick<CheckResult, 'state'>): string | undefined {
  if (rules.role === 'apprentice' && check.state === 'live-test' && !rules.apprenticesMayTestLive) {
    return 'the site does not allow apprentices to do live tests: a qualified person does this one';
  }
  return undefined;
}

export function statusOf(work: readonly WorkEntry[], checkId: string): 'not started' | 'started' | 'done' {
  if (work.some((w) => w.check === checkId && w.kind === 'done')) return 'done';
  if (work.some((w) => w.check === checkId && w.kind === 'started')) return 'started';
  return 'not started';
}

/** A question asked while starting or finishing a check. */
export interface WorkPrompt {
  id: 'authorised-by' | 'authorisation' | 'finding' | 'signed-off-by' | 'isolation-points' | 'locks' | 'proved-dead-by' | 'tester';
  prompt: string;
  required: boolean;
}

/** The questions that record the isolation, asked when the first isolated check starts. */
const ISOLATION_PROMPTS: WorkPrompt[] = [
  { id: 'isolation-points', prompt: 'Isolation points (isolators, breakers, fuses opened)?', required: true },
  { id: 'locks', prompt: 'Lock and tag numbers?', required: true },
  { id: 'proved-dead-by', prompt: 'Who proved it dead (tester proved before and after)?', required: true },
  { id: 'tester', prompt: 'Which voltage tester?', required: false },
];

export function promptsFor(kind: WorkEntry['kind'], supervised: boolean, firstIsolated = false): WorkPrompt[] {
  if (kind === 'started') {
    return [
      ...(supervised
        ? [
            { id: 'authorised-by' as const, prompt: 'Supervisor authorising this check (name or initials)?', required: true },
            { id: 'authorisation' as const, prompt: 'Is the supervisor present or giving it remotely? (present / remote)', required: true },
          ]
        : []),
      ...(firstIsolated ? ISOLATION_PROMPTS : []),
    ];
  }
  return [
    { id: 'finding', prompt: 'What did you find?', required: false },
    ...(supervised ? [{ id: 'signed-off-by' as const, prompt: 'Supervisor signing it off (name or initials)?', required: true }] : []),
  ];
}

const REQUIRED_BECAUSE: Partial<Record<WorkPrompt['id'], string>> = {
  'authorised-by': 'this cannot be left unknown: a supervisor must be named',
  authorisation: 'this cannot be left unknown: answer present or remote',
  'signed-off-by': 'this cannot be left unknown: a supervisor must sign it off',
  'isolation-points': 'this cannot be left unknown: say what was opened to isolate the machine',
  locks: 'this cannot be left unknown: give the lock or tag numbers',
  'proved-dead-by': 'this cannot be left unknown: name who proved the machine dead',
};

/** Names compared as people write them: case, spaces and full stops aside ("J. Smith" = "j smith"). */
const sameName = (a: string, b: string) => a.toLowerCase().replace(/[\s.]+/g, '') === b.toLowerCase().replace(/[\s.]+/g, '');

/**
 * A reason the answer cannot stand, or undefined. `worker` is the person doing the check (the
 * apprentice, who cannot supervise themselves).
 */
export function workAnswerProblem(p: WorkPrompt, text: string, context: { worker?: string; rules?: WorkRules } = {}): string | undefined {
  if (p.required && text === '') return REQUIRED_BECAUSE[p.id] ?? 'this is needed';
  if (p.id === 'authorisation' && !['present', 'remote'].includes(text.toLowerCase())) return 'answer present or remote';
  if (p.id === 'authorisation' && text.toLowerCase() === 'remote' && !context.rules?.remoteAuthorisationAllowed) {
    return 'this site does not allow a live or isolated check to be authorised remotely: the supervisor must be present (a site can allow it in its settings)';
  }
  if ((p.id === 'authorised-by' || p.id === 'signed-off-by') && context.worker !== undefined && sameName(text, context.worker)) {
    return `the supervisor must be someone other than you (${context.worker}): name the person supervising`;
  }
  return undefined;
}

export function entryFrom(kind: WorkEntry['kind'], check: string, by: string, at: string, got: Partial<Record<WorkPrompt['id'], string>>): WorkEntry {
  const e: WorkEntry = { check, kind, at, by };
  if (got['authorised-by']) e.authorisedBy = got['authorised-by'];
  if (got.authorisation) e.authorisation = got.authorisation.toLowerCase() === 'remote' ? 'remote' : 'present';
  if (got['signed-off-by']) e.signedOffBy = got['signed-off-by'];
  if (got.finding) e.finding = got.finding;
  if (got['proved-dead-by'] !== undefined) {
    const iso: NonNullable<WorkEntry['isolation']> = {};
    if (got['isolation-points']) iso.points = got['isolation-points'];
    if (got.locks) iso.locks = got.locks;
    if (got['proved-dead-by']) iso.provedDeadBy = got['proved-dead-by'];
    if (got.tester) iso.tester = got.tester;
    e.isolation = iso;
  }
  return e;
}
