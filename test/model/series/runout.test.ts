import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyseRunout } from '../../../src/model/series/runout.js';
import { rng, runoutSeries } from '../../support/winding-series.js';

const LIMIT_MM = 0.05;

describe('runout analysis', () => {
  it('gives TIR and the largest step in the readings\' own unit', () => {
    const a = analyseRunout({ values: [0.01, 0.012, 0.02, 0.015, 0.011, 0.01, 0.009, 0.01] }, LIMIT_MM);
    expect(a.tir).toBeCloseTo(0.011, 9);
    expect(a.maxStep).toBeCloseTo(0.008, 9);
    expect(a.maxStepAt).toEqual([2, 3]);
  });

  it('names a once-per-turn shape eccentric, twice-per-turn oval and a lone reading a high spot (property, fixed seed)', () => {
    fc.assert(
      fc.property(fc.constantFrom('eccentric' as const, 'oval' as const, 'high-spot' as const), fc.integer({ min: 16, max: 48 }), fc.double({ min: 0.03, max: 0.3, noNaN: true }), fc.integer(), (shape, points, size, seed) => {
        const random = rng(seed);
        const at = Math.floor(random() * points);
        const a = analyseRunout({ values: runoutSeries({ points, shape, size, at }, random) }, LIMIT_MM);
        expect(a.shape).toBe(shape);
        if (shape === 'high-spot') expect(a.spotAt).toBe(at + 1);
        expect(a.tir).toBeGreaterThan(0.9 * size);
      }),
      { seed: 16, numRuns: 300 },
    );
  });

  it('sees a high bar as a step that stands out of a smooth eccentric shape', () => {
    const values = runoutSeries({ points: 36, shape: 'eccentric', size: 0.04, noise: 0 }, rng(1));
    values[10]! += 0.02;
    const a = analyseRunout({ values }, LIMIT_MM);
    expect(a.barStep).toBe(true);
    expect(a.maxStepAt).toContain(11);
  });
});
