/**
 * One job through the model and the rule base: ranked causes with their evidence, warnings
 * before anything else, ordered checks and the isolation steps before the first isolated one.
 */
import type { RuleEngines } from './run-rules.js';
import type { CaseFile, WorkedCheck } from '../knowledge/case-schema.js';
import type { RuleBase } from '../knowledge/load-rules.js';
import type { AppliesTo, Check } from '../knowledge/rulebase-schema.js';
import { computeExpectations, type Expectation } from '../model/expected.js';
import { combineAll } from './certainty.js';
import { describeTree, fillTemplate } from './explain.js';
import { jobFacts, type Facts } from './facts.js';
import { factsRead } from '../knowledge/load-rules.js';
import { orderChecks } from './order-checks.js';
import { checkValue, confirmedBy, resultEvidence, separationValue } from './loop.js';
import { runToFixpoint } from './run-rules.js';
import { compareIds } from './compare-ids.js';
import { analyseTests, type Analyses } from './series-analyses.js';
import { outcomeLikelihoods, separations, type Separation } from './fit-ties.js';

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
  /** The check's hazards, with the conditional ones that hold for this job. */
  hazards: string[];
  /** What each hazard means, in the safety content's words, in the same order. */
  hazardsSay: string[];
  /** Needs the machine turning under power. */
  running: boolean;
  /** Offered in place of a check that is unsafe for this job. */
  insteadOf?: string;
  /** Once worked: what it showed, and the fitter's finding. */
  result?: 'normal' | 'abnormal' | 'inconclusive';
  finding?: string;
}

/** A check a leading cause would want that is not offered for this job, and why. */
export interface WithheldCheck {
  id: string;
  title: string;
  causes: string[];
  because: string;
  /** The safe check offered in its place, if any. */
  instead: string | null;
}

export interface Diagnosis {
  status: LoopStatus;
  /** The cause found, when status is confirmed. */
  confirmed: string | null;
  /** The check to do next; null when none is left or the fault is confirmed. */
  next: string | null;
  /** What each worked check's result weighed, for and against which causes, in the order worked. */
  effects: { check: string; effects: { cause: string; title: string; weight: number; says: string }[] }[];
  /** Once confirmed: what was found, what it means for the repair, and the return-to-service steps. */
  found: { cause: string; title: string; means: string; returnToService: string[] } | null;
  warnings: { id: string; says: string; severity: 'danger' | 'caution' }[];
  causes: RankedCauseResult[];
  ruledOut: { id: string; title: string; because: string[] }[];
  checks: CheckResult[];
  withheld: WithheldCheck[];
  /** Readings not yet taken that would tell apart two causes the readings so far explain equally well. */
  tellApart: Separation[];
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

/** How many of the leading causes contribute checks: as results clear them, the next ones come in. */
const CAUSES_WITH_CHECKS = 5;

export type JobInput = Pick<CaseFile, 'machine' | 'symptoms' | 'observations' | 'readings' | 'checks' | 'tests'>;

/** open: checks remain; confirmed: a check found the fault; exhausted: every useful check is done, nothing confirmed. */
export type LoopStatus = 'open' | 'confirmed' | 'exhausted';

/** The causes ranked for a job and the cause its worked checks confirm: what `cases check` scores, without the checks, words and isolation a diagnosis adds. */
export interface Ranking {
  confirmed: string | null;
  causes: { id: string; score: number }[];
}

export async function rankCauses(input: JobInput, base: RuleBase, engine: RuleEngines): Promise<Ranking> {
  const w = await weigh(input, base, engine, false);
  return { confirmed: w.confirmed ?? null, causes: w.causes.map((c) => ({ id: c.id, score: c.score })) };
}

/**
 * A job through the model and the rules, and the causes weighed on what fired and on the worked
 * checks' results. `words`: the evidence says what it saw (a diagnosis shows it; a ranking does not need it).
 */
async function weigh(input: JobInput, base: RuleBase, engine: RuleEngines, words: boolean) {
  const { checkById, shows } = indexOf(base);
  const worked = (input.checks ?? []).filter((w) => checkById.has(w.id));
  // What the checks measured and saw enters the model and the rules like any other reading.
  const job = withCheckFindings(input, worked);
  const expectation = computeExpectations({ machine: job.machine, readings: job.readings ?? {} });
  const analyses = analyseTests(job);
  // Each check that read voltage, current and speed again is an operating point of its own.
  const otherPoints = worked.length ? [{ label: 'first readings', readings: input.readings ?? {} }, ...worked.map((w) => ({ label: w.id, readings: w.readings ?? {} }))] : [];
  const run = await runToFixpoint(engine, base, jobFacts(job, expectation, analyses, otherPoints), words);
  const { facts, fired } = run;
  // A derived fact is explained by what the rule that derived it saw, recursively.
  const derivedBy = new Map(words ? fired.flatMap((f) => (f.rule.kind === 'derive' ? [[f.rule.derive, f] as const] : [])) : []);
  const said = new Map<string, string>();
  const derivedWords = (fact: string): string | undefined => {
    const f = derivedBy.get(fact);
    if (!f) return undefined;
    if (!said.has(fact)) {
      said.set(fact, fact); // guards against a self-reference while the words are built
      said.set(fact, say(f));
    }
    return said.get(fact);
  };
  const say = (f: (typeof fired)[number]): string =>
    !words ? '' : f.rule.says ? fillTemplate(f.rule.says, facts, expectation) : describeTree(f.tree, expectation, derivedWords) || f.rule.name;

  const ruledOutBy = new Map<string, string[]>();
  const weights = new Map<string, Evidence[]>();
  const warningIds = new Set<string>();
  const listed = <T>(map: Map<string, T[]>, key: string): T[] => {
    let list = map.get(key);
    if (!list) map.set(key, (list = []));
    return list;
  };
  for (const f of fired) {
    if (f.rule.kind === 'rule-out') listed(ruledOutBy, f.rule.cause).push(say(f));
    if (f.rule.kind === 'evidence') listed(weights, f.rule.cause).push({ rule: f.rule.name, says: say(f), weight: f.rule.weight });
    if (f.rule.kind === 'warning') warningIds.add(f.rule.warning);
  }
  const applies = (a: AppliesTo | undefined) =>
    !a ||
    ((!a.connections || a.connections.includes(job.machine.connection)) &&
      (!a.drives || a.drives.includes(job.machine.drive ?? 'unknown')) &&
      (!a.feedback || a.feedback.includes(job.machine.feedback ?? 'unknown')));

  const ruleScores = new Map<string, number>();
  const ruledOut: Diagnosis['ruledOut'] = [];
  for (const cause of base.causes) {
    const because = ruledOutBy.get(cause.id) ?? (applies(cause.appliesTo) ? undefined : ['does not apply to this machine or drive']);
    if (because) ruledOut.push({ id: cause.id, title: cause.title, because });
    else ruleScores.set(cause.id, combineAll((weights.get(cause.id) ?? []).map((e) => e.weight)));
  }
  // Then what the checks found, in the order they were worked.
  const fromResults = resultEvidence(worked, checkById, shows, ruleScores);
  for (const [cause, evidence] of fromResults) listed(weights, cause).push(...evidence);
  const causes: RankedCauseResult[] = [];
  const scores = new Map<string, number>();
  for (const cause of base.causes) {
    if (!ruleScores.has(cause.id)) continue;
    const evidence = weights.get(cause.id) ?? [];
    const score = combineAll(evidence.map((e) => e.weight));
    scores.set(cause.id, score);
    if (score > 0) causes.push({ id: cause.id, title: cause.title, score: Number(score.toFixed(3)), evidence: evidence.sort((a, b) => b.weight - a.weight) });
  }
  causes.sort((a, b) => b.score - a.score || compareIds(a.id, b.id));
  return { job, worked, expectation, analyses, run, warningIds, ruledOut, fromResults, causes, scores, confirmed: confirmation(worked, shows, scores) };
}

export async function diagnose(input: JobInput, base: RuleBase, engine: RuleEngines): Promise<Diagnosis> {
  const { checkById, shows, titleOf, catalogue, hazardText } = indexOf(base);
  const { job, worked, expectation, analyses, run, warningIds, ruledOut, fromResults, causes, scores, confirmed } = await weigh(input, base, engine, true);
  const { facts, askable, askFirst, unsafe, cautions } = run;
  const effects = worked.map((w) => ({
    check: w.id,
    effects: [...fromResults].flatMap(([cause, evidence]) => evidence.filter((e) => e.rule === `check:${w.id}`).map((e) => ({ cause, title: titleOf.get(cause) ?? cause, weight: e.weight, says: e.says }))),
  }));

  // Dangers before cautions, each in the safety file's order.
  const warnings = base.safety.warnings.filter((w) => warningIds.has(w.id)).sort((a, b) => Number(a.severity === 'caution') - Number(b.severity === 'caution'));
  const order = warnings.some((w) => w.clearFaultFirst) ? 'clear-fault-first' : warnings.some((w) => w.isolateFirst) ? 'isolate-first' : 'normal';
  const runaway = warnings.find((w) => w.runaway);

  // The checks still worth doing: those of the leading causes, not yet worked, safe for this job.
  const done = new Set(worked.map((w) => w.id));
  const faultFound = worked.find((w) => w.result === 'abnormal' && checkById.get(w.id)?.clearsFaultBeforeEnergising);
  const leading = confirmed ? [] : causes.slice(0, CAUSES_WITH_CHECKS);
  const safe = safeChecks(
    leading.map((c) => ({ id: c.id, checks: catalogue.get(c.id)!.checks.filter((k) => !done.has(k)) })),
    checkById,
    unsafe,
    { runawayWarning: runaway?.id, faultFound: faultFound ? checkById.get(faultFound.id)!.title : undefined },
  );
  // The causes in play: those with a positive score. Their checks compete on value per minute.
  const inPlay = new Map(causes.map((c) => [c.id, scores.get(c.id)!]));
  // A check that takes a reading the fits are waiting on is worth what telling the tied causes apart is worth.
  const tellApart = confirmed ? [] : separations(facts, base, new Set(inPlay.keys()));
  const separating = (check: Check) => {
    const s = tellApart.filter((x) => check.takes?.readings?.includes(x.reading as never));
    // The check reads each such reading: its value is that of the one that separates most.
    return s.map((x) => outcomeLikelihoods(x, inPlay.keys()));
  };
  const valueOf = new Map<string, number>();
  const value = (check: Check) => {
    if (!valueOf.has(check.id)) valueOf.set(check.id, Math.max(checkValue(check, shows.get(check.id) ?? [], inPlay), ...separating(check).map((l) => separationValue(check, l, inPlay))));
    return valueOf.get(check.id)!;
  };
  const lastWorked = worked.at(-1);
  const isolatedNow = lastWorked !== undefined && checkById.get(lastWorked.id)?.state === 'isolated';
  const ordered = orderChecks(
    leading.map((c) => ({ id: c.id, checks: safe.checksOf.get(c.id) ?? [] })),
    base.checks,
    value,
    { order, isolatedNow },
  );
  const describe = (check: Check, causesFor: string[]): CheckResult => ({
    id: check.id,
    title: check.title,
    state: check.state,
    causes: causesFor,
    minutes: check.minutes,
    how: check.how,
    instrument: check.instrument,
    hazards: [...new Set([...check.hazards, ...(cautions.get(check.id) ?? [])])],
    hazardsSay: [...new Set([...check.hazards, ...(cautions.get(check.id) ?? [])])].map((h) => hazardText.get(h) ?? h),
    running: check.running === true,
    ...(safe.insteadOf.has(check.id) ? { insteadOf: safe.insteadOf.get(check.id)! } : {}),
  });
  const workedResults: CheckResult[] = worked.map((w) => ({ ...describe(checkById.get(w.id)!, [...(shows.get(w.id) ?? [])]), result: w.result, ...(w.finding ? { finding: w.finding } : {}) }));
  const remaining = ordered.map(({ check, causes: causesFor }) => describe(check, causesFor));
  // A question whose answer decides whether a wanted check is safe is asked before the policy's choice.
  for (const id of safe.considered) {
    const condition = checkById.get(id)?.unsafeWhen?.condition;
    if (!condition) continue;
    for (const fact of factsRead(condition, base.conditions)) {
      if (facts[fact] !== undefined) continue;
      for (const q of base.questions) if (q.answer.kind === 'choice' && q.answer.observation === fact && (!q.askWhen || askable.has(q.id))) askFirst.add(q.id);
    }
  }
  const firstIsolated = isolatedNow ? undefined : remaining.find((c) => c.state === 'isolated');
  const status: LoopStatus = confirmed ? 'confirmed' : remaining.length === 0 && worked.length > 0 ? 'exhausted' : 'open';
  return {
    status,
    confirmed: confirmed ?? null,
    next: remaining[0]?.id ?? null,
    effects,
    found: confirmed
      ? { cause: confirmed, title: catalogue.get(confirmed)!.title, means: catalogue.get(confirmed)!.description, returnToService: base.safety.returnToService.map((r) => r.says) }
      : null,
    warnings: warnings.map((w) => ({ id: w.id, says: w.says, severity: w.severity })),
    causes,
    ruledOut,
    checks: [...workedResults, ...remaining],
    withheld: safe.withheld,
    tellApart,
    isolation: {
      beforeCheck: firstIsolated?.id ?? null,
      steps: firstIsolated ? isolationSteps(base.safety.isolation, job.machine.drive ?? 'unknown', job.machine.connection) : [],
    },
    expectation,
    analyses,
    facts,
    askable,
    askFirst,
  };
}

/** The job with each worked check's readings and observations laid over the ones before: the latest reading counts. */
function withCheckFindings(job: JobInput, worked: readonly WorkedCheck[]): JobInput {
  if (worked.length === 0) return job;
  let readings = { ...job.readings };
  let observations = { ...job.observations };
  let tests = { ...job.tests };
  for (const w of worked) {
    readings = { ...readings, ...w.readings };
    observations = { ...observations, ...w.observations };
    tests = { ...tests, ...w.tests };
  }
  return { ...job, readings, observations, tests };
}

/** A rule base's lookups, made once per rule base rather than once per job. */
interface RuleBaseIndex {
  checkById: ReadonlyMap<string, Check>;
  shows: ReadonlyMap<string, readonly string[]>;
  titleOf: ReadonlyMap<string, string>;
  catalogue: ReadonlyMap<string, RuleBase['causes'][number]>;
  hazardText: ReadonlyMap<string, string>;
}
const indexes = new WeakMap<RuleBase, RuleBaseIndex>();

function indexOf(base: RuleBase): RuleBaseIndex {
  let index = indexes.get(base);
  if (!index) {
    index = {
      checkById: new Map(base.checks.map((c) => [c.id, c])),
      shows: checksShow(base),
      titleOf: new Map(base.causes.map((c) => [c.id, c.title])),
      catalogue: new Map(base.causes.map((c) => [c.id, c])),
      hazardText: new Map(base.safety.hazards.map((h) => [h.id, h.says])),
    };
    indexes.set(base, index);
  }
  return index;
}

/** Which causes each check shows: those that list it in the catalogue. */
export function checksShow(base: RuleBase): Map<string, string[]> {
  const shows = new Map<string, string[]>();
  for (const cause of base.causes) for (const id of cause.checks) shows.set(id, [...(shows.get(id) ?? []), cause.id]);
  return shows;
}

/** The cause the loop has found: the fitter's word, else the latest abnormal result that leaves one cause clearly ahead. */
function confirmation(worked: readonly WorkedCheck[], shows: ReadonlyMap<string, readonly string[]>, scores: ReadonlyMap<string, number>): string | undefined {
  const said = [...worked].reverse().find((w) => w.confirms !== undefined && scores.has(w.confirms));
  if (said) return said.confirms;
  for (const w of [...worked].reverse()) {
    if (w.result !== 'abnormal') continue;
    const found = confirmedBy((shows.get(w.id) ?? []).filter((c) => scores.has(c)), (c) => scores.get(c) ?? 0);
    if (found) return found;
  }
  return undefined;
}

/**
 * The checks each leading cause may be offered for this job: a check whose unsafeWhen holds is
 * replaced by its safe alternative (or dropped), and after a runaway warning nothing that needs
 * the machine running is offered until the cause is found isolated.
 */
function safeChecks(leading: { id: string; checks: string[] }[], checkById: ReadonlyMap<string, Check>, unsafe: Set<string>, hold: { runawayWarning: string | undefined; faultFound: string | undefined }) {
  const checksOf = new Map<string, string[]>();
  const insteadOf = new Map<string, string>();
  const withheld = new Map<string, WithheldCheck>();
  const considered = new Set<string>();
  const blocked = (c: Check): string | undefined =>
    unsafe.has(c.id)
      ? c.unsafeWhen!.says
      : hold.runawayWarning && c.running
        ? 'it needs the machine running, and after a runaway warning the machine is not run again until the cause is found isolated'
        : hold.faultFound && (c.running || c.state === 'live-test')
          ? `${hold.faultFound} found a fault: nothing is energised onto it until it is put right`
          : undefined;
  for (const cause of leading) {
    const offered: string[] = [];
    for (const id of cause.checks) {
      const check = checkById.get(id);
      if (!check) continue;
      considered.add(id);
      const because = blocked(check);
      if (!because) {
        offered.push(id);
        continue;
      }
      const alternative = check.instead ? checkById.get(check.instead) : undefined;
      const instead = alternative && !blocked(alternative) ? alternative.id : null;
      const w = withheld.get(id) ?? { id, title: check.title, causes: [], because, instead };
      w.causes.push(cause.id);
      withheld.set(id, w);
      if (instead) {
        offered.push(instead);
        insteadOf.set(instead, id);
      }
    }
    checksOf.set(cause.id, [...new Set(offered)]);
  }
  return { checksOf, insteadOf, withheld: [...withheld.values()], considered };
}

/**
 * The isolation in the order the rule folder gives: the armature off before the field, the five
 * rules with stored energy released before the absence of voltage is verified, and only the
 * DC-specific steps that apply to this drive and connection.
 */
export function isolationSteps(iso: RuleBase['safety']['isolation'], drive: string, connection: string): string[] {
  const byId = new Map<string, { says: string; drives?: readonly string[] | undefined; connections?: readonly string[] | undefined }>([...iso.steps, ...iso.dcSpecific].map((s) => [s.id, s]));
  const applies = (s: { drives?: readonly string[] | undefined; connections?: readonly string[] | undefined }) => (!s.drives || s.drives.includes(drive)) && (!s.connections || connection === 'unknown' || s.connections.includes(connection));
  return [...iso.sequence.flatMap((id) => (byId.has(id) && applies(byId.get(id)!) ? [byId.get(id)!.says] : [])), iso.prevails];
}
