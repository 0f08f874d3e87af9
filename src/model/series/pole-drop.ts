/**
 * Pole drop: the voltage across each field coil with the field fed, in order round the frame.
 * The coils carry one current, so healthy coils drop alike (within a few per cent, common
 * practice). A coil with shorted turns drops less: on AC much less, because the shorted turns act
 * as a loaded secondary and its impedance goes with the turns squared; on DC only in proportion to
 * the resistance lost, so a DC test can miss a few shorted turns. A coil reading nothing with the
 * others higher has a short across it; a coil taking nearly all the supply is open. A reversed coil
 * drops the same as the others: only a polarity check finds it.
 */
import { median } from './robust.js';

export const POLE_DROP_WINDINGS = ['shunt-field', 'series-field', 'interpole', 'compensating'] as const;
export type PoleDropWinding = (typeof POLE_DROP_WINDINGS)[number];

export interface PoleDropSeries {
  supply: 'ac' | 'dc';
  winding: PoleDropWinding;
  /** Volts per coil, in order round the frame. */
  values: readonly number[];
}

export type CoilFaultKind = 'shorted-turns' | 'shorted' | 'open' | 'high';

export interface CoilSuspect {
  /** Coil from 1. */
  coil: number;
  kind: CoilFaultKind;
  /** Drop over the median of the coils, minus 1. */
  deviation: number;
}

export interface PoleDropAnalysis {
  suspects: CoilSuspect[];
  median: number;
  ratios: number[];
  notes: string[];
  /** False when no coil reads anything: the field carried no current. */
  usable: boolean;
}

/** Coils this far off the median are suspect: wider than a meter's ±3 % on two readings, tighter than a shorted turn of a few. */
export const POLE_DROP_TOLERANCE = 0.08;
/** A coil reading below this share of the median has a short across it. */
const SHORTED_SHARE = 0.05;
/** One coil taking this share of the whole drop, the others almost nothing, is open. */
const OPEN_SHARE = 0.8;

export function analysePoleDrop(s: PoleDropSeries): PoleDropAnalysis {
  const v = s.values;
  const total = v.reduce((a, x) => a + x, 0);
  const m = median(v);
  const notes: string[] = [];
  const suspects: CoilSuspect[] = [];
  const openAt = total > 0 ? v.findIndex((x) => x / total >= OPEN_SHARE && v.every((y) => y === x || y < SHORTED_SHARE * x)) : -1;
  if (openAt >= 0 && v.length > 1) {
    suspects.push({ coil: openAt + 1, kind: 'open', deviation: round(m > 0 ? v[openAt]! / m - 1 : 0) });
  } else if (m > 0) {
    v.forEach((x, i) => {
      const d = x / m - 1;
      if (x / m < SHORTED_SHARE) suspects.push({ coil: i + 1, kind: 'shorted', deviation: round(d) });
      else if (d <= -POLE_DROP_TOLERANCE) suspects.push({ coil: i + 1, kind: 'shorted-turns', deviation: round(d) });
      // With two coils a high one is only the other side of a low one.
      else if (d >= POLE_DROP_TOLERANCE && v.length > 2) suspects.push({ coil: i + 1, kind: 'high', deviation: round(d) });
    });
  }
  if (!(total > 0)) notes.push('every coil reads zero: no current in the field circuit; check the supply and the circuit end to end');
  if (s.supply === 'dc') notes.push('DC test: shorted turns lower a coil only by the resistance they take out; repeat with a low AC voltage to see them clearly');
  if (suspects.some((x) => x.kind === 'high')) notes.push('a coil above the others: a poor joint in it, or shorted turns in the others');
  if (v.length === 2 && suspects.length) notes.push('two coils only: a low one may be the other reading high; measure each coil\'s resistance');
  notes.push('a reversed coil drops the same as the others: check the polarity of each pole with a compass');
  return { suspects, median: m, ratios: v.map((x) => round(m > 0 ? x / m : 0)), notes, usable: total > 0 };
}

const round = (x: number) => Number(x.toFixed(4));
