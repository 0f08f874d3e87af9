/**
 * Loads a rule folder: every *.json directly in it is validated; drafts/ is not loaded.
 * Cross-references (causes, checks, hazards, warnings, facts, observation answers, quantity
 * names, shared conditions) are checked here so the engine can trust what it is given.
 */
import { readdirSync, statSync, type Dirent, type Stats } from 'node:fs';
import type * as z from 'zod';
import { join } from 'node:path';
import { QUANTITY_NAMES } from '../model/quantity-names.js';
import { TEST_FINDINGS } from '../model/series/findings.js';
import { CIRCUIT_FIT_FIELDS, FIT_FACT_FIELDS, HEALTHY_FIT_FIELDS, HYPOTHESIS_IDS } from '../model/fits/index.js';
import { READING_FIELDS } from './case-schema.js';
import { duplicateKeyIssue, readJsonFile, validate } from './read-json.js';
import { controlPaths, withVisibleText } from './visible-text.js';
import { parseKeptFileAsIs, sealKey, type RuleSeal } from './rule-seal.js';
import { failed, failedWith, ok, type Issue, type Result } from './result.js';
import {
  CATALOGUE_FILES,
  causesFile,
  checksFile,
  questionsFile,
  ruleFile,
  safetyFile,
  sharedConditionsFile,
  type Cause,
  type Check,
  type Condition,
  type Leaf,
  type Question,
  type RetiredCheck,
  type Rule,
  type Safety,
} from './rulebase-schema.js';
import { OBSERVATIONS, SYMPTOM_IDS, type ObservationName } from './vocabulary.js';

export interface LoadedRule {
  rule: Rule;
  file: string;
  /** Where in its file, for messages: "rules[3]". */
  at: string;
}

export interface RuleBase {
  dir: string;
  causes: Cause[];
  checks: Check[];
  /** Check ids no longer offered, kept so they are never reused. */
  retiredChecks?: RetiredCheck[] | undefined;
  questions: Question[];
  safety: Safety;
  conditions: Record<string, Condition>;
  rules: LoadedRule[];
  /** Text holding control characters, shown made visible (see visible-text.ts); `rules check` reports each. */
  controlText?: Issue[];
}

/** Facts every job has (some may be unknown), besides observations and derived facts. */
export const STATIC_FACTS = {
  connection: 'string',
  drive: 'string',
  feedback: 'string',
  cooling: 'string',
  hasShuntField: 'boolean',
  hasSeriesField: 'boolean',
  symptoms: 'list',
  findings: 'list',
  testFindings: 'list',
  ratio: 'quantities',
  value: 'quantities',
  measured: 'quantities',
  swapReverses: 'swaps',
  fit: 'fits',
} as const;

/** Questions the dialogue asks from the case file's own fields, which a rule-folder question may follow. */
const MACHINE_QUESTION_IDS = new Set(['connection', 'drive', 'feedback', 'cooling', 'symptoms']);

/** The swaps the reversal model answers for (facts `swapReverses` with a path "$.supply"…). */
export const SWAP_FACT_PATHS = ['supply', 'armature', 'shuntField', 'seriesField', 'bothFields'] as const;

/** Paths of the fact `fit`: "$.<hypothesis>.<field>" (see src/model/fits/index.ts). */
export const FIT_FACT_PATHS = [...HYPOTHESIS_IDS.flatMap((h) => FIT_FACT_FIELDS.map((f) => `${h}.${f}`)), ...HEALTHY_FIT_FIELDS.map((f) => `healthy.${f}`), ...CIRCUIT_FIT_FIELDS.map((f) => `circuit.${f}`)];

export interface LoadOptions {
  /** Files proved valid by the build (see rule-seal.ts): used as read, without a second pass. */
  seal?: RuleSeal | undefined;
  /** Told the seal key of every file that passed its schema unchanged, for writing a seal. */
  passed?: ((key: string) => void) | undefined;
}

export function loadRuleBase(dir: string, options: LoadOptions = {}): Result<RuleBase> {
  let entries: Dirent[];
  try {
    entries = readdirSync(dir, { withFileTypes: true }).filter((d) => d.name.endsWith('.json'));
  } catch {
    return failed({ code: 'unreadable', file: dir, path: '', message: 'rule folder cannot be read' });
  }
  const issues: Issue[] = [];
  const names: string[] = [];
  // A link is followed to a regular file; anything else named *.json is refused by name, never skipped.
  for (const d of entries) {
    if (d.isFile()) names.push(d.name);
    else if (d.isSymbolicLink()) {
      let target: Stats | undefined;
      try {
        target = statSync(join(dir, d.name));
      } catch {
        target = undefined;
      }
      if (target?.isFile()) names.push(d.name);
      else issues.push({ code: 'unreadable', file: join(dir, d.name), path: '', message: target ? 'is a link to something that is not a regular file' : 'is a link to nothing (its target does not exist)' });
    } else if (!d.isDirectory()) issues.push({ code: 'unreadable', file: join(dir, d.name), path: '', message: 'is not a regular file' });
  }
  names.sort();
  const controlText: Issue[] = [];
  const read = <S extends z.ZodType>(name: string, schemaName: string, schema: S): z.output<S> | undefined => {
    const file = join(dir, name);
    const raw = readJsonFile(file);
    if (!raw.ok) return void issues.push(...raw.issues);
    const key = options.seal || options.passed ? sealKey(schemaName, raw.value.text) : '';
    // These very bytes passed this schema at build time, and its parse returned them unchanged.
    if (options.seal?.has(key)) return raw.value.value as z.output<S>;
    const twice = duplicateKeyIssue(file, raw.value.text);
    if (twice) return void issues.push(twice);
    const v = validate(file, raw.value.value, schema);
    if (!v.ok) return void issues.push(...v.issues);
    if (options.passed && parseKeptFileAsIs(raw.value.value, v.value)) options.passed(key);
    const controls = controlPaths(v.value);
    if (controls.length === 0) return v.value;
    controlText.push(...controls.map((path) => ({ code: 'invalid' as const, file, path, message: 'holds a control character (an escape sequence, a line break or a direction override): shown as \\u…, so it cannot act on a terminal' })));
    return withVisibleText(v.value);
  };
  for (const required of Object.keys(CATALOGUE_FILES)) {
    if (!names.includes(required)) issues.push({ code: 'rule-base', file: join(dir, required), path: '', message: 'missing: every rule folder has this file' });
  }
  if (issues.length) return failedWith(issues);

  const causes = read('causes.json', 'causes.json', causesFile)?.causes;
  const checksRead = read('checks.json', 'checks.json', checksFile);
  const checks = checksRead?.checks;
  const questions = read('questions.json', 'questions.json', questionsFile)?.questions;
  const safety = read('safety.json', 'safety.json', safetyFile);
  const conditions = read('conditions.json', 'conditions.json', sharedConditionsFile)?.conditions;
  const rules: LoadedRule[] = [];
  for (const name of names.filter((n) => !Object.hasOwn(CATALOGUE_FILES, n))) {
    const f = read(name, 'rule-file', ruleFile);
    f?.rules.forEach((rule, k) => rules.push({ rule, file: join(dir, name), at: `rules[${k}]` }));
  }
  if (issues.length || !causes || !checks || !questions || !safety || !conditions) return failedWith(issues);
  const base: RuleBase = { dir, causes, checks, retiredChecks: checksRead?.retired, questions, safety, conditions, rules, ...(controlText.length ? { controlText } : {}) };
  const cross = crossCheck(base);
  return cross.length ? failedWith(cross) : ok(base);
}

/**
 * The seal keys of a rule folder's files, for the build to write: only when the whole folder
 * loads, and only for files the schemas returned unchanged.
 */
export function sealRuleFolder(dir: string): Result<string[]> {
  const keys: string[] = [];
  const loaded = loadRuleBase(dir, { passed: (k) => keys.push(k) });
  return loaded.ok ? ok(keys) : loaded;
}

/** Everything one file's schema cannot see: references between files. */
export function crossCheck(base: RuleBase): Issue[] {
  const issues: Issue[] = [];
  const f = (name: string) => join(base.dir, name);
  const causeIds = new Set(base.causes.map((c) => c.id));
  const checkIds = new Set(base.checks.map((c) => c.id));
  const hazardIds = new Set(base.safety.hazards.map((h) => h.id));
  const warningIds = new Set(base.safety.warnings.map((w) => w.id));
  const derived = new Set(base.rules.flatMap(({ rule }) => (rule.kind === 'derive' ? [rule.derive] : [])));

  duplicates(base.causes.map((c) => c.id)).forEach((d) => issues.push(issue(f('causes.json'), 'causes', `cause id "${d}" appears twice`)));
  duplicates(base.checks.map((c) => c.id)).forEach((d) => issues.push(issue(f('checks.json'), 'checks', `check id "${d}" appears twice`)));
  duplicates(base.questions.map((q) => q.id)).forEach((d) => issues.push(issue(f('questions.json'), 'questions', `question id "${d}" appears twice`)));
  base.causes.forEach((c, k) =>
    c.checks.forEach((ch, j) => {
      if (!checkIds.has(ch)) issues.push(issue(f('causes.json'), `causes[${k}].checks[${j}]`, `cause "${c.id}" names check "${ch}", which checks.json does not define`));
    }),
  );
  base.causes.forEach((c, k) => {
    if (c.refines === undefined) return;
    if (c.refines === c.id) issues.push(issue(f('causes.json'), `causes[${k}].refines`, `cause "${c.id}" cannot refine itself`));
    else if (!causeIds.has(c.refines)) issues.push(issue(f('causes.json'), `causes[${k}].refines`, `cause "${c.id}" refines "${c.refines}", which causes.json does not define`));
    else if (base.causes.find((x) => x.id === c.refines)?.refines !== undefined) issues.push(issue(f('causes.json'), `causes[${k}].refines`, `cause "${c.id}" refines "${c.refines}", which itself refines another cause: refine the broadest one`));
  });
  const retired = new Map((base.retiredChecks ?? []).map((r) => [r.id, r]));
  base.checks.forEach((c, k) => {
    const where = `checks[${k}] (${c.id})`;
    c.hazards.forEach((h, j) => {
      if (!hazardIds.has(h)) issues.push(issue(f('checks.json'), `checks[${k}].hazards[${j}]`, `check "${c.id}" names hazard "${h}", which safety.json does not define`));
    });
    if (retired.has(c.id)) issues.push(issue(f('checks.json'), `${where}.id`, `"${c.id}" is a retired check id: never reuse it for a different test; give the check a new id`));
    if (c.instead !== undefined && !checkIds.has(c.instead)) issues.push(issue(f('checks.json'), `${where}.instead`, `"${c.instead}" is not a check in checks.json`));
    if (c.instead !== undefined && !c.unsafeWhen) issues.push(issue(f('checks.json'), `${where}.instead`, 'a check offered instead needs unsafeWhen to say when'));
    if (c.unsafeWhen) issues.push(...checkCondition(c.unsafeWhen.condition, f('checks.json'), `${where}.unsafeWhen.condition`, derived, base.conditions));
    c.takes?.readings?.forEach((r, j) => {
      if (!(r in READING_FIELDS)) issues.push(issue(f('checks.json'), `${where}.takes.readings[${j}]`, `"${r}" is not a reading of dc-case/1`));
    });
    c.takes?.observations?.forEach((o, j) => {
      if (!(o in OBSERVATIONS)) issues.push(issue(f('checks.json'), `${where}.takes.observations[${j}]`, `"${o}" is not an observation of dc-case/1`));
    });
    for (const cause of Object.keys(c.sensitivityFor ?? {})) {
      if (!base.causes.some((x) => x.id === cause && x.checks.includes(c.id))) issues.push(issue(f('checks.json'), `${where}.sensitivityFor.${cause}`, `cause "${cause}" does not list check "${c.id}": a sensitivity is given only for a cause the check shows`));
    }
    c.cautions?.forEach((caution, j) => {
      if (!hazardIds.has(caution.hazard)) issues.push(issue(f('checks.json'), `${where}.cautions[${j}].hazard`, `"${caution.hazard}" is not a hazard in safety.json`));
      issues.push(...checkCondition(caution.when, f('checks.json'), `${where}.cautions[${j}].when`, derived, base.conditions));
    });
  });
  (base.retiredChecks ?? []).forEach((r, k) => {
    if (r.replacedBy !== undefined && !checkIds.has(r.replacedBy)) issues.push(issue(f('checks.json'), `retired[${k}].replacedBy`, `"${r.replacedBy}" is not a check in checks.json`));
  });
  base.causes.forEach((c, k) =>
    c.checks.forEach((ch, j) => {
      if (retired.has(ch)) issues.push(issue(f('causes.json'), `causes[${k}].checks[${j}]`, `check "${ch}" is retired${retired.get(ch)!.replacedBy ? `: use "${retired.get(ch)!.replacedBy}"` : ''}`));
    }),
  );
  const stepIds = new Set([...base.safety.isolation.steps.map((s) => s.id), ...base.safety.isolation.dcSpecific.map((s) => s.id)]);
  base.safety.isolation.sequence.forEach((id, k) => {
    if (!stepIds.has(id)) issues.push(issue(f('safety.json'), `isolation.sequence[${k}]`, `"${id}" is not an isolation step or a DC-specific step`));
  });
  for (const id of stepIds) if (!base.safety.isolation.sequence.includes(id)) issues.push(issue(f('safety.json'), 'isolation.sequence', `step "${id}" is not placed in the sequence`));
  const seenRuleNames = new Map<string, string>();
  for (const { rule, file, at } of base.rules) {
    const where = `${at} (${rule.name})`;
    const earlier = seenRuleNames.get(rule.name);
    if (earlier) issues.push(issue(file, `${where}.name`, `rule name "${rule.name}" is also used in ${earlier}`));
    seenRuleNames.set(rule.name, file);
    if ((rule.kind === 'evidence' || rule.kind === 'rule-out') && !causeIds.has(rule.cause)) {
      issues.push(issue(file, `${where}.cause`, `"${rule.cause}" is not a cause in causes.json`));
    }
    if (rule.kind === 'warning' && !warningIds.has(rule.warning)) issues.push(issue(file, `${where}.warning`, `"${rule.warning}" is not a warning in safety.json`));
    issues.push(...checkCondition(rule.conditions, file, `${where}.conditions`, derived, base.conditions));
    if (rule.says) issues.push(...checkTemplate(rule.says, file, `${where}.says`));
  }
  for (const [name, cond] of Object.entries(base.conditions)) issues.push(...checkCondition(cond, f('conditions.json'), `conditions.${name}`, derived, base.conditions));
  base.questions.forEach((q, k) => {
    const where = `questions[${k}] (${q.id})`;
    if (q.answer.kind === 'choice' && !Object.hasOwn(OBSERVATIONS, q.answer.observation)) issues.push(issue(f('questions.json'), `${where}.answer.observation`, `"${q.answer.observation}" is not an observation of dc-case/1`));
    if (q.answer.kind === 'quantity' && !Object.hasOwn(READING_FIELDS, q.answer.reading)) issues.push(issue(f('questions.json'), `${where}.answer.reading`, `"${q.answer.reading}" is not a reading of dc-case/1`));
    if (q.askWhen) issues.push(...checkCondition(q.askWhen, f('questions.json'), `${where}.askWhen`, derived, base.conditions));
    if (q.askFirstWhen) issues.push(...checkCondition(q.askFirstWhen, f('questions.json'), `${where}.askFirstWhen`, derived, base.conditions));
    q.askAfter?.forEach((after, j) => {
      if (!base.questions.some((x) => x.id === after) && !MACHINE_QUESTION_IDS.has(after)) issues.push(issue(f('questions.json'), `${where}.askAfter[${j}]`, `"${after}" is not a question`));
    });
  });
  for (const c of sharedConditionCycles(base.conditions)) {
    issues.push({ code: 'cycle', file: f('conditions.json'), path: `conditions.${c[0]}`, message: c.length === 2 ? `shared condition "${c[0]}" refers to itself` : `shared conditions refer to each other in a cycle: ${c.join(' → ')}` });
  }
  const cycle = findDeriveCycle(base);
  if (cycle) issues.push({ code: 'cycle', file: cycle.file, path: cycle.at, message: `derived facts depend on each other in a cycle: ${cycle.path.join(' → ')}` });
  return issues;
}

function checkCondition(c: Condition, file: string, path: string, derived: Set<string>, shared: Record<string, Condition>): Issue[] {
  if ('all' in c) return c.all.flatMap((x, k) => checkCondition(x, file, `${path}.all[${k}]`, derived, shared));
  if ('any' in c) return c.any.flatMap((x, k) => checkCondition(x, file, `${path}.any[${k}]`, derived, shared));
  if ('not' in c) return checkCondition(c.not, file, `${path}.not`, derived, shared);
  if ('condition' in c) return Object.hasOwn(shared, c.condition) ? [] : [issue(file, `${path}.condition`, `no shared condition "${c.condition}" in conditions.json`)];
  const out: Issue[] = [];
  const kind = factKind(c.fact, derived);
  if (kind === undefined) return [issue(file, `${path}.fact`, `unknown fact "${c.fact}": not an observation, a derived fact or one of ${Object.keys(STATIC_FACTS).join(', ')}`)];
  if (kind === 'quantities') {
    const q = c.path?.slice(2);
    if (q === undefined) out.push(issue(file, `${path}.path`, `fact "${c.fact}" needs a path naming a quantity, e.g. "$.speed"`));
    else if (!(QUANTITY_NAMES as string[]).includes(q)) out.push(issue(file, `${path}.path`, `"${q}" is not a quantity the model computes`));
  }
  if (kind === 'swaps' && !(SWAP_FACT_PATHS as readonly string[]).includes(c.path?.slice(2) ?? '')) {
    out.push(issue(file, `${path}.path`, `fact "${c.fact}" needs a path naming a swap: ${SWAP_FACT_PATHS.map((n) => `"$.${n}"`).join(', ')}`));
  }
  if (kind === 'fits' && !FIT_FACT_PATHS.includes(c.path?.slice(2) ?? '')) {
    out.push(issue(file, `${path}.path`, `fact "${c.fact}" needs a path "$.<hypothesis>.<field>": hypotheses ${HYPOTHESIS_IDS.join(', ')} (fields ${FIT_FACT_FIELDS.join(', ')}), healthy (${HEALTHY_FIT_FIELDS.join(', ')}) or circuit (${CIRCUIT_FIT_FIELDS.join(', ')})`));
  }
  if (typeof c.value === 'object' && !Array.isArray(c.value)) {
    const refKind = factKind(c.value.fact, derived);
    if (refKind === undefined) out.push(issue(file, `${path}.value.fact`, `unknown fact "${c.value.fact}"`));
    if (refKind === 'quantities' && !(QUANTITY_NAMES as string[]).includes(c.value.path?.slice(2) ?? '')) out.push(issue(file, `${path}.value.path`, `"${c.value.path}" does not name a quantity the model computes`));
  }
  if (kind === 'observation') {
    const allowed = Object.keys(OBSERVATIONS[c.fact as ObservationName].values);
    const given = Array.isArray(c.value) ? c.value : [c.value];
    for (const v of given) if (typeof v !== 'string' || !allowed.includes(v)) out.push(issue(file, `${path}.value`, `${JSON.stringify(v)} is not an answer of "${c.fact}" (${allowed.join(', ')})`));
  }
  if (c.fact === 'testFindings' && typeof c.value === 'string' && !(TEST_FINDINGS as readonly string[]).includes(c.value)) {
    out.push(issue(file, `${path}.value`, `"${c.value}" is not a test finding (${TEST_FINDINGS.join(', ')})`));
  }
  if (c.fact === 'symptoms' && typeof c.value === 'string' && !(SYMPTOM_IDS as string[]).includes(c.value)) {
    out.push(issue(file, `${path}.value`, `"${c.value}" is not a symptom of dc-case/1`));
  }
  return out;
}

/** Placeholders of a `says` sentence name a quantity the model computes or an observation, as own names. */
function checkTemplate(says: string, file: string, path: string): Issue[] {
  const out: Issue[] = [];
  for (const [whole, kind, name] of says.matchAll(/\{(value|measured|ratio|obs):?\.?([A-Za-z0-9-]+)\}/g)) {
    const known = kind === 'obs' ? Object.hasOwn(OBSERVATIONS, name!) : (QUANTITY_NAMES as string[]).includes(name!);
    if (!known) out.push(issue(file, path, `${whole} names ${kind === 'obs' ? 'no observation' : 'no quantity the model computes'}: "${name}"`));
  }
  return out;
}

function factKind(fact: string, derived: Set<string>): 'observation' | 'derived' | (typeof STATIC_FACTS)[keyof typeof STATIC_FACTS] | undefined {
  // Own properties only: "toString" or "constructor" is not a fact because every object has one.
  if (Object.hasOwn(STATIC_FACTS, fact)) return STATIC_FACTS[fact as keyof typeof STATIC_FACTS];
  if (Object.hasOwn(OBSERVATIONS, fact)) return 'observation';
  if (derived.has(fact)) return 'derived';
  return undefined;
}

/** Every leaf of a condition, shared conditions expanded (each once), under any all/any/not. */
export function leavesOf(c: Condition, shared: Record<string, Condition>, seen = new Set<string>()): Leaf[] {
  if ('all' in c) return c.all.flatMap((x) => leavesOf(x, shared, seen));
  if ('any' in c) return c.any.flatMap((x) => leavesOf(x, shared, seen));
  if ('not' in c) return leavesOf(c.not, shared, seen);
  if ('condition' in c) {
    if (seen.has(c.condition) || !Object.hasOwn(shared, c.condition)) return [];
    return leavesOf(shared[c.condition]!, shared, new Set([...seen, c.condition]));
  }
  return [c];
}

/** Facts a condition reads, shared conditions expanded. */
export function factsRead(c: Condition, shared: Record<string, Condition>): string[] {
  return leavesOf(c, shared).flatMap((l) => [l.fact, ...(typeof l.value === 'object' && !Array.isArray(l.value) ? [l.value.fact] : [])]);
}

/** The shared conditions a condition names, without following them; iterative, so depth costs no stack. */
function conditionRefs(c: Condition): string[] {
  const refs: string[] = [];
  const todo: Condition[] = [c];
  for (let next = todo.pop(); next; next = todo.pop()) {
    if ('all' in next) todo.push(...next.all);
    else if ('any' in next) todo.push(...next.any);
    else if ('not' in next) todo.push(next.not);
    else if ('condition' in next) refs.push(next.condition);
  }
  return refs;
}

/**
 * Each cycle among shared conditions, as the names around it (first name repeated at the end):
 * expanding one would never end.
 */
export function sharedConditionCycles(shared: Record<string, Condition>): string[][] {
  const cycles: string[][] = [];
  const state = new Map<string, 'open' | 'done'>();
  const visit = (name: string, path: string[]) => {
    state.set(name, 'open');
    for (const ref of conditionRefs(shared[name]!)) {
      if (!Object.hasOwn(shared, ref)) continue;
      if (state.get(ref) === 'open') cycles.push([...(ref === name ? [] : path.slice(path.indexOf(ref))), name, ref]);
      else if (!state.has(ref)) visit(ref, [...path, name]);
    }
    state.set(name, 'done');
  };
  for (const name of Object.keys(shared).sort()) if (!state.has(name)) visit(name, []);
  return cycles;
}

function findDeriveCycle(base: RuleBase): { path: string[]; file: string; at: string } | undefined {
  const edges = new Map<string, { to: string; file: string; at: string }[]>();
  for (const { rule, file, at } of base.rules) {
    if (rule.kind !== 'derive') continue;
    for (const from of factsRead(rule.conditions, base.conditions)) {
      if (!edges.has(from)) edges.set(from, []);
      edges.get(from)!.push({ to: rule.derive, file, at: `${at} (${rule.name})` });
    }
  }
  const state = new Map<string, 'open' | 'done'>();
  const visit = (node: string, path: string[]): { path: string[]; file: string; at: string } | undefined => {
    state.set(node, 'open');
    for (const e of edges.get(node) ?? []) {
      if (state.get(e.to) === 'open') return { path: [...path, node, e.to].slice(path.indexOf(e.to) >= 0 ? path.indexOf(e.to) : 0), file: e.file, at: e.at };
      if (!state.has(e.to)) {
        const found = visit(e.to, [...path, node]);
        if (found) return found;
      }
    }
    state.set(node, 'done');
    return undefined;
  };
  for (const node of [...edges.keys()].sort()) {
    if (!state.has(node)) {
      const found = visit(node, []);
      if (found) return found;
    }
  }
  return undefined;
}

function duplicates(ids: string[]): string[] {
  return [...new Set(ids.filter((x, k) => ids.indexOf(x) !== k))];
}

function issue(file: string, path: string, message: string): Issue {
  return { code: 'rule-base', file, path, message };
}
