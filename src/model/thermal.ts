/**
 * Thermal classes. The class temperature is IEC 60085's; the winding limit the tool compares a
 * resistance-method temperature with is the 40 °C reference coolant plus the IEC 60034-1 rise limit
 * for armature windings connected to a commutator and for DC field windings (B 80 K, F 105 K,
 * H 125 K; class A 60 K, from memory).
 */
import type { InsulationClass } from './machine.js';

export const CLASS_TEMPERATURE_C: Record<InsulationClass, number> = { A: 105, B: 130, F: 155, H: 180 };
export const RISE_LIMIT_K: Record<InsulationClass, number> = { A: 60, B: 80, F: 105, H: 125 };
export const REFERENCE_COOLANT_C = 40;

/** Highest average winding temperature (resistance method) the class allows at 40 °C coolant. */
export function windingTemperatureLimit(cls: InsulationClass): number {
  return REFERENCE_COOLANT_C + RISE_LIMIT_K[cls];
}

/**
 * Temperature resistances are corrected to when the machine is taken as warm: the specified
 * temperatures of IEEE 112/113 practice (class A 75 °C, B 95 °C, F 115 °C, H 130 °C; from memory),
 * 75 °C when the class is not known.
 */
export function workingTemperature(cls: InsulationClass | undefined): number {
  return cls === undefined ? 75 : { A: 75, B: 95, F: 115, H: 130 }[cls];
}
