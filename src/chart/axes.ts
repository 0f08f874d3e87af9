/**
 * Axis ranges shared by the text and SVG charts, so both show the same window onto the curves and
 * the summary can say where the speed axis was clipped.
 */
import type { CurvePoint, SpeedCurves } from '../model/curve.js';

export interface Axis {
  min: number;
  max: number;
  step: number;
  ticks: number[];
}

export interface ChartAxes {
  current: Axis;
  speed: Axis;
  /** Some curve point lies above the top of the speed axis. */
  clipped: boolean;
}

/** Ticks aimed for on each axis; the text chart drops labels that would collide. */
const TARGET_TICKS = 5;
/** The speed axis reaches at least this multiple of the rated-point speed before clipping. */
const CLIP_RATED_SPEED_FACTOR = 2;
/** Headroom above the measured point and the measured-field curve, so they are never clipped. */
const CLIP_MEASURED_FACTOR = 1.3;

/** Speed on a curve at a current, linear between neighbouring points; undefined outside the curve. */
export function speedAt(curve: readonly CurvePoint[], current: number): number | undefined {
  for (let k = 1; k < curve.length; k++) {
    const a = curve[k - 1]!;
    const b = curve[k]!;
    if (current >= a.current && current <= b.current) {
      if (b.current === a.current) return a.speed;
      return a.speed + ((b.speed - a.speed) * (current - a.current)) / (b.current - a.current);
    }
  }
  return undefined;
}

/** Drops float noise such as 0.30000000000000004 from tick values. */
const clean = (x: number) => Number(x.toPrecision(12));

/** An axis from a round number at or below min to one at or above max, in steps of 1, 2, 2.5 or 5 × 10^k. */
export function niceAxis(min: number, max: number, targetTicks = TARGET_TICKS): Axis {
  const span = max - min > 0 ? max - min : Math.abs(max) || 1;
  const raw = span / targetTicks;
  const magnitude = 10 ** Math.floor(Math.log10(raw));
  const norm = raw / magnitude;
  const step = clean((norm <= 1 ? 1 : norm <= 2 ? 2 : norm <= 2.5 ? 2.5 : norm <= 5 ? 5 : 10) * magnitude);
  const lo = clean(Math.floor(min / step) * step);
  let hi = clean(Math.ceil(max / step) * step);
  if (hi <= lo) hi = clean(lo + step);
  const count = Math.round((hi - lo) / step);
  const ticks = Array.from({ length: count + 1 }, (_, k) => clean(lo + k * step));
  return { min: lo, max: hi, step, ticks };
}

export function chartAxes(curves: SpeedCurves): ChartAxes {
  const field = curves.withMeasuredField ?? [];
  const all = [...curves.healthy, ...field, ...(curves.measured ? [curves.measured] : [])];
  const currents = all.map((p) => p.current);
  const speeds = all.map((p) => p.speed);
  const highestSpeed = Math.max(...speeds);
  // A series curve heads for infinity near 0 A; keep the rated region and the measured point readable.
  const ratedSpeed = speedAt(curves.healthy, curves.ratedCurrent) ?? Math.max(...curves.healthy.map((p) => p.speed));
  const mustShow = Math.max(...field.map((p) => p.speed), curves.measured?.speed ?? -Infinity);
  const cap = Math.max(CLIP_RATED_SPEED_FACTOR * ratedSpeed, CLIP_MEASURED_FACTOR * mustShow);
  const speed = niceAxis(Math.min(0, ...speeds), Math.min(highestSpeed, cap));
  const current = niceAxis(Math.min(0, ...currents), Math.max(...currents));
  return { current, speed, clipped: highestSpeed > speed.max };
}

/** Decimals enough to tell ticks of this step apart, and no more. */
export function formatTick(value: number, step: number): string {
  let decimals = 0;
  while (decimals < 4 && Math.abs(step * 10 ** decimals - Math.round(step * 10 ** decimals)) > 1e-9) decimals++;
  return value.toFixed(decimals);
}

export const formatRpm = (n: number) => Math.round(n).toFixed(0);

/** Current as a fitter reads a clamp meter: 0.01 A under 10 A, 0.1 A under 100 A, else whole amps. */
export function formatAmps(a: number): string {
  const digits = Math.abs(a) >= 100 ? 0 : Math.abs(a) >= 10 ? 1 : 2;
  return String(Number(a.toFixed(digits)));
}
