/**
 * The troubleshooting loop: what a worked check found comes back into the ranking, the next check
 * is chosen on what is now known, and the loop says when the fault is found.
 *
 * The method is certainty factors extended to test results (Shortliffe and Buchanan's MYCIN
 * combination, as the rules use). A check shows the causes that list it in the catalogue, each
 * with a sensitivity s — how reliably it shows that cause when present (data on the check; by
 * default 0.6 for looking, 0.8 for a live test, 0.9 isolated):
 * - `normal`: evidence −s against each cause it shows: a reliable check that finds nothing
 *   nearly clears them; a weak one only dents them.
 * - `abnormal`: evidence +s·r for each cause it shows, r being that cause's share of the belief
 *   among the causes the check shows just before the result (the likelier one explains more of
 *   it), and −0.3·s against every other cause: with one fault at a time, a fault found here makes
 *   a fault elsewhere less likely (a second, unrelated defect stays possible, so the weight is small).
 * - `inconclusive`: nothing.
 *
 * A cause is confirmed when an abnormal result on a check that shows it leaves it at 0.8 or more
 * and 0.4 clear of every other cause that check could also show — or when the fitter says so.
 *
 * The next check is the one with the most value per minute (the p/c order of search theory:
 * Mitten 1960; Kadane and Simon 1977; Heckerman, Breese and Rommelse 1995 for troubleshooting;
 * cited from memory), where the value is the chance the check settles the question — it comes
 * back abnormal and that confirms a cause — plus half the share of the remaining uncertainty
 * (entropy over the causes) it is expected to remove. A check that would show seven causes at
 * once rarely confirms anything and removes little uncertainty, so it ranks low however cheap.
 */
import type { Check, MachineState } from '../knowledge/rulebase-schema.js';
import type { WorkedCheck } from '../knowledge/case-schema.js';
import { combine } from './certainty.js';

export const DEFAULT_SENSITIVITY: Record<MachineState, number> = { observe: 0.6, 'live-test': 0.8, isolated: 0.9 };
/** Share of a check's sensitivity that an abnormal result weighs against the causes it does not show. */
export const ELSEWHERE_SHARE = 0.3;
export const CONFIRM_SCORE = 0.8;
export const CONFIRM_MARGIN = 0.4;
/** Every cause still possible keeps a little probability, so that its checks stay in view. */
const PROBABILITY_FLOOR = 0.02;
/** A check that comes back abnormal with none of its causes present (a false alarm). */
const FALSE_ALARM = 0.02;
/** The belief, when choosing a check, that the fault is none of the causes in play. */
const UNLISTED_SHARE = 0.1;
const UNLISTED = '(a cause not in play)';
/** Weight of the expected uncertainty removed, beside the chance of settling the question. */
const INFORMATION_WEIGHT = 0.5;

export interface LoopEvidence {
  rule: string;
  says: string;
  weight: number;
}

/** How reliably `check` shows `cause` when it is present. */
export function sensitivity(check: Check, cause: string): number {
  return check.sensitivityFor?.[cause] ?? check.sensitivity ?? DEFAULT_SENSITIVITY[check.state];
}

const RESULT_WORDS = { normal: 'normal', abnormal: 'abnormal (shows a fault)', inconclusive: 'inconclusive' } as const;

/**
 * The evidence each worked check's result gives, per cause, given the scores the rules gave
 * (`ruleScores`). Results are applied in the order worked. An abnormal result is shared among
 * the causes the check shows in proportion to how likely each was just before it: the fault is
 * one of them, and the likelier one explains it more (Bayes' rule, in certainty-factor form).
 */
export function resultEvidence(
  worked: readonly WorkedCheck[],
  checks: ReadonlyMap<string, Check>,
  shows: ReadonlyMap<string, readonly string[]>,
  ruleScores: ReadonlyMap<string, number>,
): Map<string, LoopEvidence[]> {
  const out = new Map<string, LoopEvidence[]>();
  const scores = new Map(ruleScores);
  const add = (cause: string, e: LoopEvidence) => {
    out.set(cause, [...(out.get(cause) ?? []), e]);
    scores.set(cause, combine(scores.get(cause) ?? 0, e.weight));
  };
  for (const w of worked) {
    const check = checks.get(w.id);
    if (!check || w.result === 'inconclusive') continue;
    const shown = (shows.get(w.id) ?? []).filter((c) => scores.has(c));
    const finding = w.finding ? `: ${w.finding}` : '';
    const belief = beliefs(scores);
    const shownBelief = shown.reduce((t, c) => t + belief.get(c)!, 0) || 1;
    for (const cause of shown) {
      const s = sensitivity(check, cause);
      if (w.result === 'normal') {
        add(cause, { rule: `check:${w.id}`, weight: -s, says: `${check.title}: normal${finding} — it shows this fault ${Math.round(s * 100)} % of the time, so this weighs against it` });
      } else {
        const share = belief.get(cause)! / shownBelief;
        add(cause, { rule: `check:${w.id}`, weight: Number((s * share).toFixed(3)), says: `${check.title}: ${RESULT_WORDS.abnormal}${finding}${shown.length > 1 ? ` — one of ${shown.length} faults it shows; this one explains ${Math.round(share * 100)} % of it` : ''}` });
      }
    }
    if (w.result === 'abnormal') {
      const s = check.sensitivity ?? DEFAULT_SENSITIVITY[check.state];
      for (const cause of scores.keys()) {
        if (shown.includes(cause)) continue;
        add(cause, { rule: `check:${w.id}`, weight: -ELSEWHERE_SHARE * s, says: `${check.title} found a fault elsewhere${finding}` });
      }
    }
  }
  return out;
}

/** The cause an abnormal result confirms, if it leaves one clearly ahead of the others its check shows. */
export function confirmedBy(shown: readonly string[], score: (cause: string) => number): string | undefined {
  const ranked = [...shown].sort((a, b) => score(b) - score(a));
  const [top, second] = ranked;
  if (top === undefined || score(top) < CONFIRM_SCORE) return undefined;
  if (second !== undefined && score(second) > score(top) - CONFIRM_MARGIN) return undefined;
  return top;
}

/** Probabilities over the causes still possible: positive scores plus a floor, normalised. */
export function beliefs(scores: ReadonlyMap<string, number>): Map<string, number> {
  const raw = [...scores].map(([id, s]) => [id, Math.max(0, s) + PROBABILITY_FLOOR] as const);
  const total = raw.reduce((t, [, p]) => t + p, 0) || 1;
  return new Map(raw.map(([id, p]) => [id, p / total]));
}

function entropy(p: Iterable<number>): number {
  let h = 0;
  for (const x of p) if (x > 0) h -= x * Math.log2(x);
  return h;
}

/**
 * The value per minute of doing `check` next: the chance it settles the question (an abnormal
 * result that confirms a cause, by the same update a real result gets), plus half the share of
 * the uncertainty it is expected to remove. The uncertainty is the entropy of the beliefs, and
 * what a result would leave is worked out by Bayes' rule with the check's sensitivities and a 2 %
 * false-alarm rate, so that the expected removal is never negative.
 */
export function checkValue(check: Check, shown: readonly string[], scores: ReadonlyMap<string, number>): number {
  const inShown = shown.filter((c) => scores.has(c));
  if (inShown.length === 0) return 0;
  // Outcome 0 abnormal, 1 normal.
  const abnormalUnder = (c: string) => (inShown.includes(c) ? sensitivity(check, c) : FALSE_ALARM);
  const { removed, chances } = uncertaintyRemoved(scores, 2, (c, k) => (k === 0 ? abnormalUnder(c) : 1 - abnormalUnder(c)));
  // What a real abnormal result would do to the scores, and whether that confirms a cause.
  const after = resultEvidence([{ id: check.id, result: 'abnormal' }], new Map([[check.id, check]]), new Map([[check.id, inShown]]), scores);
  const scoreAfter = (c: string) => (after.get(c) ?? []).reduce((v, e) => combine(v, e.weight), scores.get(c) ?? 0);
  const settles = confirmedBy(inShown, scoreAfter) !== undefined ? chances[0]! : 0;
  return (settles + INFORMATION_WEIGHT * removed) / check.minutes;
}

/**
 * The value per minute of a check that takes a reading tied hypotheses predict differently: it
 * settles nothing by itself, but its reading comes out as one of them predicts, which removes
 * the uncertainty between their causes. Half the share of the uncertainty it is expected to
 * remove, per minute, as for any other check. `likelihoods`: per cause, the chance of each outcome.
 */
export function separationValue(check: Check, likelihoods: ReadonlyMap<string, readonly number[]>, scores: ReadonlyMap<string, number>): number {
  const outcomes = [...likelihoods.values()][0]?.length ?? 0;
  const { removed } = uncertaintyRemoved(scores, outcomes, (c, k) => likelihoods.get(c)?.[k] ?? 1 / outcomes);
  return (INFORMATION_WEIGHT * removed) / check.minutes;
}

/**
 * The share of the uncertainty (entropy over the causes in play, plus the share that it is none
 * of them) a result is expected to remove, by Bayes' rule with `likelihood(cause, outcome)`; and
 * the chance of each outcome. Never negative.
 */
function uncertaintyRemoved(scores: ReadonlyMap<string, number>, outcomes: number, likelihood: (cause: string, outcome: number) => number): { removed: number; chances: number[] } {
  // The fault may be none of the causes in play: that share keeps a check that could clear them all worth doing.
  const p = new Map([...beliefs(scores)].map(([c, x]) => [c, x * (1 - UNLISTED_SHARE)] as const));
  p.set(UNLISTED, UNLISTED_SHARE);
  const h = entropy(p.values());
  const chances: number[] = [];
  let after = 0;
  for (let k = 0; k < outcomes; k++) {
    const joint = [...p].map(([c, x]) => x * likelihood(c, k));
    const total = joint.reduce((t, x) => t + x, 0);
    chances.push(total);
    if (total > 0) after += total * entropy(joint.map((x) => x / total));
  }
  return { removed: h > 0 ? Math.max(0, (h - after) / h) : 0, chances };
}
