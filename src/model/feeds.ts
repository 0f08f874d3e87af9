/**
 * Which model quantities a reading feeds, found by asking the model rather than by a list to
 * keep in step: a probe machine is given every reading but this one, then this one too, and the
 * quantities that appear or change are the ones it feeds.
 */
import { computeExpectations } from './expected.js';
import type { MachineData, Readings } from './machine.js';
import type { QuantityName } from './quantity-names.js';

const PROBE_MACHINE: MachineData & { tachoVoltsPer1000Rpm: number } = {
  connection: 'compound-cumulative',
  nameplate: { armatureVoltage: 220, armatureCurrent: 40, speed: 1500, power: 7500, fieldVoltage: 220, fieldCurrent: 1, insulationClass: 'F', noLoadSpeed: 1700 },
  resistances: { armature: 0.4, shuntField: 200, seriesField: 0.05, at: 20 },
  tachoVoltsPer1000Rpm: 60,
};

/** A plausible value for every reading; the one probed is left out of the "before" run. */
const PROBE_READINGS: Required<Omit<Readings, 'insulationTestedWinding'>> = {
  armatureVoltage: 218, supplyVoltage: 226, armatureCurrent: 30, fieldVoltage: 215, fieldCurrent: 0.95, lineCurrent: 31,
  speed: 1450, speedReverse: 1440, noLoadArmatureCurrent: 3, ambientTemperature: 25, armatureResistanceHot: 0.5,
  shuntFieldResistanceHot: 240, insulationResistance1min: 100, insulationResistance10min: 250, insulationTestTemperature: 30,
  insulationTestVoltage: 500, tachoVoltage: 86, currentLimitSetting: 60, brushLength: 20, brushLengthNew: 32,
  brushSpringPressure: 18, commutatorRunout: 0.02,
};

export function quantitiesFedBy(reading: string): QuantityName[] {
  const all = PROBE_READINGS as Readings;
  const without = Object.fromEntries(Object.entries(all).filter(([k]) => k !== reading)) as Readings;
  const before = computeExpectations({ machine: PROBE_MACHINE, readings: without });
  const after = computeExpectations({ machine: PROBE_MACHINE, readings: all });
  return (Object.keys(after.quantities) as QuantityName[]).filter((k) => {
    const a = after.quantities[k]!;
    const b = before.quantities[k];
    return !b || a.measured !== b.measured || a.value !== b.value;
  });
}
