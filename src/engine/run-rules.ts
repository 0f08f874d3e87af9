/**
 * Runs the rule base over one job's facts to a fixpoint. json-rules-engine shows a fact derived
 * in a run only to lower-priority rules of that run, so every rule has the same priority and the
 * loop reruns, with the derived facts merged, the rules that read them, until nothing new appears:
 * the result does not depend on the order rules were loaded in.
 */
import { Engine, Fact, Rule as EngineRule, type RuleProperties, type RuleResult, type TopLevelCondition } from 'json-rules-engine';
import type { Condition, Rule } from '../knowledge/rulebase-schema.js';
import { factsRead, type RuleBase } from '../knowledge/load-rules.js';
import type { Facts } from './facts.js';
import { compareIds } from './compare-ids.js';

export interface Fired {
  rule: Rule;
  /** The rule result's condition tree with each leaf's factResult, valueResult and result (undefined in a run without explanations). */
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
 * The rule base as two rule sets: the derive rules, run to a fixpoint, and everything else
 * (evidence, rule-outs, warnings, question conditions), run once on the settled facts. Only
 * derive rules add facts, so the result is the same as rerunning everything, for fewer runs.
 */
export interface RuleEngines {
  derive: ScreenedRules;
  judge: ScreenedRules;
  /** The rule base's rules by name (names are unique in a loaded rule base: the loader checks it). */
  byName: ReadonlyMap<string, Rule>;
}

/** "$.a" or "$.a.b": own properties only, walked one name at a time. */
function readPath(value: unknown, path: string): unknown {
  return readNames(value, namesOf(path));
}

/** A path's names, split once per distinct path (a rule base has a few hundred). */
const pathNames = new Map<string, readonly string[]>();
function namesOf(path: string): readonly string[] {
  let names = pathNames.get(path);
  if (!names) pathNames.set(path, (names = path.slice(2).split('.')));
  return names;
}

function readNames(value: unknown, names: readonly string[]): unknown {
  let at = value;
  for (const name of names) {
    if (at === null || typeof at !== 'object' || !Object.hasOwn(at, name)) return undefined;
    at = (at as Record<string, unknown>)[name];
  }
  return at;
}

/** The part of json-rules-engine's Operator the screen calls (the class declares only its name). */
interface Judging {
  evaluate(factValue: unknown, value: unknown): boolean;
}

/** A fact as a condition names it: the fact, and the names its path reads ("$.a.b" as ["a", "b"]), if it has one. */
interface FactRef {
  fact: string;
  names: readonly string[] | undefined;
}

const factRef = (fact: string, path: string | undefined): FactRef => ({ fact, names: path ? namesOf(path) : undefined });

/**
 * The part of a condition the screen can judge before a run: comparisons of a fact with a
 * constant or with another fact, and `all`, `any` and `not` of those (a `not` only of what is judged whole). When a
 * screen fails, the condition is false.
 */
type Screen = Comparison | { all: Screen[] } | { any: Screen[] } | { not: Screen };

/**
 * One comparison of a screen. The same comparison in many rules (a symptom, a fit's verdict) is
 * one object, judged once per set of facts: `judgedOn` holds the facts it was last judged on.
 */
interface Comparison {
  compare: FactRef;
  operator: Judging;
  value: unknown;
  valueFact?: FactRef;
  judgedOn?: Facts;
  failed?: boolean;
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

/**
 * Rules built once, run on each job's facts by a fresh engine that holds only the rules that can
 * still fire. Every json-rules-engine run copies each rule's whole condition tree and evaluates
 * it through promises, and most rules of a job fail on a single comparison (a symptom it does
 * not have, an observation nobody made). So before a run each rule's comparisons are judged by
 * the engine's own operators, on the facts read as the engine reads them, through `all`, `any`
 * and shared conditions; a rule they show false is left out, as the engine would have failed it.
 * The engine still decides every rule it runs, with its whole condition tree for explanations.
 * A ranking needs no explanations (`decide`): there a screen that judges the whole condition
 * decides its rule, and only rules with an operator the screen does not know go to the engine.
 */
export class ScreenedRules {
  private readonly rules: {
    rule: EngineRule;
    name: string;
    screen: Screen | undefined;
    /** The screen judges the whole condition (every operator known): its verdict is the engine's. */
    whole: boolean;
    reads: ReadonlySet<string>;
  }[];
  private readonly operators: { get(name: string): Judging | null };
  /** Each distinct comparison once, by its fact, path, operator and value. */
  private readonly comparisons = new Map<string, Comparison>();
  /** How many rules: the derive set's bounds the runs to a fixpoint. */
  readonly size: number;

  constructor(
    private readonly base: RuleBase,
    rules: RuleProperties[],
  ) {
    // The operators json-rules-engine evaluates with, so that the screen judges exactly as the run does.
    this.operators = (newEngine(base) as unknown as { operators: { get(name: string): Judging | null } }).operators;
    this.rules = rules.map((r) => {
      const conditions = r.conditions as Condition;
      const { screen, whole } = this.screenOf(conditions, new Set());
      return { rule: new EngineRule(r), name: String(r.name), screen, whole, reads: new Set(factsRead(conditions, base.conditions)) };
    });
    this.size = rules.length;
  }

  /**
   * What of a condition can be judged before a run (undefined when nothing can), and whether that
   * is all of it: every part a comparison with a known operator, through `all`, `any`, `not` and
   * shared conditions. A screen of the whole passes exactly when the engine fires
   * (test/engine/screened-rules.test.ts holds it to that); a screen of a part can only fail.
   */
  private screenOf(c: Condition, via: Set<string>): { screen: Screen | undefined; whole: boolean } {
    if ('all' in c) {
      // All fails when any judged part fails: the parts not judged are left out.
      const parts = c.all.map((x) => this.screenOf(x, via));
      const judged = parts.flatMap((p) => p.screen ?? []);
      return { screen: judged.length ? { all: judged } : undefined, whole: parts.length > 0 && parts.every((p) => p.whole) };
    }
    if ('any' in c) {
      // Any fails only when every part fails: one part not judged leaves it undecided.
      const parts = c.any.map((x) => this.screenOf(x, via));
      const judged = parts.every((p) => p.screen !== undefined);
      return { screen: judged ? { any: parts.map((p) => p.screen!) } : undefined, whole: parts.length > 0 && parts.every((p) => p.whole) };
    }
    if ('condition' in c) {
      // The engine evaluates a shared condition in the place of its reference.
      const shared = Object.hasOwn(this.base.conditions, c.condition) ? this.base.conditions[c.condition] : undefined;
      if (!shared || via.has(c.condition)) return { screen: undefined, whole: false };
      return this.screenOf(shared, new Set([...via, c.condition]));
    }
    // A not is judged only when what it negates is judged whole: a part left out would turn its verdict round.
    if ('not' in c) {
      const inner = this.screenOf(c.not, via);
      return inner.whole ? { screen: { not: inner.screen! }, whole: true } : { screen: undefined, whole: false };
    }
    const operator = this.operators.get(c.operator);
    if (!operator) return { screen: undefined, whole: false };
    const key = JSON.stringify([c.fact, c.path ?? null, c.operator, c.value]);
    let comparison = this.comparisons.get(key);
    if (!comparison) {
      const compare = factRef(c.fact, c.path);
      const value: unknown = c.value;
      const other = value !== null && typeof value === 'object' && !Array.isArray(value) ? (value as { fact: string; path?: string | undefined }) : undefined;
      comparison = other ? { compare, operator, value, valueFact: factRef(other.fact, other.path) } : { compare, operator, value };
      this.comparisons.set(key, comparison);
    }
    return { screen: comparison, whole: true };
  }

  /**
   * Runs the rules that can fire on these facts; resolves to the rules that fired. With `only`,
   * just the rules of those names (the rest are taken as decided already).
   */
  run(facts: Facts, only?: ReadonlySet<string>): Promise<{ results: RuleResult[] }> {
    return this.runRules(facts, true, only);
  }

  /** Runs every rule, unscreened: what the screen is held to (test/engine/screened-rules.test.ts). */
  runAll(facts: Facts): Promise<{ results: RuleResult[] }> {
    return this.runRules(facts, false);
  }

  /**
   * The names of the rules that fire on these facts, without their condition trees: what a
   * ranking needs. A rule its screen judges whole is decided by the screen; the engine runs the
   * rest. With `only`, just the rules of those names.
   */
  async decide(facts: Facts, only?: ReadonlySet<string>): Promise<string[]> {
    const fired: string[] = [];
    let engine: Engine | undefined;
    for (const { rule, name, screen, whole } of this.rules) {
      if ((only && !only.has(name)) || (screen && fails(screen, facts))) continue;
      if (whole) fired.push(name);
      else (engine ??= newEngine(this.base)).addRule(rule);
    }
    if (engine) for (const r of (await engine.run(constantFacts(facts))).results) fired.push(String(r.name));
    return fired;
  }

  /** The names of the rules whose conditions read any of these facts (shared conditions followed). */
  reading(facts: Iterable<string>): Set<string> {
    const names = new Set<string>();
    for (const fact of facts) for (const { name, reads } of this.rules) if (reads.has(fact)) names.add(name);
    return names;
  }

  private async runRules(facts: Facts, screened: boolean, only?: ReadonlySet<string>): Promise<{ results: RuleResult[] }> {
    // Adding a rule points it at this run's engine; runs that overlap point it at engines made
    // alike (the same operators and shared conditions), so a rule evaluates the same in either.
    const engine = newEngine(this.base);
    for (const { rule, name, screen } of this.rules) {
      if (only && !only.has(name)) continue;
      if (!screened || !screen || !fails(screen, facts)) engine.addRule(rule);
    }
    return engine.run(constantFacts(facts));
  }
}

/**
 * The facts for a run. A fact given as a value is cached under a hash of its id, a cache never
 * read for a constant: the same fact without it costs no hashing.
 */
function constantFacts(facts: Facts): Record<string, Fact> {
  const constants: Record<string, Fact> = {};
  for (const id of Object.keys(facts)) constants[id] = new Fact(id, facts[id], { cache: false });
  return constants;
}

/** Whether a screen shows its condition false on these facts. */
function fails(screen: Screen, facts: Facts): boolean {
  if ('all' in screen) {
    for (const x of screen.all) if (fails(x, facts)) return true;
    return false;
  }
  if ('any' in screen) {
    for (const x of screen.any) if (!fails(x, facts)) return false;
    return true;
  }
  if ('not' in screen) return !fails(screen.not, facts);
  if (screen.judgedOn !== facts) {
    const value = screen.valueFact ? factValue(facts, screen.valueFact) : screen.value;
    screen.failed = !screen.operator.evaluate(factValue(facts, screen.compare), value);
    screen.judgedOn = facts;
  }
  return screen.failed!;
}

/** A fact as json-rules-engine's almanac reads it for a condition: the value, then its path if it is an object (readPath, "$.a.b" included). */
function factValue(facts: Facts, ref: FactRef): unknown {
  const value = Object.hasOwn(facts, ref.fact) ? facts[ref.fact] : undefined;
  if (ref.names === undefined || value === null || typeof value !== 'object') return value;
  return readNames(value, ref.names);
}

/** Builds the rule sets for a rule base once; each job gets fresh runs with its own facts. */
export function buildEngine(base: RuleBase): RuleEngines {
  const derive: RuleProperties[] = [];
  const judge: RuleProperties[] = [];
  for (const { rule } of base.rules) {
    (rule.kind === 'derive' ? derive : judge).push({ name: rule.name, priority: 1, conditions: topLevel(rule.conditions), event: { type: rule.kind } });
  }
  // A question's askWhen is a rule of its own, so the engine decides it along with the rest.
  for (const q of base.questions) {
    if (q.askWhen) judge.push({ name: `${ASK_PREFIX}${q.id}`, priority: 1, conditions: topLevel(q.askWhen), event: { type: 'askable' } });
    if (q.askFirstWhen) judge.push({ name: `${ASK_FIRST_PREFIX}${q.id}`, priority: 1, conditions: topLevel(q.askFirstWhen), event: { type: 'ask-first' } });
  }
  // So are a check's safety conditions: when it is unsafe, and which conditional hazards apply.
  for (const c of base.checks) {
    if (c.unsafeWhen) judge.push({ name: `${UNSAFE_PREFIX}${c.id}`, priority: 1, conditions: topLevel(c.unsafeWhen.condition), event: { type: 'unsafe' } });
    c.cautions?.forEach((caution, k) => judge.push({ name: `${CAUTION_PREFIX}${c.id}:${k}`, priority: 1, conditions: topLevel(caution.when), event: { type: 'caution' } }));
  }
  return { derive: new ScreenedRules(base, derive), judge: new ScreenedRules(base, judge), byName: new Map(base.rules.map(({ rule }) => [rule.name, rule])) };
}

function topLevel(c: Condition): TopLevelCondition {
  return ('all' in c || 'any' in c || 'not' in c || 'condition' in c ? c : { all: [c] }) as TopLevelCondition;
}

/**
 * The rules to a fixpoint on a job's facts. `explain`: every rule that fires comes with its
 * condition tree as the engine evaluated it (a diagnosis words its evidence from them); without,
 * the rules that fire are only named (a ranking needs no more), and most are decided by their screens.
 */
export async function runToFixpoint(engines: RuleEngines, base: RuleBase, start: Facts, explain = true): Promise<RunOutcome> {
  const limit = engines.derive.size + 2;
  const byName = engines.byName;
  /** The rules of a set that fire: their names (question, safety and caution rules among them) and the rule base's rules. */
  const runSet = async (set: ScreenedRules, facts: Facts, only?: ReadonlySet<string>): Promise<{ names: string[]; fired: Fired[] }> => {
    if (!explain) {
      const names = await set.decide(facts, only);
      const fired: Fired[] = [];
      for (const n of names) {
        const rule = byName.get(n);
        if (rule) fired.push({ rule, tree: undefined });
      }
      return { names, fired };
    }
    const { results } = await set.run(facts, only);
    return { names: results.map((r) => String(r.name)), fired: results.filter((r) => byName.has(String(r.name))).map((r) => ({ rule: byName.get(String(r.name))!, tree: r.toJSON(false).conditions })) };
  };
  let facts = { ...start };
  let derived: Fired[] = [];
  let iterations = 0;
  // The first run decides every derive rule; each later run only those that read a fact the run
  // before added, as the rest read what they read before and decide as they did.
  let rerun: ReadonlySet<string> | undefined;
  for (;;) {
    if (++iterations > limit) throw new RuleCycleError(`rules did not settle after ${limit} runs: derived facts keep changing`);
    const decided = (await runSet(engines.derive, facts, rerun)).fired;
    derived = rerun ? [...derived.filter((f) => !rerun!.has(f.rule.name)), ...decided] : decided;
    const added: Facts = {};
    for (const { rule } of derived) if (rule.kind === 'derive' && facts[rule.derive] !== true) added[rule.derive] = true;
    if (Object.keys(added).length === 0) break;
    facts = { ...facts, ...added };
    rerun = engines.derive.reading(Object.keys(added));
    if (rerun.size === 0) break;
  }
  const judged = await runSet(engines.judge, facts);
  const withPrefix = (prefix: string) => {
    const found = new Set<string>();
    for (const n of judged.names) if (n.startsWith(prefix)) found.add(n.slice(prefix.length));
    return found;
  };
  const cautions = new Map<string, string[]>();
  for (const entry of withPrefix(CAUTION_PREFIX)) {
    const cut = entry.lastIndexOf(':');
    const check = entry.slice(0, cut);
    const hazard = base.checks.find((c) => c.id === check)?.cautions?.[Number(entry.slice(cut + 1))]?.hazard;
    if (hazard) cautions.set(check, [...(cautions.get(check) ?? []), hazard]);
  }
  return { facts, fired: sortByName([...derived, ...judged.fired]), askable: withPrefix(ASK_PREFIX), askFirst: withPrefix(ASK_FIRST_PREFIX), unsafe: withPrefix(UNSAFE_PREFIX), cautions, iterations };
}

function sortByName(fired: Fired[]): Fired[] {
  return [...fired].sort((a, b) => compareIds(a.rule.name, b.rule.name));
}
