import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyseBarToBar } from '../../../src/model/series/bar-to-bar.js';
import { chainCoils, pairsThrough, wavePitches, windingRings } from '../../../src/model/series/winding.js';
import { barSeries, judgeBars, randomBarCase, rng, type InsertedBarFault } from '../../support/winding-series.js';

const SEED = 16;
const analyse = (g: ReturnType<typeof barSeries>) =>
  analyseBarToBar({ method: 'resistance', winding: g.winding, poles: g.poles, values: g.values, toShaft: g.toShaft });

describe('the winding model', () => {
  it('gives a simplex wave winding the commutator pitch (C ± 1)/p (Chapman, wave windings, y_c = 2(C ± 1)/P; from memory)', () => {
    expect(wavePitches(21, 4)).toEqual([10, 11]); // p = 2: both 20/2 and 22/2
    expect(wavePitches(25, 8)).toEqual([6]); // p = 4: 24/4
    expect(wavePitches(24, 4)).toEqual([]); // 23 and 25 are odd: no simplex wave winding
    expect(wavePitches(30, 2)).toEqual([1]); // two poles: lap and wave coincide
  });

  it('puts p coils in series between neighbouring bars of a wave winding, and one coil in p readings', () => {
    const ring = windingRings(25, 'wave', 8)[0]!;
    expect(chainCoils(ring, 0)).toHaveLength(4);
    expect(pairsThrough(ring, 5)).toHaveLength(4);
    const lap = windingRings(24, 'lap', 4)[0]!;
    expect(pairsThrough(lap, 5)).toEqual([5]);
  });

  it('reads an open lap coil as C − 1 times the others: the reading runs round the rest of the winding', () => {
    // The open pair reads the other C − 1 coils in series; every other pair then reads one coil, r.
    const g = barSeries({ winding: 'lap', poles: 4, bars: 24, noise: 0, fault: { kind: 'open', coil: 5 } }, rng(1));
    expect(g.cleanRatios[5]).toBeCloseTo(23, 6);
    expect(g.cleanRatios[6]).toBeCloseTo(1, 6);
  });
});

describe('bar-to-bar analysis', () => {
  it('flags a reading 10 % or more above the others as a high-resistance joint (TM 55-2210-223-34, step 43; check-values 5.6)', () => {
    const a = analyseBarToBar({ method: 'resistance', winding: 'lap', values: [1.0, 1.01, 0.99, 1.12, 1.0] });
    expect(a.suspects).toEqual([{ bars: [4, 5], kind: 'high-resistance', deviation: 0.12, confidence: 'low' }]);
  });

  it('finds the open riser of a recorded job: 1.9 mV on every pair but 41 mV at bars 37–38', () => {
    const values = Array.from({ length: 48 }, (_, i) => (i === 36 ? 41 : 1.9));
    const a = analyseBarToBar({ method: 'voltage-drop', winding: 'lap', poles: 4, values });
    expect(a.suspects.map((s) => [s.bars, s.kind])).toEqual([[[37, 38], 'open']]);
    expect(a.pattern).toContain('open between bars 37 and 38');
  });

  it('names the one wave coil behind readings a pole-pair pitch apart', () => {
    const g = barSeries({ winding: 'wave', poles: 4, bars: 25, noise: 0, fault: { kind: 'open', coil: 5 } }, rng(2));
    const a = analyse(g);
    expect(a.suspects.map((s) => s.bars)).toEqual([
      [5, 6],
      [18, 19],
    ]);
    expect(a.pattern).toContain('one coil, from bar 6 to bar 18');
  });

  it('takes a regular alternation for the winding, not a fault', () => {
    const g = barSeries({ winding: 'lap', poles: 4, bars: 40, alternate: 0.12 }, rng(3));
    const a = analyse(g);
    expect(a.period).toBe(2);
    expect(a.suspects).toEqual([]);
  });

  it('finds a fault inside an alternating series', () => {
    const g = barSeries({ winding: 'lap', poles: 4, bars: 40, alternate: 0.12, fault: { kind: 'short', coil: 9, reads: 0.6 } }, rng(4));
    expect(analyse(g).suspects.map((s) => [s.bars, s.kind])).toEqual([[[10, 11], 'short']]);
  });

  it('locates a ground by the lowest bar-to-shaft reading', () => {
    const g = barSeries({ winding: 'lap', poles: 4, bars: 30, fault: { kind: 'ground', coil: 12, along: 0 } }, rng(5));
    const ground = analyse(g).suspects.filter((s) => s.kind === 'ground');
    expect(ground.map((s) => s.bars)).toEqual([[13, 13]]);
  });

  it('finds no suspect in a clean series of any lap or wave winding, 2–8 poles, 20–200 bars, ±3 % noise (property, fixed seed)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2 ** 31 - 1 }), (seed) => {
        const random = rng(seed);
        const g = barSeries(randomBarCase(random, 'none'), random);
        expect(analyse(g).suspects).toEqual([]);
      }),
      { seed: SEED, numRuns: 200 },
    );
  });

  for (const kind of ['open', 'high-resistance', 'short', 'bridge', 'ground'] as const satisfies readonly InsertedBarFault['kind'][]) {
    it(`finds an inserted ${kind} at the right bars and nothing where the winding is sound (property, fixed seed)`, () => {
      fc.assert(
        fc.property(fc.integer({ min: 0, max: 2 ** 31 - 1 }), (seed) => {
          const random = rng(seed);
          const g = barSeries(randomBarCase(random, kind), random);
          expect(judgeBars(g, analyse(g).suspects)).toEqual({ found: true, falseSuspects: 0 });
        }),
        { seed: SEED, numRuns: 150 },
      );
    });
  }
});

describe('bar-to-bar patterns on an undeclared winding', () => {
  it('says when outliers lie evenly round the commutator, as one wave coil shows', () => {
    const g = barSeries({ winding: 'wave', poles: 6, bars: 31, noise: 0, fault: { kind: 'open', coil: 4 } }, rng(9));
    const a = analyseBarToBar({ method: 'resistance', winding: 'unknown', values: g.values });
    expect(a.suspects).toHaveLength(3);
    expect(a.pattern).toContain('evenly round the commutator, about 10 bars apart: on a wave winding of 6 poles');
  });
});

describe('bar-to-bar readings that say more about the test than the winding', () => {
  it('asks for a repeat when most readings are zero', () => {
    const a = analyseBarToBar({ method: 'voltage-drop', winding: 'lap', values: [0, 0, 0, 1.9, 0] });
    expect(a.suspects).toEqual([]);
    expect(a.pattern).toContain('most readings are zero');
  });
});
