/**
 * Copper winding resistance against temperature (resistance method).
 * R2 / R1 = (k + θ2) / (k + θ1), with k = 234.5 °C for annealed copper as IEEE Std 118
 * and IEC 60228 use it (IEC 60034-1 rounds it to 235; the two differ by about 0.1 K).
 */
export const COPPER_INFERRED_ZERO_C = 234.5;
/** Aluminium (EC grade) windings: 225 °C, as IEEE machine and transformer practice uses it. */
export const ALUMINIUM_INFERRED_ZERO_C = 225;

export const WINDING_MATERIALS = ['copper', 'aluminium'] as const;
export type WindingMaterial = (typeof WINDING_MATERIALS)[number];

/** The inferred zero-resistance temperature of a winding material (copper when not said). */
export function inferredZero(material: WindingMaterial | undefined): number {
  return material === 'aluminium' ? ALUMINIUM_INFERRED_ZERO_C : COPPER_INFERRED_ZERO_C;
}

/** Resistance at `toC` of a copper winding measured as `r` at `fromC`. */
export function resistanceAt(r: number, fromC: number, toC: number, k = COPPER_INFERRED_ZERO_C): number {
  return (r * (k + toC)) / (k + fromC);
}

/**
 * Average winding temperature from its hot and cold resistance.
 * @example windingTemperature(0.62, 0.5, 20) // 81.08 °C
 */
export function windingTemperature(hot: number, cold: number, coldC: number, k = COPPER_INFERRED_ZERO_C): number {
  return (hot / cold) * (k + coldC) - k;
}
