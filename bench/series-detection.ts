/**
 * How often the series analysers find an inserted fault at the right place, and how often a clean
 * series gets a false suspect, on series from the winding model with ±3 % noise (see
 * test/support/winding-series.ts). Not a test: prints rates for a fixed seed.
 *
 *   npx tsx bench/series-detection.ts [series per kind, default 2000] [seed, default 16]
 */
import { analyseBarToBar } from '../src/model/series/bar-to-bar.js';
import { analysePoleDrop } from '../src/model/series/pole-drop.js';
import { analyseRunout } from '../src/model/series/runout.js';
import { barSeries, judgeBars, poleDropSeries, randomBarCase, rng, runoutSeries } from '../test/support/winding-series.js';

const perKind = Number(process.argv[2] ?? 2000);
const random = rng(Number(process.argv[3] ?? 16));
const rows: [string, string, string][] = [];
const pct = (n: number, of: number) => `${((100 * n) / of).toFixed(2)} % (${n}/${of})`;

for (const noiseKind of ['uniform', 'normal'] as const) {
const noise = noiseKind === 'uniform' ? 'uniform ±3 %' : 'normal, σ = 3 % (harsher than ±3 %)';
let faulted = 0;
let found = 0;
for (const kind of ['open', 'high-resistance', 'short', 'bridge', 'ground'] as const) {
  let hit = 0;
  for (let i = 0; i < perKind; i++) {
    const g = barSeries({ ...randomBarCase(random, kind), noiseKind }, random);
    const a = analyseBarToBar({ method: 'resistance', winding: g.winding, poles: g.poles, values: g.values, toShaft: g.toShaft });
    const j = judgeBars(g, a.suspects);
    if (j.found && j.falseSuspects === 0) hit++;
  }
  faulted += perKind;
  found += hit;
  rows.push([`bar-to-bar, ${kind}, ${noise}`, pct(hit, perKind), '']);
}
rows.push([`bar-to-bar, all faults, ${noise}`, pct(found, faulted), 'target ≥ 99 %']);
let falseBars = 0;
for (let i = 0; i < perKind * 5; i++) {
  const g = barSeries({ ...randomBarCase(random, 'none'), noiseKind }, random);
  if (analyseBarToBar({ method: 'resistance', winding: g.winding, poles: g.poles, values: g.values }).suspects.length) falseBars++;
}
rows.push([`bar-to-bar, clean series with a false suspect, ${noise}`, pct(falseBars, perKind * 5), 'target ≤ 1 %']);
}

let poleHit = 0;
let poleFalse = 0;
for (let i = 0; i < perKind; i++) {
  const coils = 2 * (1 + Math.floor(random() * 4));
  const supply = random() < 0.5 ? 'ac' : 'dc';
  const coil = Math.floor(random() * coils);
  const fraction = 0.2 + 0.4 * random();
  const a = analysePoleDrop({ supply, winding: 'shunt-field', values: poleDropSeries({ coils, supply, shorted: { coil, fraction } }, random) });
  const lows = a.suspects.filter((s) => s.kind !== 'high');
  if (lows.length === 1 && lows[0]!.coil === coil + 1 && lows[0]!.kind === 'shorted-turns') poleHit++;
  if (analysePoleDrop({ supply, winding: 'shunt-field', values: poleDropSeries({ coils, supply }, random) }).suspects.length) poleFalse++;
}
rows.push(['pole drop, 20–60 % shorted turns found in the right coil', pct(poleHit, perKind), '']);
rows.push(['pole drop, healthy field with a false suspect', pct(poleFalse, perKind), '']);

let shapeHit = 0;
for (let i = 0; i < perKind; i++) {
  const shape = (['eccentric', 'oval', 'high-spot'] as const)[i % 3]!;
  const points = 16 + Math.floor(random() * 33);
  const at = Math.floor(random() * points);
  const a = analyseRunout({ values: runoutSeries({ points, shape, size: 0.03 + 0.27 * random(), at }, random) }, 0.05);
  if (a.shape === shape && (shape !== 'high-spot' || a.spotAt === at + 1)) shapeHit++;
}
rows.push(['runout, shape (and spot) named right', pct(shapeHit, perKind), '']);

const width = Math.max(...rows.map((r) => r[0].length));
for (const [what, rate, target] of rows) console.log(`${what.padEnd(width)}  ${rate.padEnd(22)}  ${target}`);
