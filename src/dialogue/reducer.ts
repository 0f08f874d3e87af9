/**
 * The dialogue as a pure reducer: (state, event) → state. What to ask next is derived from the
 * answers and the latest diagnosis (see `currentStep`), never stored, so going back and changing
 * an answer needs no bookkeeping. Diagnosis runs outside (it is asynchronous) and comes back as
 * an event tagged with the answers' version it was made for.
 */
import type { CheckResult, Diagnosis } from '../engine/diagnose.js';
import { parseAnswer, cleanInput, lengthProblem } from './answers.js';
import { nextStep, type Flow, type Next } from './flow.js';
import type { DialogueQuestion } from './questions.js';
import { jobFromAnswers, parseDraft, type Answer } from './job.js';
import { nextOutcomeQuestion, outcomeAnswerProblem } from './outcome.js';
import { computeExpectations } from '../model/expected.js';
import { entryFrom, forbidden, needsSupervisor, pickWorkOption, promptsFor, statusOf, workAnswerProblem, type WorkEntry, type WorkPrompt, type WorkRules } from './work.js';

export type Panel = 'why' | 'causes' | 'safety' | 'help' | 'next';

/** The transcript: append-only, so a terminal can print each entry once and never redraw it. */
export type LogEntry =
  | { kind: 'answer'; answer: Answer }
  | { kind: 'withdrawn'; answer: Answer }
  | { kind: 'result'; diagnosis: Diagnosis; because: string }
  /** The loop after a check's result: the ranking and the checks as they now stand, against the ones before. */
  | { kind: 'update'; diagnosis: Diagnosis; previous: Diagnosis; check: string }
  | { kind: 'note'; text: string }
  /** A safety warning, logged the first time a diagnosis raises it, so it stays on screen. */
  | { kind: 'warning'; warning: Diagnosis['warnings'][number] }
  /** A panel asked for (why, causes, safety, help), as things stood when it was asked. */
  | { kind: 'panel'; which: Panel; diagnosis?: Diagnosis | undefined; question?: DialogueQuestion | undefined };

export interface DialogueState {
  /** `finishing`: the questions are over and the result waits for the diagnosis of the last answers. */
  phase: 'notice' | 'asking' | 'finishing' | 'result' | 'recording';
  answers: Answer[];
  log: LogEntry[];
  /** Bumped whenever the answers change; a diagnosis is current only for its version. */
  version: number;
  diagnosis?: { version: number; value: Diagnosis } | undefined;
  /** One line saying why the last input was not taken; the question is asked again. */
  error?: string | undefined;
  /** Why the questions ended. */
  endedBecause?: string | undefined;
  /** A file the fitter asked for (the job, the recorded case, the report): the shell writes it and answers with `saved`. */
  request?: 'save' | 'record' | 'report' | undefined;
  /** What the last save said: where the file went, or why it could not be written. */
  saved?: string | undefined;
  /** The outcome being recorded, once the fitter asked to record the job. */
  outcome: Answer[];
  /** Checks started and done, with their authorisations and sign-offs. */
  work: WorkEntry[];
  /** A check being started or finished: the prompts answered so far. */
  pendingWork?: { kind: WorkEntry['kind']; check: CheckResult; got: Partial<Record<WorkPrompt['id'], string>>; firstIsolated: boolean } | undefined;
  /** Said once with the next note. */
  notice?: string | undefined;
  /** A check was just finished: the next diagnosis is shown as what changed. */
  awaitingUpdate?: string | undefined;
  /** A reading far from the plate, held until the fitter says to keep it. */
  confirming?: { answer: Answer; says: string } | undefined;
  /** From a resumed session: the check prompts and the outcome answered so far, put back once the result is on screen. */
  restore?: SavedProgress | undefined;
}

/**
 * What a session keeps besides the answers and the checks worked: whether the questions had
 * ended, a check's prompts answered so far (the isolation record among them) and the outcome
 * being recorded, so that a kill at any prompt loses no answer.
 */
export interface SavedProgress {
  endedBecause?: string | undefined;
  pendingWork?: { kind: WorkEntry['kind']; check: string; got: Partial<Record<WorkPrompt['id'], string>>; firstIsolated: boolean } | undefined;
  outcome?: Answer[] | undefined;
}

export function progressOf(state: DialogueState): SavedProgress {
  const p = state.pendingWork;
  // Until a resumed result is back on screen, what it will restore is still the progress.
  if (state.restore) return state.restore;
  return {
    ...(state.phase === 'result' || state.phase === 'recording' || state.phase === 'finishing' ? { endedBecause: state.endedBecause } : {}),
    ...(p ? { pendingWork: { kind: p.kind, check: p.check.id, got: p.got, firstIsolated: p.firstIsolated } } : {}),
    ...(state.phase === 'recording' ? { outcome: state.outcome } : {}),
  };
}

export type DialogueEvent =
  | { type: 'begin' }
  | { type: 'input'; text: string; at: string }
  | { type: 'diagnosed'; version: number; diagnosis: Diagnosis }
  | { type: 'saved'; message: string };

export interface DialogueContext {
  flow: Flow;
  machineFile?: unknown;
  /** Who is working and what the site allows; a fitter with no limits when absent. */
  work?: WorkRules;
  /** A line on the asset's earlier recorded jobs, when it has any (the shell reads the cases folder once). */
  earlierJobs?: ((asset: string) => string | undefined) | undefined;
}

/** Words typed at any prompt that steer the dialogue rather than answer. */
export const COMMANDS = {
  back: 'change the last answer',
  why: 'why this question',
  causes: 'the ranking with its evidence',
  safety: 'the safety notice',
  done: 'finish now and see the result',
  save: 'save the job as a case file (once the result is shown)',
  record: 'record the confirmed cause and the repair, and file the job as a case',
  'start N': 'start check N (an apprentice names the supervisor authorising it)',
  'done N': 'finish check N: its result, what it measured, what you found (an apprentice names who signs it off)',
  next: 'the check to do next, after the results so far',
  report: 'write the job report',
  help: 'these commands',
} as const;

export function initialState(answers: Answer[] = [], work: WorkEntry[] = [], progress: SavedProgress = {}): DialogueState {
  const state: DialogueState = { phase: answers.length ? 'asking' : 'notice', answers, log: answers.map((answer) => ({ kind: 'answer', answer })), version: 0, outcome: [], work };
  // The questions had ended (or checks were being worked): the result comes back with the first diagnosis, and with it the prompts left open.
  if (answers.length && (progress.endedBecause !== undefined || work.length)) return { ...state, phase: 'finishing', endedBecause: progress.endedBecause ?? 'the session was resumed at its checks', restore: progress };
  return state;
}

/** Ends the questions: the result shows at once if the diagnosis is current, else when it comes. */
function finish(state: DialogueState, because: string): DialogueState {
  const d = state.diagnosis?.version === state.version ? state.diagnosis.value : undefined;
  if (!d) return { ...state, phase: 'finishing', endedBecause: because };
  const shown: DialogueState = { ...state, phase: 'result', endedBecause: because, restore: undefined, log: [...state.log, { kind: 'result', diagnosis: d, because }] };
  return restoreProgress(shown, state.restore);
}

/** Puts back the check prompts or the outcome a resumed session had open. */
function restoreProgress(state: DialogueState, saved: SavedProgress | undefined): DialogueState {
  if (!saved) return state;
  const p = saved.pendingWork;
  const check = p ? resultChecks(state).find((c) => c.id === p.check) : undefined;
  if (p && check) return { ...state, pendingWork: { kind: p.kind, check, got: p.got, firstIsolated: p.firstIsolated } };
  if (saved.outcome?.length) return { ...state, phase: 'recording', outcome: saved.outcome };
  return state;
}

/**
 * `done` typed by the fitter. Before the machine's connection is known there is no job to
 * diagnose, so no result would ever come: say so at once instead of waiting for one.
 */
function finishAsked(state: DialogueState, ctx: DialogueContext): DialogueState {
  if (parseDraft(draftOf(state, ctx)).ok) return finish(state, 'you asked for the result');
  return { ...state, log: [...state.log, { kind: 'note', text: 'Nothing to go on yet: answer at least what kind of machine it is, then type done again (or press Ctrl-C to leave).' }] };
}

export function draftOf(state: DialogueState, ctx: DialogueContext) {
  return jobFromAnswers(state.answers, ctx.machineFile, state.work);
}

/** What the dialogue is doing now, derived from the answers and the current diagnosis. */
export function currentStep(state: DialogueState, ctx: DialogueContext): Next {
  const parsed = parseDraft(draftOf(state, ctx));
  const diagnosis = state.diagnosis?.version === state.version ? state.diagnosis.value : undefined;
  return nextStep(ctx.flow, {
    supervisedOnly: ctx.work?.role === 'apprentice',
    answers: state.answers,
    machineGiven: ctx.machineFile !== undefined,
    diagnosis,
    job: parsed.ok ? parsed.job : undefined,
  });
}

export function reduce(state: DialogueState, event: DialogueEvent, ctx: DialogueContext): DialogueState {
  switch (event.type) {
    case 'begin':
      return state.phase === 'notice' ? { ...state, phase: 'asking' } : state;
    case 'diagnosed': {
      if (event.version !== state.version) return state; // made for answers since changed
      const shown = new Set(state.log.flatMap((e) => (e.kind === 'warning' ? [e.warning.id] : [])));
      const fresh = event.diagnosis.warnings.filter((w) => !shown.has(w.id)).map((warning): LogEntry => ({ kind: 'warning', warning }));
      const next: DialogueState = { ...state, diagnosis: { version: event.version, value: event.diagnosis }, log: fresh.length ? [...state.log, ...fresh] : state.log };
      if (next.phase === 'result' && next.awaitingUpdate) {
        return { ...next, awaitingUpdate: undefined, log: [...next.log, { kind: 'update', diagnosis: event.diagnosis, previous: latestDiagnosis(state) ?? event.diagnosis, check: next.awaitingUpdate }] };
      }
      if (next.phase === 'finishing') return finish(next, next.endedBecause ?? 'you asked for the result');
      if (next.phase === 'asking') {
        const step = currentStep(next, ctx);
        if (step.kind === 'done') return finish(next, step.why);
      }
      return next;
    }
    case 'input':
      return onInput(state, event.text, event.at, ctx);
    case 'saved':
      return { ...state, request: undefined, saved: event.message };
  }
}

/** Whether the prompt waiting takes free text (a finding, notes, a name), where a pasted paragraph is one answer. */
export function expectsFreeText(state: DialogueState, ctx: DialogueContext): boolean {
  if (state.pendingWork) return workPrompt(state, ctx)?.id !== 'authorisation';
  if (state.phase === 'recording') return outcomeStep(state, ctx)?.answer.kind === 'text';
  if (state.phase !== 'asking') return false;
  const step = currentStep(state, ctx);
  return step.kind === 'ask' && step.question.answer.kind === 'text';
}

function onInput(state: DialogueState, typed: string, at: string, ctx: DialogueContext): DialogueState {
  const text = cleanInput(typed);
  const word = text.toLowerCase();
  const base = { ...state, error: undefined, confirming: undefined };
  const tooLong = state.phase === 'notice' ? undefined : lengthProblem(text, expectsFreeText(state, ctx));
  if (tooLong) return { ...base, error: tooLong };
  if (state.phase === 'notice') return word === 'done' ? finishAsked({ ...base, phase: 'asking' }, ctx) : { ...base, phase: 'asking' };
  if (state.confirming && ['yes', 'y', 'keep'].includes(word)) {
    const answer = state.confirming.answer;
    return withAnswers({ ...base, log: [...state.log, { kind: 'answer', answer: { ...answer, shown: `${answer.shown} (kept after asking back)` } }] }, [...state.answers, answer]);
  }
  if (state.confirming && ['no', 'n'].includes(word)) return { ...base, error: 'not kept: type the reading again, or Enter to leave it unknown' };
  if (word === 'back') {
    const last = state.answers.at(-1);
    if (!last) return { ...base, error: 'nothing to go back to yet' };
    return withAnswers({ ...base, phase: 'asking', endedBecause: undefined, log: [...state.log, { kind: 'withdrawn', answer: last }] }, state.answers.slice(0, -1));
  }
  if (word === 'why' || word === 'causes' || word === 'safety' || word === 'help' || (word === 'next' && state.phase === 'result')) {
    // Panels go into the transcript, not the live area: a tall live area makes the terminal redraw everything.
    const step = state.phase === 'asking' ? currentStep(state, ctx) : undefined;
    const diagnosis = word === 'next' ? latestDiagnosis(state) : state.diagnosis?.version === state.version ? state.diagnosis.value : undefined;
    return { ...base, log: [...state.log, { kind: 'panel', which: word, diagnosis, question: step?.kind === 'ask' ? step.question : undefined }] };
  }
  if (state.phase === 'recording') return onOutcomeInput(base, text, word, at, ctx);
  if (state.pendingWork) return onWorkPrompt(base, text, word, at, ctx);
  const work = /^(start|done) +(\d+)$/.exec(word);
  if (work) return state.phase === 'result' ? beginWork(base, work[1] === 'start' ? 'started' : 'done', Number(work[2]), at, ctx) : { ...base, error: 'checks come with the result: type done to finish the questions first' };
  if (word === 'report') return state.phase === 'result' ? { ...base, request: 'report' } : { ...base, error: 'the report comes with the result: type done to finish first' };
  if (word === 'record') return state.phase === 'result' ? { ...base, phase: 'recording', outcome: [] } : { ...base, error: 'record comes with the result: type done to finish first' };
  if (word === 'save') return state.phase === 'result' ? { ...base, request: 'save' } : { ...base, error: 'save comes with the result: type done to finish first' };
  if (word === 'done') return state.phase === 'asking' ? finishAsked(base, ctx) : base;
  if (state.phase === 'finishing') return { ...base, error: 'the result is on its way: a moment' };
  if (state.phase === 'result') return { ...base, error: 'the questions are finished: type start N, done N, report, record or save, back to change the last answer, or press Ctrl-C to leave' };
  const step = currentStep(state, ctx);
  if (step.kind !== 'ask') return { ...base, error: 'still working out the next question: a moment' };
  const parsed = parseAnswer(step.question, text);
  if (!parsed.ok) return { ...base, error: parsed.reason };
  const answer: Answer = { questionId: step.question.id, target: step.question.target, value: parsed.value, shown: parsed.shown, at };
  const problem = newProblem(state.answers, [...state.answers, answer], ctx);
  if (problem) return { ...base, error: `not taken: ${problem}` };
  const far = farFromPlate(state, answer, ctx);
  if (far) return { ...base, confirming: { answer, says: far } };
  const target = step.question.target;
  const history = target.section === 'job' && target.name === 'asset' && parsed.value.kind === 'text' ? ctx.earlierJobs?.(parsed.value.value) : undefined;
  const notes: LogEntry[] = history ? [{ kind: 'note', text: history }] : [];
  return withAnswers({ ...base, log: [...state.log, { kind: 'answer', answer }, ...notes] }, [...state.answers, answer]);
}

/** What the model says of a reading several times its plate value, before it is let into the job. */
function farFromPlate(state: DialogueState, answer: Answer, ctx: DialogueContext): string | undefined {
  if (answer.target.section !== 'readings' || answer.value.kind !== 'text') return undefined;
  const parsed = parseDraft(jobFromAnswers([...state.answers, answer], ctx.machineFile));
  if (!parsed.ok) return undefined;
  const name = answer.target.name;
  return computeExpectations({ machine: parsed.job.machine, readings: parsed.job.readings }).findings.find((f) => f.code === 'reading-far-from-plate' && f.reading === name)?.says;
}

/**
 * Why an answer would make the job one the engine cannot read (a zero rated voltage, say), when the
 * job could be read before it: taken, it would leave the dialogue waiting for a diagnosis that never comes.
 */
function newProblem(before: Answer[], after: Answer[], ctx: DialogueContext): string | undefined {
  const unreadable = (answers: Answer[]) => {
    const draft = jobFromAnswers(answers, ctx.machineFile);
    if (draft.machine.connection === undefined) return undefined;
    const parsed = parseDraft(draft);
    return parsed.ok ? undefined : parsed.reason;
  };
  const now = unreadable(after);
  return now && !unreadable(before) ? now : undefined;
}

const DEFAULT_WORK_RULES: WorkRules = { role: 'fitter', apprenticesMayTestLive: true };

/** The diagnosis of the result on screen: the last result, or the last update after a check. */
export function latestDiagnosis(state: DialogueState): Diagnosis | undefined {
  for (let k = state.log.length - 1; k >= 0; k--) {
    const e = state.log[k]!;
    if (e.kind === 'result' || e.kind === 'update') return e.diagnosis;
  }
  return undefined;
}

/** The checks of the result on screen, numbered as shown: those worked first, then the ones still to do. */
export function resultChecks(state: DialogueState): CheckResult[] {
  return latestDiagnosis(state)?.checks ?? [];
}

/** Who is doing the work: the name given for the job, else "the fitter". */
export function workerOf(state: DialogueState, ctx: DialogueContext): string {
  const job = draftOf(state, ctx).job as { fitter?: string } | undefined;
  return job?.fitter ?? 'the fitter (no name given)';
}

function beginWork(state: DialogueState, kind: WorkEntry['kind'], n: number, at: string, ctx: DialogueContext): DialogueState {
  const rules = ctx.work ?? DEFAULT_WORK_RULES;
  const check = resultChecks(state)[n - 1];
  if (!check) return { ...state, error: `there is no check ${n}: the checks are numbered 1 to ${resultChecks(state).length}` };
  const status = statusOf(state.work, check.id);
  if (kind === 'started') {
    if (status !== 'not started') return { ...state, error: `check ${n} is already ${status}` };
    const no = forbidden(rules, check);
    if (no) return { ...state, error: no };
    // The first isolated check is where the machine is made safe: its isolation is recorded.
    const firstIsolated = check.state === 'isolated' && !state.work.some((w) => w.isolation);
    const pending = { kind, check, got: {}, firstIsolated };
    if (promptsFor(kind, needsSupervisor(rules, check), firstIsolated).length === 0) return finishWork(state, 'started', check, {}, at, ctx);
    return { ...state, pendingWork: pending, notice: firstIsolated ? ' The machine was isolated as the steps before this check say.' : undefined };
  }
  if (status === 'not started') return { ...state, error: `check ${n} has not been started: type start ${n} first` };
  if (status === 'done') return { ...state, error: `check ${n} is already done` };
  return { ...state, pendingWork: { kind, check, got: {}, firstIsolated: false } };
}

export function workPrompt(state: DialogueState, ctx: DialogueContext): WorkPrompt | undefined {
  const p = state.pendingWork;
  if (!p) return undefined;
  return promptsFor(p.kind, needsSupervisor(ctx.work ?? DEFAULT_WORK_RULES, p.check), p.firstIsolated, doneContext(state, p.check, p.got, ctx)).find((x) => p.got[x.id] === undefined);
}

/** What finishing this check asks: what it takes, and the causes an abnormal result could confirm. */
function doneContext(state: DialogueState, check: CheckResult, got: Partial<Record<string, string>>, ctx: DialogueContext) {
  const inPlay = latestDiagnosis(state)?.causes ?? [];
  return {
    check: ctx.flow.base.checks.find((c) => c.id === check.id),
    confirmable: inPlay.filter((c) => check.causes.includes(c.id)).map((c) => ({ value: c.id, label: c.title })),
    got,
  };
}

function onWorkPrompt(state: DialogueState, text: string, word: string, at: string, ctx: DialogueContext): DialogueState {
  const p = state.pendingWork!;
  if (word === 'back') return { ...state, pendingWork: undefined, error: `left check ${p.check.title} as it was` };
  const prompt = workPrompt(state, ctx);
  if (!prompt) return { ...state, pendingWork: undefined };
  const problem = workAnswerProblem(prompt, text, { worker: workerOf(state, ctx), rules: ctx.work ?? DEFAULT_WORK_RULES });
  if (problem) return { ...state, error: problem };
  const got = { ...p.got, [prompt.id]: workValue(prompt, text) };
  const next = { ...state, pendingWork: { ...p, got } };
  return workPrompt(next, ctx) ? next : finishWork(next, p.kind, p.check, got, at, ctx);
}

/** An answer as it is kept: a choice by its value, a bare reading in the unit the prompt shows. */
function workValue(prompt: WorkPrompt, text: string): string {
  if (text === '') return '';
  if (prompt.options && prompt.id !== 'authorisation') return pickWorkOption(prompt, text) ?? text;
  const unit = /\(in ([^;)]+)/.exec(prompt.prompt)?.[1];
  if (prompt.id.startsWith('reading:') && /^[+-]?[\d.,]+$/.test(text) && unit) return `${text} ${unit}`;
  return text;
}

function finishWork(state: DialogueState, kind: WorkEntry['kind'], check: CheckResult, got: Partial<Record<string, string>>, at: string, ctx: DialogueContext): DialogueState {
  const entry = entryFrom(kind, check.id, workerOf(state, ctx), at, got);
  const who = entry.authorisedBy ? `, authorised by ${entry.authorisedBy} (${entry.authorisation})` : entry.signedOffBy ? `, signed off by ${entry.signedOffBy}` : '';
  const result = entry.result ? ` — ${entry.result.toUpperCase()}` : '';
  const text = `${kind === 'started' ? 'Started' : 'Done'}: ${check.title}${result} — ${entry.by}, ${at.slice(11, 16)}${who}${entry.finding ? `; found: ${entry.finding}` : ''}.${state.notice ?? ''}`;
  const next: DialogueState = { ...state, pendingWork: undefined, notice: undefined, work: [...state.work, entry], log: [...state.log, { kind: 'note', text }] };
  // A result changes the job: diagnose again, and show what changed when it comes.
  return entry.result ? { ...next, version: state.version + 1, awaitingUpdate: check.id } : next;
}

/** The recording questions: back steps back within them; the last answer files the case. */
function onOutcomeInput(state: DialogueState, text: string, word: string, at: string, ctx: DialogueContext): DialogueState {
  if (word === 'back') return state.outcome.length ? { ...state, outcome: state.outcome.slice(0, -1) } : { ...state, phase: 'result' };
  const question = outcomeStep(state, ctx);
  if (!question) return state;
  const problem = outcomeAnswerProblem(question, text);
  if (problem) return { ...state, error: problem };
  const parsed = parseAnswer(question, text);
  if (!parsed.ok) return { ...state, error: parsed.reason };
  const outcome = [...state.outcome, { questionId: question.id, target: question.target, value: parsed.value, shown: parsed.shown, at }];
  const next = { ...state, outcome };
  return outcomeStep(next, ctx) ? next : { ...next, phase: 'result', request: 'record' };
}

export function outcomeStep(state: DialogueState, ctx: DialogueContext) {
  const d = state.diagnosis?.version === state.version ? state.diagnosis.value : undefined;
  return nextOutcomeQuestion(ctx.flow, d, state.answers, state.outcome);
}

function withAnswers(state: DialogueState, answers: Answer[]): DialogueState {
  return { ...state, answers, version: state.version + 1 };
}
