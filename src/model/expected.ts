/**
 * What a healthy machine would read under the fitter's supply and load, and how far each
 * reading is from it. Pure: plain numbers in, a map of quantities out, with what could not be
 * computed and which value would allow it.
 */
import { CONNECTION_TRAITS, type MachineData, type Readings } from './machine.js';
import { CONVERTER_ARMATURE_VOLTAGE_BAND, type HealthyBand, type QuantityName } from './quantity-names.js';
import { describeCurve, fluxPerUnit } from './magnetization.js';
import { resistanceAt, windingTemperature } from './resistance.js';
import { CLASS_TEMPERATURE_C, windingTemperatureLimit, workingTemperature } from './thermal.js';
import {
  insulationAt40C,
  insulationMinimum,
  PI_NOT_MEANINGFUL_ABOVE_MOHM,
  polarizationIndexMinimum,
} from './insulation.js';

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
}

export interface Expectation {
  quantities: Partial<Record<QuantityName, Quantity>>;
  missing: Missing[];
  assumptions: string[];
  findings: Finding[];
}

export interface ModelInput {
  machine: MachineData & { tachoVoltsPer1000Rpm?: number | undefined };
  readings?: Readings | undefined;
}

/** Brush contact drop for carbon brushes, both polarities together (common practice). */
export const DEFAULT_BRUSH_DROP_V = 2;
/** Field current below this share of rated leaves only residual flux: the model gives no speed. */
const FIELD_NEAR_ZERO_PU = 0.05;
/** A series machine's flux at this share of rated current or below is too uncertain to give a speed. */
const SERIES_CURRENT_FLOOR_PU = 0.05;
/** Cold field resistance at working temperature and plate Vf/If disagreeing by more is a finding. */
const FIELD_RESISTANCE_TOLERANCE = 0.15;
/** Brush spring pressure range for general industrial machines, 13.8–27.6 kPa (common practice). */
const BRUSH_PRESSURE_MIN_KPA = 13.8;
/** Commutator runout (TIR) above which the surface wants machining, 0.05 mm (common practice). */
const COMMUTATOR_RUNOUT_LIMIT_MM = 0.05;
/** No-load armature current of an integral-hp wound-field motor is 3–10 % of rated (common practice). */
const NO_LOAD_CURRENT_SHARE = 0.1;

const rpmToRadS = (n: number) => (n * 2 * Math.PI) / 60;
const radSToRpm = (w: number) => (w * 60) / (2 * Math.PI);
const round = (x: number, digits = 4) => Number(x.toPrecision(digits + 2));
const fmt = (x: number, unit: string) => `${Number(x.toPrecision(4))} ${unit}`;

/**
 * @example
 * computeExpectations({ machine: { connection: 'shunt', nameplate: { armatureVoltage: 230, … } }, readings: { … } })
 *   .quantities.speed // { value: 1768.7, unit: 'rpm', measured: 2520, ratio: 1.42, … }
 */
export function computeExpectations({ machine, readings = {} }: ModelInput): Expectation {
  const out: Expectation = { quantities: {}, missing: [], assumptions: [], findings: [] };
  const traits = CONNECTION_TRAITS[machine.connection];
  const np = machine.nameplate ?? {};
  const res = machine.resistances ?? {};
  const add = (name: QuantityName, q: Omit<Quantity, 'ratio' | 'measured' | 'basis'> & { measured?: number | undefined; estimated?: boolean }) => {
    const measured = q.measured ?? null;
    out.quantities[name] = {
      value: round(q.value),
      unit: q.unit,
      measured: measured === null ? null : round(measured),
      ratio: measured === null || q.value === 0 ? null : round(measured / q.value),
      basis: q.estimated ? 'estimated' : 'computed',
      formula: q.formula,
      ...(q.band ? { band: q.band } : {}),
    };
  };
  const miss = (quantity: QuantityName, ...needs: string[]) => out.missing.push({ quantity, needs });
  const assume = (text: string) => out.assumptions.push(text);

  if (machine.connection === 'compound') assume('compound mode unknown: modelled as cumulative compound');

  // --- resistances at working temperature -------------------------------------------------
  const workC = workingTemperature(np.insulationClass);
  const warm = (r: number | undefined) => (r === undefined ? undefined : res.at === undefined ? r : resistanceAt(r, res.at, workC));
  if (res.at !== undefined && (res.armature ?? res.shuntField ?? res.seriesField) !== undefined) {
    assume(`resistances measured at ${res.at} °C corrected to a working temperature of ${workC} °C (copper, k = 234.5 °C), as a machine under load runs warm`);
  } else if ((res.armature ?? res.shuntField ?? res.seriesField) !== undefined) {
    assume('resistances used as given (no measurement temperature in the case file)');
  }
  const brushDrop = machine.brushDrop ?? DEFAULT_BRUSH_DROP_V;
  if (machine.brushDrop === undefined && machine.connection !== 'permanent-magnet') assume(`brush contact drop taken as ${DEFAULT_BRUSH_DROP_V} V total (carbon brushes, common practice)`);
  else if (machine.brushDrop === undefined) assume(`brush contact drop taken as ${DEFAULT_BRUSH_DROP_V} V total (common practice)`);

  // --- rated field -------------------------------------------------------------------------
  const ratedFieldVoltage = np.fieldVoltage ?? (traits.fieldAcrossTerminals ? np.armatureVoltage : undefined);
  const rShuntWarm = warm(res.shuntField);
  let ratedFieldCurrent: number | undefined;
  if (traits.shuntField) {
    if (np.fieldCurrent !== undefined) ratedFieldCurrent = np.fieldCurrent;
    else if (rShuntWarm !== undefined && ratedFieldVoltage !== undefined) ratedFieldCurrent = ratedFieldVoltage / rShuntWarm;
    if (np.fieldCurrent !== undefined && rShuntWarm !== undefined && ratedFieldVoltage !== undefined) {
      const plateR = ratedFieldVoltage / np.fieldCurrent;
      const ratio = rShuntWarm / plateR;
      if (Math.abs(ratio - 1) > FIELD_RESISTANCE_TOLERANCE) {
        out.findings.push({
          code: ratio < 1 ? 'field-resistance-below-plate' : 'field-resistance-above-plate',
          says: `shunt field resistance ${fmt(rShuntWarm, 'Ω')} at ${res.at === undefined ? 'the given temperature' : `${workC} °C`} is ${Math.round(ratio * 100)} % of the ${fmt(plateR, 'Ω')} the nameplate's ${fmt(ratedFieldVoltage, 'V')} / ${fmt(np.fieldCurrent, 'A')} implies`,
        });
      }
    }
  }

  // --- rated armature current and armature circuit resistance ------------------------------
  let ratedIa = np.armatureCurrent;
  if (ratedIa === undefined && np.lineCurrent !== undefined) {
    if (!traits.fieldAcrossTerminals) ratedIa = np.lineCurrent;
    else if (ratedFieldCurrent !== undefined) ratedIa = np.lineCurrent - ratedFieldCurrent;
  }
  const inputCurrent = np.lineCurrent ?? (ratedIa !== undefined ? ratedIa + (traits.fieldAcrossTerminals ? ratedFieldCurrent ?? 0 : 0) : undefined);
  const seriesInCircuit = traits.seriesField;
  let circuitR: number | undefined;
  let circuitEstimated = false;
  const raWarm = warm(res.armature);
  const rseWarm = warm(res.seriesField);
  if (raWarm !== undefined && (!seriesInCircuit || rseWarm !== undefined)) {
    circuitR = raWarm + (seriesInCircuit ? rseWarm! : 0);
  } else if (np.armatureVoltage !== undefined && np.power !== undefined && inputCurrent !== undefined && ratedIa !== undefined && ratedIa > 0) {
    const losses = np.armatureVoltage * inputCurrent - np.power;
    const efficiency = np.power / (np.armatureVoltage * inputCurrent);
    // A motor converts 50–97 % of its input; outside that a plate value was misread or mistyped.
    if (efficiency < 0.5 || efficiency > 0.97) {
      out.findings.push({ code: 'nameplate-power-implausible', says: `nameplate output ${fmt(np.power, 'W')} is ${Math.round(efficiency * 100)} % of the ${fmt(np.armatureVoltage * inputCurrent, 'W')} input that voltage and current mean: ${nameplateHint(efficiency)}` });
    } else if (losses > 0) {
      circuitR = (0.5 * losses) / (ratedIa * ratedIa);
      circuitEstimated = true;
      const eta = np.power / (np.armatureVoltage * inputCurrent);
      assume(`armature circuit resistance estimated as ${fmt(circuitR, 'Ω')}: efficiency ${Math.round(eta * 100)} % from P/(V·I), armature copper loss taken as half the losses at rated load (textbook assumption)`);
    }
  } else if (raWarm !== undefined) {
    circuitR = raWarm;
    circuitEstimated = true;
    assume('series field resistance not given: armature circuit resistance taken as the armature alone');
  }
  if (circuitR !== undefined) {
    add('armatureCircuitResistance', {
      value: circuitR,
      unit: 'ohm',
      formula: circuitEstimated ? 'Ra ≈ ½·(V·I − P)/Ia²' : seriesInCircuit ? 'Ra + Rse at working temperature' : 'Ra at working temperature',
      estimated: circuitEstimated,
    });
  }

  // --- the rated operating point -----------------------------------------------------------
  const ratedSpeed = np.speed;
  let kPhiRated: number | undefined;
  let ratedEmf: number | undefined;
  if (np.armatureVoltage !== undefined && ratedIa !== undefined && circuitR !== undefined) {
    ratedEmf = np.armatureVoltage - ratedIa * circuitR - brushDrop;
    add('ratedBackEmf', { value: ratedEmf, unit: 'V', formula: 'E = V − Ia·R − Vb at the rated point', estimated: circuitEstimated });
    if (ratedSpeed !== undefined && ratedSpeed > 0) {
      kPhiRated = ratedEmf / rpmToRadS(ratedSpeed);
      add('machineConstant', { value: kPhiRated, unit: 'V s/rad', formula: 'kΦ = E/ω at the rated point', estimated: circuitEstimated });
    }
  }
  if (np.power !== undefined && ratedSpeed !== undefined && ratedSpeed > 0) {
    add('ratedTorque', { value: np.power / rpmToRadS(ratedSpeed), unit: 'N m', formula: 'T = P/ω (shaft, rated)' });
  } else {
    miss('ratedTorque', ...[np.power === undefined ? 'machine.nameplate.power' : '', ratedSpeed === undefined ? 'machine.nameplate.speed' : ''].filter(Boolean));
  }
  if (kPhiRated === undefined) {
    const needs: string[] = [];
    if (np.armatureVoltage === undefined) needs.push('machine.nameplate.armatureVoltage');
    if (ratedIa === undefined) needs.push('machine.nameplate.armatureCurrent');
    if (circuitR === undefined) needs.push('machine.resistances.armature or machine.nameplate.power');
    if (ratedSpeed === undefined) needs.push('machine.nameplate.speed');
    miss('machineConstant', ...needs);
  }

  if (ratedIa !== undefined) {
    add('ratedArmatureCurrent', { value: ratedIa, unit: 'A', measured: readings.armatureCurrent, formula: np.armatureCurrent !== undefined ? 'nameplate' : 'Ia = IL − If' });
  }
  if (np.armatureVoltage !== undefined) {
    add('ratedArmatureVoltage', {
      value: np.armatureVoltage,
      unit: 'V',
      measured: readings.armatureVoltage,
      formula: 'nameplate',
      ...(machine.drive === 'controlled-converter' ? { band: CONVERTER_ARMATURE_VOLTAGE_BAND } : {}),
    });
  }
  if (readings.supplyVoltage !== undefined && readings.armatureVoltage !== undefined && readings.supplyVoltage > 0) {
    add('cableDrop', { value: readings.supplyVoltage, unit: 'V', measured: readings.armatureVoltage, formula: 'supply-end voltage against machine-terminal voltage' });
  }

  // --- series-field share of flux for compound machines ------------------------------------
  const curve = machine.magnetization;
  let seriesShare = traits.defaultSeriesShare;
  if (traits.shuntField && traits.seriesField) {
    if (np.noLoadSpeed !== undefined && ratedEmf !== undefined && kPhiRated !== undefined && np.armatureVoltage !== undefined) {
      // At no load only the shunt field acts: its flux is what the no-load speed implies.
      const phiNoLoad = (np.armatureVoltage - brushDrop) / (kPhiRated * rpmToRadS(np.noLoadSpeed));
      const share = solveSeriesShare(curve, traits.seriesSense, phiNoLoad);
      if (share !== undefined) {
        seriesShare = share;
        assume(`series field gives ${Math.round(share * 100)} % of rated excitation, from the nameplate no-load speed`);
      }
    }
    if (seriesShare === traits.defaultSeriesShare) assume(`series field taken to give ${Math.round(seriesShare * 100)} % of rated excitation (typical compound machine; give nameplate noLoadSpeed to derive it)`);
  }
  if (traits.shuntField || traits.seriesField) assume(`flux from ${describeCurve(curve)}`);

  /** Flux per unit of rated for a shunt-field current and an armature current, both per unit. */
  const flux = (fieldPu: number, armaturePu: number): number => {
    if (!traits.shuntField && !traits.seriesField) return 1;
    if (!traits.shuntField) return fluxPerUnit(curve, armaturePu);
    if (!traits.seriesField) return fluxPerUnit(curve, fieldPu);
    const s = seriesShare * traits.seriesSense;
    return fluxPerUnit(curve, fieldPu * (1 - s) + s * armaturePu);
  };

  // --- field current -----------------------------------------------------------------------
  const fieldVoltageMeasured = readings.fieldVoltage ?? (traits.fieldAcrossTerminals ? readings.armatureVoltage : undefined);
  let fieldVoltageUsed = fieldVoltageMeasured;
  if (traits.shuntField && fieldVoltageUsed === undefined && ratedFieldVoltage !== undefined) {
    fieldVoltageUsed = ratedFieldVoltage;
    assume(`field voltage not measured: the field supply taken as at its rated ${fmt(ratedFieldVoltage, 'V')}`);
  }
  let expectedField: number | undefined;
  if (traits.shuntField) {
    if (ratedFieldVoltage !== undefined) add('ratedFieldVoltage', { value: ratedFieldVoltage, unit: 'V', measured: fieldVoltageMeasured, formula: np.fieldVoltage !== undefined ? 'nameplate' : 'terminal voltage (field across the armature)' });
    if (np.fieldCurrent !== undefined && ratedFieldVoltage !== undefined && fieldVoltageUsed !== undefined) {
      expectedField = (np.fieldCurrent * fieldVoltageUsed) / ratedFieldVoltage;
      add('fieldCurrent', { value: expectedField, unit: 'A', measured: readings.fieldCurrent, formula: 'If = If,plate · Vf/Vf,plate (the plate value is hot)' });
    } else if (rShuntWarm !== undefined && fieldVoltageUsed !== undefined) {
      expectedField = fieldVoltageUsed / rShuntWarm;
      add('fieldCurrent', { value: expectedField, unit: 'A', measured: readings.fieldCurrent, formula: 'If = Vf/Rf at working temperature' });
    } else {
      miss('fieldCurrent', 'machine.nameplate.fieldCurrent or machine.resistances.shuntField');
    }
    if (ratedFieldCurrent !== undefined) add('ratedFieldCurrent', { value: ratedFieldCurrent, unit: 'A', measured: readings.fieldCurrent, formula: np.fieldCurrent !== undefined ? 'nameplate' : 'If = Vf/Rf at working temperature' });
  }

  // --- armature current at the measured point ----------------------------------------------
  let ia = readings.armatureCurrent;
  if (ia === undefined && readings.lineCurrent !== undefined) {
    const fieldShare = traits.fieldAcrossTerminals ? readings.fieldCurrent ?? expectedField ?? 0 : 0;
    ia = Math.max(0, readings.lineCurrent - fieldShare);
  }
  const vm = readings.armatureVoltage;
  /** Below this share of rated voltage the machine is not energised: no speed, and no runaway, to compute. */
  const deadTerminals = vm !== undefined && np.armatureVoltage !== undefined && vm < 0.05 * np.armatureVoltage;
  if (deadTerminals) out.findings.push({ code: 'no-terminal-voltage', says: `${fmt(vm, 'V')} at the terminals: the machine is not energised` });

  // --- speed -------------------------------------------------------------------------------
  const speedAt = (fieldA: number | undefined, label: string, name: QuantityName, measured: number | undefined) => {
    if (deadTerminals) return;
    if (kPhiRated === undefined || vm === undefined || ia === undefined || ratedIa === undefined) {
      const needs: string[] = [];
      if (kPhiRated === undefined) needs.push('the machine constant (see machineConstant)');
      if (vm === undefined) needs.push('readings.armatureVoltage');
      if (ia === undefined) needs.push('readings.armatureCurrent');
      miss(name, ...needs);
      return;
    }
    const fieldPu = traits.shuntField ? (fieldA ?? NaN) / (ratedFieldCurrent ?? NaN) : 0;
    if (traits.shuntField && !(fieldPu >= 0)) {
      miss(name, 'machine.nameplate.fieldCurrent or machine.resistances.shuntField');
      return;
    }
    const armaturePu = ia / ratedIa;
    if (traits.shuntField && !traits.seriesField && fieldPu < FIELD_NEAR_ZERO_PU) {
      out.findings.push({ code: 'field-near-zero', says: `${label} field current ${fmt(fieldA ?? 0, 'A')} leaves only residual flux: nothing in the model limits the speed (runaway)` });
      return;
    }
    if (!traits.shuntField && traits.seriesField && armaturePu < SERIES_CURRENT_FLOOR_PU) {
      out.findings.push({ code: 'series-current-near-zero', says: `armature current ${fmt(ia, 'A')} is under ${SERIES_CURRENT_FLOOR_PU * 100} % of rated: a series machine's speed is not bounded there (runaway)` });
      return;
    }
    const phi = flux(fieldPu, armaturePu);
    if (phi <= 0) return;
    const emf = vm - ia * circuitR! - (ia > 0 ? brushDrop : 0);
    const n = radSToRpm(emf / (kPhiRated * phi));
    add(name, {
      value: Math.max(0, n),
      unit: 'rpm',
      measured,
      formula: `n = E/(kΦ_r·Φ/Φ_r), E = V − Ia·R − Vb, Φ/Φ_r = ${round(phi, 3)} from ${label}`,
      estimated: circuitEstimated,
    });
    return phi;
  };
  const phiHealthy = speedAt(expectedField, 'the healthy', 'speed', readings.speed);
  if (traits.shuntField && readings.fieldCurrent !== undefined) speedAt(readings.fieldCurrent, 'the measured', 'speedFromMeasuredField', readings.speed);
  else if (traits.shuntField) miss('speedFromMeasuredField', 'readings.fieldCurrent');

  if (vm !== undefined && ia !== undefined && circuitR !== undefined) {
    add('backEmf', { value: vm - ia * circuitR - (ia > 0 ? brushDrop : 0), unit: 'V', formula: 'E = V − Ia·R − Vb at the measured point', estimated: circuitEstimated });
  }
  if (kPhiRated !== undefined && ia !== undefined && phiHealthy !== undefined) {
    add('torque', { value: kPhiRated * phiHealthy * ia, unit: 'N m', formula: 'T = kΦ·Ia (electromagnetic, at the measured current)', estimated: circuitEstimated });
  } else if (ia === undefined) miss('torque', 'readings.armatureCurrent');

  // --- speed regulation of the healthy machine between no load and rated load --------------
  if (kPhiRated !== undefined && ratedSpeed !== undefined && np.armatureVoltage !== undefined && ratedIa !== undefined && circuitR !== undefined) {
    let noLoad = np.noLoadSpeed;
    if (noLoad === undefined && traits.shuntField) {
      const iaNl = readings.noLoadArmatureCurrent ?? 0.05 * ratedIa;
      const phiNl = flux(1, iaNl / ratedIa);
      noLoad = radSToRpm((np.armatureVoltage - iaNl * circuitR - brushDrop) / (kPhiRated * phiNl));
    } else if (noLoad === undefined && !traits.seriesField) {
      noLoad = radSToRpm((np.armatureVoltage - brushDrop) / kPhiRated);
    }
    if (noLoad !== undefined) {
      add('speedRegulation', { value: ((noLoad - ratedSpeed) / ratedSpeed) * 100, unit: '%', formula: 'SR = (n_NL − n_FL)/n_FL', estimated: circuitEstimated || np.noLoadSpeed === undefined });
    }
  }

  // --- winding temperature by resistance ---------------------------------------------------
  const cls = np.insulationClass;
  const windingTemp = (name: QuantityName, hot: number | undefined, cold: number | undefined, limitName: QuantityName, label: string, lowMeans: string) => {
    if (hot === undefined) return;
    if (cold === undefined || res.at === undefined) {
      miss(name, cold === undefined ? `machine.resistances.${label === 'armature' ? 'armature' : 'shuntField'}` : 'machine.resistances.at');
      return;
    }
    const t = windingTemperature(hot, cold, res.at);
    add(name, { value: t, unit: 'degC', formula: 'θ2 = (R2/R1)·(234.5 + θ1) − 234.5 (resistance method, copper)' });
    const ambient = readings.ambientTemperature ?? res.at;
    if (t < ambient - 5) {
      out.findings.push({ code: `${label}-resistance-low`, says: `hot ${label} resistance ${fmt(hot, 'Ω')} implies ${fmt(t, '°C')}, below ambient: ${lowMeans}` });
      // The interpoles are part of A1–A2: losing about their share points at them, not the armature.
      const lost = resistanceAt(cold, res.at, ambient) - hot;
      if (label === 'armature' && res.interpole !== undefined && lost >= 0.5 * res.interpole) {
        out.findings.push({ code: 'armature-circuit-lost-interpole-share', says: `the armature circuit reads ${fmt(lost, 'Ω')} less than it should, comparable with the ${fmt(res.interpole, 'Ω')} interpole winding: the interpoles look shorted or bypassed` });
      }
    }
    if (cls !== undefined) {
      const limit = windingTemperatureLimit(cls);
      add(limitName, { value: limit, unit: 'degC', formula: `40 °C coolant + IEC 60034-1 rise limit, class ${cls}` });
      if (t > CLASS_TEMPERATURE_C[cls] + 60) {
        out.findings.push({ code: `${label}-resistance-high`, says: `hot ${label} resistance ${fmt(hot, 'Ω')} implies ${fmt(t, '°C')}, beyond any temperature the winding survives: a high-resistance joint or connection is more likely` });
      }
    } else miss(limitName, 'machine.nameplate.insulationClass');
  };
  windingTemp('armatureWindingTemperature', readings.armatureResistanceHot, res.armature, 'armatureTemperatureLimit', 'armature', 'shorted turns, a bypassed section or a wrong reading');
  windingTemp('fieldWindingTemperature', readings.shuntFieldResistanceHot, res.shuntField, 'fieldTemperatureLimit', 'field', 'shorted field turns or a wrong reading');

  // --- insulation --------------------------------------------------------------------------
  const ir1 = readings.insulationResistance1min;
  if (ir1 !== undefined) {
    const testC = readings.insulationTestTemperature ?? readings.ambientTemperature;
    if (testC === undefined) miss('insulationResistanceAt40C', 'readings.insulationTestTemperature');
    else {
      if (readings.insulationTestTemperature === undefined) assume('insulation test temperature taken as the ambient temperature');
      add('insulationResistanceAt40C', { value: insulationAt40C(ir1, testC), unit: 'Mohm', formula: 'R40 = Rt·0.5^((40 − T)/10) (IEEE 43)' });
    }
    const winding = readings.insulationTestedWinding ?? 'whole-machine';
    if (readings.insulationTestedWinding === undefined) assume('insulation test taken as made on the whole machine (strictest winding minimum)');
    const armatureV = np.armatureVoltage ?? 1000;
    const fieldV = np.fieldVoltage ?? np.armatureVoltage ?? 1000;
    if (np.armatureVoltage === undefined) assume('rated voltage unknown: insulation minimum taken for a 1 kV winding');
    add('insulationMinimum', { value: insulationMinimum(winding, { armature: armatureV, field: fieldV }), unit: 'Mohm', formula: `IEEE 43-2013 recommended minimum at 40 °C, ${winding}` });
    const ir10 = readings.insulationResistance10min;
    if (ir10 !== undefined) {
      if (ir1 > PI_NOT_MEANINGFUL_ABOVE_MOHM) assume(`polarization index not judged: IR at 1 min is above ${PI_NOT_MEANINGFUL_ABOVE_MOHM} MΩ (IEEE 43)`);
      else if (ir1 > 0) {
        add('polarizationIndex', { value: ir10 / ir1, unit: '1', formula: 'PI = IR10min/IR1min' });
        add('polarizationIndexMinimum', { value: polarizationIndexMinimum(cls ?? 'B'), unit: '1', formula: `IEEE 43-2013 minimum, class ${cls ?? 'B (class unknown)'}` });
      }
    } else miss('polarizationIndex', 'readings.insulationResistance10min');
  }

  // --- readings compared with a plain reference --------------------------------------------
  if (readings.speedReverse !== undefined && readings.speed !== undefined && readings.speed > 0) {
    add('speedReverse', { value: readings.speed, unit: 'rpm', measured: readings.speedReverse, formula: 'speed the other way at the same set-point should equal the forward speed' });
  }
  if (machine.tachoVoltsPer1000Rpm !== undefined && readings.speed !== undefined && readings.tachoVoltage !== undefined) {
    const expectedTacho = (machine.tachoVoltsPer1000Rpm * readings.speed) / 1000;
    add('tachoVoltage', { value: expectedTacho, unit: 'V', measured: readings.tachoVoltage, formula: 'tacho V/1000 rpm × measured speed' });
    if (expectedTacho > 0 && readings.tachoVoltage < -0.2 * expectedTacho) {
      out.findings.push({ code: 'tacho-polarity-reversed', says: `tacho reads ${fmt(readings.tachoVoltage, 'V')} where ${fmt(expectedTacho, 'V')} is expected: its polarity is reversed against the rotation` });
    }
  }
  if (readings.currentLimitSetting !== undefined && ratedIa !== undefined) {
    add('currentLimit', { value: ratedIa, unit: 'A', measured: readings.currentLimitSetting, formula: 'drive current limit against rated armature current' });
  }
  if (readings.brushLength !== undefined && readings.brushLengthNew !== undefined) {
    add('brushLength', { value: readings.brushLengthNew, unit: 'mm', measured: readings.brushLength, formula: 'brush length against new length' });
  }
  if (readings.brushSpringPressure !== undefined) {
    add('brushSpringPressure', { value: BRUSH_PRESSURE_MIN_KPA, unit: 'kPa', measured: readings.brushSpringPressure, formula: 'lowest pressure of the general industrial range (common practice)' });
  }
  if (readings.commutatorRunout !== undefined) {
    add('commutatorRunout', { value: COMMUTATOR_RUNOUT_LIMIT_MM, unit: 'mm', measured: readings.commutatorRunout, formula: 'runout limit (common practice)' });
  }
  if (readings.noLoadArmatureCurrent !== undefined && ratedIa !== undefined) {
    add('noLoadCurrent', { value: NO_LOAD_CURRENT_SHARE * ratedIa, unit: 'A', measured: readings.noLoadArmatureCurrent, formula: 'no-load armature current up to 10 % of rated (common practice)' });
  }
  return out;
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

/**
 * What to look at on a plate whose output and input disagree. An output a thousandth of a
 * plausible one is a power in kW typed as W; an output above the input is not: there a power
 * in hp taken as kW, a decimal slip, or a current or voltage from another line of the plate
 * (the field's, or another rating's) is more likely.
 */
export function nameplateHint(efficiency: number): string {
  const asKilowatts = efficiency * 1000;
  if (asKilowatts >= 0.5 && asKilowatts <= 0.97) return 'check the plate (the power looks like kW typed as W)';
  if (efficiency > 1) return 'the output cannot exceed the input: check the power (hp written as kW, or a decimal slip) and that the voltage and current are the armature\'s rated ones';
  if (efficiency > 0.97) return 'no motor is that efficient: check the power, and that the voltage and current are the armature\'s rated ones';
  return 'check the power, the voltage and the current against the plate';
}
