import { describe, expect, it } from 'vitest';
import { insulationAt40C, insulationMinimum, insulationTestVoltage, polarizationIndexMinimum } from '../../src/model/insulation.js';

describe('IEEE 43 insulation resistance', () => {
  it('corrects to 40 °C by halving per 10 °C rise (IEEE 43-2013 clause 6.3 approximation)', () => {
    // Correction factors KT: 20 °C 0.25, 30 °C 0.5, 50 °C 2, 60 °C 4, 70 °C 8.
    expect(insulationAt40C(100, 20)).toBeCloseTo(25, 9);
    expect(insulationAt40C(100, 30)).toBeCloseTo(50, 9);
    expect(insulationAt40C(100, 50)).toBeCloseTo(200, 9);
    expect(insulationAt40C(100, 60)).toBeCloseTo(400, 9);
    expect(insulationAt40C(3, 70)).toBeCloseTo(24, 9); // 3 MΩ at 70 °C -> 24 MΩ by the formula
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
