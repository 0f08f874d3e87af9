/**
 * Test series from a model of the winding, for the analysers' tests and the detection bench.
 *
 * Bar-to-bar: the winding is its ring of coils (src/model/series/winding.ts) with a resistance per
 * coil and any bridges between bars; each reading is the two-point resistance between adjacent
 * bars, found by reducing the ring to the few nodes that matter and solving their nodal equations.
 * Noise is a uniform ±3 % on every reading (a meter's stated accuracy).
 */
import { pairsThrough, windingRings, type WindingKind, type WindingRing } from '../../src/model/series/winding.js';
import { random } from '../../src/model/fits/generate.js';

/** A small deterministic generator (mulberry32, shared with the fault-case generator), so a bench run can be repeated from its seed. */
export const rng = random;

export interface Bridge {
  a: number;
  b: number;
  ohms: number;
}

/** Node potentials of a small resistor network with 1 A in at `from` and out at `to` (grounded). */
function twoPoint(nodes: number, edges: { i: number; j: number; g: number }[], from: number, to: number): number {
  const n = nodes;
  const m = Array.from({ length: n }, () => Array.from<number>({ length: n + 1 }).fill(0));
  for (const { i, j, g } of edges) {
    m[i]![i]! += g;
    m[j]![j]! += g;
    m[i]![j]! -= g;
    m[j]![i]! -= g;
  }
  m[from]![n] = 1;
  // Ground `to`: replace its equation by V = 0.
  m[to]!.fill(0);
  m[to]![to] = 1;
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r]![c]!) > Math.abs(m[p]![c]!)) p = r;
    [m[c], m[p]] = [m[p]!, m[c]!];
    const d = m[c]![c]!;
    if (Math.abs(d) < 1e-300) return Infinity;
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = m[r]![c]! / d;
      if (f !== 0) for (let k = c; k <= n; k++) m[r]![k]! -= f * m[c]![k]!;
    }
  }
  return m[from]![n]! / m[from]![from]!;
}

/** The ring with its coil resistances (by start bar) and bridges; resistances between points on it. */
export class RingNetwork {
  /** Ring position of each bar. */
  private readonly pos: number[];
  /** Resistance of the coil at each ring position. */
  private readonly atPos: number[];
  constructor(
    readonly ring: WindingRing,
    coilOhms: readonly number[],
    private readonly bridges: readonly Bridge[] = [],
  ) {
    const { bars, pitch } = ring;
    this.pos = Array.from<number>({ length: bars });
    this.atPos = Array.from<number>({ length: bars });
    for (let i = 0; i < bars; i++) {
      const bar = (i * pitch) % bars;
      this.pos[bar] = i;
      this.atPos[i] = coilOhms[bar]!;
    }
  }

  /** Resistance along the ring from position x to y (x < y, fractional positions lie inside a coil). */
  private arc(x: number, y: number): number {
    let sum = 0;
    for (let i = Math.floor(x); i < Math.ceil(y); i++) {
      const lo = Math.max(x, i);
      const hi = Math.min(y, i + 1);
      if (hi > lo) sum += (hi - lo) * this.atPos[i]!;
    }
    return sum;
  }

  /** Resistance between two points given as ring positions (a bar's position, or a fraction inside a coil). */
  between(x: number, y: number): number {
    const n = this.ring.bars;
    const keys = [...new Set([x, y, ...this.bridges.flatMap((b) => [this.pos[b.a]!, this.pos[b.b]!])])].sort((a, b) => a - b);
    const index = new Map(keys.map((k, i) => [k, i]));
    const edges: { i: number; j: number; g: number }[] = [];
    for (let i = 0; i < keys.length; i++) {
      const from = keys[i]!;
      const to = i + 1 < keys.length ? keys[i + 1]! : keys[0]! + n;
      const r = to <= n ? this.arc(from, to) : this.arc(from, n) + this.arc(0, to - n);
      if (keys.length > 1) edges.push({ i, j: (i + 1) % keys.length, g: r === Infinity ? 0 : 1 / r });
    }
    for (const b of this.bridges) edges.push({ i: index.get(this.pos[b.a]!)!, j: index.get(this.pos[b.b]!)!, g: 1 / b.ohms });
    return twoPoint(keys.length, edges, index.get(x)!, index.get(y)!);
  }

  barPosition(bar: number): number {
    return this.pos[bar]!;
  }

  /** The adjacent-bar readings, bars 1–2 first. */
  readings(): number[] {
    const n = this.ring.bars;
    return Array.from({ length: n }, (_, k) => this.between(this.pos[k]!, this.pos[(k + 1) % n]!));
  }
}

export type InsertedBarFault =
  | { kind: 'open'; coil: number }
  | { kind: 'high-resistance'; coil: number; reads: number }
  | { kind: 'short'; coil: number; reads: number }
  | { kind: 'bridge'; pair: number }
  | { kind: 'ground'; coil: number; along: number };

export interface GeneratedBars {
  winding: WindingKind;
  poles: number;
  ring: WindingRing;
  values: number[];
  toShaft?: number[];
  /** Noise-free readings over their median. */
  cleanRatios: number[];
  /** Pairs (from 0) the fault shows in directly, or for a ground the bars (from 0) at the ends of its coil. */
  faultAt: number[];
  fault?: InsertedBarFault;
}

export interface BarOptions {
  winding: 'lap' | 'wave';
  poles: number;
  bars: number;
  coilOhms?: number;
  noise?: number;
  /** Uniform in ±noise (a meter's stated accuracy, the default), or normal with noise as its standard deviation. */
  noiseKind?: 'uniform' | 'normal';
  /** Coils starting on odd bars read this much more (two coils per slot). */
  alternate?: number;
  fault?: InsertedBarFault;
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[s.length >> 1]! : (s[s.length / 2 - 1]! + s[s.length / 2]!) / 2;
};

/** A bar-to-bar series from the winding model, with an optional fault and uniform noise. */
export function barSeries(o: BarOptions, random: () => number): GeneratedBars {
  const ring = windingRings(o.bars, o.winding, o.poles)[0];
  if (!ring) throw new Error(`no ${o.poles}-pole wave winding has ${o.bars} bars`);
  const r = o.coilOhms ?? 0.002;
  const coils = Array.from({ length: o.bars }, (_, b) => r * (b % 2 && o.alternate ? 1 + o.alternate : 1));
  const bridges: Bridge[] = [];
  const f = o.fault;
  let faultAt: number[] = [];
  const healthy = new RingNetwork(ring, coils).readings();
  const scaleTo = (coil: number, reads: number) => {
    // Bisection on the coil's resistance until the pairs through it read `reads` × their healthy value.
    const pair = pairsThrough(ring, coil)[0]!;
    const want = reads * healthy[pair]!;
    let lo = reads > 1 ? coils[coil]! : 0;
    let hi = reads > 1 ? coils[coil]! * 1e4 : coils[coil]!;
    for (let i = 0; i < 60; i++) {
      const mid = (lo + hi) / 2;
      const trial = [...coils];
      trial[coil] = mid;
      const net = new RingNetwork(ring, trial);
      const got = net.between(net.barPosition(pair), net.barPosition((pair + 1) % o.bars));
      if (got < want) lo = mid;
      else hi = mid;
    }
    return (lo + hi) / 2;
  };
  if (f?.kind === 'open') coils[f.coil] = Infinity;
  if (f?.kind === 'high-resistance' || f?.kind === 'short') coils[f.coil] = scaleTo(f.coil, f.reads);
  if (f?.kind === 'bridge') bridges.push({ a: f.pair, b: (f.pair + 1) % o.bars, ohms: r * 1e-3 });
  if (f && f.kind !== 'bridge' && f.kind !== 'ground') faultAt = pairsThrough(ring, f.coil);
  if (f?.kind === 'bridge') faultAt = [f.pair];
  const net = new RingNetwork(ring, coils, bridges);
  const clean = net.readings();
  const noise = o.noise ?? 0.03;
  const gauss = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
  const noisy = (x: number) => x * (1 + noise * (o.noiseKind === 'normal' ? gauss() : 2 * random() - 1));
  const m = median(clean);
  const out: GeneratedBars = { winding: o.winding, poles: o.poles, ring, values: clean.map(noisy), cleanRatios: clean.map((x) => x / m), faultAt, ...(f ? { fault: f } : {}) };
  if (f?.kind === 'ground') {
    // An ohmmeter from each bar to the shaft reads the winding to the fault, plus the fault itself.
    const at = net.barPosition(f.coil) + f.along;
    const faultOhms = r * 0.02;
    out.toShaft = Array.from({ length: o.bars }, (_, b) => noisy(net.between(net.barPosition(b), at) + faultOhms));
    out.faultAt = [f.coil, (f.coil + ring.pitch) % o.bars];
  }
  return out;
}

/** Bar counts a simplex wave winding of these poles can have, within [min, max]. */
export function waveBarCounts(poles: number, min: number, max: number): number[] {
  const out: number[] = [];
  for (let c = min; c <= max; c++) if (windingRings(c, 'wave', poles).length > 0) out.push(c);
  return out;
}


/** A fault of each kind at a random place and size the winding can show, on a random lap or wave winding. */
export function randomBarCase(random: () => number, faultKind: InsertedBarFault['kind'] | 'none'): BarOptions {
  const pick = <T,>(xs: readonly T[]) => xs[Math.floor(random() * xs.length)]!;
  const winding = pick(['lap', 'wave'] as const);
  const poles = pick([2, 4, 6, 8]);
  const bars = winding === 'wave' ? pick(waveBarCounts(poles, 20, 200)) : 20 + Math.floor(random() * 181);
  const ring = windingRings(bars, winding, poles)[0]!;
  const coil = Math.floor(random() * bars);
  const span = ring.span;
  const within = (lo: number, hi: number) => lo + random() * (hi - lo);
  const base = { winding, poles, bars };
  switch (faultKind) {
    case 'none':
      return base;
    case 'open':
      return { ...base, fault: { kind: 'open', coil } };
    case 'high-resistance':
      return { ...base, fault: { kind: 'high-resistance', coil, reads: within(1.3, Math.min(5, (0.45 * bars) / span)) } };
    case 'short':
      return { ...base, fault: { kind: 'short', coil, reads: within(span === 1 ? 0.05 : (span - 1) / span + 0.02, 0.8) } };
    case 'bridge':
      return { ...base, fault: { kind: 'bridge', pair: coil } };
    case 'ground':
      return { ...base, fault: { kind: 'ground', coil, along: random() } };
  }
}

/** The kind of suspect each inserted fault should raise. */
export const EXPECTED_KIND = { open: 'open', 'high-resistance': 'high-resistance', short: 'short', bridge: 'short', ground: 'ground' } as const;

export interface Judged {
  found: boolean;
  falseSuspects: number;
}

/**
 * Whether the analysis found the inserted fault at the right place: every pair it shows in by 15 %
 * or more is a suspect of the right kind (a ground: the lowest bar is an end of its coil), and no
 * pair the fault leaves within 5 % of the median is a suspect.
 */
export function judgeBars(g: GeneratedBars, suspects: readonly { bars: [number, number]; kind: string }[]): Judged {
  const pairSuspects = suspects.filter((s) => s.kind !== 'ground');
  const falseSuspects =
    pairSuspects.filter((s) => Math.abs(g.cleanRatios[s.bars[0] - 1]! - 1) < 0.05).length + (g.fault?.kind !== 'ground' ? suspects.length - pairSuspects.length : 0);
  if (!g.fault) return { found: true, falseSuspects };
  const kind = EXPECTED_KIND[g.fault.kind];
  if (g.fault.kind === 'ground') {
    const grounds = suspects.filter((s) => s.kind === 'ground');
    return { found: grounds.length === 1 && g.faultAt.includes(grounds[0]!.bars[0] - 1), falseSuspects };
  }
  const shows = g.faultAt.filter((k) => Math.abs(g.cleanRatios[k]! - 1) >= 0.15);
  const found = shows.length > 0 && shows.every((k) => pairSuspects.some((s) => s.bars[0] - 1 === k && s.kind === kind));
  return { found, falseSuspects };
}

/** Field coil drops: n equal coils in series, one with a fraction of its turns shorted (DC: drop ∝ turns left; AC: ∝ turns left squared, a lower bound). */
export function poleDropSeries(o: { coils: number; supply: 'ac' | 'dc'; shorted?: { coil: number; fraction: number }; noise?: number }, random: () => number): number[] {
  const noise = o.noise ?? 0.03;
  const share = Array.from({ length: o.coils }, (_, i) => {
    if (o.shorted?.coil !== i) return 1;
    const left = 1 - o.shorted.fraction;
    return o.supply === 'ac' ? left * left : left;
  });
  const total = share.reduce((a, x) => a + x, 0);
  return share.map((x) => ((110 * x) / total) * (1 + noise * (2 * random() - 1)));
}

/** Dial readings round one turn: eccentric, oval or one high spot of the given size, ±3 % of it as noise. */
export function runoutSeries(o: { points: number; shape: 'eccentric' | 'oval' | 'high-spot'; size: number; at?: number; noise?: number }, random: () => number): number[] {
  const phase = random() * 2 * Math.PI;
  const noise = (o.noise ?? 0.03) * o.size;
  return Array.from({ length: o.points }, (_, i) => {
    const t = (2 * Math.PI * i) / o.points + phase;
    const shape = o.shape === 'eccentric' ? (o.size / 2) * Math.cos(t) : o.shape === 'oval' ? (o.size / 2) * Math.cos(2 * t) : i === (o.at ?? 0) ? o.size : 0;
    return 0.5 + shape + noise * (2 * random() - 1);
  });
}
