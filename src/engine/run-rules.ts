/**
 * Runs the rule base over one job's facts to a fixpoint. json-rules-engine shows a fact derived
 * in a run only to lower-priority rules of that run, so every rule has the same priority and the
 * loop reruns with the derived facts merged until nothing new appears: the result does not depend
 * on the order rules were loaded in.
 */
import { Engine, type RuleResult, type TopLevelCondition } from 'json-rules-engine';
import type { Condition, Rule } from '../knowledge/rulebase-schema.js';
import type { RuleBase } from '../knowledge/load-rules.js';
import type { Facts } from './facts.js';
import { compareIds } from './compare-ids.js';

export interface Fired {
  rule: Rule;
  /** The rule result's condition tree with each leaf's factResult, valueResult and result. */
  tree: unknown;
}

export interface RunOutcome {
  facts: Facts;
  fired: Fired[];
  /** Questions whose askWhen held. */
  askable: Set<string>;
  /** Questions whose askFirstWhen held. */
  askFirst: Set<string>;
  /** Checks whose unsafeWhen held: never offered for this job. */
  unsafe: Set<string>;
  /** Conditional hazards that hold, as "check id" → hazard ids. */
  cautions: Map<string, string[]>;
  iterations: number;
}

export class RuleCycleError extends Error {}

const ASK_PREFIX = 'ask:';
const ASK_FIRST_PREFIX = 'ask-first:';
const UNSAFE_PREFIX = 'unsafe:';
const CAUTION_PREFIX = 'caution:';

const known = (a: unknown) => a !== undefined && a !== null;

/**
 * The rule base as two engines: the derive rules, run to a fixpoint, and everything else
 * (evidence, rule-outs, warnings, question conditions), run once on the settled facts. Only
 * derive rules add facts, so the result is the same as rerunning everything, for fewer runs.
 */
export interface RuleEngines {
  derive: Engine;
  judge: Engine;
}

/** "$.a" or "$.a.b": own properties only, walked one name at a time. */
function readPath(value: unknown, path: string): unknown {
  let at = value;
  for (const name of path.slice(2).split('.')) {
    if (at === null || typeof at !== 'object' || !Object.hasOwn(at, name)) return undefined;
    at = (at as Record<string, unknown>)[name];
  }
  return at;
}

function newEngine(base: RuleBase): Engine {
  // Paths are "$.name" or "$.name.field" (the schema allows no other): property reads, not a JSONPath query,
  // which costs a thrown error per lookup and was a tenth of a diagnosis.
  const engine = new Engine([], { allowUndefinedFacts: true, pathResolver: readPath });
  // Observations are mostly unknown in a real job: these operators are false on an unknown fact.
  engine.addOperator<unknown, unknown>('is', (a, b) => known(a) && a === b);
  engine.addOperator<unknown, unknown>('isNot', (a, b) => known(a) && a !== b);
  engine.addOperator<unknown, unknown[]>('isOneOf', (a, b) => known(a) && b.includes(a));
  engine.addOperator<unknown, unknown[]>('isNoneOf', (a, b) => known(a) && !b.includes(a));
  for (const [name, cond] of Object.entries(base.conditions)) engine.setCondition(name, topLevel(cond));
  return engine;
}

/** Builds the engines for a rule base once; each job gets fresh runs with its own facts. */
export function buildEngine(base: RuleBase): RuleEngines {
  const derive = newEngine(base);
  const judge = newEngine(base);
  for (const { rule } of base.rules) {
    (rule.kind === 'derive' ? derive : judge).addRule({ name: rule.name, priority: 1, conditions: topLevel(rule.conditions), event: { type: rule.kind } });
  }
  // A question's askWhen is a rule of its own, so the engine decides it along with the rest.
  for (const q of base.questions) {
    if (q.askWhen) judge.addRule({ name: `${ASK_PREFIX}${q.id}`, priority: 1, conditions: topLevel(q.askWhen), event: { type: 'askable' } });
    if (q.askFirstWhen) judge.addRule({ name: `${ASK_FIRST_PREFIX}${q.id}`, priority: 1, conditions: topLevel(q.askFirstWhen), event: { type: 'ask-first' } });
  }
  // So are a check's safety conditions: when it is unsafe, and which conditional hazards apply.
  for (const c of base.checks) {
    if (c.unsafeWhen) judge.addRule({ name: `${UNSAFE_PREFIX}${c.id}`, priority: 1, conditions: topLevel(c.unsafeWhen.condition), event: { type: 'unsafe' } });
    c.cautions?.forEach((caution, k) => judge.addRule({ name: `${CAUTION_PREFIX}${c.id}:${k}`, priority: 1, conditions: topLevel(caution.when), event: { type: 'caution' } }));
  }
  return { derive, judge };
}

function topLevel(c: Condition): TopLevelCondition {
  return ('all' in c || 'any' in c || 'not' in c || 'condition' in c ? c : { all: [c] }) as TopLevelCondition;
}

export async function runToFixpoint(engines: RuleEngines, base: RuleBase, start: Facts): Promise<RunOutcome> {
  const limit = base.rules.filter((r) => r.rule.kind === 'derive').length + 2;
  const byName = new Map(base.rules.map(({ rule }) => [rule.name, rule]));
  const firedOf = (results: RuleResult[]): Fired[] =>
    // Rule names are unique in a loaded rule base (the loader checks it).
    results.filter((r) => byName.has(String(r.name))).map((r) => ({ rule: byName.get(String(r.name))!, tree: r.toJSON(false).conditions }));
  let facts = { ...start };
  let derived: Fired[] = [];
  let iterations = 0;
  for (;;) {
    if (++iterations > limit) throw new RuleCycleError(`rules did not settle after ${limit} runs: derived facts keep changing`);
    derived = firedOf((await engines.derive.run(facts)).results);
    const added: Facts = {};
    for (const { rule } of derived) if (rule.kind === 'derive' && facts[rule.derive] !== true) added[rule.derive] = true;
    if (Object.keys(added).length === 0) break;
    facts = { ...facts, ...added };
  }
  const { results } = await engines.judge.run(facts);
  const names = results.map((r) => String(r.name));
  const withPrefix = (prefix: string) => new Set(names.filter((n) => n.startsWith(prefix)).map((n) => n.slice(prefix.length)));
  const cautions = new Map<string, string[]>();
  for (const entry of withPrefix(CAUTION_PREFIX)) {
    const cut = entry.lastIndexOf(':');
    const check = entry.slice(0, cut);
    const hazard = base.checks.find((c) => c.id === check)?.cautions?.[Number(entry.slice(cut + 1))]?.hazard;
    if (hazard) cautions.set(check, [...(cautions.get(check) ?? []), hazard]);
  }
  return { facts, fired: sortByName([...derived, ...firedOf(results)]), askable: withPrefix(ASK_PREFIX), askFirst: withPrefix(ASK_FIRST_PREFIX), unsafe: withPrefix(UNSAFE_PREFIX), cautions, iterations };
}

function sortByName(fired: Fired[]): Fired[] {
  return [...fired].sort((a, b) => compareIds(a.rule.name, b.rule.name));
}
