import { describe, expect, it } from 'vitest';
import { COPPER_INFERRED_ZERO_C, resistanceAt, windingTemperature } from '../../src/model/resistance.js';
import { CLASS_TEMPERATURE_C, RISE_LIMIT_K, windingTemperatureLimit } from '../../src/model/thermal.js';

describe('resistance method', () => {
  it('uses the copper constant whose 20 °C coefficient is 0.00393 /K', () => {
    // IEC 60228 copper coefficient alpha20 = 0.00393 /K = 1/(234.5 + 20).
    expect(1 / (COPPER_INFERRED_ZERO_C + 20)).toBeCloseTo(0.00393, 5);
  });

  it('corrects 1 ohm at 20 °C to 1.1768 ohm at 65 °C', () => {
    // (234.5 + 65)/(234.5 + 20) = 1.1768, the ratio of the IEEE 118 / IEC 60228 copper correction.
    expect(resistanceAt(1, 20, 65)).toBeCloseTo(1.1768, 4);
  });

  it('finds 81.08 °C from 0.500 ohm cold at 20 °C and 0.620 ohm hot', () => {
    // Formula θ2 = (R2/R1)(k + θ1) − k, IEEE 118 (k = 234.5) and IEC 60034-1 (k = 235).
    expect(windingTemperature(0.62, 0.5, 20)).toBeCloseTo(81.08, 2);
    expect(windingTemperature(0.62, 0.5, 20, 235)).toBeCloseTo(81.2, 2);
  });

  it('gives the same temperature with the IEEE 234.5 and the IEC 235 constants to within 0.3 K up to a 125 K rise', () => {
    // The two differ by (R2/R1 − 1) × 0.5 K: 0.1 K for the 0.500 -> 0.620 ohm vector above.
    for (const hot of [0.52, 0.6, 0.62, 0.7, 0.74]) {
      expect(Math.abs(windingTemperature(hot, 0.5, 20) - windingTemperature(hot, 0.5, 20, 235))).toBeLessThan(0.3);
    }
    expect(windingTemperature(0.62, 0.5, 20, 235) - windingTemperature(0.62, 0.5, 20)).toBeCloseTo(0.12, 2);
  });

  it('does not apply a 0 °C coefficient from a 22 °C base (a published wrong answer of 134.7 ohm)', () => {
    // A field coil of 108 ohm at 22 °C, at 80 °C: the correct copper form gives 108 × 314.5/256.5 = 132.4 ohm.
    expect(resistanceAt(108, 22, 80)).toBeCloseTo(132.42, 1);
    expect(Math.abs(resistanceAt(108, 22, 80) - 134.7)).toBeGreaterThan(2);
  });
});

describe('thermal classes', () => {
  it('holds the IEC 60085 class temperatures', () => {
    expect(CLASS_TEMPERATURE_C).toEqual({ A: 105, B: 130, F: 155, H: 180 });
  });

  it('limits a class F winding to a 105 K rise over 40 °C coolant (IEC 60034-1 Table 7)', () => {
    expect(RISE_LIMIT_K.B).toBe(80);
    expect(RISE_LIMIT_K.H).toBe(125);
    expect(windingTemperatureLimit('F')).toBe(145);
    // A 110 K rise on class F exceeds the limit; 100 K does not; 100 K exceeds class B.
    expect(40 + 110).toBeGreaterThan(windingTemperatureLimit('F'));
    expect(40 + 100).toBeLessThanOrEqual(windingTemperatureLimit('F'));
    expect(40 + 100).toBeGreaterThan(windingTemperatureLimit('B'));
  });
});
