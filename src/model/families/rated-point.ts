/**
 * The armature circuit and the rated operating point: resistances at working temperature, rated
 * armature current, the circuit resistance (measured, or estimated from the plate losses), the
 * rated back-EMF and machine constant kΦ, and the series-field share of a compound machine.
 */
import { describeCurve, fluxPerUnit } from '../magnetization.js';
import type { MachineData } from '../machine.js';
import { inferredZero, resistanceAt } from '../resistance.js';
import { workingTemperature } from '../thermal.js';
import { CONVERTER_ARMATURE_VOLTAGE_BAND } from '../quantity-names.js';
import { addQuantity, assume, find, fmt, needs, radSToRpm, rpmToRadS, type ModelContext } from './context.js';

/** Brush contact drop for carbon brushes, both polarities together (common practice). */
export const DEFAULT_BRUSH_DROP_V = 2;

/**
 * Full-load efficiency usual for an industrial DC motor of a given input (from memory of
 * makers' lists; common practice): about 70 % at 0.5 kW, 84 % at 5 kW, 90 % at 50 kW and 94 %
 * at 500 kW, straight between those on a logarithmic scale of power.
 */
const TYPICAL_EFFICIENCY: readonly [watts: number, efficiency: number][] = [
  [500, 0.7],
  [5_000, 0.84],
  [50_000, 0.9],
  [500_000, 0.94],
];

export function typicalEfficiency(inputWatts: number): number {
  const t = TYPICAL_EFFICIENCY;
  if (inputWatts <= t[0]![0]) return t[0]![1];
  for (let k = 1; k < t.length; k++) {
    const [w1, e1] = t[k]!;
    const [w0, e0] = t[k - 1]!;
    if (inputWatts <= w1) return e0 + ((e1 - e0) * Math.log(inputWatts / w0)) / Math.log(w1 / w0);
  }
  return t.at(-1)![1];
}
/** Cold field resistance at working temperature and plate Vf/If disagreeing by more is a finding. */
const FIELD_RESISTANCE_TOLERANCE = 0.15;

/** A winding resistance from the case file, at the working temperature where its temperature is known. */
export function warmResistance(ctx: ModelContext, r: number | undefined): number | undefined {
  const at = ctx.machine.resistances?.at;
  return r === undefined ? undefined : at === undefined ? r : resistanceAt(r, at, ctx.derived.workC, inferredZero(ctx.machine.windingMaterial));
}

export function ratedPoint(ctx: ModelContext): void {
  const { machine, traits, derived: d } = ctx;
  const np = machine.nameplate ?? {};
  const res = machine.resistances ?? {};
  if (machine.connection === 'compound') assume(ctx, 'compound mode unknown: modelled as cumulative compound');

  d.workC = workingTemperature(np.insulationClass);
  const k = inferredZero(machine.windingMaterial);
  const material = machine.windingMaterial === 'aluminium' ? `aluminium, k = ${k} °C` : `copper, k = ${k} °C`;
  if (res.at !== undefined && (res.armature ?? res.shuntField ?? res.seriesField) !== undefined) {
    assume(ctx, `resistances measured at ${res.at} °C corrected to a working temperature of ${d.workC} °C (${material}), as a machine under load runs warm`);
  } else if ((res.armature ?? res.shuntField ?? res.seriesField) !== undefined) {
    assume(ctx, 'resistances used as given (no measurement temperature in the case file)');
  }

  // --- rated field -------------------------------------------------------------------------
  d.ratedFieldVoltage = np.fieldVoltage ?? (traits.fieldAcrossTerminals ? np.armatureVoltage : undefined);
  const rShuntWarm = warmResistance(ctx, res.shuntField);
  if (traits.shuntField) {
    if (np.fieldCurrent !== undefined) d.ratedFieldCurrent = np.fieldCurrent;
    else if (rShuntWarm !== undefined && d.ratedFieldVoltage !== undefined) d.ratedFieldCurrent = d.ratedFieldVoltage / rShuntWarm;
    if (np.fieldCurrent !== undefined && rShuntWarm !== undefined && d.ratedFieldVoltage !== undefined) {
      const plateR = d.ratedFieldVoltage / np.fieldCurrent;
      const ratio = rShuntWarm / plateR;
      if (Math.abs(ratio - 1) > FIELD_RESISTANCE_TOLERANCE) {
        find(
          ctx,
          ratio < 1 ? 'field-resistance-below-plate' : 'field-resistance-above-plate',
          `shunt field resistance ${fmt(rShuntWarm, 'Ω')} at ${res.at === undefined ? 'the given temperature' : `${d.workC} °C`} is ${Math.round(ratio * 100)} % of the ${fmt(plateR, 'Ω')} the nameplate's ${fmt(d.ratedFieldVoltage, 'V')} / ${fmt(np.fieldCurrent, 'A')} implies`,
        );
      }
    }
  }

  // --- rated armature current and armature circuit resistance ------------------------------
  let ratedIa = np.armatureCurrent;
  if (ratedIa === undefined && np.lineCurrent !== undefined) {
    if (!traits.fieldAcrossTerminals) ratedIa = np.lineCurrent;
    else if (d.ratedFieldCurrent !== undefined) ratedIa = np.lineCurrent - d.ratedFieldCurrent;
  }
  let inputCurrent = np.lineCurrent ?? (ratedIa !== undefined ? ratedIa + (traits.fieldAcrossTerminals ? d.ratedFieldCurrent ?? 0 : 0) : undefined);
  if (ratedIa === undefined && inputCurrent === undefined && np.power !== undefined && np.armatureVoltage !== undefined && np.armatureVoltage > 0) {
    // A plate (or a book) giving output, voltage and speed but no current: the current the usual efficiency means.
    const efficiency = typicalEfficiency(np.power / typicalEfficiency(np.power));
    inputCurrent = np.power / efficiency / np.armatureVoltage;
    ratedIa = Math.max(0, inputCurrent - (traits.fieldAcrossTerminals ? d.ratedFieldCurrent ?? 0 : 0));
    assume(ctx, `rated armature current taken as ${fmt(ratedIa, 'A')}: no current on the plate, so the ${fmt(np.power, 'W')} output at the efficiency usual for its size (${Math.round(efficiency * 100)} %, from memory)`);
  }
  if (ratedIa !== undefined) d.ratedIa = ratedIa;
  const raWarm = warmResistance(ctx, res.armature);
  const rseWarm = warmResistance(ctx, res.seriesField);
  if (raWarm !== undefined && (!traits.seriesField || rseWarm !== undefined)) {
    d.circuitR = raWarm + (traits.seriesField ? rseWarm! : 0);
  } else if (np.armatureVoltage !== undefined && np.power !== undefined && inputCurrent !== undefined && ratedIa !== undefined && ratedIa > 0) {
    const input = np.armatureVoltage * inputCurrent;
    const efficiency = np.power / input;
    // A motor converts 50–97 % of its input; outside that one of the three plate values is wrong.
    if (efficiency < 0.5 || efficiency > 0.97) {
      find(ctx, 'nameplate-power-implausible', `nameplate output ${fmt(np.power, 'W')} is ${Math.round(efficiency * 100)} % of the ${fmt(input, 'W')} input that voltage and current mean: ${nameplateHint(efficiency)}`);
    } else {
      d.circuitR = (0.5 * (input - np.power)) / (ratedIa * ratedIa);
      d.circuitEstimated = true;
      assume(ctx, `armature circuit resistance estimated as ${fmt(d.circuitR, 'Ω')}: efficiency ${Math.round(efficiency * 100)} % from P/(V·I), armature copper and brush loss taken as half the losses at rated load (textbook assumption), so no brush drop is added to it`);
    }
  } else if (raWarm !== undefined) {
    d.circuitR = raWarm;
    d.circuitEstimated = true;
    assume(ctx, 'series field resistance not given: armature circuit resistance taken as the armature alone');
  } else if (np.armatureVoltage !== undefined && inputCurrent !== undefined && ratedIa !== undefined && ratedIa > 0) {
    // No resistance and no output on the plate: the losses a machine of this size usually has.
    const input = np.armatureVoltage * inputCurrent;
    const efficiency = typicalEfficiency(input);
    d.circuitR = (0.5 * input * (1 - efficiency)) / (ratedIa * ratedIa);
    d.circuitEstimated = true;
    assume(ctx, `armature circuit resistance estimated as ${fmt(d.circuitR, 'Ω')}: no resistance or output on the plate, so the efficiency is taken as ${Math.round(efficiency * 100)} %, usual for a ${fmt(input, 'W')} DC motor (from memory), with half the losses in the armature circuit; measure the armature resistance to judge the readings more closely`);
  }
  // A resistance estimated from the plate losses already carries the brush loss (½ of V·I − P).
  const fromPlateLosses = d.circuitEstimated && raWarm === undefined;
  d.brushDrop = machine.brushDrop ?? (fromPlateLosses ? 0 : DEFAULT_BRUSH_DROP_V);
  if (machine.brushDrop === undefined && !fromPlateLosses) assume(ctx, `brush contact drop taken as ${DEFAULT_BRUSH_DROP_V} V total (carbon brushes, common practice)`);
  if (d.circuitR !== undefined) {
    addQuantity(ctx, 'armatureCircuitResistance', {
      value: d.circuitR,
      unit: 'ohm',
      formula: d.circuitEstimated ? (raWarm === undefined ? 'Ra ≈ ½·(V·I − P)/Ia² (brush loss included)' : 'Ra at working temperature (series field not given)') : traits.seriesField ? 'Ra + Rse at working temperature' : 'Ra at working temperature',
      estimated: d.circuitEstimated,
    });
  }

  // --- the rated operating point -----------------------------------------------------------
  const inputs = {
    'machine.nameplate.armatureVoltage': np.armatureVoltage,
    'machine.nameplate.armatureCurrent': ratedIa,
    'machine.resistances.armature or machine.nameplate.power': d.circuitR,
    'machine.nameplate.speed': np.speed && np.speed > 0 ? np.speed : undefined,
  };
  if (needs(ctx, 'machineConstant', inputs)) {
    d.ratedEmf = np.armatureVoltage! - ratedIa! * d.circuitR! - d.brushDrop;
    d.kPhiRated = d.ratedEmf / rpmToRadS(np.speed!);
    addQuantity(ctx, 'ratedBackEmf', { value: d.ratedEmf, unit: 'V', formula: 'E = V − Ia·R − Vb at the rated point', estimated: d.circuitEstimated });
    addQuantity(ctx, 'machineConstant', { value: d.kPhiRated, unit: 'V s/rad', formula: 'kΦ = E/ω at the rated point', estimated: d.circuitEstimated });
  }
  if (needs(ctx, 'ratedTorque', { 'machine.nameplate.power': np.power, 'machine.nameplate.speed': np.speed && np.speed > 0 ? np.speed : undefined })) {
    addQuantity(ctx, 'ratedTorque', { value: np.power! / rpmToRadS(np.speed!), unit: 'N m', formula: 'T = P/ω (shaft, rated)' });
  }
  const readings = ctx.readings;
  if (ratedIa !== undefined) {
    addQuantity(ctx, 'ratedArmatureCurrent', { value: ratedIa, unit: 'A', measured: readings.armatureCurrent, formula: np.armatureCurrent !== undefined ? 'nameplate' : 'Ia = IL − If' });
  }
  if (np.armatureVoltage !== undefined) {
    addQuantity(ctx, 'ratedArmatureVoltage', {
      value: np.armatureVoltage,
      unit: 'V',
      measured: readings.armatureVoltage,
      formula: 'nameplate',
      ...(machine.drive === 'controlled-converter' ? { band: CONVERTER_ARMATURE_VOLTAGE_BAND } : {}),
    });
  }
  if (readings.supplyVoltage !== undefined && readings.armatureVoltage !== undefined && readings.supplyVoltage > 0) {
    addQuantity(ctx, 'cableDrop', { value: readings.supplyVoltage, unit: 'V', measured: readings.armatureVoltage, formula: 'supply-end voltage against machine-terminal voltage' });
  }
  seriesFieldShare(ctx);
}

/** The series field's share of rated excitation: from the plate's no-load speed, else a typical 20 %. */
function seriesFieldShare(ctx: ModelContext): void {
  const { machine, traits, derived: d } = ctx;
  const np = machine.nameplate ?? {};
  d.seriesShare = traits.defaultSeriesShare;
  if (traits.shuntField && traits.seriesField) {
    if (np.noLoadSpeed !== undefined && d.kPhiRated !== undefined && np.armatureVoltage !== undefined) {
      // At no load only the shunt field acts: its flux is what the no-load speed implies.
      const phiNoLoad = (np.armatureVoltage - d.brushDrop) / (d.kPhiRated * rpmToRadS(np.noLoadSpeed));
      const share = solveSeriesShare(machine.magnetization, traits.seriesSense, phiNoLoad);
      if (share !== undefined) {
        d.seriesShare = share;
        assume(ctx, `series field gives ${Math.round(share * 100)} % of rated excitation, from the nameplate no-load speed`);
      }
    }
    if (d.seriesShare === traits.defaultSeriesShare) assume(ctx, `series field taken to give ${Math.round(d.seriesShare * 100)} % of rated excitation (typical compound machine; give nameplate noLoadSpeed to derive it)`);
  }
  if (traits.shuntField || traits.seriesField) assume(ctx, `flux from ${describeCurve(machine.magnetization)}`);
}

/** Flux per unit of rated for a shunt-field current and an armature current, both per unit. */
export function fluxAt(ctx: ModelContext, fieldPu: number, armaturePu: number): number {
  const { traits, machine, derived: d } = ctx;
  if (!traits.shuntField && !traits.seriesField) return 1;
  if (!traits.shuntField) return fluxPerUnit(machine.magnetization, armaturePu);
  if (!traits.seriesField) return fluxPerUnit(machine.magnetization, fieldPu);
  const s = d.seriesShare * traits.seriesSense;
  return fluxPerUnit(machine.magnetization, fieldPu * (1 - s) + s * armaturePu);
}

/** Speed of the machine at a terminal voltage, current and flux per unit, from the rated kΦ. */
export function speedFrom(ctx: ModelContext, volts: number, ia: number, phi: number): number {
  const d = ctx.derived;
  return radSToRpm((volts - ia * d.circuitR! - (ia > 0 ? d.brushDrop : 0)) / (d.kPhiRated! * phi));
}

/** The series-field share of rated excitation that makes the shunt field alone give `phiNoLoad`. */
function solveSeriesShare(curve: MachineData['magnetization'], sense: 1 | -1 | 0, phiNoLoad: number): number | undefined {
  if (sense === 0 || !(phiNoLoad > 0)) return undefined;
  // Shunt mmf alone at no load is 1 − sense·s; flux rises with it, so bisect on s in [0, 0.9].
  let lo = 0;
  let hi = 0.9;
  const f = (s: number) => fluxPerUnit(curve, 1 - sense * s) - phiNoLoad;
  if (f(lo) * f(hi) > 0) return undefined;
  for (let k = 0; k < 60; k++) {
    const mid = (lo + hi) / 2;
    if (f(lo) * f(mid) <= 0) hi = mid;
    else lo = mid;
  }
  return (lo + hi) / 2;
}

/** The likeliest slip behind a plate whose output and input disagree: kW typed as W only where that fits. */
export function nameplateHint(efficiency: number): string {
  const asKilowatts = efficiency * 1000;
  if (asKilowatts >= 0.5 && asKilowatts <= 0.97) return 'check the plate (the power looks like kW typed as W)';
  if (efficiency > 1) return "the output cannot exceed the input: check the power (hp written as kW, or a decimal slip) and that the voltage and current are the armature's rated ones";
  if (efficiency > 0.97) return "no motor is that efficient: check the power, and that the voltage and current are the armature's rated ones";
  return 'check the power, the voltage and the current against the plate';
}
