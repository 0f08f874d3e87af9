/**
 * The job as it stands: rebuilt from the answers each time, so going back and changing an
 * answer needs no bookkeeping. The text the fitter typed is kept, so a saved case file reads
 * the way the meters did.
 */
import { caseSchema, CASE_FORMAT, type CaseFile, type CaseInput, type MachineFile } from '../knowledge/case-schema.js';
import type { AnswerValue } from './answers.js';
import type { Target } from './questions.js';
import { checksFromWork, type WorkEntry } from './work.js';
import { seriesFromText } from './series-answer.js';

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
export function jobFromAnswers(answers: readonly Answer[], machineFile?: unknown, work: readonly WorkEntry[] = []): Draft {
  const file = machineFile as (Record<string, unknown> & { nameplate?: Record<string, unknown> }) | undefined;
  // Fresh objects all the way down: the machine file is never written into.
  const draft: Draft = { format: CASE_FORMAT, machine: { ...file, ...(file?.nameplate ? { nameplate: { ...file.nameplate } } : {}) } };
  const record = draft as unknown as Record<string, Record<string, unknown> | undefined>;
  const into = (t: Target): Record<string, unknown> | undefined => {
    if (t.section === 'machine') return draft.machine;
    if (t.section === 'nameplate') return (draft.machine.nameplate ??= {});
    if (t.section === 'job' || t.section === 'observations' || t.section === 'readings' || t.section === 'tests') return (record[t.section] ??= {});
    return undefined; // symptoms are a list; the outcome is recorded separately (outcome.ts)
  };
  for (const a of answers) {
    const t = a.target;
    if (t.section === 'symptoms') {
      draft.symptoms = a.value.kind === 'many' ? (a.value.values as CaseInput['symptoms']) : [];
      continue;
    }
    const obj = into(t);
    if (!obj || !('name' in t)) continue;
    if (a.value.kind === 'unknown') delete obj[t.name];
    else if (t.section === 'tests' && a.value.kind === 'text') {
      const line = seriesFromText(t.name, a.value.value);
      if (line.ok) obj[t.name] = line.input;
    } else obj[t.name] = a.value.kind === 'many' ? a.value.values : a.value.value;
  }
  const checks = checksFromWork(work);
  if (checks.length) (draft as Record<string, unknown>).checks = checks;
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
