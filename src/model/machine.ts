/**
 * The machine as the model sees it: plain numbers in declared units
 * (V, A, ohm, W, rpm, degC, Mohm). The case schema converts typed quantities into this shape.
 */

import type { WindingMaterial } from './resistance.js';

export const CONNECTIONS = [
  'series',
  'shunt',
  'separately-excited',
  'compound-cumulative',
  'compound-differential',
  'compound',
  'permanent-magnet',
] as const;
export type Connection = (typeof CONNECTIONS)[number];

export const INSULATION_CLASSES = ['A', 'B', 'F', 'H'] as const;
export type InsulationClass = (typeof INSULATION_CLASSES)[number];

/** IEEE 43-2013 corrects IR for temperature differently for the two (thermosetting when not said). */
export const INSULATION_SYSTEMS = ['thermosetting', 'thermoplastic'] as const;
export type InsulationSystem = (typeof INSULATION_SYSTEMS)[number];

export const TESTED_WINDINGS = ['armature', 'shunt-field', 'series-field', 'whole-machine'] as const;
export type TestedWinding = (typeof TESTED_WINDINGS)[number];

/** How each connection is built: what shared code needs, declared once, not branched on by name. */
export interface ConnectionTraits {
  /** A shunt or separately excited field sets the flux. */
  shuntField: boolean;
  /** A series field carries armature current. */
  seriesField: boolean;
  /** +1 series field aids the shunt field, -1 opposes it, 0 none. */
  seriesSense: 1 | -1 | 0;
  /** The shunt field is fed from the armature terminals unless a field voltage is measured. */
  fieldAcrossTerminals: boolean;
  /** Part of rated flux set by the series field when no test data says otherwise. */
  defaultSeriesShare: number;
  label: string;
}

export const CONNECTION_TRAITS: Record<Connection, ConnectionTraits> = {
  series: { shuntField: false, seriesField: true, seriesSense: 1, fieldAcrossTerminals: false, defaultSeriesShare: 1, label: 'series' },
  shunt: { shuntField: true, seriesField: false, seriesSense: 0, fieldAcrossTerminals: true, defaultSeriesShare: 0, label: 'shunt' },
  'separately-excited': { shuntField: true, seriesField: false, seriesSense: 0, fieldAcrossTerminals: false, defaultSeriesShare: 0, label: 'separately excited' },
  'compound-cumulative': { shuntField: true, seriesField: true, seriesSense: 1, fieldAcrossTerminals: true, defaultSeriesShare: 0.2, label: 'cumulative compound' },
  'compound-differential': { shuntField: true, seriesField: true, seriesSense: -1, fieldAcrossTerminals: true, defaultSeriesShare: 0.2, label: 'differential compound' },
  // Mode unknown: modelled as the usual cumulative machine, and the output says so.
  compound: { shuntField: true, seriesField: true, seriesSense: 1, fieldAcrossTerminals: true, defaultSeriesShare: 0.2, label: 'compound (mode unknown, taken as cumulative)' },
  'permanent-magnet': { shuntField: false, seriesField: false, seriesSense: 0, fieldAcrossTerminals: false, defaultSeriesShare: 0, label: 'permanent magnet' },
};

/** Flux per unit against field (or, for a series machine, armature) current per unit. */
export type Magnetization = 'linear' | ReadonlyArray<readonly [number, number]>;

export interface Nameplate {
  armatureVoltage?: number | undefined;
  armatureCurrent?: number | undefined;
  lineCurrent?: number | undefined;
  speed?: number | undefined;
  /** Top of the field-weakening range (a plate written "1750/2300 r/min" gives base and top). */
  maxSpeed?: number | undefined;
  noLoadSpeed?: number | undefined;
  /** Armature current running uncoupled at rated voltage, from the plate or the test sheet: the no-load reference for any connection. */
  noLoadCurrent?: number | undefined;
  power?: number | undefined;
  fieldVoltage?: number | undefined;
  fieldCurrent?: number | undefined;
  insulationClass?: InsulationClass | undefined;
}

export interface Resistances {
  armature?: number | undefined;
  shuntField?: number | undefined;
  seriesField?: number | undefined;
  interpole?: number | undefined;
  /** Winding temperature when measured, degC. */
  at?: number | undefined;
}

export interface MachineData {
  connection: Connection;
  nameplate?: Nameplate | undefined;
  resistances?: Resistances | undefined;
  magnetization?: Magnetization | undefined;
  /** Total brush contact drop, V. */
  brushDrop?: number | undefined;
  /** What feeds the armature: a controlled converter sets its voltage for the speed asked. */
  drive?: 'fixed-supply' | 'controlled-converter' | 'battery' | 'unknown' | undefined;
  insulationSystem?: InsulationSystem | undefined;
  windingMaterial?: WindingMaterial | undefined;
}

export interface Readings {
  armatureVoltage?: number | undefined;
  supplyVoltage?: number | undefined;
  /** Starter or external resistance still in the armature circuit, between the supply and the terminals (0 at run). */
  starterResistance?: number | undefined;
  armatureCurrent?: number | undefined;
  fieldVoltage?: number | undefined;
  fieldCurrent?: number | undefined;
  /** The field regulator's set point, where the drive regulates field current. */
  fieldCurrentSetting?: number | undefined;
  /** Field winding temperature while the running readings were taken (a cold machine is at ambient). */
  fieldTemperature?: number | undefined;
  lineCurrent?: number | undefined;
  speed?: number | undefined;
  speedReverse?: number | undefined;
  noLoadArmatureCurrent?: number | undefined;
  /** Speed running uncoupled on the same supply: with the no-load current, a second operating point. */
  uncoupledSpeed?: number | undefined;
  ambientTemperature?: number | undefined;
  armatureResistanceHot?: number | undefined;
  shuntFieldResistanceHot?: number | undefined;
  insulationResistance1min?: number | undefined;
  insulationResistance10min?: number | undefined;
  insulationTestTemperature?: number | undefined;
  insulationTestVoltage?: number | undefined;
  insulationTestedWinding?: TestedWinding | undefined;
  tachoVoltage?: number | undefined;
  currentLimitSetting?: number | undefined;
  brushLength?: number | undefined;
  brushLengthNew?: number | undefined;
  brushSpringPressure?: number | undefined;
  commutatorRunout?: number | undefined;
}
