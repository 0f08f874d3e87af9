import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { describeQuantityError, parseQuantity, type Dimension } from '../../src/units/quantity.js';

const value = (text: string | number, d: Dimension) => {
  const r = parseQuantity(text, d);
  if (!r.ok) throw new Error(`expected ${text} to parse: ${describeQuantityError(r.error)}`);
  return r.value;
};
const errorCode = (text: string | number, d: Dimension) => {
  const r = parseQuantity(text, d);
  return r.ok ? 'parsed' : r.error.code;
};

describe('parseQuantity', () => {
  it('reads the units fitters type', () => {
    expect(value('1.2 A', 'current')).toBe(1.2);
    expect(value('1200mA', 'current')).toBe(1.2);
    expect(value('350 mA', 'current')).toBe(0.35);
    expect(value('2.2 kW', 'power')).toBe(2200);
    expect(value('0.8 ohm', 'resistance')).toBe(0.8);
    expect(value('500 Mohm', 'insulation')).toBe(500);
    expect(value('0.5 Gohm', 'insulation')).toBe(500);
    expect(value('1450 rpm', 'speed')).toBe(1450);
  });

  it('converts horsepower and Fahrenheit exactly as mathjs does', () => {
    // Reference: mathjs's own unit conversions (general-purpose reference library).
    expect(value('3 hp', 'power')).toBeCloseTo(unit('3 hp').toNumber('W'), 6);
    expect(value('3 hp', 'power')).toBeCloseTo(2237.0996, 3);
    expect(value('104 degF', 'temperature')).toBeCloseTo(unit('104 degF').toNumber('degC'), 9);
    expect(value('104 degF', 'temperature')).toBeCloseTo(40, 9);
  });

  it('normalises decimal commas, ohm signs, degree signs and rpm spellings', () => {
    expect(value('14,5 V', 'voltage')).toBe(14.5);
    expect(value('2 Ω', 'resistance')).toBe(2);
    expect(value('5 kΩ', 'resistance')).toBe(5000);
    expect(value('2 MΩ', 'insulation')).toBe(2);
    expect(value('500 megohm', 'insulation')).toBe(500);
    expect(value('40 °C', 'temperature')).toBe(40);
    expect(value('104 °F', 'temperature')).toBeCloseTo(40, 9);
    expect(value('1450 r/min', 'speed')).toBe(1450);
    expect(value('1450 min-1', 'speed')).toBe(1450);
    expect(value('1450 RPM', 'speed')).toBe(1450);
    expect(value('25 Hz', 'speed')).toBe(1500);
  });

  it('reads lower-case unit letters where nothing else fits the field', () => {
    expect(value('14.5 v', 'voltage')).toBe(14.5);
    expect(value('1.2 a', 'current')).toBe(1.2);
    expect(value('3 kw', 'power')).toBe(3000);
  });

  it('reads "40 C" as degrees Celsius only where a temperature is expected', () => {
    expect(value('40 C', 'temperature')).toBe(40);
    expect(errorCode('40 C', 'current')).toBe('wrong-dimension');
  });

  it('takes a bare number in the field default unit', () => {
    expect(value(220, 'voltage')).toBe(220);
    expect(value('220', 'voltage')).toBe(220);
    expect(value(40, 'temperature')).toBe(40);
  });

  it('rejects what is not one number with one unit of the right kind', () => {
    expect(errorCode('', 'voltage')).toBe('empty');
    expect(errorCode('   ', 'voltage')).toBe('empty');
    expect(errorCode('V', 'voltage')).toBe('no-number');
    expect(errorCode('5 A', 'voltage')).toBe('wrong-dimension');
    expect(errorCode('1.2 A A', 'current')).toBe('wrong-dimension');
    expect(errorCode('1.2 A + 3 A', 'current')).toBe('not-a-quantity');
    expect(errorCode('cos(1) A', 'current')).toBe('not-a-quantity');
    expect(errorCode('12 furlongs', 'voltage')).toBe('not-a-quantity');
  });

  it('rejects negative magnitudes and absurd values', () => {
    expect(errorCode('-0.8 ohm', 'resistance')).toBe('negative');
    expect(errorCode('-3 A', 'current')).toBe('negative');
    expect(errorCode('10 MV', 'voltage')).toBe('out-of-range');
    expect(errorCode('1e6 rpm', 'speed')).toBe('out-of-range');
    expect(errorCode(Number.NaN, 'speed')).toBe('not-a-quantity');
    expect(value('-12 V', 'signedVoltage')).toBe(-12);
  });

  it('says what was wrong in words', () => {
    const r = parseQuantity('5 A', 'voltage');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(describeQuantityError(r.error)).toBe('"5 A" is not a voltage (expected a value in V)');
  });
});
