/**
 * Evidence in the fitter's words. A rule's `says` is a sentence with placeholders filled from
 * the job's facts: {value.fieldCurrent}, {measured.speed} (number and unit), {ratio.speed}
 * (a percentage), {obs:leads-disturbed} (the answer's words), {fit:weakField} (a fit's sentence). Without `says`, the sentence is
 * built from the rule result's condition tree: each leaf that held, with the value it saw.
 */
import type { Expectation } from '../model/expected.js';
import { QUANTITY_LABELS, type QuantityName } from '../model/quantity-names.js';
import { OBSERVATIONS, SYMPTOMS, type ObservationName } from '../knowledge/vocabulary.js';
import type { Facts } from './facts.js';

const UNIT_WORDS: Record<string, string> = { degC: '°C', ohm: 'Ω', Mohm: 'MΩ', '1': '', 'N m': 'N·m' };

export function formatNumber(x: number): string {
  const abs = Math.abs(x);
  const digits = abs >= 100 ? 0 : abs >= 10 ? 1 : abs >= 1 ? 2 : 3;
  return String(Number(x.toFixed(digits)));
}

function withUnit(x: number, unit: string): string {
  const u = UNIT_WORDS[unit] ?? unit;
  return u ? `${formatNumber(x)} ${u}` : formatNumber(x);
}

export function fillTemplate(template: string, facts: Facts, e: Expectation): string {
  return template.replace(/\{(value|measured|ratio|obs|tests|fit):?\.?([A-Za-z0-9-]+)\}/g, (whole, kind: string, name: string) => {
    if (kind === 'tests') return (facts.testWords as Record<string, string> | undefined)?.[name] ?? 'no such test';
    // {fit:extraResistance}: the fit's own sentence with its numbers (src/model/fits/describe.ts).
    if (kind === 'fit') return (facts.fitSays as Record<string, string> | undefined)?.[name] ?? whole;
    if (kind === 'obs') {
      const spec = Object.hasOwn(OBSERVATIONS, name) ? OBSERVATIONS[name as ObservationName] : undefined;
      const answer = facts[name];
      return spec && typeof answer === 'string' ? (spec.values as Record<string, string>)[answer] ?? answer : 'unknown';
    }
    const q = Object.hasOwn(e.quantities, name) ? e.quantities[name as QuantityName] : undefined;
    if (!q) return whole;
    if (kind === 'ratio') return q.ratio === null ? '?' : `${Math.round(q.ratio * 100)} %`;
    const x = kind === 'value' ? q.value : q.measured;
    return x === null ? '?' : withUnit(x, q.unit);
  });
}

interface TreeLeaf {
  fact: string;
  path?: string;
  operator: string;
  value: unknown;
  factResult?: unknown;
  result?: boolean;
}

/** Leaves of a condition tree that held, in order. */
function heldLeaves(node: unknown): TreeLeaf[] {
  if (!node || typeof node !== 'object') return [];
  const n = node as Record<string, unknown>;
  for (const key of ['all', 'any'] as const) if (Array.isArray(n[key])) return (n[key] as unknown[]).flatMap(heldLeaves);
  if (n.not) return [];
  if (typeof n.fact === 'string' && n.result === true) return [n as unknown as TreeLeaf];
  return [];
}

const MACHINE_WORDS: Record<string, string> = { connection: 'connection', drive: 'drive', feedback: 'speed feedback', cooling: 'cooling' };
/** A yes-or-no trait of the machine, said as a sentence either way. */
const MACHINE_TRAITS: Record<string, [string, string]> = {
  hasShuntField: ['the machine has a shunt field', 'the machine has no shunt field'],
  hasSeriesField: ['the machine has a series field', 'the machine has no series field'],
};

const OPERATOR_WORDS: Record<string, string> = {
  greaterThan: 'above',
  greaterThanInclusive: 'at least',
  lessThan: 'below',
  lessThanInclusive: 'at most',
};

/** Words for a derived fact: what the rule that derived it saw. */
export type DerivedWords = (fact: string) => string | undefined;

export function describeTree(tree: unknown, e: Expectation, derivedWords: DerivedWords = () => undefined): string {
  const parts = heldLeaves(tree).map((leaf) => {
    const name = leaf.path?.slice(2);
    const derived = derivedWords(leaf.fact);
    if (derived !== undefined) return derived;
    if (leaf.fact === 'symptoms') return SYMPTOMS[leaf.value as keyof typeof SYMPTOMS] ?? String(leaf.value);
    if (Object.hasOwn(OBSERVATIONS, leaf.fact)) {
      const spec = OBSERVATIONS[leaf.fact as ObservationName];
      return `${spec.says}: ${Object.hasOwn(spec.values, String(leaf.factResult)) ? (spec.values as Record<string, string>)[String(leaf.factResult)] : String(leaf.factResult).replace(/-/g, ' ')}`;
    }
    if (leaf.fact === 'findings') return e.findings.find((f) => f.code === leaf.value)?.says ?? String(leaf.value).replace(/-/g, ' ');
    if (name && Object.hasOwn(QUANTITY_LABELS, name)) {
      const q = Object.hasOwn(e.quantities, name) ? e.quantities[name as QuantityName] : undefined;
      const label = QUANTITY_LABELS[name as QuantityName];
      if (leaf.fact === 'ratio' && q && q.measured !== null) {
        return `${label} ${withUnit(q.measured, q.unit)} is ${Math.round((q.ratio ?? 0) * 100)} % of the expected ${withUnit(q.value, q.unit)}`;
      }
      if (q) return `${label} ${withUnit(leaf.fact === 'measured' && q.measured !== null ? q.measured : q.value, q.unit)} ${OPERATOR_WORDS[leaf.operator] ?? leaf.operator} ${describeValue(leaf.value, e)}`;
    }
    if (typeof leaf.factResult === 'boolean' && Object.hasOwn(MACHINE_TRAITS, leaf.fact)) return MACHINE_TRAITS[leaf.fact]![leaf.factResult ? 0 : 1];
    if (Object.hasOwn(MACHINE_WORDS, leaf.fact)) return `${MACHINE_WORDS[leaf.fact]}: ${String(leaf.factResult).replace(/-/g, ' ')}`;
    return `${leaf.fact} ${leaf.operator} ${JSON.stringify(leaf.value)}`;
  });
  return parts.join('; ');
}

function describeValue(v: unknown, e: Expectation): string {
  if (v && typeof v === 'object' && 'path' in v) {
    const name = String((v as { path: string }).path).slice(2) as QuantityName;
    const q = e.quantities[name];
    return q ? `the ${QUANTITY_LABELS[name]} ${withUnit(q.value, q.unit)}` : name;
  }
  return String(v);
}
