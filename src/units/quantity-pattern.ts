/**
 * For the published JSON Schema only: a regular expression per dimension matching the usual
 * spellings of a quantity, so that an editor flags "5 A" typed as a voltage while the file is
 * written. dctriage itself reads quantities with the unit adapter (quantity.ts), which accepts
 * every unit mathjs knows; test/units/quantity-pattern.test.ts checks each spelling below is read.
 */
import type { Dimension } from './quantity.js';

const NUMBER = String.raw`[+-]?(\d+([.,]\d*)?|[.,]\d+)([eE][+-]?\d+)?`;
const OHMS = String.raw`([kMGmuµ] ?)?(Ω|[Oo]hms?)|[Mm]ega?ohms?`;

/** The units of each dimension, as alternatives of a regular expression. */
const UNITS: Record<Dimension, string> = {
  voltage: 'kV|mV|V|kv|mv|v|volts?|kilovolts?|millivolts?',
  signedVoltage: 'kV|mV|V|kv|mv|v|volts?|kilovolts?|millivolts?',
  current: 'kA|mA|uA|A|ka|ma|a|amps?|amperes?|milliamperes?',
  resistance: OHMS,
  insulation: OHMS,
  power: 'MW|kW|KW|W|mw|kw|w|hp|watts?|kilowatts?',
  speed: 'rpm|RPM|Rpm|r/min|rev/min|revs?/min|min-1|min⁻¹|Hz|hz',
  temperature: '° ?[CF]|[CFcfK]|degC|degF|degc|degf',
  pressure: 'kPa|kpa|MPa|Pa|bar|mbar|psi',
  length: 'mm|cm|m|um|in|inch|inches|mil',
};

/**
 * "^…$" matching a number alone (the field's default unit) or a number and one of the usual units.
 * @example new RegExp(quantityPattern('voltage'), 'u').test('14,5 V') // true
 * @example new RegExp(quantityPattern('voltage'), 'u').test('5 A')    // false
 */
export function quantityPattern(dimension: Dimension): string {
  return String.raw`^\s*${NUMBER}(\s*(${UNITS[dimension]}))?\s*$`;
}
