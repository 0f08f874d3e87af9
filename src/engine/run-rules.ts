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
  iterations: number;
}

export class RuleCycleError extends Error {}

const ASK_PREFIX = 'ask:';
const ASK_FIRST_PREFIX = 'ask-first:';

const known = (a: unknown) => a !== undefined && a !== null;

/** Builds the engine for a rule base once; each job gets fresh runs with its own facts. */
export function buildEngine(base: RuleBase): Engine {
  const engine = new Engine([], { allowUndefinedFacts: true });
  // Observations are mostly unknown in a real job: these operators are false on an unknown fact.
  engine.addOperator<unknown, unknown>('is', (a, b) => known(a) && a === b);
  engine.addOperator<unknown, unknown>('isNot', (a, b) => known(a) && a !== b);
  engine.addOperator<unknown, unknown[]>('isOneOf', (a, b) => known(a) && b.includes(a));
  engine.addOperator<unknown, unknown[]>('isNoneOf', (a, b) => known(a) && !b.includes(a));
  for (const [name, cond] of Object.entries(base.conditions)) engine.setCondition(name, topLevel(cond));
  base.rules.forEach(({ rule }) => {
    engine.addRule({ name: rule.name, priority: 1, conditions: topLevel(rule.conditions), event: { type: rule.kind } });
  });
  // A question's askWhen is a rule of its own, so the engine decides it along with the rest.
  for (const q of base.questions) {
    if (q.askWhen) engine.addRule({ name: `${ASK_PREFIX}${q.id}`, priority: 1, conditions: topLevel(q.askWhen), event: { type: 'askable' } });
    if (q.askFirstWhen) engine.addRule({ name: `${ASK_FIRST_PREFIX}${q.id}`, priority: 1, conditions: topLevel(q.askFirstWhen), event: { type: 'ask-first' } });
  }
  return engine;
}

function topLevel(c: Condition): TopLevelCondition {
  return ('all' in c || 'any' in c || 'not' in c || 'condition' in c ? c : { all: [c] }) as TopLevelCondition;
}

export async function runToFixpoint(engine: Engine, base: RuleBase, start: Facts): Promise<RunOutcome> {
  const limit = base.rules.filter((r) => r.rule.kind === 'derive').length + 2;
  const byName = new Map(base.rules.map(({ rule }) => [rule.name, rule]));
  let facts = { ...start };
  for (let iteration = 1; iteration <= limit; iteration++) {
    const { results } = await engine.run(facts);
    const names = results.map((r: RuleResult) => String(r.name));
    const withPrefix = (prefix: string) => new Set(names.filter((n) => n.startsWith(prefix)).map((n) => n.slice(prefix.length)));
    const askable = withPrefix(ASK_PREFIX);
    const askFirst = withPrefix(ASK_FIRST_PREFIX);
    // Rule names are unique in a loaded rule base (the loader checks it).
    const fired = results.filter((r) => byName.has(String(r.name))).map((r: RuleResult) => ({ rule: byName.get(String(r.name))!, tree: r.toJSON(false).conditions }));
    const added: Facts = {};
    for (const { rule } of fired) if (rule.kind === 'derive' && facts[rule.derive] !== true) added[rule.derive] = true;
    if (Object.keys(added).length === 0) return { facts, fired: sortByName(fired), askable, askFirst, iterations: iteration };
    facts = { ...facts, ...added };
  }
  throw new RuleCycleError(`rules did not settle after ${limit} runs: derived facts keep changing`);
}

function sortByName(fired: Fired[]): Fired[] {
  return [...fired].sort((a, b) => a.rule.name.localeCompare(b.rule.name));
}
