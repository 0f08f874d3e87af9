/**
 * The one adapter from what a fitter types ("14,5 V", "1450 r/min", "40 C") to a plain
 * number in the unit a field declares. mathjs lives here and nowhere else; user text is
 * only ever given to `unit()`, never to `evaluate` or `parse`.
 */
import { quote } from './quote.js';
import {
  create,
  createCreateUnit,
  createUnitClass,
  createUnitFunction,
  absDependencies,
  addScalarDependencies,
  BigNumberDependencies,
  ComplexDependencies,
  divideScalarDependencies,
  formatDependencies,
  FractionDependencies,
  isNumericDependencies,
  multiplyScalarDependencies,
  numberDependencies,
  subtractScalarDependencies,
  typedDependencies,
  type FactoryFunctionMap,
  type Unit,
} from 'mathjs';
import { equalDependencies, fixDependencies, powDependencies, roundDependencies } from 'mathjs/number';

/**
 * What `unit()` and `createUnit()` need, spelled out instead of mathjs's `unitDependencies`, so
 * that four functions the Unit class calls only with plain numbers here (our values are numbers,
 * and mathjs turns its Fraction unit values into numbers before these calls) come in their
 * number-only versions. The general ones pull in matrices, inverses and determinants, whose
 * typed functions were most of the start-up. The scalar arithmetic stays general: temperature
 * offsets are Fractions. test/units/lean-mathjs.test.ts compares this instance with full mathjs.
 */
const unitFactories = {
  BigNumberDependencies,
  ComplexDependencies,
  FractionDependencies,
  absDependencies,
  addScalarDependencies,
  divideScalarDependencies,
  formatDependencies,
  isNumericDependencies,
  multiplyScalarDependencies,
  numberDependencies,
  subtractScalarDependencies,
  typedDependencies,
  powDependencies,
  roundDependencies,
  fixDependencies,
  equalDependencies,
  createUnitClass,
  createUnitFunction,
  createCreateUnit,
  // mathjs's typings mark every dependency map optional; these are always defined.
} as FactoryFunctionMap;

/**
 * The private mathjs instance, made on first use: building its unit system costs tens of
 * milliseconds, which --help, --version and the dialogue's first frame should not pay.
 */
let instance: ReturnType<typeof create> | undefined;
function math(): ReturnType<typeof create> {
  if (!instance) {
    const made = create(unitFactories, { number: 'number' });
    // rpm as revolutions per minute, 1/time, so it converts to Hz (rev/s) as well.
    made.createUnit('rpm', '1 / min');
    made.createUnit('megohm', '1 Mohm');
    instance = made;
  }
  return instance;
}

/** What a field holds, with its default unit and the range a real DC machine job can show. */
export const DIMENSIONS = {
  voltage: { unit: 'V', min: 0, max: 2000 },
  signedVoltage: { unit: 'V', min: -2000, max: 2000 },
  current: { unit: 'A', min: 0, max: 20000 },
  resistance: { unit: 'ohm', min: 0, max: 1e6 },
  insulation: { unit: 'Mohm', min: 0, max: 1e7 },
  power: { unit: 'W', min: 0, max: 2e7 },
  speed: { unit: 'rpm', min: 0, max: 20000 },
  temperature: { unit: 'degC', min: -50, max: 400 },
  pressure: { unit: 'kPa', min: 0, max: 500 },
  length: { unit: 'mm', min: 0, max: 1000 },
} as const;

export type Dimension = keyof typeof DIMENSIONS;

export type QuantityError =
  | { code: 'empty' }
  | { code: 'no-number'; text: string }
  | { code: 'not-a-quantity'; text: string }
  | { code: 'wrong-dimension'; text: string; expected: Dimension }
  | { code: 'negative'; text: string; expected: Dimension }
  | { code: 'out-of-range'; text: string; expected: Dimension; value: number; min: number; max: number };

export type QuantityResult = { ok: true; value: number } | { ok: false; error: QuantityError };

const MAX_TEXT = 60;

/** Rewrites the spellings fitters use into what mathjs reads; `dimension` resolves "40 C". */
export function normalizeQuantityText(text: string, dimension: Dimension): string {
  let s = text.trim().replace(/\s+/g, ' ');
  s = s.replace(/^([+-]?\d+),(\d+)/, '$1.$2'); // decimal comma: 14,5 V
  s = s.replace(/(\d)\s*(?=[^\d\s.eE+-])/, '$1 '); // 1.2A -> 1.2 A
  s = s.replace(/\s*([Mm]egohms?|[Mm]egaohms?|MΩ)$/u, ' Mohm');
  s = s.replace(/\s*(k|M|G|m|u|µ)?\s*(Ω|Ohms?|ohms?)$/u, (_m, prefix: string | undefined) => ` ${prefix === 'µ' ? 'u' : (prefix ?? '')}ohm`);
  s = s.replace(/\s*°\s*([CF])$/i, (_m, l: string) => ` deg${l.toUpperCase()}`);
  s = s.replace(/\s*(r\/min|rev\/min|revs?\/min|min-1|min⁻¹|1\/min|RPM|rpm|Rpm)$/, ' rpm');
  s = s.replace(/\s*(N\s*[·.*]?\s*m|Nm)$/, ' N m');
  const lower = s.match(/^(\S+) (\S+)$/);
  if (lower) {
    const [, num, u] = lower as unknown as [string, string, string];
    const fixed = lowercaseUnit(u, dimension);
    if (fixed !== u) s = `${num} ${fixed}`;
  }
  return s;
}

/** Units typed in lower case where no other reading makes sense for the field. */
function lowercaseUnit(u: string, dimension: Dimension): string {
  const table: Partial<Record<Dimension, Record<string, string>>> = {
    voltage: { v: 'V', kv: 'kV', mv: 'mV' },
    signedVoltage: { v: 'V', kv: 'kV', mv: 'mV' },
    current: { a: 'A', ma: 'mA', ka: 'kA', amps: 'A', amp: 'A' },
    power: { w: 'W', kw: 'kW', mw: 'MW', KW: 'kW' },
    temperature: { c: 'degC', C: 'degC', f: 'degF', F: 'degF', degc: 'degC', degf: 'degF' },
    speed: { hz: 'Hz' },
    pressure: { kpa: 'kPa' },
  };
  return table[dimension]?.[u] ?? u;
}

/**
 * Parses a quantity as typed (or a bare number in the dimension's default unit).
 * @example parseQuantity('14,5 V', 'voltage') // { ok: true, value: 14.5 }
 * @example parseQuantity('5 A', 'voltage')    // { ok: false, error: { code: 'wrong-dimension', … } }
 */
/** Recent readings of typed text: case files repeat their nameplates ("220 V"), and mathjs is most of a reading's cost. */
const recent = new Map<string, QuantityResult>();
const RECENT_MAX = 4096;

export function parseQuantity(input: string | number, dimension: Dimension): QuantityResult {
  if (typeof input !== 'string') return readQuantity(input, dimension);
  const key = `${dimension}\u0000${input}`;
  const known = recent.get(key);
  if (known) return known;
  const result = Object.freeze(readQuantity(input, dimension));
  if (recent.size >= RECENT_MAX) recent.clear();
  recent.set(key, result);
  return result;
}

function readQuantity(input: string | number, dimension: Dimension): QuantityResult {
  if (typeof input === 'number') return checkRange(input, String(input), dimension);
  const text = input.trim();
  if (text === '') return fail({ code: 'empty' });
  if (text.length > MAX_TEXT) return fail({ code: 'not-a-quantity', text });
  const normalized = normalizeQuantityText(text, dimension);
  if (/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(normalized)) {
    return checkRange(Number(normalized), text, dimension);
  }
  // A number followed by one unit expression: anything else (sums, functions, two numbers) is refused.
  if (!/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)? [A-Za-z][A-Za-z0-9 /^*]*$/.test(normalized)) {
    return fail(/^\D*$/.test(normalized) ? { code: 'no-number', text } : { code: 'not-a-quantity', text });
  }
  const space = normalized.indexOf(' ');
  const convert = conversionOf(normalized.slice(space + 1), dimension);
  if (convert === 'not-a-quantity') return fail({ code: 'not-a-quantity', text });
  if (convert === 'wrong-dimension') return fail({ code: 'wrong-dimension', text, expected: dimension });
  return checkRange(convert.scale * Number(normalized.slice(0, space)) + convert.offset, text, dimension);
}

/**
 * How mathjs converts a unit as typed into the dimension's default unit: value ↦ scale·value +
 * offset (an offset only for temperatures), or why the unit is refused. Worked out once for each
 * unit text, as readings differ in their numbers far more than in their units.
 */
type Conversion = { scale: number; offset: number } | 'not-a-quantity' | 'wrong-dimension';
const conversions = new Map<string, Conversion>();

function conversionOf(unitText: string, dimension: Dimension): Conversion {
  const key = `${dimension}\u0000${unitText}`;
  let known = conversions.get(key);
  if (known === undefined) {
    known = workOutConversion(unitText, DIMENSIONS[dimension].unit);
    if (conversions.size >= RECENT_MAX) conversions.clear();
    conversions.set(key, known);
  }
  return known;
}

function workOutConversion(unitText: string, to: string): Conversion {
  let zero: Unit;
  let one: Unit;
  try {
    zero = math().unit(`0 ${unitText}`) as Unit;
    one = math().unit(`1 ${unitText}`) as Unit;
  } catch {
    return 'not-a-quantity';
  }
  if (!one.equalBase(math().unit(to))) return 'wrong-dimension';
  const offset = zero.toNumber(to);
  return { scale: one.toNumber(to) - offset, offset };
}

function checkRange(value: number, text: string, dimension: Dimension): QuantityResult {
  const { min, max } = DIMENSIONS[dimension];
  if (!Number.isFinite(value)) return fail({ code: 'not-a-quantity', text });
  if (value < 0 && min === 0) return fail({ code: 'negative', text, expected: dimension });
  if (value < min || value > max) return fail({ code: 'out-of-range', text, expected: dimension, value, min, max });
  return { ok: true, value: roundNoise(value) };
}

/** Drops float noise from unit conversion (350 mA -> 0.35000000000000003). */
function roundNoise(x: number): number {
  return x === 0 ? 0 : Number(x.toPrecision(12));
}

function fail(error: QuantityError): QuantityResult {
  return { ok: false, error };
}

/** One line a fitter can act on. */
export function describeQuantityError(e: QuantityError): string {
  const unit = (d: Dimension) => DIMENSIONS[d].unit;
  switch (e.code) {
    case 'empty':
      return 'empty value: give a number with a unit, or leave the field out';
    case 'no-number':
      return `${quote(e.text)} has no number in front of the unit`;
    case 'not-a-quantity':
      return `${quote(e.text)} is not a number with one unit (expected e.g. "14.5 V"; sums and formulas are not read)`;
    case 'wrong-dimension':
      return `${quote(e.text)} is not a ${dimensionName(e.expected)} (expected a value in ${unit(e.expected)})`;
    case 'negative':
      return `${quote(e.text)} is negative; a ${dimensionName(e.expected)} here is a magnitude`;
    case 'out-of-range':
      return `${quote(e.text)} is outside the plausible range for a ${dimensionName(e.expected)} (${e.min} to ${e.max} ${unit(e.expected)})`;
  }
}

function dimensionName(d: Dimension): string {
  return d === 'signedVoltage' ? 'voltage' : d === 'insulation' ? 'insulation resistance' : d;
}
