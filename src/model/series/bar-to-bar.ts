/**
 * Bar-to-bar readings round a commutator: one per adjacent pair, bars 1–2 first. Each reading is
 * normalised to the median; an outlier is named by its bars and kind, and outliers that one fault
 * explains (both readings beside one bar, or one wave coil seen a pole-pair pitch apart) are told
 * as one pattern. A regular alternation (two coils per slot, with end connections of two lengths)
 * is the winding's own pattern: each phase of it is normalised to its own median.
 *
 * Thresholds: a reading 10 % or more off the median is suspect (US Army TM 55-2210-223-34, the
 * comparative bar-to-bar test: 10 % above the average means a poor riser joint, below it a
 * shorted coil), or five robust standard deviations of this series' own scatter if that is wider.
 *
 * The readings are taken as the resistance between the two bars with the brushes lifted (or the
 * drop across them with a test current fed in and out at the same two bars), so an open coil's
 * pair reads the rest of the winding: C times the median on a lap winding, C/p on a wave winding.
 */
import { median, robustSpread } from './robust.js';
import { chainCoils, openRatio, pairsThrough, windingRings, type WindingKind, type WindingRing } from './winding.js';

export const BAR_FAULT_KINDS = ['open', 'high-resistance', 'short', 'ground'] as const;
export type BarFaultKind = (typeof BAR_FAULT_KINDS)[number];

export interface BarToBarSeries {
  method: 'resistance' | 'voltage-drop';
  winding: WindingKind;
  poles?: number | undefined;
  /** One reading per adjacent pair, bars 1–2 first, in one unit. */
  values: readonly number[];
  /** Bar-to-shaft readings, bar 1 first, in the same unit. */
  toShaft?: readonly number[] | undefined;
}

export type Confidence = 'high' | 'medium' | 'low';

export interface BarSuspect {
  /** Bars from 1: the pair read (a ground names the bar nearest it twice). */
  bars: [number, number];
  kind: BarFaultKind;
  /** Reading over the median, minus 1. */
  deviation: number;
  confidence: Confidence;
}

export interface BarToBarAnalysis {
  suspects: BarSuspect[];
  /** What the suspects make together, in words. */
  pattern: string;
  next: string[];
  median: number;
  /** Each reading over its reference (the median, or its phase's median for an alternating winding). */
  ratios: number[];
  /** Readings repeat with this period (1: no alternation). */
  period: number;
  /** Fraction off the median beyond which a reading is suspect. */
  threshold: number;
  /** False when the readings say more about the test than the winding (most of them zero). */
  usable: boolean;
}

/** TM 55-2210-223-34: 10 % off the average of the comparative test. */
export const BAR_TOLERANCE = 0.1;
const SPREAD_MULTIPLE = 5;
/** A bar-to-shaft reading this far below the series' median is the ground's bar. */
const GROUND_FRACTION = 0.3;

export function analyseBarToBar(series: BarToBarSeries): BarToBarAnalysis {
  const v = series.values;
  const bars = v.length;
  if (!(median(v) > 0)) {
    // Half the readings or more at zero: the test, not the winding, needs looking at first.
    const ground = groundOf(series.toShaft);
    return { suspects: ground ? [ground] : [], pattern: 'most readings are zero: check the test current, the leads and the meter range, then repeat', next: ['repeat the test'], median: median(v), ratios: v.map(() => 0), period: 1, threshold: BAR_TOLERANCE, usable: false };
  }
  const { period, reference } = alternation(v);
  const ratios = v.map((x, i) => (reference[i % period]! > 0 ? x / reference[i % period]! : NaN));
  const threshold = Math.max(BAR_TOLERANCE, SPREAD_MULTIPLE * robustSpread(ratios));
  const allowed = windingRings(bars, series.winding, series.poles);
  const rings = allowed.length ? allowed : windingRings(bars, 'lap', undefined);
  // An unknown winding is judged as lap: a wave winding's open coil then reads as a high resistance.
  // Ten times the median is open on any winding: a riser joint that poor is open in all but name.
  const openAt = Math.min(10, Math.max(2, 0.6 * Math.min(...rings.map(openRatio))));

  const suspects: BarSuspect[] = [];
  ratios.forEach((r, i) => {
    const d = r - 1;
    let kind: BarFaultKind | undefined;
    if (r >= openAt) kind = 'open';
    else if (d >= threshold) kind = 'high-resistance';
    else if (-d >= threshold) kind = 'short';
    if (kind) suspects.push({ bars: [i + 1, (i + 1) % bars + 1], kind, deviation: round(d), confidence: confidenceOf(Math.abs(d), threshold, kind) });
  });
  const ground = groundOf(series.toShaft);
  if (ground) suspects.push(ground);

  const pattern = describePattern(suspects, rings, series, period) + (allowed.length ? '' : `; a simplex wave winding of ${series.poles} poles cannot have ${bars} bars, judged as lap`);
  return { suspects, pattern, next: nextSteps(suspects, series), median: median(v), ratios: ratios.map(round), period, threshold: round(threshold), usable: true };
}

/**
 * The period (1–4) the readings repeat with, and each phase's median. A period is taken only
 * when it halves the scatter and each phase has at least four readings.
 */
function alternation(v: readonly number[]): { period: number; reference: number[] } {
  const plain = { period: 1, reference: [median(v)] };
  const spreadOf = (period: number, reference: number[]) => robustSpread(v.map((x, i) => x / reference[i % period]!));
  const base = spreadOf(1, plain.reference);
  let best = plain;
  let bestSpread = base;
  for (let period = 2; period <= 4; period++) {
    if (v.length % period !== 0 || v.length / period < 4) continue;
    const reference = Array.from({ length: period }, (_, phase) => median(v.filter((_, i) => i % period === phase)));
    if (reference.some((r) => !(r > 0))) continue;
    const s = spreadOf(period, reference);
    if (s < 0.5 * bestSpread) {
      best = { period, reference };
      bestSpread = s;
    }
  }
  return best;
}

function confidenceOf(deviation: number, threshold: number, kind: BarFaultKind): Confidence {
  if (kind === 'open' || deviation >= 2 * threshold) return 'high';
  return deviation >= 1.3 * threshold ? 'medium' : 'low';
}

/** The bar-to-shaft reading near zero, with a clear minimum: the ground's nearest bar. */
function groundOf(toShaft: readonly number[] | undefined): BarSuspect | undefined {
  if (!toShaft || toShaft.length < 2) return undefined;
  const m = median(toShaft);
  if (!(m > 0)) return undefined;
  let at = 0;
  toShaft.forEach((x, i) => {
    if (x < toShaft[at]!) at = i;
  });
  const ratio = toShaft[at]! / m;
  if (ratio > GROUND_FRACTION) return undefined;
  return { bars: [at + 1, at + 1], kind: 'ground', deviation: round(ratio - 1), confidence: ratio < 0.1 ? 'high' : 'medium' };
}

/** The coil (by start bar, from 0) one fault would explain these pairs by, on any ring the winding allows. */
function coilExplaining(pairs: number[], rings: WindingRing[]): { ring: WindingRing; coil: number } | undefined {
  const want = [...pairs].sort((a, b) => a - b).join(',');
  for (const ring of rings) {
    if (ring.span < 2) continue;
    for (const coil of new Set(pairs.flatMap((k) => chainCoils(ring, k)))) {
      if (pairsThrough(ring, coil).join(',') === want) return { ring, coil };
    }
  }
  return undefined;
}

function describePattern(suspects: BarSuspect[], rings: WindingRing[], s: BarToBarSeries, period: number): string {
  const bars = s.values.length;
  const parts: string[] = [];
  if (period > 1) parts.push(`readings repeat every ${period} pairs: the winding's own pattern (coils of two lengths), each phase judged against its own median`);
  const pairs = suspects.filter((x) => x.kind !== 'ground');
  if (pairs.length === 0) parts.push(`even: every pair within ${Math.round(100 * BAR_TOLERANCE)} % of the median`);
  const kinds = [...new Set(pairs.map((x) => x.kind))];
  for (const kind of kinds) {
    const of = pairs.filter((x) => x.kind === kind);
    const firsts = of.map((x) => x.bars[0] - 1);
    const wave = of.length > 1 ? coilExplaining(firsts, rings) : undefined;
    if (wave) {
      parts.push(
        `${kind} at ${of.length} pairs ${wave.ring.pitch} bars apart, a pole-pair pitch of this wave winding: one coil, from bar ${wave.coil + 1} to bar ${((wave.coil + wave.ring.pitch) % bars) + 1}, lies in all of them`,
      );
      continue;
    }
    if ((kind === 'high-resistance' || kind === 'open') && of.length === 2 && (of[0]!.bars[1] === of[1]!.bars[0] || of[1]!.bars[1] === of[0]!.bars[0])) {
      const shared = of[0]!.bars[1] === of[1]!.bars[0] ? of[0]!.bars[1] : of[0]!.bars[0];
      parts.push(`${kind} on both pairs beside bar ${shared}: its riser joint`);
      continue;
    }
    for (const x of of) parts.push(`${kind} between bars ${x.bars[0]} and ${x.bars[1]} (${signedPercent(x.deviation)})${single(kind, s)}`);
    if (s.winding !== 'wave' && evenlySpaced(firsts, bars)) {
      parts.push(`the ${kind} pairs lie evenly round the commutator, about ${Math.round(bars / of.length)} bars apart: on a wave winding of ${2 * of.length} poles one coil shows so; check the winding`);
    }
  }
  const ground = suspects.find((x) => x.kind === 'ground');
  if (ground) parts.push(`ground nearest bar ${ground.bars[0]}: the lowest bar-to-shaft reading`);
  if (s.winding === 'wave' && s.poles === undefined && pairs.length > 1) parts.push('poles not given: a wave fault repeats every pole pair, so give the poles to tie readings together');
  return parts.join('; ');
}

/** Pairs spaced equally round the commutator (within a bar), as one wave coil shows. */
function evenlySpaced(firsts: number[], bars: number): boolean {
  if (firsts.length < 2) return false;
  const sorted = [...firsts].sort((a, b) => a - b);
  const gaps = sorted.map((x, i) => (i + 1 < sorted.length ? sorted[i + 1]! - x : sorted[0]! + bars - x));
  const pitch = bars / firsts.length;
  return gaps.every((g) => Math.abs(g - pitch) <= 1);
}

function single(kind: BarFaultKind, s: BarToBarSeries): string {
  const span = s.winding === 'wave' && s.poles ? ` (on this wave winding the pair spans ${s.poles / 2} coils)` : '';
  switch (kind) {
    case 'open':
      return `: open coil or riser, the reading runs round the rest of the winding${span}`;
    case 'high-resistance':
      return `: poor riser joint${span}`;
    case 'short':
      return `: shorted coil or bars bridged${span}`;
    case 'ground':
      return '';
  }
}

function nextSteps(suspects: BarSuspect[], s: BarToBarSeries): string[] {
  const out: string[] = [];
  const has = (k: BarFaultKind) => suspects.some((x) => x.kind === k);
  if (suspects.some((x) => x.confidence === 'low')) out.push('re-measure the low-confidence pairs with clean probe contact on the bar faces');
  if (has('open')) out.push('inspect the risers of the open pair for a cracked or dry joint; look for burnt bars a pole pitch apart');
  if (has('high-resistance')) out.push('re-make the riser joints of the high pairs, then re-test bar to bar');
  if (has('short')) out.push('growler or surge test the coil under the low pair; clear carbon or copper bridging between the bars');
  if (has('ground')) out.push('insulation test to frame, then lift the coil leads at the ground bar to find the faulty coil');
  if (out.length === 0 && s.method === 'voltage-drop') out.push('none from this test; a surge test finds turn faults the bar-to-bar test can miss');
  if (out.length === 0) out.push('none from this test');
  return out;
}

const round = (x: number) => Number(x.toFixed(4));
const signedPercent = (d: number) => `${d >= 0 ? '+' : ''}${Math.round(d * 100)} %`;
