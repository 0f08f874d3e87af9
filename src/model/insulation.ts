/**
 * Insulation resistance by IEEE Std 43-2013: correction to 40 °C, recommended minimums, and the
 * polarization index.
 */
import type { InsulationClass, InsulationSystem, TestedWinding } from './machine.js';

export const IR_BASE_TEMPERATURE_C = 40;

/**
 * The factor K_T that takes an IR read at `testC` to 40 °C (R40 = K_T · R_T). IEEE 43-2013 treats
 * the two kinds of insulation differently:
 * - thermoplastic (asphaltic mica, shellac — older windings): IR halves for every 10 °C rise,
 *   K_T = 0.5^((40 − T)/10), the approximation the standard's earlier editions gave;
 * - thermosetting (epoxy and polyester systems, most windings since the 1970s): an Arrhenius form
 *   K_T = exp(−B·(1/(T + 273) − 1/313)), with B = 4230 K below 40 °C and 1245 K from 40 °C up
 *   (from memory: verify against IEEE 43-2013 clause 6.4).
 */
export function insulationCorrectionFactor(testC: number, system: InsulationSystem = 'thermosetting'): number {
  if (system === 'thermoplastic') return Math.pow(0.5, (IR_BASE_TEMPERATURE_C - testC) / 10);
  const b = testC < IR_BASE_TEMPERATURE_C ? THERMOSET_B_BELOW_40_K : THERMOSET_B_FROM_40_K;
  return Math.exp(-b * (1 / (testC + 273) - 1 / (IR_BASE_TEMPERATURE_C + 273)));
}
/** IEEE 43-2013 thermosetting constants, from memory (see insulationCorrectionFactor). */
export const THERMOSET_B_BELOW_40_K = 4230;
export const THERMOSET_B_FROM_40_K = 1245;

/** IR corrected to 40 °C: R40 = K_T · R_T. */
export function insulationAt40C(megohms: number, testC: number, system: InsulationSystem = 'thermosetting'): number {
  return megohms * insulationCorrectionFactor(testC, system);
}

/**
 * Recommended minimum 1-minute IR at 40 °C, IEEE 43-2013 clause 12.3 (Table 3): DC armatures
 * take the 5 MΩ row (the 2000 edition had them at 100 MΩ); field windings take kV + 1.
 * A whole-machine test takes the strictest of its windings.
 */
export function insulationMinimum(winding: TestedWinding, ratedVolts: { armature: number; field: number }): number {
  const fieldRow = ratedVolts.field / 1000 + 1;
  const armatureRow = 5;
  switch (winding) {
    case 'armature':
      return armatureRow;
    case 'shunt-field':
      return fieldRow;
    case 'series-field':
      return ratedVolts.armature / 1000 + 1;
    case 'whole-machine':
      return Math.max(armatureRow, fieldRow, ratedVolts.armature / 1000 + 1);
  }
}

/** Minimum PI, IEEE 43-2013 Table 4: class A 1.5, classes B and above 2.0. */
export function polarizationIndexMinimum(cls: InsulationClass): number {
  return cls === 'A' ? 1.5 : 2.0;
}

/** Above 5000 MΩ at one minute the PI says nothing about the winding (IEEE 43-2013 clause 12.2). */
export const PI_NOT_MEANINGFUL_ABOVE_MOHM = 5000;

/** DC test voltage for an IR test, IEEE 43 Table 1, from the winding's rated DC voltage. */
export function insulationTestVoltage(ratedVolts: number): { min: number; max: number } {
  if (ratedVolts < 1000) return { min: 500, max: 500 };
  if (ratedVolts <= 2500) return { min: 500, max: 1000 };
  if (ratedVolts <= 5000) return { min: 1000, max: 2500 };
  if (ratedVolts <= 12000) return { min: 2500, max: 5000 };
  return { min: 5000, max: 10000 };
}
