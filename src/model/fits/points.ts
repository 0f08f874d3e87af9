/**
 * The job's own operating points, fitted together: the running readings, the machine run
 * uncoupled (its no-load current and speed), and any worked check that read voltage, current and
 * speed again (at another load, or after a change). Two or more points at different currents
 * give the armature circuit resistance and kΦ by least squares (measured-constants.ts), set
 * beside what the healthy machine has: a resistance several times the circuit's own with kΦ
 * where it should be is a resistance fault; kΦ short with the resistance right is a flux fault.
 */
import type { Readings } from '../machine.js';
import type { ModelMachine } from '../families/context.js';
import { fitBasis } from './basis.js';
import { fitArmatureCircuit, type OperatingPoint } from './measured-constants.js';

export interface LabelledPoint extends OperatingPoint {
  label: string;
}

/** Points closer in current than this share of rated leave the resistance to the reading errors (±2 % on speed is ±40 % on R at half rated current apart). */
const SAME_CURRENT_SHARE = 0.4;

/** The operating points a job holds: running, uncoupled, and those worked checks read. */
export function operatingPoints(readings: Readings, fromChecks: readonly { label: string; readings: Readings }[] = []): LabelledPoint[] {
  const out: LabelledPoint[] = [];
  const add = (label: string, volts: number | undefined, amps: number | undefined, rpm: number | undefined) => {
    if (volts === undefined || amps === undefined || rpm === undefined || !(volts > 0) || !(amps >= 0) || !(rpm > 0)) return;
    if (out.some((p) => p.volts === volts && p.amps === amps && p.rpm === rpm)) return;
    out.push({ label, volts, amps, rpm });
  };
  // The points checks read go first, under their own names; the latest readings are one of them when checks were worked.
  for (const c of fromChecks) add(c.label, c.readings.armatureVoltage ?? readings.armatureVoltage, c.readings.armatureCurrent, c.readings.speed);
  add('running', readings.armatureVoltage, readings.armatureCurrent, readings.speed);
  // Uncoupled on the same supply the terminals see nearly the supply-end voltage (little current, little cable drop); else the running terminal voltage.
  add('uncoupled', readings.supplyVoltage ?? readings.armatureVoltage, readings.noLoadArmatureCurrent, readings.uncoupledSpeed);
  return out;
}

export interface CircuitFacts {
  points: number;
  /** Fitted armature circuit resistance, Ω. */
  resistance: number;
  /** Fitted over the healthy circuit's. */
  resistanceRatio: number;
  /** Fitted kΦ over the healthy kΦ at the field the machine has. */
  fluxRatio: number;
  /** The largest point residual as a share of its voltage (0 with two points). */
  worstResidualShare: number;
  says: string;
}

const pct = (x: number) => `${Math.round(x * 100)} %`;
const ohms = (x: number) => `${Number(x.toPrecision(3))} Ω`;

/**
 * The circuit fit over the job's points, undefined with fewer than two points at currents far
 * enough apart to separate resistance from kΦ.
 * @example circuitFacts(machine, readings, points)?.says
 *   // "from 2 operating points (running, uncoupled) the armature circuit measures 0.95 Ω, 3.1 × the 0.31 Ω it should have, with kΦ at 99 % of healthy"
 */
export function circuitFacts(machine: ModelMachine, readings: Readings, points: readonly LabelledPoint[]): CircuitFacts | undefined {
  if (points.length < 2) return undefined;
  const b = fitBasis(machine, readings);
  if (!b || b.voltageFree) return undefined;
  const currents = points.map((p) => p.amps);
  if (Math.max(...currents) - Math.min(...currents) < SAME_CURRENT_SHARE * b.ratedAmps) return undefined;
  const fieldPu = b.shuntField ? (readings.fieldCurrent ?? b.healthyFieldAt(readings.armatureVoltage ?? b.ratedVolts)) / b.ratedFieldAmps! : 0;
  const shape = (amps: number) => b.flux(fieldPu, amps / b.ratedAmps);
  const fit = fitArmatureCircuit(points, b.brushDrop, shape);
  if (!fit || !(fit.machineConstant > 0)) return undefined;
  const resistanceRatio = fit.resistance / b.circuitOhms;
  const fluxRatio = fit.machineConstant / b.kPhiRated;
  const residual = points.length > 2 ? `; the points sit within ${pct(Math.max(0.01, fit.worstResidualShare))} of one line` : '';
  const says = `from ${points.length} operating points (${points.map((p) => p.label).join(', ')}) the armature circuit measures ${ohms(fit.resistance)}, ${Number(resistanceRatio.toFixed(1))} × the ${ohms(b.circuitOhms)} it should have, with kΦ at ${pct(fluxRatio)} of healthy${residual}`;
  return { points: points.length, resistance: fit.resistance, resistanceRatio, fluxRatio, worstResidualShare: fit.worstResidualShare, says };
}
