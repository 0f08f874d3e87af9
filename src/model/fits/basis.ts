/**
 * What the fits need from the healthy model, taken from the same families `computeExpectations`
 * runs (rated point, healthy field, operating point), so a fit and the expectation table never
 * disagree about the healthy machine.
 */
import type { Readings } from '../machine.js';
import { newContext, type ModelContext, type ModelMachine } from '../families/context.js';
import { fluxAt, ratedPoint } from '../families/rated-point.js';
import { healthyField } from '../families/field.js';
import { operatingPoint } from '../families/speed.js';

export interface FitBasis {
  ctx: ModelContext;
  ratedVolts: number;
  ratedAmps: number;
  circuitOhms: number;
  brushDrop: number;
  kPhiRated: number;
  /** Shunt or separately excited field present (its current is a reading to explain). */
  shuntField: boolean;
  seriesField: boolean;
  /** The shunt field is fed from the armature terminals, so it follows their voltage. */
  fieldAcrossTerminals: boolean;
  /** A field regulator holds the current at its set point (known from a set point reading). */
  fieldRegulated: boolean;
  ratedFieldAmps?: number | undefined;
  /** The healthy field current at a terminal voltage (the field family's reference, following the terminals where it is fed from them). */
  healthyFieldAt: (terminalVolts: number) => number;
  /** A controlled converter sets the armature voltage for the speed asked: the voltage is free. */
  voltageFree: boolean;
  /** The voltage a healthy fixed supply gives the machine: the supply-end reading, else the plate. */
  nominalVolts: number;
  /** Flux per unit for a shunt-field current per unit, armature current per unit and series mmf factor. */
  flux: (fieldPu: number, armaturePu: number, seriesFactor?: number) => number;
}

/** Undefined when the plate does not give the rated point (no kΦ, no circuit resistance). */
export function fitBasis(machine: ModelMachine, readings: Readings): FitBasis | undefined {
  const ctx = newContext(machine, readings);
  ratedPoint(ctx);
  healthyField(ctx);
  operatingPoint(ctx);
  const d = ctx.derived;
  const np = machine.nameplate ?? {};
  if (d.kPhiRated === undefined || d.circuitR === undefined || d.ratedIa === undefined || np.armatureVoltage === undefined || !(d.kPhiRated > 0)) return undefined;
  const traits = ctx.traits;
  if (traits.shuntField && (d.ratedFieldCurrent === undefined || d.expectedField === undefined)) return undefined;
  const flux = (fieldPu: number, armaturePu: number, seriesFactor = 1) => fluxAt(ctx, fieldPu, armaturePu * seriesFactor);
  return {
    ctx,
    ratedVolts: np.armatureVoltage,
    ratedAmps: d.ratedIa,
    circuitOhms: d.circuitR,
    brushDrop: d.brushDrop,
    kPhiRated: d.kPhiRated,
    shuntField: traits.shuntField,
    seriesField: traits.seriesField,
    fieldAcrossTerminals: traits.fieldAcrossTerminals,
    fieldRegulated: readings.fieldCurrentSetting !== undefined,
    ratedFieldAmps: d.ratedFieldCurrent,
    healthyFieldAt: (v) => {
      const reference = d.expectedField ?? 0;
      const measured = readings.armatureVoltage;
      const follows = traits.fieldAcrossTerminals && readings.fieldCurrentSetting === undefined && measured !== undefined && measured > 0;
      return follows ? (reference * v) / measured : reference;
    },
    voltageFree: machine.drive === 'controlled-converter',
    nominalVolts: readings.supplyVoltage ?? np.armatureVoltage,
    flux,
  };
}
