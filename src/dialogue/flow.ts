/**
 * The order of a job: the questions that decide what is safe to ask, the machine (unless a
 * machine file was given), the symptoms, then whatever the policy finds most useful until the
 * leading cause is clear or nothing left would change the order.
 */
import type { Diagnosis } from '../engine/diagnose.js';
import type { RuleBase } from '../knowledge/load-rules.js';
import { computeExpectations } from '../model/expected.js';
import type { CaseFile } from '../knowledge/case-schema.js';
import type { Answer } from './job.js';
import { chooseQuestion, compilePolicy, leaderIsClear, type Policy } from './policy.js';
import { fromRuleQuestion, machineQuestions, SAFETY_OPENING, type DialogueQuestion } from './questions.js';

/** The dialogue stops offering questions after this many adaptive ones; the fitter can go on asking for the result earlier. */
export const MAX_ADAPTIVE_QUESTIONS = 14;

export interface Flow {
  base: RuleBase;
  policy: Policy;
  opening: DialogueQuestion[];
  machine: DialogueQuestion[];
  adaptive: DialogueQuestion[];
  all: Map<string, DialogueQuestion>;
}

export function buildFlow(base: RuleBase): Flow {
  const opening = SAFETY_OPENING.flatMap((id) => base.questions.filter((q) => q.id === id)).map((q) => fromRuleQuestion(q, true));
  const adaptive = base.questions.filter((q) => !SAFETY_OPENING.includes(q.id)).map((q) => fromRuleQuestion(q, false));
  const machine = machineQuestions();
  const all = new Map([...opening, ...machine, ...adaptive].map((q) => [q.id, q]));
  return { base, policy: compilePolicy(base, adaptive), opening, machine, adaptive, all };
}

export type Next = { kind: 'ask'; question: DialogueQuestion; gain?: number } | { kind: 'needs-diagnosis' } | { kind: 'done'; why: string };

export interface Progress {
  answers: readonly Answer[];
  /** An apprentice: live and isolated measurements are done as checks, under a supervisor's authorisation, not asked as questions. */
  supervisedOnly?: boolean;
  /** The machine came from a file: its questions are not asked. */
  machineGiven: boolean;
  /** The job details came from a file (replaying a case): not asked either. */
  jobGiven?: boolean;
  /** The diagnosis of the answers as they stand, once the machine's connection is known. */
  diagnosis?: Diagnosis | undefined;
  /** The job as the engine reads it, for judging which readings can be used. */
  job?: CaseFile | undefined;
}

export function nextStep(flow: Flow, p: Progress): Next {
  const answered = new Set(p.answers.map((a) => a.questionId));
  for (const q of flow.opening) if (!answered.has(q.id)) return { kind: 'ask', question: q };
  for (const q of flow.machine) {
    if (answered.has(q.id) || q.id === 'symptoms') continue;
    // A machine file answers the machine's questions, not the job's (work order, asset, who).
    if (q.target.section === 'job' ? p.jobGiven : p.machineGiven) continue;
    if (q.id === 'feedback' && !drivesMayHaveFeedback(p.answers)) continue;
    if (q.target.section === 'nameplate' && q.target.name.startsWith('field') && !hasWoundShuntField(p.answers)) continue;
    return { kind: 'ask', question: q };
  }
  if (!answered.has('symptoms')) return { kind: 'ask', question: flow.all.get('symptoms')! };
  if (!p.diagnosis) return { kind: 'needs-diagnosis' };
  // Questions asked for the fitter's safety (what the machine drives) do not use up the diagnosis's questions.
  const adaptiveAsked = p.answers.filter((a) => !flow.all.get(a.questionId)?.opening && !flow.all.get(a.questionId)?.source?.forSafety).length;
  if (adaptiveAsked >= MAX_ADAPTIVE_QUESTIONS) return { kind: 'done', why: `${MAX_ADAPTIVE_QUESTIONS} questions asked` };
  if (leaderIsClear(p.diagnosis)) return { kind: 'done', why: 'the leading cause is clear' };
  const d = p.diagnosis;
  const safetyFirst = d.warnings.length > 0 && flow.base.safety.warnings.some((w) => w.isolateFirst && d.warnings.some((x) => x.id === w.id));
  const available = (q: DialogueQuestion) =>
    !answered.has(q.id) &&
    (!q.source?.askWhen || d.askable.has(q.id)) &&
    // After a fault trip or a runaway warning nothing is asked that means running it again.
    !(safetyFirst && (q.source?.needsRunning || q.state === 'live-test')) &&
    !(p.supervisedOnly && q.state !== 'observe') &&
    // A reading is worth asking when the model can judge it, or when the fits wait on it to tell tied causes apart.
    (q.target.section !== 'readings' || readingIsUsable(p.job, q.target.name) || awaitedByFits(p.job, d, q.target.name));
  // Context before detail: a question waits for the ones it follows; asked first, those come first.
  const waiting = (q: DialogueQuestion) => (q.source?.askAfter ?? []).filter((id) => !answered.has(id));
  const ready = (q: DialogueQuestion) => available(q) && waiting(q).length === 0;
  const firstWanted = flow.adaptive.find((q) => d.askFirst.has(q.id) && available(q));
  if (firstWanted) {
    const before = waiting(firstWanted).map((id) => flow.all.get(id)).find((q): q is DialogueQuestion => q !== undefined && available(q));
    if (before || ready(firstWanted)) return { kind: 'ask', question: before ?? firstWanted };
  }
  // Once the machine stands isolated, the isolated questions still worth asking come before anything live.
  const lastAdaptive = [...p.answers].reverse().find((a) => !flow.all.get(a.questionId)?.opening);
  const standsIsolated = lastAdaptive !== undefined && flow.all.get(lastAdaptive.questionId)?.state === 'isolated';
  const choice = chooseQuestion(flow.policy, d, ready, standsIsolated);
  return choice ? { kind: 'ask', question: choice.question, gain: choice.gain } : { kind: 'done', why: 'no remaining question would change the order' };
}

function answerOf(answers: readonly Answer[], id: string): string | undefined {
  const a = [...answers].reverse().find((x) => x.questionId === id);
  return a?.value.kind === 'one' ? a.value.value : undefined;
}

function drivesMayHaveFeedback(answers: readonly Answer[]): boolean {
  return answerOf(answers, 'drive') !== 'fixed-supply';
}

function hasWoundShuntField(answers: readonly Answer[]): boolean {
  return !['series', 'permanent-magnet'].includes(answerOf(answers, 'connection') ?? '');
}

/** A reading not yet taken that would tell tied fitted hypotheses apart. */
function awaitedByFits(job: CaseFile | undefined, d: Diagnosis, reading: string): boolean {
  return (job?.readings as Record<string, unknown> | undefined)?.[reading] === undefined && d.tellApart.some((s) => s.reading === reading);
}

/** A reading is worth asking for only if the model can set it against something. */
export function readingIsUsable(job: CaseFile | undefined, reading: string): boolean {
  if (!job) return false;
  const readings = (job.readings ?? {}) as Record<string, unknown>;
  if (readings[reading] !== undefined) return false;
  const before = computeExpectations({ machine: job.machine, readings: job.readings });
  const probe = computeExpectations({ machine: { ...job.machine, tachoVoltsPer1000Rpm: job.machine.tachoVoltsPer1000Rpm ?? 60 }, readings: { ...job.readings, [reading]: reading === 'speed' || reading === 'speedReverse' ? 1000 : 10 } });
  const gained = Object.entries(probe.quantities).filter(([k, q]) => {
    const b = before.quantities[k as keyof typeof before.quantities];
    return !b || (b.measured === null && q.measured !== null);
  });
  // Insulation and temperature readings feed quantities with no "measured" side; count new quantities too.
  return gained.length > 0 || probe.findings.length > before.findings.length;
}
