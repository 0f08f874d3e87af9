/**
 * The machine's constants as the readings measure them. From one loaded operating point, the
 * machine constant kΦ = (V − Ia·R − Vb)/ω; from two or more points of the same machine (no load
 * and loaded, before and after, forward and reverse), the armature circuit resistance and kΦ
 * by linear least squares, with each point's residual. Plain numbers: V, A, rpm, Ω, V·s/rad.
 */
import { rpmToRadS } from '../families/context.js';

export interface OperatingPoint {
  /** Armature terminal voltage, V. */
  volts: number;
  /** Armature current, A. */
  amps: number;
  /** Speed, rpm. */
  rpm: number;
}

/**
 * kΦ at one operating point, V·s/rad (the same number as the torque constant in N·m/A).
 * @example measuredMachineConstant({ volts: 150, amps: 50, rpm: 1000 }, 1, 0) // 0.955
 */
export function measuredMachineConstant(p: OperatingPoint, circuitOhms: number, brushDropV: number): number | undefined {
  const w = rpmToRadS(p.rpm);
  if (!(w > 0)) return undefined;
  return (p.volts - p.amps * circuitOhms - (p.amps > 0 ? brushDropV : 0)) / w;
}

export interface CircuitFit {
  /** Armature circuit resistance, Ω. */
  resistance: number;
  /** kΦ at rated exciting current (times `fluxShape` at each point), V·s/rad. */
  machineConstant: number;
  /** Measured minus fitted terminal voltage at each point, V. */
  residualVolts: number[];
  /** The largest residual as a share of its point's voltage. */
  worstResidualShare: number;
}

/**
 * Fits V − Vb = kΦ·s(Ia)·ω + R·Ia over the points, where s is the flux shape (1 for a constant
 * field; Φ/Φr against current for a series machine). Two unknowns, so two or more points that
 * differ in current; undefined when the points cannot separate R from kΦ.
 * @example fitArmatureCircuit([{ volts: 150, amps: 50, rpm: 1000 }, { volts: 150, amps: 4, rpm: 1460 }], 0)
 *   // { resistance: 1, machineConstant: 0.955, … }
 */
export function fitArmatureCircuit(points: readonly OperatingPoint[], brushDropV: number, fluxShape: (amps: number) => number = () => 1): CircuitFit | undefined {
  if (points.length < 2) return undefined;
  // Normal equations of y = a·x1 + b·x2 with x1 = s·ω, x2 = Ia.
  let s11 = 0;
  let s12 = 0;
  let s22 = 0;
  let t1 = 0;
  let t2 = 0;
  const rows = points.map((p) => ({ x1: fluxShape(p.amps) * rpmToRadS(p.rpm), x2: p.amps, y: p.volts - (p.amps > 0 ? brushDropV : 0), v: p.volts }));
  for (const r of rows) {
    s11 += r.x1 * r.x1;
    s12 += r.x1 * r.x2;
    s22 += r.x2 * r.x2;
    t1 += r.x1 * r.y;
    t2 += r.x2 * r.y;
  }
  const det = s11 * s22 - s12 * s12;
  if (!(Math.abs(det) > 1e-9 * s11 * s22)) return undefined;
  const machineConstant = (t1 * s22 - t2 * s12) / det;
  const resistance = (s11 * t2 - s12 * t1) / det;
  const residualVolts = rows.map((r) => r.y - machineConstant * r.x1 - resistance * r.x2);
  const worstResidualShare = Math.max(...rows.map((r, k) => Math.abs(residualVolts[k]!) / Math.max(1e-9, r.v)));
  return { resistance, machineConstant, residualVolts, worstResidualShare };
}
