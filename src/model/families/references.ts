/**
 * Readings judged against a plain reference rather than the machine equations (the other
 * direction, the tacho constant, a drive setting, a wear limit), and readings so far from the
 * plate that they are more likely a slip of the meter or the keyboard than the machine.
 */
import type { Readings } from '../machine.js';
import { addQuantity, find, fmt, type ModelContext } from './context.js';

/** Brush spring pressure range for general industrial machines, 13.8–27.6 kPa (common practice). */
const BRUSH_PRESSURE_MIN_KPA = 13.8;
/** Commutator runout (TIR) above which the surface wants machining, 0.05 mm (common practice). */
const COMMUTATOR_RUNOUT_LIMIT_MM = 0.05;
/** No-load armature current of an integral-hp wound-field motor is 3–10 % of rated (common practice). */
const NO_LOAD_CURRENT_SHARE = 0.1;

/**
 * How many times its plate value a reading may be before it is asked back: voltages seldom exceed
 * the plate by half, field currents by a third, and an armature current beyond about five times
 * rated would have blown the protection (common practice; the factors leave room for a fault).
 */
export const PLAUSIBLE_MULTIPLE: Partial<Record<keyof Readings, { multiple: number; words: string; unit: string }>> = {
  armatureVoltage: { multiple: 3, words: 'armature voltage', unit: 'V' },
  supplyVoltage: { multiple: 3, words: 'supply voltage', unit: 'V' },
  fieldVoltage: { multiple: 3, words: 'field voltage', unit: 'V' },
  fieldCurrent: { multiple: 3, words: 'field current', unit: 'A' },
  armatureCurrent: { multiple: 6, words: 'armature current', unit: 'A' },
  lineCurrent: { multiple: 6, words: 'supply current', unit: 'A' },
  speed: { multiple: 3, words: 'speed', unit: 'rpm' },
};

/** The plate value a reading is measured against, for the plausibility check. */
export function plateValueFor(reading: keyof Readings, ctx: Pick<ModelContext, 'machine' | 'derived'>): number | undefined {
  const np = ctx.machine.nameplate ?? {};
  switch (reading) {
    case 'armatureVoltage':
    case 'supplyVoltage':
      return np.armatureVoltage;
    case 'fieldVoltage':
      return ctx.derived.ratedFieldVoltage ?? np.fieldVoltage;
    case 'fieldCurrent':
      return ctx.derived.ratedFieldCurrent ?? np.fieldCurrent;
    case 'armatureCurrent':
      return ctx.derived.ratedIa ?? np.armatureCurrent;
    case 'lineCurrent':
      return np.lineCurrent ?? ctx.derived.ratedIa;
    case 'speed':
      return np.maxSpeed ?? np.speed;
    default:
      return undefined;
  }
}

export function plainReferences(ctx: ModelContext): void {
  const { readings, machine, derived: d } = ctx;
  if (readings.starterResistance !== undefined) {
    addQuantity(ctx, 'starterResistance', { value: 0, unit: 'ohm', measured: readings.starterResistance, formula: 'at the run position every starter step is cut out' });
  }
  if (readings.speedReverse !== undefined && readings.speed !== undefined && readings.speed > 0) {
    addQuantity(ctx, 'speedReverse', { value: readings.speed, unit: 'rpm', measured: readings.speedReverse, formula: 'speed the other way at the same set-point should equal the forward speed' });
  }
  if (machine.tachoVoltsPer1000Rpm !== undefined && readings.speed !== undefined && readings.tachoVoltage !== undefined) {
    const expectedTacho = (machine.tachoVoltsPer1000Rpm * readings.speed) / 1000;
    addQuantity(ctx, 'tachoVoltage', { value: expectedTacho, unit: 'V', measured: readings.tachoVoltage, formula: 'tacho V/1000 rpm × measured speed' });
    if (expectedTacho > 0 && readings.tachoVoltage < -0.2 * expectedTacho) {
      find(ctx, 'tacho-polarity-reversed', `tacho reads ${fmt(readings.tachoVoltage, 'V')} where ${fmt(expectedTacho, 'V')} is expected: its polarity is reversed against the rotation`);
    }
  }
  if (readings.currentLimitSetting !== undefined && d.ratedIa !== undefined) {
    addQuantity(ctx, 'currentLimit', { value: d.ratedIa, unit: 'A', measured: readings.currentLimitSetting, formula: 'drive current limit against rated armature current' });
  }
  if (readings.brushLength !== undefined && readings.brushLengthNew !== undefined) {
    addQuantity(ctx, 'brushLength', { value: readings.brushLengthNew, unit: 'mm', measured: readings.brushLength, formula: 'brush length against new length' });
  }
  if (readings.brushSpringPressure !== undefined) {
    addQuantity(ctx, 'brushSpringPressure', { value: BRUSH_PRESSURE_MIN_KPA, unit: 'kPa', measured: readings.brushSpringPressure, formula: 'lowest pressure of the general industrial range (common practice)' });
  }
  if (readings.commutatorRunout !== undefined) {
    addQuantity(ctx, 'commutatorRunout', { value: COMMUTATOR_RUNOUT_LIMIT_MM, unit: 'mm', measured: readings.commutatorRunout, formula: 'runout limit (common practice)' });
  }
  const plateNoLoad = ctx.machine.nameplate?.noLoadCurrent;
  if (readings.noLoadArmatureCurrent !== undefined && plateNoLoad !== undefined) {
    // The machine's own no-load point, for any connection, is a better reference than a share of rated.
    addQuantity(ctx, 'noLoadCurrent', { value: plateNoLoad, unit: 'A', measured: readings.noLoadArmatureCurrent, formula: 'no-load armature current against the plate or test-sheet value' });
  } else if (readings.noLoadArmatureCurrent !== undefined && d.ratedIa !== undefined) {
    addQuantity(ctx, 'noLoadCurrent', { value: NO_LOAD_CURRENT_SHARE * d.ratedIa, unit: 'A', measured: readings.noLoadArmatureCurrent, formula: 'no-load armature current up to 10 % of rated (common practice)' });
  }
  for (const [name, limit] of Object.entries(PLAUSIBLE_MULTIPLE) as [keyof Readings, { multiple: number; words: string; unit: string }][]) {
    const value = readings[name];
    const plate = plateValueFor(name, ctx);
    if (typeof value !== 'number' || plate === undefined || !(plate > 0) || !(Math.abs(value) > limit.multiple * plate)) continue;
    const times = Number((Math.abs(value) / plate).toFixed(1));
    ctx.out.findings.push({
      code: 'reading-far-from-plate',
      reading: name,
      says: `${limit.words} ${fmt(value, limit.unit)} is ${times} × the plate's ${fmt(plate, limit.unit)}: check the reading and its unit before trusting anything computed from it`,
    });
  }
}
