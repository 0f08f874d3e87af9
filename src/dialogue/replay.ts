/**
 * The dialogue's own policy with a case file as the one who answers: machine, job and symptoms
 * are given up front, every other fact is taken from the file only when its question is asked
 * (absent: unknown). Measures how quickly the dialogue gets there.
 */
import type { RuleEngines } from '../engine/run-rules.js';
import type { CaseFile, CaseInput } from '../knowledge/case-schema.js';
import { diagnose, type Diagnosis } from '../engine/diagnose.js';
import type { AnswerValue } from './answers.js';
import { nextStep, type Flow } from './flow.js';
import { jobFromAnswers, parseDraft, type Answer } from './job.js';
import type { DialogueQuestion } from './questions.js';
import { seriesToText } from './series-answer.js';

export interface Replay {
  diagnosis: Diagnosis;
  questionsAsked: string[];
  stoppedBecause: string;
}

/** `raw` is the case file as written (quantities as typed); `parsed` the validated one. */
export async function replayCase(raw: CaseInput, flow: Flow, engine: RuleEngines): Promise<Replay> {
  const answers: Answer[] = [];
  const given = { machine: raw.machine, job: raw.job, symptoms: raw.symptoms ?? [] };
  const asked: string[] = [];
  const symptomsAnswer: Answer = { questionId: 'symptoms', target: { section: 'symptoms' }, value: { kind: 'many', values: given.symptoms }, shown: '', at: '' };
  for (;;) {
    const draft = jobFromAnswers([...answers, symptomsAnswer], given.machine);
    const parsed = parseDraft({ ...draft, job: given.job });
    if (!parsed.ok) throw new Error(`case does not parse during replay: ${parsed.reason}`);
    const job: CaseFile = parsed.job;
    const diagnosis = await diagnose(job, flow.base, engine);
    const step = nextStep(flow, { answers: [...answers, symptomsAnswer], machineGiven: true, jobGiven: true, diagnosis, job });
    if (step.kind !== 'ask') return { diagnosis, questionsAsked: asked, stoppedBecause: step.kind === 'done' ? step.why : 'no diagnosis' };
    asked.push(step.question.id);
    answers.push({ questionId: step.question.id, target: step.question.target, value: answerFromFile(raw, step.question), shown: '', at: '' });
  }
}

function answerFromFile(raw: CaseInput, q: DialogueQuestion): AnswerValue {
  const t = q.target;
  if (t.section === 'tests') {
    const series = (raw.tests as Record<string, unknown> | undefined)?.[t.name];
    return series && typeof series === 'object' ? { kind: 'text', value: seriesToText(t.name, series as Record<string, unknown>) } : { kind: 'unknown' };
  }
  const v =
    t.section === 'observations' ? (raw.observations as Record<string, unknown> | undefined)?.[t.name] :
    t.section === 'readings' ? (raw.readings as Record<string, unknown> | undefined)?.[t.name] :
    undefined;
  if (v === undefined || v === 'unknown') return { kind: 'unknown' };
  return typeof v === 'number' ? { kind: 'text', value: String(v) } : t.section === 'observations' ? { kind: 'one', value: String(v) } : { kind: 'text', value: String(v) };
}
