/**
 * The questions the dialogue can ask, in one shape: the machine and job questions built from the
 * dc-case/1 vocabulary, the rest from the rule folder's questions.json.
 */
import { CONNECTIONS, CONNECTION_TRAITS, INSULATION_CLASSES } from '../model/machine.js';
import type { Question } from '../knowledge/rulebase-schema.js';
import type { MachineState } from '../knowledge/rulebase-schema.js';
import { COOLING, DRIVES, FEEDBACK, OBSERVATIONS, SYMPTOMS, type ObservationName } from '../knowledge/vocabulary.js';
import { READING_FIELDS, type ReadingName } from '../knowledge/case-schema.js';
import type { Dimension } from '../units/quantity.js';
import type { DialogueSeries } from '../model/series/findings.js';

/** Where an answer goes in the job. */
export type Target =
  | { section: 'machine'; name: 'connection' | 'drive' | 'feedback' | 'cooling' }
  | { section: 'nameplate'; name: string }
  | { section: 'job'; name: 'workOrder' | 'asset' | 'fitter' }
  | { section: 'symptoms' }
  | { section: 'observations'; name: ObservationName }
  | { section: 'readings'; name: string }
  | { section: 'tests'; name: DialogueSeries }
  | { section: 'outcome'; name: string };

export interface Option {
  value: string;
  label: string;
}

export type AnswerKind =
  | { kind: 'choice'; options: Option[] }
  | { kind: 'many'; options: Option[] }
  /** `unit`: the unit the question shows and a bare number is taken in (else the dimension's default). */
  | { kind: 'quantity'; dimension: Dimension; unit?: string }
  | { kind: 'series'; series: DialogueSeries }
  | { kind: 'text' };

export interface DialogueQuestion {
  id: string;
  prompt: string;
  state: MachineState;
  target: Target;
  answer: AnswerKind;
  /** The rule folder's question, when it came from there (for askWhen and the policy). */
  source?: Question;
  /** Asked in the fixed opening, before the adaptive part. */
  opening: boolean;
}

const options = (values: readonly string[], label: (v: string) => string = (v) => v): Option[] => values.filter((v) => v !== 'unknown').map((v) => ({ value: v, label: label(v) }));

function nameplateQuestion(name: string, prompt: string, dimension: Dimension, unit?: string): DialogueQuestion {
  return { id: `nameplate-${name}`, prompt, state: 'observe', target: { section: 'nameplate', name }, answer: { kind: 'quantity', dimension, ...(unit ? { unit } : {}) }, opening: true };
}

/** The machine, the job details and the symptoms, asked before the rules take over. */
export function machineQuestions(): DialogueQuestion[] {
  return [
    { id: 'connection', prompt: 'How is the machine connected?', state: 'observe', target: { section: 'machine', name: 'connection' }, answer: { kind: 'choice', options: options(CONNECTIONS, (c) => CONNECTION_TRAITS[c as keyof typeof CONNECTION_TRAITS].label) }, opening: true },
    { id: 'drive', prompt: 'What feeds the armature?', state: 'observe', target: { section: 'machine', name: 'drive' }, answer: { kind: 'choice', options: options(DRIVES, (d) => ({ 'fixed-supply': 'fixed DC supply with starter or contactor', 'controlled-converter': 'controlled converter (drive)', battery: 'battery (cannot be isolated upstream)' })[d] ?? d) }, opening: true },
    { id: 'feedback', prompt: 'What speed feedback does the drive use?', state: 'observe', target: { section: 'machine', name: 'feedback' }, answer: { kind: 'choice', options: options(FEEDBACK) }, opening: true },
    { id: 'cooling', prompt: 'How is the machine cooled?', state: 'observe', target: { section: 'machine', name: 'cooling' }, answer: { kind: 'choice', options: options(COOLING, (c) => ({ 'self-ventilated': 'shaft fan', 'separately-ventilated': 'separate blower', 'non-ventilated': 'no fan' })[c] ?? c) }, opening: true },
    nameplateQuestion('armatureVoltage', 'Nameplate: rated armature voltage?', 'voltage'),
    nameplateQuestion('armatureCurrent', 'Nameplate: rated armature current?', 'current'),
    nameplateQuestion('speed', 'Nameplate: rated speed? (a drive motor\'s base/top, e.g. 1750/2300, gives both)', 'speed'),
    nameplateQuestion('power', 'Nameplate: rated output?', 'power', 'kW'),
    nameplateQuestion('fieldVoltage', 'Nameplate: field voltage?', 'voltage'),
    nameplateQuestion('fieldCurrent', 'Nameplate: field current?', 'current'),
    { id: 'nameplate-insulationClass', prompt: 'Nameplate: insulation class?', state: 'observe', target: { section: 'nameplate', name: 'insulationClass' }, answer: { kind: 'choice', options: options(INSULATION_CLASSES) }, opening: true },
    { id: 'work-order', prompt: 'Work order number (for the report)?', state: 'observe', target: { section: 'job', name: 'workOrder' }, answer: { kind: 'text' }, opening: true },
    { id: 'asset', prompt: 'Asset or machine tag?', state: 'observe', target: { section: 'job', name: 'asset' }, answer: { kind: 'text' }, opening: true },
    { id: 'fitter', prompt: 'Your name or initials (the report records who did what)?', state: 'observe', target: { section: 'job', name: 'fitter' }, answer: { kind: 'text' }, opening: true },
    { id: 'symptoms', prompt: 'What is it doing wrong? Pick one or more numbers, e.g. "1 6".', state: 'observe', target: { section: 'symptoms' }, answer: { kind: 'many', options: Object.entries(SYMPTOMS).map(([value, label]) => ({ value, label })) }, opening: true },
  ];
}

/** A rule-folder question in the dialogue's shape. */
export function fromRuleQuestion(q: Question, opening: boolean): DialogueQuestion {
  if (q.answer.kind === 'choice') {
    const name = q.answer.observation as ObservationName;
    const spec = OBSERVATIONS[name];
    return { id: q.id, prompt: q.prompt, state: q.state, target: { section: 'observations', name }, answer: { kind: 'choice', options: Object.entries(spec.values).map(([value, label]) => ({ value, label })) }, source: q, opening };
  }
  if (q.answer.kind === 'quantity') {
    const name = q.answer.reading;
    const field = READING_FIELDS[name as ReadingName];
    return { id: q.id, prompt: q.prompt, state: q.state, target: { section: 'readings', name }, answer: { kind: 'quantity', dimension: field.dimension }, source: q, opening };
  }
  if (q.answer.kind === 'series') {
    return { id: q.id, prompt: q.prompt, state: q.state, target: { section: 'tests', name: q.answer.series }, answer: { kind: 'series', series: q.answer.series }, source: q, opening };
  }
  return { ...machineQuestions().find((m) => m.id === 'symptoms')!, id: q.id, prompt: q.prompt, source: q, opening };
}

/** Questions asked first because they decide what is safe to ask next. */
export const SAFETY_OPENING = ['present-state', 'drive-fault'];
