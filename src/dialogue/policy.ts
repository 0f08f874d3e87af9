/**
 * Which question to ask next: the one with the largest expected information gain about the
 * cause (Shannon entropy of the belief over causes, before minus expected after the answer).
 *
 * Running the rule engine for every question × answer would take seconds, so the rules are
 * compiled once into what the policy needs: for each question and cause, how likely each answer
 * is. A choice answer named by a cause's supporting rule becomes more likely under that cause
 * (a factor e^(3w) for weight w), one named by an opposing rule less likely. A reading is
 * modelled as "out of the healthy band" or not: likely out of band (0.8) for causes whose rules
 * look at the quantities it feeds, unlikely (0.2) for the others.
 *
 * The engine itself runs only on the answers actually given.
 */
import type { Diagnosis } from '../engine/diagnose.js';
import type { Condition, Leaf } from '../knowledge/rulebase-schema.js';
import type { RuleBase } from '../knowledge/load-rules.js';
import { quantitiesFedBy } from '../model/feeds.js';
import type { DialogueQuestion } from './questions.js';
import { compareIds } from '../engine/compare-ids.js';
import { SERIES_OUTCOMES } from '../model/series/findings.js';
import { outcomeLikelihoods } from '../engine/fit-ties.js';

export interface CompiledQuestion {
  question: DialogueQuestion;
  /** cause id → probability of each answer (same order as `answers`). */
  likelihood: Map<string, number[]>;
  answers: string[];
}

export interface Policy {
  questions: CompiledQuestion[];
  causeIds: string[];
}

/**
 * How often a fitter at the machine can answer, by what the question needs: what can be seen
 * is usually known, a live measurement often, an isolated test seldom during the call-out
 * (common practice). The expected gain is scaled by it, so a question that is usually answered
 * "unknown" is asked later.
 */
const CHANCE_OF_AN_ANSWER: Record<DialogueQuestion['state'], number> = { observe: 0.85, 'live-test': 0.6, isolated: 0.3 };
/** Once the machine stands isolated, isolated tests are what can be done, and nothing that needs it running. */
const CHANCE_WHEN_ISOLATED: Record<DialogueQuestion['state'], number> = { observe: 0.85, 'live-test': 0.1, isolated: 0.85 };
const CHANCE_OF_A_RUNNING_ANSWER_WHEN_STOPPED = 0.3;
/** A stopped machine is halfway to an isolated one. */
const CHANCE_OF_AN_ISOLATED_ANSWER_WHEN_STOPPED = 0.55;

function chanceOfAnswer(q: DialogueQuestion, presentState: unknown): number {
  if (presentState === 'isolated') return q.source?.needsRunning ? 0.1 : CHANCE_WHEN_ISOLATED[q.state];
  if (presentState === 'stopped' || presentState === 'tripped') {
    if (q.source?.needsRunning) return CHANCE_OF_A_RUNNING_ANSWER_WHEN_STOPPED;
    if (q.state === 'isolated') return CHANCE_OF_AN_ISOLATED_ANSWER_WHEN_STOPPED;
  }
  return CHANCE_OF_AN_ANSWER[q.state];
}

/** An answer a rule of weight w names is e^(3w) times as likely under its cause. */
const ANSWER_WEIGHT_SCALE = 3;
const OUT_OF_BAND_IF_WATCHED = 0.7;
const OUT_OF_BAND_OTHERWISE = 0.25;
/** Belief given to a cause no evidence speaks for yet, against scores in (0, 1]. */
const UNSEEN_CAUSE_BELIEF = 0.01;

/** Leaves a condition reaches, derived facts and shared conditions expanded, each with the sign it holds under. */
function leavesOf(c: Condition, base: RuleBase, derivers: Map<string, Condition[]>, sign: 1 | -1, seen: Set<string>): { leaf: Leaf; sign: 1 | -1 }[] {
  if ('all' in c) return c.all.flatMap((x) => leavesOf(x, base, derivers, sign, seen));
  if ('any' in c) return c.any.flatMap((x) => leavesOf(x, base, derivers, sign, seen));
  if ('not' in c) return leavesOf(c.not, base, derivers, sign === 1 ? -1 : 1, seen);
  if ('condition' in c) {
    const shared = base.conditions[c.condition];
    return shared && !seen.has(`c:${c.condition}`) ? leavesOf(shared, base, derivers, sign, new Set([...seen, `c:${c.condition}`])) : [];
  }
  const via = derivers.get(c.fact);
  if (via && !seen.has(`d:${c.fact}`)) {
    const next = new Set([...seen, `d:${c.fact}`]);
    return [{ leaf: c, sign }, ...via.flatMap((x) => leavesOf(x, base, derivers, sign, next))];
  }
  return [{ leaf: c, sign }];
}

export function compilePolicy(base: RuleBase, questions: DialogueQuestion[]): Policy {
  const derivers = new Map<string, Condition[]>();
  for (const { rule } of base.rules) if (rule.kind === 'derive') derivers.set(rule.derive, [...(derivers.get(rule.derive) ?? []), rule.conditions]);
  const evidence = base.rules.flatMap(({ rule }) => (rule.kind === 'evidence' ? [{ cause: rule.cause, weight: rule.weight, leaves: leavesOf(rule.conditions, base, derivers, 1, new Set()) }] : []));
  const causeIds = base.causes.map((c) => c.id);
  const compiled: CompiledQuestion[] = [];
  for (const q of questions) {
    const t = q.target;
    if (t.section === 'observations' && q.answer.kind === 'choice') {
      const answers = q.answer.options.map((o) => o.value);
      const likelihood = new Map<string, number[]>();
      for (const cause of causeIds) {
        const factor = answers.map(() => 1);
        for (const ev of evidence.filter((e) => e.cause === cause)) {
          for (const { leaf, sign } of ev.leaves.filter((l) => l.leaf.fact === t.name)) {
            const named = Array.isArray(leaf.value) ? leaf.value : [leaf.value];
            const positive = leaf.operator === 'is' || leaf.operator === 'isOneOf' || leaf.operator === 'equal';
            answers.forEach((a, k) => {
              const holds = named.includes(a) === positive;
              if (holds) factor[k]! *= Math.exp(ANSWER_WEIGHT_SCALE * ev.weight * sign);
            });
          }
        }
        const total = factor.reduce((s, x) => s + x, 0);
        likelihood.set(cause, factor.map((x) => x / total));
      }
      compiled.push({ question: q, likelihood, answers });
    } else if (t.section === 'tests') {
      // Each answer is one finding the series can bring; rules naming it weigh as for a choice.
      const answers = [...SERIES_OUTCOMES[t.name]];
      const likelihood = new Map<string, number[]>();
      for (const cause of causeIds) {
        const factor = answers.map(() => 1);
        for (const ev of evidence.filter((e) => e.cause === cause)) {
          for (const { leaf, sign } of ev.leaves.filter((l) => l.leaf.fact === 'testFindings' && (answers as unknown[]).includes(l.leaf.value))) {
            const positive = leaf.operator === 'contains';
            answers.forEach((a, k) => {
              if ((leaf.value === a) === positive) factor[k]! *= Math.exp(ANSWER_WEIGHT_SCALE * ev.weight * sign);
            });
          }
        }
        const total = factor.reduce((s, x) => s + x, 0);
        likelihood.set(cause, factor.map((x) => x / total));
      }
      compiled.push({ question: q, likelihood, answers });
    } else if (t.section === 'readings') {
      const fed = new Set(quantitiesFedBy(t.name));
      const likelihood = new Map<string, number[]>();
      for (const cause of causeIds) {
        const watched = evidence.some((e) => e.cause === cause && e.leaves.some(({ leaf }) => (leaf.fact === 'ratio' || leaf.fact === 'value' || leaf.fact === 'measured') && (fed as Set<string>).has(leaf.path?.slice(2) ?? '')));
        const p = watched ? OUT_OF_BAND_IF_WATCHED : OUT_OF_BAND_OTHERWISE;
        likelihood.set(cause, [p, 1 - p]);
      }
      compiled.push({ question: q, likelihood, answers: ['out-of-band', 'in-band'] });
    }
  }
  return { questions: compiled, causeIds };
}

/** Belief over the causes still possible, from the engine's scores. */
export function belief(d: Diagnosis, causeIds: string[]): Map<string, number> {
  const out = new Set(d.ruledOut.map((r) => r.id));
  const score = new Map(d.causes.map((c) => [c.id, c.score]));
  const raw = causeIds.filter((id) => !out.has(id)).map((id) => [id, Math.max(0, score.get(id) ?? 0) + UNSEEN_CAUSE_BELIEF] as const);
  const total = raw.reduce((s, [, x]) => s + x, 0);
  return new Map(raw.map(([id, x]) => [id, x / total]));
}

const entropy = (ps: Iterable<number>) => {
  let h = 0;
  for (const p of ps) if (p > 0) h -= p * Math.log2(p);
  return h;
};

export function informationGain(cq: CompiledQuestion, b: Map<string, number>): number {
  const before = entropy(b.values());
  let after = 0;
  cq.answers.forEach((_, k) => {
    const joint = [...b].map(([c, p]) => p * (cq.likelihood.get(c)?.[k] ?? 0));
    const pa = joint.reduce((s, x) => s + x, 0);
    if (pa > 0) after += pa * entropy(joint.map((x) => x / pa));
  });
  return before - after;
}

export interface Choice {
  question: DialogueQuestion;
  gain: number;
}

/** An isolated question is asked only when it separates the leaders clearly better than any other. */
const ISOLATION_PREMIUM = 1.5;
/** Below this many bits no question is worth asking. */
export const MIN_GAIN_BITS = 0.03;

/**
 * A reading that would tell tied hypotheses apart, as a question of its own: each answer is "as
 * one of them predicts", likely under that one's causes (src/engine/fit-ties.ts).
 */
function separatingQuestion(cq: CompiledQuestion, d: Diagnosis): CompiledQuestion | undefined {
  const t = cq.question.target;
  const s = t.section === 'readings' ? (d.tellApart ?? []).find((x) => x.reading === t.name) : undefined;
  if (!s) return undefined;
  return { question: cq.question, likelihood: outcomeLikelihoods(s, cq.likelihood.keys()), answers: s.between.map((h) => `as ${h.hypothesis} predicts`) };
}

export function rankQuestions(policy: Policy, d: Diagnosis, available: (q: DialogueQuestion) => boolean): Choice[] {
  const b = belief(d, policy.causeIds);
  return policy.questions
    .filter((cq) => available(cq.question))
    .map((cq) => {
      const split = separatingQuestion(cq, d);
      const gain = Math.max(informationGain(cq, b), split ? informationGain(split, b) : 0);
      return { question: cq.question, gain: chanceOfAnswer(cq.question, d.facts['present-state']) * gain };
    })
    .sort((x, y) => y.gain - x.gain || compareIds(x.question.id, y.question.id));
}

export function chooseQuestion(policy: Policy, d: Diagnosis, available: (q: DialogueQuestion) => boolean, standsIsolated = false): Choice | undefined {
  const ranked = rankQuestions(policy, d, available).filter((c) => c.gain >= MIN_GAIN_BITS);
  const bestNear = ranked.find((c) => c.question.state !== 'isolated');
  const bestIsolated = ranked.find((c) => c.question.state === 'isolated');
  if (!bestIsolated) return bestNear;
  if (!bestNear) return bestIsolated;
  // Isolated now: finish what isolation can tell before energising again (no live, isolated, live, isolated).
  if (standsIsolated) return bestIsolated;
  return bestIsolated.gain > bestNear.gain * ISOLATION_PREMIUM ? bestIsolated : bestNear;
}

/** The leading cause is clear: strong, and well ahead of the next. */
export function leaderIsClear(d: Diagnosis): boolean {
  const [first, second] = d.causes;
  return first !== undefined && first.score >= 0.8 && first.score - (second?.score ?? 0) >= 0.3;
}

