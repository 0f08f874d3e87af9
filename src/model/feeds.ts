/**
 * Which model quantities a reading feeds, found by asking the model rather than by a list to
 * keep in step: a probe machine is given every reading but this one, then this one too, and the
 * quantities that then measure it, or are derived from it, are the ones it feeds.
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
  speed: 1450, speedReverse: 1440, noLoadArmatureCurrent: 3, uncoupledSpeed: 1690, ambientTemperature: 25, armatureResistanceHot: 0.5,
  shuntFieldResistanceHot: 240, insulationResistance1min: 100, insulationResistance10min: 250, insulationTestTemperature: 30,
  insulationTestVoltage: 500, tachoVoltage: 86, currentLimitSetting: 60, brushLength: 20, brushLengthNew: 32,
  brushSpringPressure: 18, commutatorRunout: 0.02, fieldCurrentSetting: 1, fieldTemperature: 60, starterResistance: 0,
};

export function quantitiesFedBy(reading: string): QuantityName[] {
  const all = PROBE_READINGS as Readings;
  const without = Object.fromEntries(Object.entries(all).filter(([k]) => k !== reading)) as Readings;
  const before = computeExpectations({ machine: PROBE_MACHINE, readings: without });
  const after = computeExpectations({ machine: PROBE_MACHINE, readings: all });
  const probed = (all as Record<string, number>)[reading];
  // Fed: a quantity that measures this very reading or takes it as its reference, or one derived from
  // readings alone (no measured side). One whose expected value merely becomes computable (speed, once
  // Ia is known) is not.
  return (Object.keys(after.quantities) as QuantityName[]).filter((k) => {
    const a = after.quantities[k]!;
    const b = before.quantities[k];
    const changed = !b || a.measured !== b.measured || a.value !== b.value;
    return changed && (a.measured === null || a.measured === probed || a.value === probed);
  });
}
