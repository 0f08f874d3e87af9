/**
 * Working the checks after the result: who started and finished each one, when, and for an
 * apprentice the supervisor who authorised a live or isolated check and signed it off. Names
 * are recorded as stated; nothing here verifies them.
 */
import * as z from 'zod';
import type { CheckResult } from '../engine/diagnose.js';
import type { Check } from '../knowledge/rulebase-schema.js';
import { READING_FIELDS, type ReadingName } from '../knowledge/case-schema.js';
import { OBSERVATIONS, type ObservationName } from '../knowledge/vocabulary.js';
import { describeQuantityError, DIMENSIONS, parseQuantity } from '../units/quantity.js';

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
  /** What the check showed, once done. */
  result: z.enum(['normal', 'abnormal', 'inconclusive']).optional(),
  /** Readings the check took, as typed, by the case file's names. */
  readings: z.record(z.string(), z.string()).optional(),
  /** What the check saw, by the case file's observation names. */
  observations: z.record(z.string(), z.string()).optional(),
  /** The cause the fitter says this check found. */
  confirms: z.string().optional(),
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
  /** A fixed prompt, or `reading:NAME` / `observation:NAME` for what a check takes. */
  id: 'authorised-by' | 'authorisation' | 'finding' | 'signed-off-by' | 'isolation-points' | 'locks' | 'proved-dead-by' | 'tester' | 'result' | 'confirms' | `reading:${string}` | `observation:${string}`;
  prompt: string;
  required: boolean;
  /** Choices, where the answer is one of a few (a result, an observation, a cause). */
  options?: { value: string; label: string }[];
}

/** The questions that record the isolation, asked when the first isolated check starts. */
const ISOLATION_PROMPTS: WorkPrompt[] = [
  { id: 'isolation-points', prompt: 'Isolation points (isolators, breakers, fuses opened)?', required: true },
  { id: 'locks', prompt: 'Lock and tag numbers?', required: true },
  { id: 'proved-dead-by', prompt: 'Who proved it dead (tester proved before and after)?', required: true },
  { id: 'tester', prompt: 'Which voltage tester?', required: false },
];

export const RESULT_OPTIONS = [
  { value: 'normal', label: 'normal: nothing wrong where it looks' },
  { value: 'abnormal', label: 'abnormal: it shows a fault' },
  { value: 'inconclusive', label: 'inconclusive' },
];

const UNIT_WORDS: Record<string, string> = { ohm: 'Ω', Mohm: 'MΩ', degC: '°C' };

/** What finishing a check asks, beyond the fixed prompts: what the check measures and sees, and whether it found the fault. */
export interface DoneContext {
  check?: Pick<Check, 'takes'> | undefined;
  /** The causes an abnormal result could confirm: those the check shows that are in play. */
  confirmable?: { value: string; label: string }[];
  got?: Partial<Record<string, string>>;
}

export function promptsFor(kind: WorkEntry['kind'], supervised: boolean, firstIsolated = false, done: DoneContext = {}): WorkPrompt[] {
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
  const takes = done.check?.takes ?? {};
  const readings = (takes.readings ?? []).filter((r): r is ReadingName => r in READING_FIELDS);
  const observations = (takes.observations ?? []).filter((o): o is ObservationName => o in OBSERVATIONS);
  const abnormal = done.got?.result === 'abnormal';
  return [
    { id: 'result', prompt: 'Result?', required: true, options: RESULT_OPTIONS },
    ...readings.map((r): WorkPrompt => {
      const unit = DIMENSIONS[READING_FIELDS[r].dimension].unit;
      return { id: `reading:${r}`, prompt: `${capital(READING_FIELDS[r].says)}? (in ${UNIT_WORDS[unit] ?? unit}; Enter to skip)`, required: false };
    }),
    ...observations.map((o): WorkPrompt => ({ id: `observation:${o}`, prompt: `${capital(OBSERVATIONS[o].says)}? (Enter to skip)`, required: false, options: Object.entries(OBSERVATIONS[o].values).map(([value, label]) => ({ value, label })) })),
    { id: 'finding', prompt: 'What did you find (in your words)?', required: false },
    ...(abnormal && done.confirmable?.length ? [{ id: 'confirms' as const, prompt: 'Does this find the fault? Pick the cause it confirms, or Enter for not yet.', required: false, options: done.confirmable }] : []),
    ...(supervised ? [{ id: 'signed-off-by' as const, prompt: 'Supervisor signing it off (name or initials)?', required: true }] : []),
  ];
}

const capital = (t: string) => t.charAt(0).toUpperCase() + t.slice(1);

/** The value an answer to a choice prompt stands for: its number, its value or the start of its words. */
export function pickWorkOption(p: WorkPrompt, text: string): string | undefined {
  if (!p.options) return undefined;
  const t = text.toLowerCase();
  if (/^\d+$/.test(t)) return p.options[Number(t) - 1]?.value;
  const hits = p.options.filter((o) => o.value === t || o.value.startsWith(t) || o.label.toLowerCase().startsWith(t));
  return hits.length === 1 ? hits[0]!.value : p.options.find((o) => o.value === t)?.value;
}

const REQUIRED_BECAUSE: Partial<Record<string, string>> = {
  result: 'this cannot be left unknown: answer normal, abnormal or inconclusive',
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
  if (p.required && text === '') return REQUIRED_BECAUSE[p.id as keyof typeof REQUIRED_BECAUSE] ?? 'this is needed';
  if (text === '') return undefined;
  if (p.options && p.id !== 'authorisation' && pickWorkOption(p, text) === undefined) {
    return `"${text}" is not one of the choices: ${p.options.map((o, k) => `${k + 1} ${o.value}`).join(', ')}`;
  }
  if (p.id.startsWith('reading:')) {
    const name = p.id.slice('reading:'.length) as ReadingName;
    const r = parseQuantity(text, READING_FIELDS[name].dimension);
    if (!r.ok) return describeQuantityError(r.error);
  }
  if (p.id === 'authorisation' && !['present', 'remote'].includes(text.toLowerCase())) return 'answer present or remote';
  if (p.id === 'authorisation' && text.toLowerCase() === 'remote' && !context.rules?.remoteAuthorisationAllowed) {
    return 'this site does not allow a live or isolated check to be authorised remotely: the supervisor must be present (a site can allow it in its settings)';
  }
  if ((p.id === 'authorised-by' || p.id === 'signed-off-by') && context.worker !== undefined && sameName(text, context.worker)) {
    return `the supervisor must be someone other than you (${context.worker}): name the person supervising`;
  }
  return undefined;
}

export function entryFrom(kind: WorkEntry['kind'], check: string, by: string, at: string, got: Partial<Record<string, string>>): WorkEntry {
  const e: WorkEntry = { check, kind, at, by };
  if (got.result) e.result = got.result as NonNullable<WorkEntry['result']>;
  const pick = (prefix: string) => Object.fromEntries(Object.entries(got).filter(([k, v]) => k.startsWith(prefix) && v).map(([k, v]) => [k.slice(prefix.length), v!]));
  const readings = pick('reading:');
  const observations = pick('observation:');
  if (Object.keys(readings).length) e.readings = readings;
  if (Object.keys(observations).length) e.observations = observations;
  if (got.confirms) e.confirms = got.confirms;
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

/**
 * The checks worked, as a case file records them: one entry per check done with a result, in the
 * order finished, its start and supervision folded in.
 */
export function checksFromWork(work: readonly WorkEntry[]): Record<string, unknown>[] {
  return work
    .filter((w) => w.kind === 'done' && w.result)
    .map((done) => {
      const started = work.find((w) => w.check === done.check && w.kind === 'started');
      return {
        id: done.check,
        result: done.result,
        ...(done.readings ? { readings: done.readings } : {}),
        ...(done.observations ? { observations: done.observations } : {}),
        ...(done.finding ? { finding: done.finding } : {}),
        ...(done.confirms ? { confirms: done.confirms } : {}),
        by: done.by,
        at: done.at,
        ...(started ? { startedAt: started.at } : {}),
        ...(started?.authorisedBy ? { authorisedBy: started.authorisedBy } : {}),
        ...(started?.authorisation ? { authorisation: started.authorisation } : {}),
        ...(done.signedOffBy ? { signedOffBy: done.signedOffBy } : {}),
        ...(started?.isolation ? { isolation: isolationRecord(started.isolation) } : {}),
      };
    });
}

/** The case file keeps isolation points and locks as lists. */
function isolationRecord(i: NonNullable<WorkEntry['isolation']>): Record<string, unknown> {
  const list = (t: string | undefined) => (t ? t.split(/[,;]\s*/).filter(Boolean) : undefined);
  return { ...(i.points ? { points: list(i.points) } : {}), ...(i.locks ? { locks: list(i.locks) } : {}), ...(i.provedDeadBy ? { provedDeadBy: i.provedDeadBy } : {}), ...(i.tester ? { tester: i.tester } : {}) };
}
