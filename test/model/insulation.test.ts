import { describe, expect, it } from 'vitest';
import { insulationAt40C, insulationCorrectionFactor, insulationMinimum, insulationTestVoltage, polarizationIndexMinimum } from '../../src/model/insulation.js';

describe('IEEE 43 insulation resistance', () => {
  it('corrects thermoplastic insulation to 40 °C by halving per 10 °C rise (IEEE 43 approximation; electricneutron.com worked example)', () => {
    // Correction factors KT: 20 °C 0.25, 30 °C 0.5, 50 °C 2, 60 °C 4, 70 °C 8.
    expect(insulationAt40C(100, 20, 'thermoplastic')).toBeCloseTo(25, 9);
    expect(insulationAt40C(100, 30, 'thermoplastic')).toBeCloseTo(50, 9);
    expect(insulationAt40C(100, 50, 'thermoplastic')).toBeCloseTo(200, 9);
    expect(insulationAt40C(100, 60, 'thermoplastic')).toBeCloseTo(400, 9);
    expect(insulationAt40C(3, 70, 'thermoplastic')).toBeCloseTo(24, 9); // 3 MΩ at 70 °C -> 24 MΩ by the formula
  });

  it('corrects thermosetting insulation by the Arrhenius form, gentler than halving (IEEE 43-2013 clause 6.4; constants from memory)', () => {
    // K_T = exp(−B(1/(T+273) − 1/313)): B = 4230 K below 40 °C, 1245 K from 40 °C up (from memory).
    expect(insulationCorrectionFactor(40)).toBeCloseTo(1, 12);
    expect(insulationCorrectionFactor(20)).toBeCloseTo(Math.exp(-4230 * (1 / 293 - 1 / 313)), 12);
    expect(insulationCorrectionFactor(60)).toBeCloseTo(Math.exp(-1245 * (1 / 333 - 1 / 313)), 12);
    // The two systems agree at 40 °C and part either side of it: a cold thermoset winding is corrected less.
    expect(insulationCorrectionFactor(20)).toBeGreaterThan(insulationCorrectionFactor(20, 'thermoplastic'));
    expect(insulationAt40C(100, 20)).toBe(insulationAt40C(100, 20, 'thermosetting'));
  });

  it('takes the 5 MΩ row for DC armatures (IEEE 43-2013, Table 3) and kV + 1 for fields', () => {
    expect(insulationMinimum('armature', { armature: 500, field: 500 })).toBe(5);
    expect(insulationMinimum('shunt-field', { armature: 250, field: 250 })).toBeCloseTo(1.25, 9);
    expect(insulationMinimum('whole-machine', { armature: 440, field: 310 })).toBe(5);
  });

  it('asks PI 1.5 of class A and 2.0 of classes B, F and H (IEEE 43-2013)', () => {
    expect(polarizationIndexMinimum('A')).toBe(1.5);
    expect(polarizationIndexMinimum('B')).toBe(2);
    expect(polarizationIndexMinimum('F')).toBe(2);
    expect(polarizationIndexMinimum('H')).toBe(2);
  });

  it('chooses the test voltage by rated DC voltage (IEEE 43 Table 1)', () => {
    expect(insulationTestVoltage(250)).toEqual({ min: 500, max: 500 });
    expect(insulationTestVoltage(700)).toEqual({ min: 500, max: 500 });
    expect(insulationTestVoltage(3000)).toEqual({ min: 1000, max: 2500 });
  });
});
