/**
 * An insulation resistance curve: readings against minutes at one test voltage. From it the 1- and
 * 10-minute values corrected to 40 °C, the polarization index (10 min / 1 min) and the dielectric
 * absorption ratio (1 min / 30 s), and the curve's shape. Clean dry insulation keeps rising for
 * the whole ten minutes as the absorption current dies away; a curve that flattens within a couple
 * of minutes, or falls, is leakage over the surface or through the bulk: moisture or dirt
 * (IEEE 43-2013, the PI's basis; the shapes are common practice).
 */
import { insulationAt40C, PI_NOT_MEANINGFUL_ABOVE_MOHM } from '../insulation.js';

export const INSULATION_SYSTEMS = ['thermosetting', 'thermoplastic'] as const;
export type InsulationSystem = (typeof INSULATION_SYSTEMS)[number];

/**
 * Resistance at 40 °C for an insulation system. Thermoplastic (asphaltic-mica, shellac) windings
 * take the long-standing rule that IR halves for every 10 °C rise (IEEE 43, clause 6.3; the
 * halving rule confirmed in shared check-values 2.3). Thermosetting windings take the model's own
 * correction (src/model/insulation.ts), which today is the same halving rule: IEEE 43-2013 gives
 * thermosetting systems their own two-part formula, which this project has not yet confirmed.
 */
export function correctTo40C(megohms: number, testC: number, system: InsulationSystem): number {
  return system === 'thermoplastic' ? megohms * Math.pow(0.5, (40 - testC) / 10) : insulationAt40C(megohms, testC);
}

export interface InsulationCurve {
  testVoltage?: number | undefined;
  /** Winding temperature during the test, °C. */
  temperature: number;
  /** [minutes, MΩ], minutes rising. */
  values: readonly (readonly [number, number])[];
}

export type CurveShape = 'rising' | 'flattens-early' | 'falls' | 'too-short';

export interface InsulationCurveAnalysis {
  oneMinute: number | null;
  tenMinutes: number | null;
  oneMinuteAt40C: number | null;
  tenMinutesAt40C: number | null;
  polarizationIndex: number | null;
  /** Whether the PI says anything: not above 5000 MΩ at one minute (IEEE 43-2013). */
  polarizationIndexMeaningful: boolean;
  dielectricAbsorptionRatio: number | null;
  shape: CurveShape;
  says: string;
}

/** The reading at a time, read off the curve (straight between points on log–log axes); null outside it. */
export function readingAt(values: readonly (readonly [number, number])[], minutes: number): number | null {
  for (let i = 0; i < values.length; i++) {
    const [t, r] = values[i]!;
    if (Math.abs(t - minutes) < 1e-9) return r;
    if (i > 0 && values[i - 1]![0] < minutes && t > minutes) {
      const [t0, r0] = values[i - 1]!;
      if (!(r0 > 0 && r > 0)) return r0 + ((r - r0) * (minutes - t0)) / (t - t0);
      const f = Math.log(minutes / t0) / Math.log(t / t0);
      return Math.exp(Math.log(r0) + f * Math.log(r / r0));
    }
  }
  return null;
}

/** A reading this much below an earlier one is a fall, not the meter's wander. */
const FALL = 0.03;

export function analyseInsulationCurve(c: InsulationCurve, system: InsulationSystem): InsulationCurveAnalysis {
  const v = c.values;
  const r1 = readingAt(v, 1);
  const r10 = readingAt(v, 10);
  const r05 = readingAt(v, 0.5);
  const at40 = (r: number | null) => (r === null ? null : round(correctTo40C(r, c.temperature, system)));
  const pi = r1 !== null && r10 !== null && r1 > 0 ? round(r10 / r1) : null;
  const dar = r1 !== null && r05 !== null && r05 > 0 ? round(r1 / r05) : null;
  const shape = shapeOf(v);
  const says = {
    rising: 'keeps rising: the absorption current dying away, as dry clean insulation does',
    'flattens-early': 'flattens within two minutes: leakage current swamps absorption, moisture or contamination',
    falls: 'falls as the test goes on: moisture or contamination (or a surface leakage path heating)',
    'too-short': 'too few readings after one minute to judge the shape',
  }[shape];
  return {
    oneMinute: r1,
    tenMinutes: r10,
    oneMinuteAt40C: at40(r1),
    tenMinutesAt40C: at40(r10),
    polarizationIndex: pi,
    polarizationIndexMeaningful: r1 !== null && r1 <= PI_NOT_MEANINGFUL_ABOVE_MOHM,
    dielectricAbsorptionRatio: dar,
    shape,
    says,
  };
}

function shapeOf(v: readonly (readonly [number, number])[]): CurveShape {
  const late = v.filter(([t]) => t >= 1);
  if (late.length < 2) return 'too-short';
  for (let i = 1; i < v.length; i++) {
    const before = Math.max(...v.slice(0, i).map(([, r]) => r));
    if (v[i]![1] < (1 - FALL) * before && v[i]![0] >= 1) return 'falls';
  }
  const last = v[v.length - 1]!;
  if (last[0] < 5) return late.length >= 2 && last[1] / late[0]![1] < 1.05 ? 'flattens-early' : 'too-short';
  // Rise after two minutes, against the rise from one minute to the end, on log axes.
  const r1 = readingAt(v, 1) ?? late[0]![1];
  const r2 = readingAt(v, 2) ?? r1;
  const whole = Math.log(last[1] / r1);
  const after = Math.log(last[1] / r2);
  return whole < Math.log(1.25) && after < Math.log(1.08) ? 'flattens-early' : 'rising';
}

const round = (x: number) => Number(x.toPrecision(6));
