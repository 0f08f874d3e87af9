/**
 * Drafts a rule from a solved case: what sets this case apart from the recorded cases of other
 * causes — the model's readings outside the healthy band, and the symptoms, observations and
 * findings that other causes' cases seldom show — as the conditions of one evidence rule for the
 * confirmed cause. The weight is the smallest that ranks this case's cause first (else in its top
 * 3) against the rule base as it stands.
 */
import { PLACEHOLDER } from './draft-placeholders.js';
import type { CaseFile } from '../knowledge/case-schema.js';
import type { RuleBase } from '../knowledge/load-rules.js';
import type { Condition, DraftFile, Leaf } from '../knowledge/rulebase-schema.js';
export type { DraftFile };
import { computeExpectations } from '../model/expected.js';
import { HEALTHY_BANDS, QUANTITY_LABELS, type QuantityName } from '../model/quantity-names.js';
import { OBSERVATIONS, SYMPTOMS, type ObservationName } from '../knowledge/vocabulary.js';
import { diagnose } from './diagnose.js';
import { buildEngine } from './run-rules.js';
import { jobFacts } from './facts.js';
import { compareIds } from './compare-ids.js';


export interface Draft {
  name: string;
  cause: string;
  file: DraftFile;
  conditions: number;
}

/** A fact seen in more than this share of the other causes' cases does not set a case apart. */
const TOO_COMMON = 0.3;
/** At most this many conditions: the rarest facts, so the rule can fire on the next such job. */
const MAX_CONDITIONS = 4;
const WEIGHTS = [0.4, 0.5, 0.6, 0.7, 0.8, 0.9];

interface Candidate {
  leaf: Leaf;
  /** Share of the other causes' cases where it holds too: lower is more telling. */
  commonness: number;
  says: string;
}

const round2 = (x: number) => Math.round(x * 100) / 100;

function causeOf(c: CaseFile): string | undefined {
  return c.outcome?.cause ?? c.outcome?.newCause?.id;
}

/** The facts of one case that can become conditions, each with how common it is elsewhere. */
function candidates(target: CaseFile, others: CaseFile[]): Candidate[] {
  const cause = causeOf(target);
  const rivals = others.filter((o) => causeOf(o) !== cause);
  const share = (holds: (c: CaseFile) => boolean) => (rivals.length ? rivals.filter(holds).length / rivals.length : 0);
  const out: Candidate[] = [];
  const e = computeExpectations({ machine: target.machine, readings: target.readings });
  for (const [name, q] of Object.entries(e.quantities) as [QuantityName, NonNullable<(typeof e.quantities)[QuantityName]>][]) {
    const band = HEALTHY_BANDS[name];
    if (!band || q.ratio === null) continue;
    const low = band.low !== undefined && q.ratio < band.low;
    const high = band.high !== undefined && q.ratio > band.high;
    if (!low && !high) continue;
    // Halfway between the band's edge and this reading: catches milder cases, clear of healthy ones.
    const threshold = round2(low ? (band.low! + q.ratio) / 2 : (band.high! + q.ratio) / 2);
    const holds = (c: CaseFile) => {
      const r = computeExpectations({ machine: c.machine, readings: c.readings }).quantities[name]?.ratio;
      return r !== null && r !== undefined && (low ? r < threshold : r > threshold);
    };
    out.push({ leaf: { fact: 'ratio', path: `$.${name}`, operator: low ? 'lessThan' : 'greaterThan', value: threshold }, commonness: share(holds), says: `${QUANTITY_LABELS[name]} {ratio.${name}} of expected` });
  }
  for (const f of e.findings) {
    const holds = (c: CaseFile) => computeExpectations({ machine: c.machine, readings: c.readings }).findings.some((x) => x.code === f.code);
    out.push({ leaf: { fact: 'findings', operator: 'contains', value: f.code }, commonness: share(holds), says: `the model finds: ${f.code.replace(/-/g, ' ')}` });
  }
  for (const s of target.symptoms ?? []) {
    out.push({ leaf: { fact: 'symptoms', operator: 'contains', value: s }, commonness: share((c) => (c.symptoms ?? []).includes(s)), says: SYMPTOMS[s] });
  }
  for (const [name, answer] of Object.entries(target.observations ?? {}) as [ObservationName, string | undefined][]) {
    if (answer === undefined || answer === 'unknown') continue;
    const answered = rivals.filter((c) => (c.observations as Record<string, string> | undefined)?.[name] === answer).length;
    const spec = OBSERVATIONS[name];
    out.push({ leaf: { fact: name, operator: 'is', value: answer }, commonness: rivals.length ? answered / rivals.length : 0, says: `${spec.says}: {obs:${name}}` });
  }
  return out.filter((c) => c.commonness <= TOO_COMMON).sort((a, b) => a.commonness - b.commonness || compareIds(JSON.stringify(a.leaf), JSON.stringify(b.leaf)));
}

export function withDraft(base: RuleBase, draft: DraftFile, file: string): RuleBase {
  return {
    ...base,
    causes: [...base.causes, ...(draft.causes ?? [])],
    checks: [...base.checks, ...(draft.checks ?? [])],
    rules: [...base.rules, ...draft.rules.map((rule, k) => ({ rule, file, at: `rules[${k}]` }))],
  };
}

export async function draftFromCase(target: CaseFile, others: CaseFile[], base: RuleBase): Promise<Draft | { error: string }> {
  const cause = causeOf(target);
  if (!cause) return { error: 'the case names no confirmed cause (outcome.cause or outcome.newCause)' };
  const chosen = candidates(target, others).slice(0, MAX_CONDITIONS);
  if (chosen.length === 0) return { error: 'nothing in this case sets it apart from the other recorded causes: add readings or observations first' };
  const caseId = (target.id ?? 'case').toLowerCase().replace(/[^a-z0-9-]+/g, '-');
  const name = `draft-${cause}-${caseId}`.slice(0, 80).replace(/-+$/, '');
  const newCause = target.outcome?.newCause;
  const extra: Pick<DraftFile, 'causes' | 'checks'> = newCause
    ? {
        causes: [{ id: newCause.id, title: newCause.title, description: `${newCause.title} (drafted from case ${target.id ?? ''}${PLACEHOLDER.description}`, checks: [`confirm-${newCause.id}`] }],
        checks: [{ id: `confirm-${newCause.id}`, title: `Confirm: ${newCause.title}`, how: PLACEHOLDER.how, instrument: PLACEHOLDER.instrument, state: 'isolated', hazards: [], minutes: 30 }],
      }
    : {};
  const conditions: Condition = { all: chosen.map((c) => c.leaf) };
  const says = chosen.map((c) => c.says).join('; ');
  const make = (weight: number): DraftFile => ({
    family: 'drafts',
    description: `Drafted from case ${target.id ?? ''}: review the conditions and the weight before adopting.`,
    rules: [{ name, kind: 'evidence', cause, weight, conditions, says }],
    ...extra,
  });
  // The smallest weight that ranks the case's cause first; failing that, the smallest in the top 3.
  let best: { weight: number; rank: number } | undefined;
  for (const weight of WEIGHTS) {
    const trial = withDraft(base, make(weight), 'draft');
    // The rules' own ranking: what the case's checks found is not what a rule is drafted from.
    const d = await diagnose({ ...target, checks: [] }, trial, buildEngine(trial));
    const rank = d.causes.findIndex((c) => c.id === cause) + 1;
    if (rank === 1) {
      best = { weight, rank };
      break;
    }
    if (rank >= 1 && rank <= 3 && !best) best = { weight, rank };
  }
  const weight = best?.weight ?? WEIGHTS.at(-1)!;
  return { name, cause, file: make(weight), conditions: chosen.length };
}

/**
 * The cases a draft's rules fire on. Draft rules read only the model's quantities, findings,
 * symptoms and observations, so a case they do not fire on keeps its ranking: only these need
 * diagnosing again to see what the draft would change.
 */
export async function casesDraftFiresOn(draft: DraftFile, cases: CaseFile[], base: RuleBase): Promise<boolean[]> {
  const only: RuleBase = { ...base, rules: draft.rules.map((rule, k) => ({ rule, file: 'draft', at: `rules[${k}]` })), questions: [] };
  const engine = buildEngine(only);
  const fires: boolean[] = [];
  for (const c of cases) {
    const facts = jobFacts(c, computeExpectations({ machine: c.machine, readings: c.readings }));
    const { results } = await engine.judge.run(facts);
    fires.push(results.length > 0);
  }
  return fires;
}
