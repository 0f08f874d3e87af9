/**
 * What a workshop lead's review of a rule folder should catch beyond the loader's own checks:
 * causes no rule can reach, rules that can never fire, a cause ruled out and supported by the
 * same conditions, questions no rule uses.
 */
import { FIT_INPUTS } from '../model/fits/index.js';
import { placeholderTexts } from './draft-placeholders.js';
import { join } from 'node:path';
import type { RuleBase } from '../knowledge/load-rules.js';
import { factsRead, leavesOf } from '../knowledge/load-rules.js';
import type { Condition, Leaf } from '../knowledge/rulebase-schema.js';
import { quantitiesFedBy } from '../model/feeds.js';

export interface RuleFinding {
  kind: 'unreachable-cause' | 'never-fires' | 'ruled-out-and-supported' | 'unused-question' | 'placeholder-text' | 'schema' | 'case-out-of-top-3' | 'control-character';
  file: string;
  /** The rule, cause, question or case it is about. */
  about: string;
  message: string;
}

/** Leaves that must all hold together for a condition to hold (the top `all`, flattened). */
function conjunction(c: Condition, shared: Record<string, Condition>, seen = new Set<string>()): Leaf[] {
  if ('all' in c) return c.all.flatMap((x) => conjunction(x, shared, seen));
  if ('condition' in c && shared[c.condition] && !seen.has(c.condition)) return conjunction(shared[c.condition]!, shared, new Set([...seen, c.condition]));
  if ('fact' in c) return [c];
  return [];
}

/** Why these leaves cannot all hold, if they cannot. */
function contradiction(leaves: Leaf[]): string | undefined {
  const byFact = new Map<string, Leaf[]>();
  for (const l of leaves) {
    const key = `${l.fact}${l.path ?? ''}`;
    byFact.set(key, [...(byFact.get(key) ?? []), l]);
  }
  for (const [key, ls] of byFact) {
    const equal = ls.filter((l) => l.operator === 'is' || l.operator === 'equal').map((l) => JSON.stringify(l.value));
    if (new Set(equal).size > 1) return `${key} cannot be ${equal.join(' and ')} at once`;
    for (const l of ls.filter((x) => x.operator === 'is' || x.operator === 'equal')) {
      for (const m of ls) {
        if (m.operator === 'isNot' && JSON.stringify(m.value) === JSON.stringify(l.value)) return `${key} is required to be and not to be ${JSON.stringify(l.value)}`;
        if (m.operator === 'isNoneOf' && Array.isArray(m.value) && m.value.includes(l.value as string)) return `${key} is required to be ${JSON.stringify(l.value)} and none of ${JSON.stringify(m.value)}`;
        if (m.operator === 'isOneOf' && Array.isArray(m.value) && !m.value.includes(l.value as string)) return `${key} is required to be ${JSON.stringify(l.value)} and one of ${JSON.stringify(m.value)}`;
      }
    }
    const lower = ls.filter((l) => (l.operator === 'greaterThan' || l.operator === 'greaterThanInclusive') && typeof l.value === 'number');
    const upper = ls.filter((l) => (l.operator === 'lessThan' || l.operator === 'lessThanInclusive') && typeof l.value === 'number');
    for (const lo of lower) {
      for (const hi of upper) {
        const strict = lo.operator === 'greaterThan' || hi.operator === 'lessThan';
        if ((lo.value as number) > (hi.value as number) || (strict && lo.value === hi.value)) return `${key} must be above ${lo.value} and below ${hi.value}`;
      }
    }
  }
  return undefined;
}

export function reviewRuleBase(base: RuleBase): RuleFinding[] {
  const findings: RuleFinding[] = (base.controlText ?? []).map((i) => ({ kind: 'control-character', file: i.file, about: i.path, message: i.message }));
  const causesFile = join(base.dir, 'causes.json');
  for (const cause of base.causes) {
    if (!base.rules.some(({ rule }) => rule.kind === 'evidence' && rule.cause === cause.id && rule.weight > 0)) {
      findings.push({ kind: 'unreachable-cause', file: causesFile, about: cause.id, message: `no rule speaks for cause "${cause.id}": it can never be ranked` });
    }
  }
  const applies = new Map(base.causes.map((c) => [c.id, c.appliesTo]));
  for (const { rule, file, at } of base.rules) {
    const leaves = conjunction(rule.conditions, base.conditions);
    let why = contradiction(leaves);
    if (!why && (rule.kind === 'evidence' || rule.kind === 'rule-out')) {
      const only = applies.get(rule.cause)?.connections;
      const wants = leaves.find((l) => l.fact === 'connection' && (l.operator === 'equal' || l.operator === 'is'));
      if (only && wants && rule.kind === 'evidence' && !only.includes(wants.value as never)) why = `it asks for connection ${JSON.stringify(wants.value)}, but cause "${rule.cause}" applies only to ${only.join(', ')}`;
    }
    if (why) findings.push({ kind: 'never-fires', file, about: `${at} (${rule.name})`, message: `rule "${rule.name}" can never fire: ${why}` });
  }
  for (const { rule: out, file, at } of base.rules.filter(({ rule }) => rule.kind === 'rule-out')) {
    if (out.kind !== 'rule-out') continue;
    const same = base.rules.find(({ rule }) => rule.kind === 'evidence' && rule.cause === out.cause && rule.weight > 0 && JSON.stringify(rule.conditions) === JSON.stringify(out.conditions));
    if (same) findings.push({ kind: 'ruled-out-and-supported', file, about: `${at} (${out.name})`, message: `cause "${out.cause}" is ruled out by "${out.name}" and supported by "${same.rule.name}" on the same conditions` });
  }
  // A check's safety conditions read answers too: what the machine drives decides whether reversing is safe.
  const checkConditions = base.checks.flatMap((c) => [...(c.unsafeWhen ? [c.unsafeWhen.condition] : []), ...(c.cautions ?? []).map((x) => x.when)]);
  const read = new Set([...base.rules.flatMap(({ rule }) => factsRead(rule.conditions, base.conditions)), ...checkConditions.flatMap((c) => factsRead(c, base.conditions))]);
  const quantitiesRead = new Set(
    base.rules.flatMap(({ rule }) => leavesOf(rule.conditions, base.conditions).flatMap((l) => [l.path?.slice(2), typeof l.value === 'object' && !Array.isArray(l.value) ? l.value.path?.slice(2) : undefined])).filter((x): x is string => !!x),
  );
  const questionsFile = join(base.dir, 'questions.json');
  base.questions.forEach((q, k) => {
    const used =
      q.answer.kind === 'choice' ? read.has(q.answer.observation) :
      q.answer.kind === 'quantity' ? quantitiesFedBy(q.answer.reading).some((name) => quantitiesRead.has(name)) || (read.has('fit') && FIT_INPUTS.includes(q.answer.reading)) :
      q.answer.kind === 'series' ? read.has('testFindings') :
      read.has('symptoms');
    if (!used) findings.push({ kind: 'unused-question', file: questionsFile, about: `questions[${k}] (${q.id})`, message: `no rule uses the answer to question "${q.id}"` });
  });
  for (const p of placeholderTexts(base.causes, base.checks)) {
    const file = join(base.dir, p.path.startsWith('causes') ? 'causes.json' : 'checks.json');
    findings.push({ kind: 'placeholder-text', file, about: `${p.path} (${p.about})`, message: `still the draft's placeholder ${JSON.stringify(p.text)}: write what a fitter needs before this reaches one` });
  }
  return findings;
}
