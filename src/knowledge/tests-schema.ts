/**
 * The `tests` block of dc-case/1: series a fitter brings back (bar-to-bar, pole drop, runout, an
 * insulation curve). Each value may be a number in the series' unit or a typed quantity; values
 * come out as plain numbers in the series' unit. A series that cannot be right (one value, a
 * negative resistance, a count that does not match the bars) is refused naming the field and
 * the position.
 */
import * as z from 'zod';
import { TESTED_WINDINGS } from '../model/machine.js';
import { POLE_DROP_WINDINGS } from '../model/series/pole-drop.js';
import { WINDING_KINDS, windingRings } from '../model/series/winding.js';
import { describeQuantityError, DIMENSIONS, parseQuantity, type Dimension } from '../units/quantity.js';

const rawValue = z.union([z.string(), z.number()], { error: 'expected a number or a quantity such as "1.9 mV"' });

/** How many of the dimension's default unit one `unit` is, or an error in words. */
function unitFactor(unit: string, dimension: Dimension): { ok: true; factor: number } | { ok: false; message: string } {
  const one = parseQuantity(`1 ${unit}`, dimension);
  if (one.ok && one.value > 0) return { ok: true, factor: one.value };
  return { ok: false, message: `"${unit}" is not a unit of ${dimension} (e.g. ${DIMENSIONS[dimension].unit})` };
}

/** Parses each value into `unit`; a bare number is already in it. Issues name the position. */
function valuesIn(raw: readonly (string | number)[], unit: string, dimension: Dimension, ctx: z.RefinementCtx, field: string): number[] | undefined {
  const f = unitFactor(unit, dimension);
  if (!f.ok) {
    ctx.addIssue({ code: 'custom', message: f.message, path: ['unit'], input: unit });
    return undefined;
  }
  const out: number[] = [];
  let bad = false;
  raw.forEach((x, i) => {
    // A bare number is in the series' unit: read it as typed with that unit, so a message quotes it so.
    const parsed = parseQuantity(typeof x === 'number' ? `${x} ${unit}` : x, dimension);
    if (parsed.ok) out.push(parsed.value / f.factor);
    else {
      bad = true;
      ctx.addIssue({ code: 'custom', message: `reading ${i + 1}: ${describeQuantityError(parsed.error)}`, path: [field, i], input: x });
    }
  });
  return bad ? undefined : out.map((x) => Number(x.toPrecision(12)));
}

const atLeastTwo = (what: string) => z.array(rawValue).min(2, `a series needs at least two ${what}; one reading says nothing against the others`);

const barToBar = z
  .strictObject({
    method: z.enum(['resistance', 'voltage-drop']).meta({ description: 'resistance (a micro-ohmmeter per pair) or voltage-drop (a steady current through the armature, the drop per pair)' }),
    unit: z.string().meta({ description: 'unit of the readings: a resistance (mohm, uohm) for "resistance", a voltage (mV) for "voltage-drop"' }),
    winding: z.enum(WINDING_KINDS).meta({ description: 'lap, wave or unknown: a wave winding shows one fault a pole-pair pitch apart' }),
    poles: z.number().int().min(2).max(24).multipleOf(2, 'poles come in pairs: an even number').optional().meta({ description: 'main poles of the machine' }),
    bars: z.number().int().min(3).max(1000).optional().meta({ description: 'commutator bars; when given, there must be one reading per bar' }),
    values: atLeastTwo('readings').meta({ description: 'one reading per adjacent bar pair, bars 1–2 first, in order round the commutator' }),
    toShaft: atLeastTwo('readings').optional().meta({ description: 'bar-to-shaft readings, bar 1 first' }),
  })
  .transform((s, ctx) => {
    const dimension: Dimension = s.method === 'resistance' ? 'resistance' : 'voltage';
    const values = valuesIn(s.values, s.unit, dimension, ctx, 'values');
    const toShaft = s.toShaft ? valuesIn(s.toShaft, s.unit, dimension, ctx, 'toShaft') : undefined;
    const bars = s.bars ?? s.values.length;
    if (s.bars !== undefined && s.values.length !== s.bars) {
      ctx.addIssue({ code: 'custom', message: `${s.values.length} readings for ${s.bars} bars: give one reading per adjacent pair, the last one bars ${s.bars}–1`, path: ['values'] });
    }
    if (s.toShaft && s.toShaft.length !== bars) ctx.addIssue({ code: 'custom', message: `${s.toShaft.length} bar-to-shaft readings for ${bars} bars: give one per bar`, path: ['toShaft'] });
    if (s.winding === 'wave' && s.poles !== undefined && windingRings(bars, 'wave', s.poles).length === 0) {
      ctx.addIssue({ code: 'custom', message: `a simplex wave winding of ${s.poles} poles cannot have ${bars} bars (bars ± 1 must divide by ${s.poles / 2})`, path: ['poles'], input: s.poles });
    }
    if (!values || (s.toShaft && !toShaft)) return z.NEVER;
    return { method: s.method, unit: s.unit, winding: s.winding, ...(s.poles !== undefined ? { poles: s.poles } : {}), bars, values, ...(toShaft ? { toShaft } : {}) };
  });

const poleDrop = z
  .strictObject({
    supply: z.enum(['ac', 'dc']).meta({ description: 'ac (shows shorted turns clearly) or dc (hardly)' }),
    winding: z.enum(POLE_DROP_WINDINGS).meta({ description: 'which field winding the coils belong to' }),
    values: atLeastTwo('coil readings').meta({ description: 'volts across each coil, in order round the frame' }),
  })
  .transform((s, ctx) => {
    const values = valuesIn(s.values, 'V', 'voltage', ctx, 'values');
    return values ? { supply: s.supply, winding: s.winding, values } : z.NEVER;
  });

const runout = z
  .strictObject({
    unit: z.string().meta({ description: 'unit of the dial readings (mm, in, um)' }),
    values: z.array(rawValue).min(3, 'a runout series needs at least three readings round the turn').meta({ description: 'dial readings at equal steps round the commutator, one turn' }),
  })
  .transform((s, ctx) => {
    const f = unitFactor(s.unit, 'length');
    // Dial readings are positions, not magnitudes: parse each as a length from an offset so a negative dial reading is kept.
    const values: number[] = [];
    let bad = !f.ok;
    if (!f.ok) ctx.addIssue({ code: 'custom', message: f.message, path: ['unit'], input: s.unit });
    s.values.forEach((x, i) => {
      const text = typeof x === 'number' ? x : x.trim();
      const negative = typeof text === 'string' ? text.startsWith('-') : text < 0;
      const magnitude = typeof text === 'string' ? text.replace(/^-/, '') : Math.abs(text) * (f.ok ? f.factor : 1);
      const parsed = parseQuantity(magnitude, 'length');
      if (!parsed.ok) {
        bad = true;
        ctx.addIssue({ code: 'custom', message: `reading ${i + 1}: ${describeQuantityError(parsed.error)}`, path: ['values', i], input: x });
      } else if (f.ok) values.push(Number(((negative ? -1 : 1) * parsed.value / f.factor).toPrecision(12)));
    });
    return bad || !f.ok ? z.NEVER : { unit: s.unit, values };
  });

const insulation = z
  .strictObject({
    winding: z.enum(TESTED_WINDINGS).meta({ description: 'the winding tested to frame' }),
    testVoltage: rawValue.optional().meta({ description: 'tester voltage (default unit V)' }),
    temperature: rawValue.meta({ description: 'winding temperature during the test (default unit degC)' }),
    values: z
      .array(z.tuple([z.number().positive('minutes after the voltage was applied, above 0'), rawValue]))
      .min(2, 'a curve needs at least two [minutes, resistance] readings')
      .meta({ description: '[minutes, resistance] pairs, minutes rising; resistance default unit Mohm' }),
  })
  .transform((s, ctx) => {
    const one = (x: string | number, dimension: Dimension, path: (string | number)[]) => {
      const p = parseQuantity(x, dimension);
      if (!p.ok) ctx.addIssue({ code: 'custom', message: describeQuantityError(p.error), path, input: x });
      return p.ok ? p.value : undefined;
    };
    const temperature = one(s.temperature, 'temperature', ['temperature']);
    const testVoltage = s.testVoltage === undefined ? undefined : one(s.testVoltage, 'voltage', ['testVoltage']);
    const values = s.values.map(([t, r], i) => [t, one(r, 'insulation', ['values', i, 1])] as const);
    s.values.forEach(([t], i) => {
      if (i > 0 && t <= s.values[i - 1]![0]) ctx.addIssue({ code: 'custom', message: `minutes must rise: ${t} after ${s.values[i - 1]![0]}`, path: ['values', i, 0], input: t });
    });
    if (temperature === undefined || values.some(([, r]) => r === undefined) || (s.testVoltage !== undefined && testVoltage === undefined)) return z.NEVER;
    return { winding: s.winding, ...(testVoltage !== undefined ? { testVoltage } : {}), temperature, values: values.map(([t, r]) => [t, r!] as [number, number]) };
  });

export const testsSchema = z
  .strictObject({
    barToBar: barToBar.optional().meta({ description: 'bar-to-bar readings round the commutator' }),
    poleDrop: poleDrop.optional().meta({ description: 'the voltage across each field coil' }),
    runout: runout.optional().meta({ description: 'dial readings round the commutator, one turn' }),
    insulation: insulation.optional().meta({ description: 'insulation resistance minute by minute' }),
  })
  .meta({ description: 'series of test readings: bar-to-bar, pole drop, commutator runout, an insulation resistance curve' });

export type TestsFile = z.output<typeof testsSchema>;
