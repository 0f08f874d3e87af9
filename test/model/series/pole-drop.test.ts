import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analysePoleDrop } from '../../../src/model/series/pole-drop.js';
import { poleDropSeries, rng } from '../../support/winding-series.js';

describe('pole drop analysis', () => {
  it('names the coil well below the others as shorted turns, and says a DC test shows them weakly', () => {
    const a = analysePoleDrop({ supply: 'dc', winding: 'shunt-field', values: [55, 54.6, 41, 55.3] });
    // 41 V against the median 54.8 V.
    expect(a.suspects).toEqual([{ coil: 3, kind: 'shorted-turns', deviation: -0.2518 }]);
    expect(a.notes.join(' ')).toContain('DC test');
  });

  it('reads a coil at zero with the others higher as a short across it', () => {
    const a = analysePoleDrop({ supply: 'ac', winding: 'shunt-field', values: [73, 0.4, 73.5, 72.8] });
    expect(a.suspects).toEqual([{ coil: 2, kind: 'shorted', deviation: -0.9945 }]);
  });

  it('reads one coil taking the whole supply as open', () => {
    const a = analysePoleDrop({ supply: 'dc', winding: 'series-field', values: [0, 0, 11.8, 0] });
    expect(a.suspects.map((s) => [s.coil, s.kind])).toEqual([[3, 'open']]);
  });

  it('points to the polarity check, since a reversed coil drops like the others', () => {
    expect(analysePoleDrop({ supply: 'ac', winding: 'interpole', values: [20, 20.2, 19.9, 20.1] }).notes.join(' ')).toContain('polarity');
  });

  it('finds 20–60 % shorted turns in the right coil of 2–8 coils and nothing in healthy fields, ±3 % noise (property, fixed seed)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 4 }), fc.constantFrom('ac' as const, 'dc' as const), fc.integer({ min: 0, max: 7 }), fc.double({ min: 0.2, max: 0.6, noNaN: true }), fc.integer(), (pairs, supply, at, fraction, seed) => {
        const coils = 2 * pairs;
        const random = rng(seed);
        const coil = at % coils;
        const faulty = analysePoleDrop({ supply, winding: 'shunt-field', values: poleDropSeries({ coils, supply, shorted: { coil, fraction } }, random) });
        expect(faulty.suspects.filter((s) => s.kind !== 'high')).toEqual([expect.objectContaining({ coil: coil + 1, kind: 'shorted-turns' })]);
        const healthy = analysePoleDrop({ supply, winding: 'shunt-field', values: poleDropSeries({ coils, supply }, random) });
        expect(healthy.suspects).toEqual([]);
      }),
      { seed: 16, numRuns: 300 },
    );
  });
});

describe('pole drop with no field current', () => {
  it('says the field circuit carries no current when every coil reads zero', () => {
    const a = analysePoleDrop({ supply: 'dc', winding: 'shunt-field', values: [0, 0, 0, 0] });
    expect(a.suspects).toEqual([]);
    expect(a.notes[0]).toContain('no current in the field circuit');
  });
});
