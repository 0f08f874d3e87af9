/**
 * How a simplex armature winding joins its commutator bars, as far as a bar-to-bar test sees it.
 *
 * With the brushes lifted, a simplex lap or wave winding is one closed circuit of C coils through
 * all C bars. A lap coil joins neighbouring bars (commutator pitch 1). A simplex wave coil joins
 * bars y = (C ± 1)/p apart, p being the pole pairs, so p coils in series lead from a bar to its
 * neighbour (Chapman, Electric Machinery Fundamentals, wave windings: y_c = 2(C ± 1)/P; from
 * memory). An adjacent-bar reading therefore spans one coil on a lap winding and p coils on a wave
 * winding, and one faulty wave coil shows in p readings about C/p bars (a pole-pair pitch) apart.
 *
 * Bars and coils are numbered from 0 here; the analysers number them from 1 for people.
 */

export const WINDING_KINDS = ['lap', 'wave', 'unknown'] as const;
export type WindingKind = (typeof WINDING_KINDS)[number];

/** A winding as the ring of bars its one closed circuit visits. */
export interface WindingRing {
  bars: number;
  /** Commutator pitch: each coil runs from bar b to bar b + pitch (mod bars). */
  pitch: number;
  /** Coils between a bar and its neighbour: 1 for lap, p for simplex wave. */
  span: number;
}

/** Commutator pitches a simplex wave winding of this many bars and poles can have (none if it cannot exist). */
export function wavePitches(bars: number, poles: number): number[] {
  const p = poles / 2;
  if (!Number.isInteger(p) || p < 1) return [];
  if (p === 1) return [1];
  return [bars - 1, bars + 1].filter((n) => n % p === 0).map((n) => n / p);
}

/** The rings a winding description allows: one for lap, one or two for wave (C odd on 4 poles allows y = (C ± 1)/2). */
export function windingRings(bars: number, winding: WindingKind, poles: number | undefined): WindingRing[] {
  if (winding !== 'wave' || poles === undefined) return [{ bars, pitch: 1, span: 1 }];
  return wavePitches(bars, poles).map((pitch) => ({ bars, pitch, span: poles / 2 }));
}

const mod = (a: number, n: number) => ((a % n) + n) % n;

/** The coils (by start bar) in series between bar k and bar k + 1 along the short way round. */
export function chainCoils(ring: WindingRing, pair: number): number[] {
  const { bars, pitch, span } = ring;
  // Going forward span coils from bar k lands on k + 1 when span·pitch ≡ +1, else on k − 1: then the chain runs from k + 1 to k.
  const start = mod(span * pitch, bars) === 1 % bars ? pair : mod(pair + 1, bars);
  return Array.from({ length: span }, (_, j) => mod(start + j * pitch, bars));
}

/** The adjacent-bar pairs (by first bar) whose reading takes in the coil starting at this bar. */
export function pairsThrough(ring: WindingRing, coil: number): number[] {
  const out: number[] = [];
  for (let k = 0; k < ring.bars; k++) if (chainCoils(ring, k).includes(coil)) out.push(k);
  return out;
}

/** About how many times the median an open coil's pair reads: the rest of the ring against the chain in parallel with it (C − span exactly, once the ring is broken). */
export function openRatio(ring: WindingRing): number {
  return ring.bars / ring.span;
}
