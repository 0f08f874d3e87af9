import { describe, expect, it } from 'vitest';
import { quantityPattern } from '../../src/units/quantity-pattern.js';
import { parseQuantity, type Dimension } from '../../src/units/quantity.js';

/** Spellings a fitter writes, per dimension: the schema's pattern must let every one through, and the tool must read it. */
const WRITTEN: Record<Dimension, string[]> = {
  voltage: ['220 V', '14,5 V', '0.22 kV', '220V', '220 v', '500 mV', '220 volts', '220'],
  signedVoltage: ['-12 V', '60 V'],
  current: ['1.2 A', '1200mA', '5 a', '5 amps', '5 ampere', '2 kA', '300 uA'],
  resistance: ['0.5 ohm', '0.5 Ω', '5 kΩ', '5 kohm', '500 mΩ', '5 Ohms', '5 k Ω'],
  insulation: ['500 MΩ', '500 Mohm', '500 megohm', '0.5 GΩ', '500'],
  power: ['2.2 kW', '3 hp', '15000 W', '15 kw', '15 KW'],
  speed: ['1450 rpm', '1450 RPM', '1450 r/min', '1450 rev/min', '1450 min-1', '1450 min⁻¹', '25 Hz'],
  temperature: ['40 °C', '40 C', '40 degC', '104 °F', '313 K', '40° C'],
  pressure: ['20 kPa', '0.2 bar', '3 psi', '200 mbar'],
  length: ['12 mm', '1.2 cm', '0.5 in', '50 um'],
};

const matches = (d: Dimension, text: string) => new RegExp(quantityPattern(d), 'u').test(text);

describe('the quantity patterns of the published schema', () => {
  it.each(Object.entries(WRITTEN))('%s: pass every usual spelling, each of which the tool reads', (d, list) => {
    for (const t of list) {
      expect(matches(d as Dimension, t), t).toBe(true);
      expect(parseQuantity(t, d as Dimension).ok, t).toBe(true);
    }
  });

  it('flag a quantity of another dimension', () => {
    expect(matches('voltage', '5 A')).toBe(false);
    expect(matches('current', '220 V')).toBe(false);
    expect(matches('speed', '220 V')).toBe(false);
    expect(matches('temperature', '40 kPa')).toBe(false);
    expect(matches('voltage', '1 + 2 V')).toBe(false);
  });
});
