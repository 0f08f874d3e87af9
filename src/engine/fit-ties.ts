/**
 * Where the readings cannot choose: two fitted hypotheses explain them equally well, and a
 * reading not yet taken would tell them apart (src/model/fits). Which causes each hypothesis
 * speaks for is read from the rule files — the rules that support a cause when its fit is best —
 * so the question policy and the choice of the next check can go after that reading.
 */
import type { Condition } from '../knowledge/rulebase-schema.js';
import type { RuleBase } from '../knowledge/load-rules.js';
import type { Facts } from './facts.js';

export interface Separation {
  /** The reading that would tell them apart: each hypothesis predicts its own value of it. */
  reading: string;
  /** The tied hypotheses it separates (two or more), and the causes still in play that each speaks for. */
  between: { hypothesis: string; causes: string[] }[];
}

const causesOfHypotheses = new WeakMap<RuleBase, Map<string, string[]>>();

function bestLeaves(c: Condition): string[] {
  if ('all' in c) return c.all.flatMap(bestLeaves);
  if ('any' in c) return c.any.flatMap(bestLeaves);
  if ('not' in c || 'condition' in c) return [];
  const m = c.fact === 'fit' && c.operator === 'equal' && c.value === 'best' ? /^\$\.([A-Za-z0-9]+)\.verdict$/.exec(c.path ?? '') : null;
  return m ? [m[1]!] : [];
}

/** Hypothesis → the causes its "best" verdict supports, from the rule base's evidence rules. */
export function hypothesisCauses(base: RuleBase): Map<string, string[]> {
  const known = causesOfHypotheses.get(base);
  if (known) return known;
  const out = new Map<string, string[]>();
  for (const { rule } of base.rules) {
    if (rule.kind !== 'evidence' || !(rule.weight > 0)) continue;
    for (const h of bestLeaves(rule.conditions)) if (!out.get(h)?.includes(rule.cause)) out.set(h, [...(out.get(h) ?? []), rule.cause]);
  }
  causesOfHypotheses.set(base, out);
  return out;
}

/** Per reading, the tied hypotheses it would separate whose causes are still in play (a cause counts for the first hypothesis that names it). */
export function separations(facts: Facts, base: RuleBase, inPlay: ReadonlySet<string>): Separation[] {
  const ties = (facts.fitTies ?? []) as { a: string; b: string; separatedBy: string[] }[];
  const causes = hypothesisCauses(base);
  const byReading = new Map<string, string[]>();
  for (const t of ties) {
    for (const reading of t.separatedBy) {
      const list = byReading.get(reading) ?? [];
      for (const h of [t.a, t.b]) if (!list.includes(h)) list.push(h);
      byReading.set(reading, list);
    }
  }
  const out: Separation[] = [];
  for (const [reading, hypotheses] of byReading) {
    const claimed = new Set<string>();
    const between = hypotheses.flatMap((hypothesis) => {
      const own = (causes.get(hypothesis) ?? []).filter((c) => inPlay.has(c) && !claimed.has(c));
      own.forEach((c) => claimed.add(c));
      return own.length ? [{ hypothesis, causes: own }] : [];
    });
    if (between.length >= 2) out.push({ reading, between });
  }
  return out;
}

/** How surely a reading the fits wait on comes out as the true hypothesis predicts (the predictions differ by more than the reading's tolerance). */
const AS_PREDICTED = 0.85;

/**
 * The chance of each outcome of a separating reading under each cause: outcome k is "as
 * hypothesis k predicts"; a cause of hypothesis k gives it with 0.85 and the others share the
 * rest; a cause none of them speaks for gives every outcome alike.
 */
export function outcomeLikelihoods(s: Separation, causeIds: Iterable<string>): Map<string, number[]> {
  const k = s.between.length;
  const out = new Map<string, number[]>();
  for (const c of causeIds) out.set(c, Array.from({ length: k }, () => 1 / k));
  s.between.forEach((h, j) => {
    for (const c of h.causes) out.set(c, Array.from({ length: k }, (_, i) => (i === j ? AS_PREDICTED : (1 - AS_PREDICTED) / (k - 1))));
  });
  return out;
}
