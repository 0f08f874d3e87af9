/**
 * One hypothesis per physical fault signature: the fault's own parameter, where it acts in the
 * machine equations, the range the search covers and the range in which the value still means
 * that fault (a field at 140 % is not "weak"). Which causes a hypothesis speaks for is data, in
 * the rule file that reads the fits (rules/fits.json), not here.
 */
import type { Readings } from '../machine.js';
import type { FitBasis } from './basis.js';

/** The world one hypothesis changes: each field's healthy value is the neutral one. */
export interface World {
  /** Voltage the supply gives at its own end, V. */
  sourceVolts: number;
  /** Resistance between the supply end and the terminals, Ω. */
  cableOhms: number;
  /** Resistance added to the armature circuit, Ω. */
  extraOhms: number;
  /** The field supply's current as a share of the healthy field's. */
  fieldFactor: number;
  /** Share of the shunt-field turns shorted out. */
  turnsShorted: number;
  /** Share of the healthy series-field mmf that acts (0 shorted, −1 reversed). */
  seriesFactor: number;
  /** Flux as a share of what the excitation gives (magnet strength). */
  fluxFactor: number;
}

export type HypothesisKind = 'machine' | 'load';

export interface Hypothesis {
  id: string;
  kind: HypothesisKind;
  /** What the parameter is, in words: "extra armature-circuit resistance". */
  parameter: string;
  unit: string;
  /** The parameter's value on a healthy machine. */
  healthy: (b: FitBasis) => number;
  /** The range searched (machine hypotheses). */
  search: (b: FitBasis, r: Readings) => [number, number];
  /** True where the value still means this fault. */
  plausible: (value: number, b: FitBasis, r: Readings) => boolean;
  /** Whether the hypothesis can exist on this machine and be judged with these readings. */
  applies: (b: FitBasis, r: Readings) => boolean;
  /** The field of the world the parameter sets (machine hypotheses). Hypotheses that set the same field over the same range share one search. */
  acts?: keyof World;
  /** The parameter computed from the readings (load hypotheses). */
  measure?: (b: FitBasis, r: Readings, torquePu: number) => number | undefined;
}

const fieldWound = (b: FitBasis) => b.shuntField;
const fixedSupply = (b: FitBasis) => !b.voltageFree;
const compound = (b: FitBasis) => b.shuntField && b.seriesField;

export const HYPOTHESES: readonly Hypothesis[] = [
  {
    id: 'weakField',
    kind: 'machine',
    parameter: 'field current as a share of the healthy field',
    unit: '1',
    healthy: () => 1,
    search: () => [0, 2],
    plausible: (v) => v >= 0 && v <= 0.94,
    applies: fieldWound,
    acts: 'fieldFactor',
  },
  {
    id: 'strongField',
    kind: 'machine',
    parameter: 'field current as a share of the healthy field',
    unit: '1',
    healthy: () => 1,
    search: () => [0, 2],
    plausible: (v) => v >= 1.06 && v <= 1.8,
    applies: fieldWound,
    acts: 'fieldFactor',
  },
  {
    id: 'fieldTurnsShorted',
    kind: 'machine',
    parameter: 'share of the field turns shorted',
    unit: '1',
    healthy: () => 0,
    search: () => [-0.3, 0.85],
    // One coil of four holds a quarter of the turns: more than that is not shorted turns in a coil.
    plausible: (v) => v >= 0.05 && v <= 0.25,
    applies: fieldWound,
    acts: 'turnsShorted',
  },
  {
    id: 'extraResistance',
    kind: 'machine',
    parameter: 'extra armature-circuit resistance',
    unit: 'ohm',
    healthy: () => 0,
    search: (b, r) => [-b.circuitOhms, Math.max(40 * b.circuitOhms, (0.8 * b.ratedVolts) / Math.max(1e-6, r.armatureCurrent ?? b.ratedAmps))],
    // A quarter of the circuit's own resistance is the least a fault adds that readings can show;
    // beyond 80 % of the terminal voltage dropped in it the machine would barely turn.
    plausible: (v, b, r) => v >= 0.25 * b.circuitOhms && v * (r.armatureCurrent ?? 0) <= 0.8 * b.ratedVolts,
    applies: (_b, r) => (r.armatureCurrent ?? 0) > 0,
    acts: 'extraOhms',
  },
  {
    id: 'lowSupply',
    kind: 'machine',
    parameter: 'supply voltage',
    unit: 'V',
    healthy: (b) => b.nominalVolts,
    search: (b) => [0.2 * b.nominalVolts, 1.8 * b.nominalVolts],
    plausible: (v, b) => v >= 0.3 * b.nominalVolts && v <= 0.94 * b.nominalVolts,
    applies: fixedSupply,
    acts: 'sourceVolts',
  },
  {
    id: 'highSupply',
    kind: 'machine',
    parameter: 'supply voltage',
    unit: 'V',
    healthy: (b) => b.nominalVolts,
    search: (b) => [0.2 * b.nominalVolts, 1.8 * b.nominalVolts],
    plausible: (v, b) => v >= 1.06 * b.ratedVolts && v <= 1.6 * b.ratedVolts,
    applies: () => true,
    acts: 'sourceVolts',
  },
  {
    id: 'cableDrop',
    kind: 'machine',
    parameter: 'resistance of the supply cable',
    unit: 'ohm',
    healthy: () => 0,
    search: (b, r) => [-0.1 * b.nominalVolts / Math.max(1e-6, r.armatureCurrent ?? b.ratedAmps), b.nominalVolts / Math.max(1e-6, r.armatureCurrent ?? b.ratedAmps)],
    // A drop of 4 % of the supply is the most a healthy cable run takes (common practice).
    plausible: (v, b, r) => v * (r.armatureCurrent ?? 0) >= 0.04 * b.nominalVolts,
    applies: (b, r) => fixedSupply(b) && r.supplyVoltage !== undefined && (r.armatureCurrent ?? 0) > 0,
    acts: 'cableOhms',
  },
  {
    id: 'seriesFieldShorted',
    kind: 'machine',
    parameter: 'share of the series-field mmf acting',
    unit: '1',
    healthy: () => 1,
    search: (b) => (b.shuntField ? [-1.6, 1.6] : [0.02, 1.6]),
    plausible: (v, b) => (b.shuntField ? v >= -0.25 && v <= 0.75 : v >= 0.1 && v <= 0.85),
    applies: (b) => b.seriesField,
    acts: 'seriesFactor',
  },
  {
    id: 'seriesFieldOpposing',
    kind: 'machine',
    parameter: 'share of the series-field mmf acting',
    unit: '1',
    healthy: () => 1,
    search: () => [-1.6, 1.6],
    plausible: (v) => v >= -1.6 && v <= -0.25,
    applies: compound,
    acts: 'seriesFactor',
  },
  {
    id: 'weakMagnets',
    kind: 'machine',
    parameter: 'magnet flux as a share of healthy',
    unit: '1',
    healthy: () => 1,
    search: () => [0.05, 2],
    plausible: (v) => v >= 0.3 && v <= 0.94,
    applies: (b) => !b.shuntField && !b.seriesField,
    acts: 'fluxFactor',
  },
  {
    id: 'overload',
    kind: 'load',
    parameter: 'load torque as a share of rated',
    unit: '1',
    healthy: () => 1,
    search: () => [0, 0],
    plausible: (v) => v >= 1.08,
    applies: (_b, r) => (r.armatureCurrent ?? 0) > 0,
    measure: (_b, _r, torquePu) => torquePu,
  },
  {
    id: 'lightLoad',
    kind: 'load',
    parameter: 'load torque as a share of rated',
    unit: '1',
    healthy: () => 1,
    search: () => [0, 0],
    plausible: (v) => v <= 0.3,
    applies: (b, r) => r.armatureCurrent !== undefined && b.seriesField && !b.shuntField,
    measure: (_b, _r, torquePu) => torquePu,
  },
  {
    id: 'currentLimit',
    kind: 'load',
    parameter: 'current limit',
    unit: 'A',
    healthy: (b) => b.ratedAmps,
    search: () => [0, 0],
    // The current sits at the limit (within 4 %), and the limit is below rated current.
    plausible: (v, b, r) => Math.abs((r.armatureCurrent ?? 0) - v) <= 0.04 * v && v < 0.97 * b.ratedAmps,
    applies: (b, r) => b.voltageFree && r.currentLimitSetting !== undefined && r.armatureCurrent !== undefined,
    measure: (_b, r) => r.currentLimitSetting,
  },
];

export const HYPOTHESIS_IDS = HYPOTHESES.map((h) => h.id);
