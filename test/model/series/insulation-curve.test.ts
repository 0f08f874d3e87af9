import { describe, expect, it } from 'vitest';
import { insulationAt40C } from '../../../src/model/insulation.js';
import { analyseInsulationCurve, correctTo40C, readingAt } from '../../../src/model/series/insulation-curve.js';

describe('insulation curve', () => {
  it('corrects to 40 °C by halving per 10 °C for thermoplastic insulation (IEEE 43, clause 6.3; check-values 2.3: KT(20 °C) = 0.25, 3 MΩ at 70 °C → 24 MΩ)', () => {
    expect(correctTo40C(100, 20, 'thermoplastic')).toBeCloseTo(25, 9);
    expect(correctTo40C(3, 70, 'thermoplastic')).toBeCloseTo(24, 9);
  });

  it('uses the model\'s IEEE 43-2013 correction for thermosetting insulation (constants from memory; see src/model/insulation.ts)', () => {
    expect(correctTo40C(100, 30, 'thermosetting')).toBeCloseTo(insulationAt40C(100, 30, 'thermosetting'), 9);
    expect(correctTo40C(100, 30, 'thermosetting')).toBeGreaterThan(correctTo40C(100, 30, 'thermoplastic'));
  });

  it('gives PI = R10/R1 and DAR = R1/R30s (IEEE 43-2013), corrected values at 40 °C', () => {
    const a = analyseInsulationCurve({ temperature: 30, values: [[0.5, 800], [1, 1000], [2, 1250], [5, 1600], [10, 2100]] }, 'thermoplastic');
    expect(a.polarizationIndex).toBeCloseTo(2.1, 6);
    expect(a.dielectricAbsorptionRatio).toBeCloseTo(1.25, 6);
    expect(a.oneMinuteAt40C).toBeCloseTo(500, 6);
    expect(a.tenMinutesAt40C).toBeCloseTo(1050, 6);
    expect(a.shape).toBe('rising');
    expect(a.polarizationIndexMeaningful).toBe(true);
  });

  it('reads a curve that stops rising after a minute or two as moisture or dirt', () => {
    const a = analyseInsulationCurve({ temperature: 25, values: [[0.5, 40], [1, 46], [2, 48], [3, 48.5], [5, 49], [10, 49]] }, 'thermosetting');
    expect(a.shape).toBe('flattens-early');
    expect(a.polarizationIndex).toBeCloseTo(49 / 46, 4);
  });

  it('reads a falling curve as moisture or contamination', () => {
    expect(analyseInsulationCurve({ temperature: 25, values: [[1, 60], [2, 58], [5, 50], [10, 44]] }, 'thermosetting').shape).toBe('falls');
  });

  it('does not judge the PI above 5000 MΩ at one minute (IEEE 43-2013)', () => {
    expect(analyseInsulationCurve({ temperature: 40, values: [[1, 8000], [10, 9000]] }, 'thermosetting').polarizationIndexMeaningful).toBe(false);
  });

  it('reads between points straight on log–log axes', () => {
    expect(readingAt([[1, 100], [10, 1000]], Math.sqrt(10))).toBeCloseTo(Math.sqrt(10) * 100, 6);
    expect(readingAt([[1, 100], [10, 1000]], 20)).toBeNull();
  });
});
