/**
 * Commutator runout: dial readings at equal steps over one turn. TIR is the largest minus the
 * smallest reading; the largest step between neighbouring readings shows a high or low bar. The
 * shape comes from the first two harmonics of the readings round the turn: once per turn is an
 * eccentric commutator (off centre, or a bent shaft), twice per turn an oval one, and a reading the
 * harmonics cannot explain is one high (or low) spot.
 */
export interface RunoutSeries {
  /** Readings in one length unit, equal steps, one turn. */
  values: readonly number[];
}

export type RunoutShape = 'round' | 'eccentric' | 'oval' | 'high-spot' | 'low-spot' | 'irregular';

export interface RunoutAnalysis {
  tir: number;
  maxStep: number;
  /** Readings (from 1) either side of the largest step. */
  maxStepAt: [number, number];
  shape: RunoutShape;
  /** Reading (from 1) of the spot, for a high or low spot. */
  spotAt?: number;
  /** Whether the largest step stands out of the smooth shape: a high or low bar. */
  barStep: boolean;
}

/** Below this share of the limit there is no shape worth naming. */
const ROUND_SHARE = 0.2;

export function analyseRunout(s: RunoutSeries, limit: number): RunoutAnalysis {
  const v = s.values;
  const n = v.length;
  const tir = Math.max(...v) - Math.min(...v);
  let maxStep = 0;
  let at = 0;
  const steps = v.map((x, i) => Math.abs(v[(i + 1) % n]! - x));
  steps.forEach((d, i) => {
    if (d > maxStep) {
      maxStep = d;
      at = i;
    }
  });
  const sortedSteps = [...steps].sort((a, b) => a - b);
  const typicalStep = sortedSteps[n >> 1]!;
  const { fit, a1, a2 } = harmonics(v);
  const residual = v.map((x, i) => x - fit[i]!);
  let spot = 0;
  residual.forEach((e, i) => {
    if (Math.abs(e) > Math.abs(residual[spot]!)) spot = i;
  });
  const others = residual.filter((_, i) => i !== spot).map(Math.abs).sort((a, b) => a - b);
  const otherTypical = others[others.length >> 1] ?? 0;
  let shape: RunoutShape;
  if (tir <= ROUND_SHARE * limit) shape = 'round';
  else if (Math.abs(residual[spot]!) >= 0.3 * tir && Math.abs(residual[spot]!) >= 3 * otherTypical) shape = residual[spot]! > 0 ? 'high-spot' : 'low-spot';
  else if (a1 >= 2 * a2) shape = 'eccentric';
  else if (a2 >= 2 * a1) shape = 'oval';
  else shape = 'irregular';
  return {
    tir: round(tir),
    maxStep: round(maxStep),
    maxStepAt: [at + 1, ((at + 1) % n) + 1],
    shape,
    ...(shape === 'high-spot' || shape === 'low-spot' ? { spotAt: spot + 1 } : {}),
    barStep: maxStep >= 3 * typicalStep && maxStep >= 0.25 * tir && shape !== 'round',
  };
}

/** The mean and first two harmonics fitted to readings at equal steps round one turn. */
function harmonics(v: readonly number[]): { fit: number[]; a1: number; a2: number } {
  const n = v.length;
  const meanValue = v.reduce((s, x) => s + x, 0) / n;
  const coeff = (k: number) => {
    let c = 0;
    let s = 0;
    v.forEach((x, i) => {
      c += x * Math.cos((2 * Math.PI * k * i) / n);
      s += x * Math.sin((2 * Math.PI * k * i) / n);
    });
    return { c: (2 * c) / n, s: (2 * s) / n };
  };
  const h1 = coeff(1);
  // With four readings or fewer the second harmonic is the Nyquist term: leave it out.
  const h2 = n > 4 ? coeff(2) : { c: 0, s: 0 };
  const fit = v.map((_, i) => {
    const t = (2 * Math.PI * i) / n;
    return meanValue + h1.c * Math.cos(t) + h1.s * Math.sin(t) + h2.c * Math.cos(2 * t) + h2.s * Math.sin(2 * t);
  });
  return { fit, a1: Math.hypot(h1.c, h1.s), a2: Math.hypot(h2.c, h2.s) };
}

const round = (x: number) => Number(x.toPrecision(6));

export const RUNOUT_SHAPE_WORDS: Record<RunoutShape, string> = {
  round: 'round within the dial\'s resolution',
  eccentric: 'eccentric: once per turn (off centre or a bent shaft)',
  oval: 'oval: twice per turn',
  'high-spot': 'one high spot',
  'low-spot': 'one low spot',
  irregular: 'irregular',
};
