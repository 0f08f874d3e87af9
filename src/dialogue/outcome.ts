/**
 * Recording the outcome at the end of a job: the confirmed cause (from the ranking, the whole
 * catalogue, or a new one), what was done, the readings after the repair, notes, who recorded it.
 * The questions follow from the answers so far, like the job's own.
 */
import type { Diagnosis } from '../engine/diagnose.js';
import type { Flow } from './flow.js';
import type { Answer } from './job.js';
import type { DialogueQuestion } from './questions.js';

const ANOTHER = 'another-cause';
const NEW = 'new-cause';

function q(id: string, prompt: string, answer: DialogueQuestion['answer']): DialogueQuestion {
  return { id, prompt, state: 'observe', target: { section: 'outcome', name: id }, answer, opening: false };
}

const valueOf = (got: readonly Answer[], id: string) => {
  const a = got.find((x) => x.questionId === id)?.value;
  return a?.kind === 'one' || a?.kind === 'text' ? a.value : undefined;
};

/** The next recording question, or undefined when the outcome is complete. */
export function nextOutcomeQuestion(flow: Flow, d: Diagnosis | undefined, job: readonly Answer[], got: readonly Answer[]): DialogueQuestion | undefined {
  const asked = new Set(got.map((a) => a.questionId));
  const ranked = (d?.causes ?? []).slice(0, 5).map((c) => ({ value: c.id, label: c.title }));
  const steps: DialogueQuestion[] = [q('confirmed', 'Which cause did you confirm?', { kind: 'choice', options: [...ranked, { value: ANOTHER, label: 'another cause from the catalogue' }, { value: NEW, label: 'a cause not in the catalogue' }] })];
  const confirmed = valueOf(got, 'confirmed');
  if (confirmed === ANOTHER) steps.push(q('catalogue-cause', 'Which one?', { kind: 'choice', options: flow.base.causes.map((c) => ({ value: c.id, label: c.title })) }));
  if (confirmed === NEW) {
    steps.push(q('new-cause-id', 'A short id for it (letters, digits and "-", e.g. brush-holder-loose)?', { kind: 'text' }));
    steps.push(q('new-cause-title', 'Its title, as a fitter would say it?', { kind: 'text' }));
  }
  steps.push(q('fix', 'What was done to put it right?', { kind: 'text' }));
  for (const a of job) {
    if (a.target.section !== 'readings' || a.value.kind === 'unknown') continue;
    const original = flow.all.get(a.questionId);
    if (original?.answer.kind === 'quantity') steps.push({ ...q(`after-${a.target.name}`, `After the repair: ${original.prompt.replace(/^Live test: /, '')}`, original.answer), state: original.state, target: { section: 'outcome', name: `after-${a.target.name}` } });
  }
  steps.push(q('notes', 'Notes for the next fitter?', { kind: 'text' }));
  steps.push(q('recorded-by', 'Recorded by (name or initials)?', { kind: 'text' }));
  return steps.find((s) => !asked.has(s.id));
}

/** A reason the answer cannot stand, for answers the question's own kind does not check. */
export function outcomeAnswerProblem(question: DialogueQuestion, text: string): string | undefined {
  if (question.id === 'new-cause-id' && !/^[a-z0-9][a-z0-9-]{0,79}$/.test(text)) return `"${text}" is not a usable id: lower-case letters, digits and "-", starting with a letter or digit`;
  if (question.id === 'confirmed' && text === '') return 'the confirmed cause is needed to record the job';
  return undefined;
}

/** The outcome part of a dc-case/1 file. */
export function outcomeOf(got: readonly Answer[], today: string): Record<string, unknown> {
  const confirmed = valueOf(got, 'confirmed');
  const cause = confirmed === ANOTHER ? valueOf(got, 'catalogue-cause') : confirmed === NEW ? undefined : confirmed;
  const readingsAfter: Record<string, string> = {};
  for (const a of got) if (a.questionId.startsWith('after-') && a.value.kind === 'text') readingsAfter[a.questionId.slice('after-'.length)] = a.value.value;
  const text = (id: string) => valueOf(got, id);
  const outcome: Record<string, unknown> = { date: today };
  if (cause) outcome.cause = cause;
  if (confirmed === NEW) outcome.newCause = { id: text('new-cause-id'), title: text('new-cause-title') ?? text('new-cause-id') };
  for (const [key, id] of [['fix', 'fix'], ['notes', 'notes'], ['recordedBy', 'recorded-by']] as const) if (text(id)) outcome[key] = text(id);
  if (Object.keys(readingsAfter).length) outcome.readingsAfter = readingsAfter;
  return outcome;
}
