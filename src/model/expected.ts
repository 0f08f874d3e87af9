/**
 * What a healthy machine would read under the fitter's supply and load, and how far each
 * reading is from it. Pure: plain numbers in, a map of quantities out, with what could not be
 * computed and which value would allow it.
 *
 * The work is done by small families of computations, in the order each needs the one before:
 * the rated point and armature circuit, the healthy field, the operating point (speed, torque),
 * winding heat, insulation, and readings judged against plain references.
 */
import type { Readings } from './machine.js';
import { newContext, type Expectation, type ModelMachine } from './families/context.js';
import { ratedPoint } from './families/rated-point.js';
import { healthyField } from './families/field.js';
import { operatingPoint } from './families/speed.js';
import { windingHeat } from './families/winding-heat.js';
import { insulationJudgement } from './families/insulation.js';
import { plainReferences } from './families/references.js';

export type { Expectation, Finding, Missing, Quantity } from './families/context.js';
export { DEFAULT_BRUSH_DROP_V, nameplateHint } from './families/rated-point.js';

export interface ModelInput {
  machine: ModelMachine;
  readings?: Readings | undefined;
}

/** The families in the order they run: each may use what the ones before it derived. */
const FAMILIES = [ratedPoint, healthyField, operatingPoint, windingHeat, insulationJudgement, plainReferences];

/**
 * @example
 * computeExpectations({ machine: { connection: 'shunt', nameplate: { armatureVoltage: 230, … } }, readings: { … } })
 *   .quantities.speed // { value: 1768.7, unit: 'rpm', measured: 2520, ratio: 1.42, … }
 */
export function computeExpectations({ machine, readings = {} }: ModelInput): Expectation {
  const ctx = newContext(machine, readings);
  for (const family of FAMILIES) family(ctx);
  return ctx.out;
}
