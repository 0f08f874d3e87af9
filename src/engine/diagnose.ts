/**
 * One job through the model and the rule base: ranked causes with their evidence, warnings
 * before anything else, ordered checks and the isolation steps before the first isolated one.
 */
import type { RuleEngines } from './run-rules.js';
import type { CaseFile } from '../knowledge/case-schema.js';
import type { RuleBase } from '../knowledge/load-rules.js';
import type { AppliesTo, Check } from '../knowledge/rulebase-schema.js';
import { computeExpectations, type Expectation } from '../model/expected.js';
import { combineAll } from './certainty.js';
import { describeTree, fillTemplate } from './explain.js';
import { jobFacts, type Facts } from './facts.js';
import { orderChecks } from './order-checks.js';
import { runToFixpoint } from './run-rules.js';
import { compareIds } from './compare-ids.js';
import { analyseTests, type Analyses } from './series-analyses.js';

export interface Evidence {
  rule: string;
  says: string;
  weight: number;
}

export interface RankedCauseResult {
  id: string;
  title: string;
  score: number;
  evidence: Evidence[];
}

export interface CheckResult {
  id: string;
  title: string;
  state: Check['state'];
  causes: string[];
  minutes: number;
  how: string;
  instrument: string;
  hazards: string[];
}

export interface Diagnosis {
  warnings: { id: string; says: string }[];
  causes: RankedCauseResult[];
  ruledOut: { id: string; title: string; because: string[] }[];
  checks: CheckResult[];
  isolation: { beforeCheck: string | null; steps: string[] };
  expectation: Expectation;
  /** What the test series show (bar-to-bar, pole drop, runout, insulation curve). */
  analyses: Analyses;
  facts: Facts;
  /** Questions whose askWhen condition holds for this job. */
  askable: Set<string>;
  /** Questions to ask before the policy's choices (their askFirstWhen holds). */
  askFirst: Set<string>;
}

/** How many of the leading causes contribute checks. */
const CAUSES_WITH_CHECKS = 4;

export type JobInput = Pick<CaseFile, 'machine' | 'symptoms' | 'observations' | 'readings' | 'tests'>;

export async function diagnose(job: JobInput, base: RuleBase, engine: RuleEngines): Promise<Diagnosis> {
  const expectation = computeExpectations({ machine: job.machine, readings: job.readings ?? {} });
  const analyses = analyseTests(job);
  const { facts, fired, askable, askFirst } = await runToFixpoint(engine, base, jobFacts(job, expectation, analyses));
  // A derived fact is explained by what the rule that derived it saw, recursively.
  const derivedBy = new Map(fired.flatMap((f) => (f.rule.kind === 'derive' ? [[f.rule.derive, f] as const] : [])));
  const words = new Map<string, string>();
  const derivedWords = (fact: string): string | undefined => {
    const f = derivedBy.get(fact);
    if (!f) return undefined;
    if (!words.has(fact)) {
      words.set(fact, fact); // guards against a self-reference while the words are built
      words.set(fact, say(f));
    }
    return words.get(fact);
  };
  const say = (f: (typeof fired)[number]): string =>
    f.rule.says ? fillTemplate(f.rule.says, facts, expectation) : describeTree(f.tree, expectation, derivedWords) || f.rule.name;

  const ruledOutBy = new Map<string, string[]>();
  const weights = new Map<string, Evidence[]>();
  const warningIds = new Set<string>();
  for (const f of fired) {
    if (f.rule.kind === 'rule-out') ruledOutBy.set(f.rule.cause, [...(ruledOutBy.get(f.rule.cause) ?? []), say(f)]);
    if (f.rule.kind === 'evidence') weights.set(f.rule.cause, [...(weights.get(f.rule.cause) ?? []), { rule: f.rule.name, says: say(f), weight: f.rule.weight }]);
    if (f.rule.kind === 'warning') warningIds.add(f.rule.warning);
  }
  const applies = (a: AppliesTo | undefined) =>
    !a ||
    ((!a.connections || a.connections.includes(job.machine.connection)) &&
      (!a.drives || a.drives.includes(job.machine.drive ?? 'unknown')) &&
      (!a.feedback || a.feedback.includes(job.machine.feedback ?? 'unknown')));

  const causes: RankedCauseResult[] = [];
  const ruledOut: Diagnosis['ruledOut'] = [];
  for (const cause of base.causes) {
    const because = ruledOutBy.get(cause.id) ?? (applies(cause.appliesTo) ? undefined : ['does not apply to this machine or drive']);
    if (because) {
      ruledOut.push({ id: cause.id, title: cause.title, because });
      continue;
    }
    const evidence = weights.get(cause.id) ?? [];
    const score = combineAll(evidence.map((e) => e.weight));
    if (score > 0) causes.push({ id: cause.id, title: cause.title, score: Number(score.toFixed(3)), evidence: evidence.sort((a, b) => b.weight - a.weight) });
  }
  causes.sort((a, b) => b.score - a.score || compareIds(a.id, b.id));

  const warnings = base.safety.warnings.filter((w) => warningIds.has(w.id));
  const order = warnings.some((w) => w.clearFaultFirst) ? 'clear-fault-first' : warnings.some((w) => w.isolateFirst) ? 'isolate-first' : 'normal';
  const leading = causes.slice(0, CAUSES_WITH_CHECKS);
  const total = leading.reduce((s, c) => s + c.score, 0) || 1;
  const catalogue = new Map(base.causes.map((c) => [c.id, c]));
  const ordered = orderChecks(
    leading.map((c) => ({ id: c.id, share: c.score / total, checks: catalogue.get(c.id)!.checks })),
    base.checks,
    order,
  );
  const checks = ordered.map(({ check, causes }) => ({
    id: check.id,
    title: check.title,
    state: check.state,
    causes,
    minutes: check.minutes,
    how: check.how,
    instrument: check.instrument,
    hazards: check.hazards,
  }));
  const firstIsolated = checks.find((c) => c.state === 'isolated');
  const iso = base.safety.isolation;
  return {
    warnings: warnings.map((w) => ({ id: w.id, says: w.says })),
    causes,
    ruledOut,
    checks,
    isolation: {
      beforeCheck: firstIsolated?.id ?? null,
      steps: firstIsolated ? isolationSteps(iso, job.machine.drive ?? 'unknown') : [],
    },
    expectation,
    analyses,
    facts,
    askable,
    askFirst,
  };
}

/** The isolation in the order it is done: make the shaft and the field safe, the five rules, then what applies to this drive. */
export function isolationSteps(iso: RuleBase['safety']['isolation'], drive: string): string[] {
  const dc = iso.dcSpecific.filter((s) => !s.drives || (s.drives as string[]).includes(drive));
  return [...dc.filter((s) => s.when === 'before').map((s) => s.says), ...iso.steps.map((s) => s.says), ...dc.filter((s) => s.when === 'after').map((s) => s.says), iso.prevails];
}
