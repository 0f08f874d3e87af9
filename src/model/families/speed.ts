/**
 * Speed and torque at the measured operating point: the speed a healthy machine would run at,
 * the speed the measured field gives, back-EMF, torque at the flux the machine really has, the
 * healthy speed regulation, and the top of the plate's field-weakening range.
 */
import type { QuantityName } from '../quantity-names.js';
import { addQuantity, find, fmt, needs, radSToRpm, round, type ModelContext } from './context.js';
import { fluxAt, speedFrom } from './rated-point.js';

/** Field current below this share of rated leaves only residual flux: the model gives no speed. */
const FIELD_NEAR_ZERO_PU = 0.05;
/** A series machine's flux at this share of rated current or below is too uncertain to give a speed. */
const SERIES_CURRENT_FLOOR_PU = 0.05;

export function operatingPoint(ctx: ModelContext): void {
  const { readings, traits, derived: d } = ctx;
  const np = ctx.machine.nameplate ?? {};
  let ia = readings.armatureCurrent;
  if (ia === undefined && readings.lineCurrent !== undefined) {
    const fieldShare = traits.fieldAcrossTerminals ? readings.fieldCurrent ?? d.expectedField ?? 0 : 0;
    ia = Math.max(0, readings.lineCurrent - fieldShare);
  }
  if (ia !== undefined) d.ia = ia;
  const vm = readings.armatureVoltage;
  /** Below this share of rated voltage the machine is not energised: no speed, and no runaway, to compute. */
  d.deadTerminals = vm !== undefined && np.armatureVoltage !== undefined && vm < 0.05 * np.armatureVoltage;
  if (d.deadTerminals) find(ctx, 'no-terminal-voltage', `${fmt(vm!, 'V')} at the terminals: the machine is not energised`);

  const phiHealthy = speedAt(ctx, d.expectedField, 'the healthy', 'speed');
  let phiMeasured: number | undefined;
  if (traits.shuntField) {
    if (needs(ctx, 'speedFromMeasuredField', { 'readings.fieldCurrent': readings.fieldCurrent })) phiMeasured = speedAt(ctx, readings.fieldCurrent, 'the measured', 'speedFromMeasuredField');
  }
  const phiNow = traits.shuntField && readings.fieldCurrent !== undefined ? phiMeasured : phiHealthy;
  if (phiNow !== undefined) d.phiNow = phiNow;

  if (vm !== undefined && ia !== undefined && d.circuitR !== undefined) {
    addQuantity(ctx, 'backEmf', { value: vm - ia * d.circuitR - (ia > 0 ? d.brushDrop : 0), unit: 'V', formula: 'E = V − Ia·R − Vb at the measured point', estimated: d.circuitEstimated });
  }
  if (needs(ctx, 'torque', { 'readings.armatureCurrent': ia, 'the machine constant (see machineConstant)': d.kPhiRated }) && phiNow !== undefined) {
    const which = traits.shuntField && readings.fieldCurrent !== undefined ? 'the measured field' : 'the healthy field';
    addQuantity(ctx, 'torque', { value: d.kPhiRated! * phiNow * ia!, unit: 'N m', formula: `T = kΦ·Ia (electromagnetic, at the measured current, flux from ${which})`, estimated: d.circuitEstimated });
  }
  speedRegulation(ctx);
  if (np.maxSpeed !== undefined && readings.speed !== undefined) {
    addQuantity(ctx, 'maxSpeed', { value: np.maxSpeed, unit: 'rpm', measured: readings.speed, formula: 'top of the field-weakening range, nameplate' });
  }
}

/** Adds the speed a field current gives at the measured point; returns the flux per unit it used. */
function speedAt(ctx: ModelContext, fieldA: number | undefined, label: string, name: QuantityName): number | undefined {
  const { readings, traits, derived: d } = ctx;
  if (d.deadTerminals) return undefined;
  const ok = needs(ctx, name, {
    'the machine constant (see machineConstant)': d.kPhiRated,
    'readings.armatureVoltage': readings.armatureVoltage,
    'readings.armatureCurrent': d.ia,
  });
  if (!ok || d.ratedIa === undefined) return undefined;
  const ia = d.ia!;
  const fieldPu = traits.shuntField ? (fieldA ?? NaN) / (d.ratedFieldCurrent ?? NaN) : 0;
  if (traits.shuntField && !(fieldPu >= 0)) {
    ctx.out.missing.push({ quantity: name, needs: ['machine.nameplate.fieldCurrent or machine.resistances.shuntField'] });
    return undefined;
  }
  const armaturePu = ia / d.ratedIa;
  if (traits.shuntField && !traits.seriesField && fieldPu < FIELD_NEAR_ZERO_PU) {
    find(ctx, 'field-near-zero', `${label} field current ${fmt(fieldA ?? 0, 'A')} leaves only residual flux: nothing in the model limits the speed (runaway)`);
    return undefined;
  }
  if (!traits.shuntField && traits.seriesField && armaturePu < SERIES_CURRENT_FLOOR_PU) {
    find(ctx, 'series-current-near-zero', `armature current ${fmt(ia, 'A')} is under ${SERIES_CURRENT_FLOOR_PU * 100} % of rated: a series machine's speed is not bounded there (runaway)`);
    return undefined;
  }
  const phi = fluxAt(ctx, fieldPu, armaturePu);
  if (phi <= 0) return undefined;
  addQuantity(ctx, name, {
    value: Math.max(0, speedFrom(ctx, readings.armatureVoltage!, ia, phi)),
    unit: 'rpm',
    measured: readings.speed,
    formula: `n = E/(kΦ_r·Φ/Φ_r), E = V − Ia·R − Vb, Φ/Φ_r = ${round(phi, 3)} from ${label} field`,
    estimated: d.circuitEstimated,
  });
  return phi;
}

/** Speed regulation of the healthy machine between no load and rated load. */
function speedRegulation(ctx: ModelContext): void {
  const { readings, traits, derived: d } = ctx;
  const np = ctx.machine.nameplate ?? {};
  if (d.kPhiRated === undefined || np.speed === undefined || np.armatureVoltage === undefined || d.ratedIa === undefined || d.circuitR === undefined) return;
  let noLoad = np.noLoadSpeed;
  if (noLoad === undefined && traits.shuntField) {
    const iaNl = readings.noLoadArmatureCurrent ?? 0.05 * d.ratedIa;
    noLoad = speedFrom(ctx, np.armatureVoltage, iaNl, fluxAt(ctx, 1, iaNl / d.ratedIa));
  } else if (noLoad === undefined && !traits.seriesField) {
    noLoad = radSToRpm((np.armatureVoltage - d.brushDrop) / d.kPhiRated);
  }
  if (noLoad !== undefined) {
    addQuantity(ctx, 'speedRegulation', { value: ((noLoad - np.speed) / np.speed) * 100, unit: '%', formula: 'SR = (n_NL − n_FL)/n_FL', estimated: d.circuitEstimated || np.noLoadSpeed === undefined });
  }
}
