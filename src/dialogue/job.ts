/**
 * The job as it stands: rebuilt from the answers each time, so going back and changing an
 * answer needs no bookkeeping. The text the fitter typed is kept, so a saved case file reads
 * the way the meters did.
 */
import { caseSchema, CASE_FORMAT, type CaseFile, type CaseInput, type MachineFile } from '../knowledge/case-schema.js';
import type { AnswerValue } from './answers.js';
import type { Target } from './questions.js';

export interface Answer {
  questionId: string;
  target: Target;
  value: AnswerValue;
  /** What the transcript shows. */
  shown: string;
  /** Who answered and when: the job report lists them. */
  at: string;
}

type Draft = Omit<CaseInput, 'machine'> & { machine: Record<string, unknown> & { nameplate?: Record<string, unknown> } };

/** The case file the answers make, the machine from a file underneath them. */
export function jobFromAnswers(answers: readonly Answer[], machineFile?: unknown): Draft {
  const draft: Draft = { format: CASE_FORMAT, machine: { ...(machineFile as Record<string, unknown> | undefined) } };
  const set = (obj: Record<string, unknown>, key: string, v: AnswerValue) => {
    if (v.kind === 'unknown') delete obj[key];
    else obj[key] = v.kind === 'many' ? v.values : v.value;
  };
  for (const a of answers) {
    const t = a.target;
    switch (t.section) {
      case 'machine':
        set(draft.machine, t.name, a.value);
        break;
      case 'nameplate':
        draft.machine.nameplate = { ...draft.machine.nameplate };
        set(draft.machine.nameplate, t.name, a.value);
        break;
      case 'job':
        draft.job = { ...draft.job };
        set(draft.job as Record<string, unknown>, t.name, a.value);
        break;
      case 'symptoms':
        draft.symptoms = a.value.kind === 'many' ? (a.value.values as CaseInput['symptoms']) : [];
        break;
      case 'observations':
        draft.observations = { ...draft.observations };
        set(draft.observations as Record<string, unknown>, t.name, a.value);
        break;
      case 'readings':
        draft.readings = { ...draft.readings };
        set(draft.readings as Record<string, unknown>, t.name, a.value);
        break;
      case 'outcome':
        break; // recorded separately, see outcome.ts
    }
  }
  return draft;
}

/** The draft as the engine reads it; a machine whose connection is not yet known is not ready. */
export function parseDraft(draft: Draft): { ok: true; job: CaseFile } | { ok: false; reason: string } {
  if (draft.machine.connection === undefined) return { ok: false, reason: 'connection not known yet' };
  const r = caseSchema.safeParse(draft);
  if (r.success) return { ok: true, job: r.data };
  return { ok: false, reason: r.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ') };
}

export type { MachineFile };
