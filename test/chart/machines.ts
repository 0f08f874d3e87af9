/** The two machines the chart tests draw: a shunt motor running on a weak field, and a series motor. */
import type { ModelInput } from '../../src/model/expected.js';
import { speedCurves, type SpeedCurves } from '../../src/model/curve.js';

export const shuntMachine: ModelInput['machine'] = {
  connection: 'shunt',
  nameplate: { armatureVoltage: 220, armatureCurrent: 24, speed: 1500, fieldVoltage: 220, fieldCurrent: 0.8 },
  resistances: { armature: 0.5 },
};
export const shuntReadings = { armatureVoltage: 221, armatureCurrent: 9.5, fieldCurrent: 0.54, speed: 2010 };

/** 600 rpm at 85 A and 250 V. */
export const seriesMachine: ModelInput['machine'] = {
  connection: 'series',
  nameplate: { armatureVoltage: 250, armatureCurrent: 85, speed: 600 },
  resistances: { armature: 0.1, seriesField: 0.05 },
  brushDrop: 3,
  magnetization: 'linear',
};

export function curvesFor(input: ModelInput): SpeedCurves {
  const curves = speedCurves(input);
  if (!curves) throw new Error('model gave no speed curve');
  return curves;
}

export const shuntCurves = () => curvesFor({ machine: shuntMachine, readings: shuntReadings });
export const seriesCurves = () => curvesFor({ machine: seriesMachine });

/** Straight-line interpolation written out here, independent of the chart's own helper. */
export function interpolate(curve: SpeedCurves['healthy'], current: number): number {
  const k = curve.findIndex((p) => p.current >= current);
  const b = curve[k];
  const a = curve[k - 1];
  if (!b || !a) throw new Error(`${current} A is outside the curve`);
  return a.speed + ((b.speed - a.speed) * (current - a.current)) / (b.current - a.current);
}
