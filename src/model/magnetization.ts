/**
 * How flux follows the exciting current, both per unit of rated.
 *
 * The default is a Fröhlich-type curve Φ = (1 + c)·i / (c + i) (Fröhlich's B = aH/(1 + bH),
 * normalised so that Φ(1) = 1). With c = 1.2 the knee sits near rated current and a field at
 * 56 % of rated current still gives 70 % of rated flux, as saturated shunt fields typically do
 * (common practice), so the model does not overstate the speed rise of a weakened field the way
 * a straight line does.
 */
import type { Magnetization } from './machine.js';

export const FROEHLICH_C = 1.2;

export function froehlichFlux(i: number, c = FROEHLICH_C): number {
  if (i <= 0) return 0;
  return ((1 + c) * i) / (c + i);
}

/** Piecewise-linear through the given points (and the origin), extrapolated along the last segment. */
export function interpolateCurve(points: ReadonlyArray<readonly [number, number]>, i: number): number {
  const pts = [[0, 0] as const, ...[...points].sort((a, b) => a[0] - b[0])].filter(
    (p, k, all) => k === 0 || p[0] !== all[k - 1]![0],
  );
  if (i <= 0) return 0;
  for (let k = 1; k < pts.length; k++) {
    const [x1, y1] = pts[k]!;
    const [x0, y0] = pts[k - 1]!;
    if (i <= x1 || k === pts.length - 1) return y0 + ((y1 - y0) * (i - x0)) / (x1 - x0);
  }
  return 0;
}

/** Flux per unit at exciting current `i` per unit, for the chosen curve. */
export function fluxPerUnit(curve: Magnetization | undefined, i: number): number {
  if (curve === 'linear') return Math.max(0, i);
  if (curve === undefined) return froehlichFlux(i);
  // A test-sheet curve is normalised so that rated current gives rated flux.
  const atRated = interpolateCurve(curve, 1);
  return atRated > 0 ? interpolateCurve(curve, i) / atRated : 0;
}

export function describeCurve(curve: Magnetization | undefined): string {
  if (curve === 'linear') return 'flux proportional to exciting current (linear, as the case file asks)';
  if (curve === undefined) return `generic Fröhlich-type magnetisation curve, Φ = ${1 + FROEHLICH_C}·i/(${FROEHLICH_C} + i) per unit`;
  return `magnetisation curve from the test sheet (${curve.length} points, interpolated)`;
}

/**
 * The exciting current per unit that gives `phi` per unit of flux: the curve read backwards
 * (bisection; every curve here rises with current). Undefined beyond what 3 per unit gives.
 */
export function excitationForFlux(curve: Magnetization | undefined, phi: number): number | undefined {
  if (!(phi > 0)) return 0;
  let lo = 0;
  let hi = 3;
  if (fluxPerUnit(curve, hi) < phi) return undefined;
  for (let k = 0; k < 60; k++) {
    const mid = (lo + hi) / 2;
    if (fluxPerUnit(curve, mid) < phi) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}
