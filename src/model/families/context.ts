/**
 * What every family of model computations shares: the machine and readings, the values one family
 * works out for the next (the rated point, the armature circuit, the flux curve), and the output
 * being built. Each family takes the context, adds its quantities, and says what it lacked.
 */
import { CONNECTION_TRAITS, type ConnectionTraits, type MachineData, type Readings } from '../machine.js';
import type { HealthyBand, QuantityName } from '../quantity-names.js';

export interface Quantity {
  value: number;
  unit: string;
  /** The matching reading for an expectation; null for a quantity derived from readings. */
  measured: number | null;
  /** measured ÷ value, when both exist. */
  ratio: number | null;
  basis: 'computed' | 'estimated';
  formula: string;
  /** The healthy band where this machine has its own, instead of the quantity's usual one. */
  band?: HealthyBand;
}

export interface Missing {
  quantity: QuantityName;
  /** Case-file values that, all given, would let the quantity be computed ("a or b" where either will do). */
  needs: string[];
}

export interface Finding {
  code: string;
  says: string;
  /** The reading the finding is about, where it is about one. */
  reading?: string;
}

export interface Expectation {
  quantities: Partial<Record<QuantityName, Quantity>>;
  missing: Missing[];
  assumptions: string[];
  findings: Finding[];
}

export type ModelMachine = MachineData & { tachoVoltsPer1000Rpm?: number | undefined };

/** Values one family computes for the families after it; undefined until (unless) computed. */
export interface Derived {
  /** Working temperature resistances are corrected to, °C. */
  workC: number;
  ratedFieldVoltage?: number | undefined;
  /** The field current a healthy field carries at its rating (plate, or Vf/Rf hot). */
  ratedFieldCurrent?: number | undefined;
  ratedIa?: number | undefined;
  circuitR?: number | undefined;
  /** The circuit resistance was estimated from the plate losses, which already hold the brush loss. */
  circuitEstimated: boolean;
  brushDrop: number;
  kPhiRated?: number | undefined;
  ratedEmf?: number | undefined;
  /** Series-field share of rated excitation (compound machines). */
  seriesShare: number;
  /** The field current the healthy machine carries now (the reference, not the measured one). */
  expectedField?: number | undefined;
  /** Armature current at the measured point. */
  ia?: number | undefined;
  /** The terminals read almost nothing: the machine is not energised. */
  deadTerminals: boolean;
  /** Flux per unit at the measured point, from the measured field where known, else the healthy one. */
  phiNow?: number | undefined;
}

export interface ModelContext {
  machine: ModelMachine;
  readings: Readings;
  traits: ConnectionTraits;
  derived: Derived;
  out: Expectation;
}

export function newContext(machine: ModelMachine, readings: Readings): ModelContext {
  return {
    machine,
    readings,
    traits: CONNECTION_TRAITS[machine.connection],
    derived: { workC: 75, circuitEstimated: false, brushDrop: 0, seriesShare: 0, deadTerminals: false },
    out: { quantities: {}, missing: [], assumptions: [], findings: [] },
  };
}

export const rpmToRadS = (n: number) => (n * 2 * Math.PI) / 60;
export const radSToRpm = (w: number) => (w * 60) / (2 * Math.PI);
export const round = (x: number, digits = 4) => Number(x.toPrecision(digits + 2));
export const fmt = (x: number, unit: string) => `${Number(x.toPrecision(4))} ${unit}`;

export interface QuantitySpec extends Omit<Quantity, 'ratio' | 'measured' | 'basis'> {
  measured?: number | undefined;
  estimated?: boolean;
}

export function addQuantity(ctx: ModelContext, name: QuantityName, q: QuantitySpec): void {
  const measured = q.measured ?? null;
  ctx.out.quantities[name] = {
    value: round(q.value),
    unit: q.unit,
    measured: measured === null ? null : round(measured),
    ratio: measured === null || q.value === 0 ? null : round(measured / q.value),
    basis: q.estimated ? 'estimated' : 'computed',
    formula: q.formula,
    ...(q.band ? { band: q.band } : {}),
  };
}

/**
 * A quantity's declared inputs: each key names where the value comes from in a case file ("a or b"
 * where either will do). True when all are there; otherwise the quantity is recorded as missing
 * with the absent ones, so what is missing follows from the declaration.
 */
export function needs(ctx: ModelContext, quantity: QuantityName, inputs: Record<string, unknown>): boolean {
  const absent = Object.entries(inputs).filter(([, v]) => v === undefined || (typeof v === 'number' && !Number.isFinite(v))).map(([k]) => k);
  if (absent.length > 0) ctx.out.missing.push({ quantity, needs: absent });
  return absent.length === 0;
}

export function assume(ctx: ModelContext, text: string): void {
  ctx.out.assumptions.push(text);
}

export function find(ctx: ModelContext, code: string, says: string): void {
  ctx.out.findings.push({ code, says });
}
