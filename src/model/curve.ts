/**
 * The healthy machine's speed against armature current at one terminal voltage: the
 * characteristic a fitter compares the measured operating point with. Built by asking the model
 * at each current, so it follows exactly what the rest of the tool computes.
 */
import { computeExpectations, type ModelInput } from './expected.js';

export interface CurvePoint {
  current: number;
  speed: number;
}

export interface SpeedCurves {
  voltage: number;
  ratedCurrent: number;
  /** The healthy machine, 0–150 % of rated current; a current where the model gives no speed is left out. */
  healthy: CurvePoint[];
  /** The same machine with the measured field current, when there is one. */
  withMeasuredField?: CurvePoint[];
  measured?: CurvePoint;
}

/** Steps across 0–150 % of rated armature current. */
export const CURVE_STEPS = 30;

export function speedCurves(input: ModelInput): SpeedCurves | undefined {
  const e = computeExpectations(input);
  const rated = e.quantities.ratedArmatureCurrent?.value;
  const voltage = input.readings?.armatureVoltage ?? input.machine.nameplate?.armatureVoltage;
  if (rated === undefined || voltage === undefined || !(rated > 0)) return undefined;
  const at = (current: number, fieldCurrent?: number) => {
    const q = computeExpectations({ machine: input.machine, readings: { armatureVoltage: voltage, armatureCurrent: current, ...(fieldCurrent === undefined ? { fieldVoltage: input.readings?.fieldVoltage } : { fieldCurrent, fieldVoltage: input.readings?.fieldVoltage }) } }).quantities;
    return (fieldCurrent === undefined ? q.speed : q.speedFromMeasuredField)?.value;
  };
  const grid = Array.from({ length: CURVE_STEPS + 1 }, (_, k) => (1.5 * rated * k) / CURVE_STEPS);
  const points = (fieldCurrent?: number) => grid.flatMap((current) => {
    const speed = at(current, fieldCurrent);
    return speed === undefined || !Number.isFinite(speed) ? [] : [{ current, speed }];
  });
  const healthy = points();
  if (healthy.length < 2) return undefined;
  const out: SpeedCurves = { voltage, ratedCurrent: rated, healthy };
  const fieldCurrent = input.readings?.fieldCurrent;
  if (fieldCurrent !== undefined) {
    const alt = points(fieldCurrent);
    if (alt.length >= 2) out.withMeasuredField = alt;
  }
  const ia = input.readings?.armatureCurrent;
  const n = input.readings?.speed;
  if (ia !== undefined && n !== undefined) out.measured = { current: ia, speed: n };
  return out;
}
