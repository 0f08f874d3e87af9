/**
 * Fits every hypothesis to the readings: for each, the value of the fault's own parameter that
 * best explains them (one-parameter least squares, each reading's residual scaled by how far a
 * healthy machine's reading may stray), whether that value is plausible, and the residual left
 * on every reading. Then the verdicts: which hypotheses explain all readings, which the readings
 * contradict, and which are tied — with the reading or check that would separate them.
 */
import type { Readings } from '../machine.js';
import type { ModelMachine } from '../families/context.js';
import { radSToRpm } from '../families/context.js';
import { fitBasis, type FitBasis } from './basis.js';
import { HYPOTHESES, type Hypothesis, type World } from './hypotheses.js';
import { minimise } from './minimise.js';

/** The readings a fit predicts, with how far each may stray on a healthy machine (share). */
export const FIT_READINGS = {
  speed: { tolerance: 0.03, words: 'speed' },
  fieldCurrent: { tolerance: 0.05, words: 'field current' },
  armatureVoltage: { tolerance: 0.06, words: 'terminal voltage' },
  supplyVoltage: { tolerance: 0.06, words: 'supply voltage' },
  armatureCurrent: { tolerance: 0.1, words: 'armature current' },
  uncoupledSpeed: { tolerance: 0.03, words: 'speed running uncoupled' },
} as const;
export type FitReading = keyof typeof FIT_READINGS;
/** Every reading a fit takes in: those it explains, and those it takes as given. */
export const FIT_INPUTS: readonly string[] = [...Object.keys(FIT_READINGS), 'noLoadArmatureCurrent', 'currentLimitSetting', 'fieldCurrentSetting', 'starterResistance'];

/** Verdicts a rule can test (`{ "fact": "fit", "path": "$.weakField.verdict", … }`). */
export const FIT_VERDICTS = ['best', 'explains', 'contradicted', 'implausible', 'not-needed', 'unfit'] as const;
export type FitVerdict = (typeof FIT_VERDICTS)[number];

export interface Prediction {
  armatureVoltage: number;
  supplyVoltage: number;
  fieldCurrent?: number | undefined;
  speed: number;
  /** Electromagnetic torque per unit of rated (kΦr·Ia,rated). */
  torquePu: number;
  /** Speed the same machine would run at uncoupled (at the no-load current read, else 5 % of rated): a second operating point. */
  uncoupledSpeed: number;
}

export interface Residual {
  reading: FitReading;
  predicted: number;
  measured: number;
  /** (predicted − measured) over the reading's scale. */
  share: number;
  /** share over the reading's tolerance: |z| ≤ 1 is explained. */
  z: number;
}

export interface HypothesisFit {
  id: string;
  kind: Hypothesis['kind'];
  parameter: string;
  unit: string;
  value: number;
  healthyValue: number;
  plausible: boolean;
  residuals: Residual[];
  /** The largest |share| over the readings: "explains within x %". */
  worstShare: number;
  /** The largest |z|. */
  worstZ: number;
  explains: boolean;
  verdict: FitVerdict;
  /** The reading that disagrees most, when the verdict is contradicted. */
  contradictedBy?: FitReading | undefined;
  prediction?: Prediction | undefined;
}

export interface FitReport {
  healthy: { residuals: Residual[]; worstZ: number; explains: boolean; torquePu: number };
  hypotheses: HypothesisFit[];
  /** Hypotheses tied as best, and the readings or checks that would tell each pair apart. */
  ties: { a: string; b: string; separatedBy: string[] }[];
  basis: FitBasis;
}

/** Hypotheses whose worst residual is within this many tolerances of the best are tied. */
const TIE_Z = 0.35;
/** A load within this share of rated torque is within rating. */
const LOAD_WITHIN_RATING = 1.08;
/** How far a current or voltage reading taken on site may be off (common practice: ±2 %). */
const READING_ERROR = 0.02;
/** Poles of the machine a shorted field coil sits in (four: the usual industrial machine, common practice). */
const POLES = 4;

export function neutralWorld(b: FitBasis, r: Readings): World {
  return {
    sourceVolts: b.voltageFree ? Math.min(r.armatureVoltage ?? b.ratedVolts, 1.06 * b.ratedVolts) : b.nominalVolts,
    cableOhms: 0,
    extraOhms: 0,
    fieldFactor: 1,
    turnsShorted: 0,
    seriesFactor: 1,
    fluxFactor: 1,
  };
}

/**
 * The machine equations under one world at armature current `ia` (and at the current it draws
 * uncoupled, unless `uncoupled` is false: a search whose readings hold no uncoupled speed skips
 * that second point, and its prediction says NaN).
 */
export function predict(b: FitBasis, w: World, ia: number, noLoadIa = 0.05 * b.ratedAmps, uncoupled = true): Prediction {
  return predictInto({ armatureVoltage: 0, supplyVoltage: 0, fieldCurrent: undefined, speed: 0, torquePu: 0, uncoupledSpeed: 0 }, b, w, ia, noLoadIa, uncoupled);
}

/** One operating state, written in place: a search evaluates thousands and keeps none. */
interface State {
  terminal: number;
  field: number | undefined;
  phi: number;
  speed: number;
}
const scratchState: State = { terminal: 0, field: undefined, phi: 0, speed: 0 };

/** predict, written into `into`: a search reuses one prediction rather than make one per value it tries. */
function predictInto(into: Prediction, b: FitBasis, w: World, ia: number, noLoadIa: number, uncoupled: boolean): Prediction {
  const loaded = stateAt(scratchState, b, w, ia);
  into.armatureVoltage = loaded.terminal;
  into.supplyVoltage = w.sourceVolts;
  into.fieldCurrent = loaded.field;
  into.speed = loaded.speed;
  into.torquePu = (loaded.phi * ia) / b.ratedAmps;
  into.uncoupledSpeed = uncoupled ? stateAt(scratchState, b, w, noLoadIa).speed : Number.NaN;
  return into;
}

/** Terminal voltage, field current and speed at one armature current: the cable drop, and a shunt field fed from the terminals, follow the current. */
function stateAt(out: State, b: FitBasis, w: World, amps: number): State {
  const terminal = w.sourceVolts - amps * w.cableOhms;
  let field: number | undefined;
  let fieldPu = 0;
  if (b.shuntField) {
    const supplied = b.healthyFieldAt(terminal) * w.fieldFactor;
    // A regulator holds the current, so shorted turns cost ampere-turns; a voltage-fed field
    // draws more current through fewer turns, so its ampere-turns barely change.
    field = b.fieldRegulated ? supplied : supplied / Math.max(1e-6, 1 - w.turnsShorted);
    fieldPu = field / b.ratedFieldAmps!;
  }
  const armaturePu = amps / b.ratedAmps;
  // Shorted turns sit in one coil: that pole loses its share of the turns while the others
  // carry the (higher) current in full, and saturation keeps them from making up the loss.
  const faultyPoleTurns = 1 - Math.min(1, POLES * w.turnsShorted);
  const phi =
    w.fluxFactor *
    (w.turnsShorted === 0
      ? b.flux(fieldPu, armaturePu, w.seriesFactor)
      : ((POLES - 1) * b.flux(fieldPu, armaturePu, w.seriesFactor) + b.flux(fieldPu * faultyPoleTurns, armaturePu, w.seriesFactor)) / POLES);
  const e = terminal - amps * (b.circuitOhms + w.extraOhms) - (amps > 0 ? b.brushDrop : 0);
  out.terminal = terminal;
  out.field = field;
  out.phi = phi;
  out.speed = phi > 1e-6 ? radSToRpm(e / (b.kPhiRated * phi)) : Number.POSITIVE_INFINITY;
  return out;
}

type Visit = (reading: FitReading, predicted: number, measured: number, share: number, z: number) => void;

/** Each reading's residual under a prediction, in a fixed order: speed, uncoupled speed, field current, terminal voltage, supply voltage. */
function eachResidual(b: FitBasis, r: Readings, p: Prediction, speedTolerance: number, visit: Visit): void {
  if (r.speed !== undefined && r.speed > 0) residual(visit, speedTolerance, 'speed', p.speed, r.speed, r.speed);
  // Run uncoupled on a fixed supply, the machine shows its constants at a second point; a converter would hold its reference.
  if (usesUncoupled(b, r)) residual(visit, speedTolerance, 'uncoupledSpeed', p.uncoupledSpeed, r.uncoupledSpeed, r.uncoupledSpeed!);
  if (b.shuntField && p.fieldCurrent !== undefined) residual(visit, speedTolerance, 'fieldCurrent', p.fieldCurrent, r.fieldCurrent, b.ratedFieldAmps!);
  residual(visit, speedTolerance, 'armatureVoltage', p.armatureVoltage, r.armatureVoltage, b.ratedVolts);
  if (!b.voltageFree) residual(visit, speedTolerance, 'supplyVoltage', p.supplyVoltage, r.supplyVoltage, b.ratedVolts);
}

/** One reading's residual, as a share of its scale and in its tolerances, to the visitor (none when it was not read). */
function residual(visit: Visit, speedTolerance: number, reading: FitReading, predicted: number, measured: number | undefined, scale: number): void {
  if (measured === undefined || !(scale > 0)) return;
  const share = Number.isFinite(predicted) ? (predicted - measured) / scale : 10;
  visit(reading, predicted, measured, share, share / (reading === 'speed' || reading === 'uncoupledSpeed' ? speedTolerance : FIT_READINGS[reading].tolerance));
}

const usesUncoupled = (b: FitBasis, r: Readings) => r.uncoupledSpeed !== undefined && r.uncoupledSpeed > 0 && !b.voltageFree;

function residualsOf(b: FitBasis, r: Readings, p: Prediction, speedTolerance: number = FIT_READINGS.speed.tolerance): Residual[] {
  const out: Residual[] = [];
  eachResidual(b, r, p, speedTolerance, (reading, predicted, measured, share, z) => out.push({ reading, predicted, measured, share, z }));
  return out;
}

/** The running sum misfit's visitor adds to: one function for every call, so a search allocates no closure per value. */
let squares = 0;
const addSquare: Visit = (_reading, _predicted, _measured, _share, z) => {
  squares += z * z;
};

/** The sum of squared residuals (in tolerances) that a fit minimises: the sum residualsOf's list would give, without building it. */
function misfit(b: FitBasis, r: Readings, p: Prediction, speedTolerance: number): number {
  squares = 0;
  eachResidual(b, r, p, speedTolerance, addSquare);
  return squares;
}

const worst = (rs: Residual[], key: 'z' | 'share') => rs.reduce((m, x) => Math.max(m, Math.abs(x[key])), 0);

/**
 * @example fitReadings(machine, { armatureVoltage: 229, armatureCurrent: 60, fieldCurrent: 1.11, speed: 1070 })
 *   ?.hypotheses.find((h) => h.id === 'extraResistance') // { value: 0.3, verdict: 'best', … }
 */
export function fitReadings(machine: ModelMachine, given: Readings): FitReport | undefined {
  const b = fitBasis(machine, given);
  // A supply (line) current read instead of the armature's: the operating point has taken the field's share out.
  const r = given.armatureCurrent === undefined && b?.ctx.derived.ia !== undefined ? { ...given, armatureCurrent: b.ctx.derived.ia } : given;
  if (!b || r.speed === undefined || !(r.speed > 0) || r.armatureCurrent === undefined || r.armatureVoltage === undefined) return undefined;
  const ia = r.armatureCurrent;
  const noLoadIa = r.noLoadArmatureCurrent ?? 0.05 * b.ratedAmps;
  const neutral = neutralWorld(b, r);
  const healthyPrediction = predict(b, neutral, ia, noLoadIa);
  // The current is an input to every prediction: its own reading error moves the predicted speed
  // (much on a series machine, whose flux follows it), so the speed's tolerance carries that too.
  // On a converter the terminal voltage is an input as well, with its own reading error.
  const sensitivity = (moved: number) => (Number.isFinite(moved) && healthyPrediction.speed > 0 ? Math.abs(moved - healthyPrediction.speed) / healthyPrediction.speed : 0);
  const byCurrent = sensitivity(predict(b, neutral, ia * (1 + READING_ERROR), noLoadIa).speed);
  const byVoltage = b.voltageFree ? sensitivity(predict(b, { ...neutral, sourceVolts: neutral.sourceVolts * (1 + READING_ERROR) }, ia, noLoadIa).speed) : 0;
  // Added, not combined as squares: reading errors of one sign must not make a healthy machine a fault.
  const speedTolerance = FIT_READINGS.speed.tolerance + byCurrent + byVoltage;
  const residuals = (p: Prediction) => residualsOf(b, r, p, speedTolerance);
  const healthyResiduals = residuals(healthyPrediction);
  // The load on the shaft from the current at the flux the machine really has (its measured field).
  const fieldPu = b.shuntField ? (r.fieldCurrent ?? b.healthyFieldAt(r.armatureVoltage)) / b.ratedFieldAmps! : 0;
  const torquePu = (b.flux(fieldPu, ia / b.ratedAmps) * ia) / b.ratedAmps;
  const healthy = { residuals: healthyResiduals, worstZ: worst(healthyResiduals, 'z'), explains: worst(healthyResiduals, 'z') <= 1, torquePu };

  // The parameter's best value for each world field over each range: hypotheses that differ only
  // in which values they call that fault (a weak and a strong field) share one search.
  const searched = new Map<string, number>();
  const withUncoupled = usesUncoupled(b, r);
  /** The neutral world with one quantity set: a search sets it again for each value it tries. */
  const worldWith = (acts: keyof World, value: number): World => ({ ...neutral, [acts]: value });
  const bestValue = (acts: keyof World, lo: number, hi: number): number => {
    const key = `${acts} ${lo} ${hi}`;
    let value = searched.get(key);
    if (value === undefined) {
      const world = worldWith(acts, lo);
      const trial = predict(b, world, ia, noLoadIa, withUncoupled);
      value = minimise((x) => {
        world[acts] = x;
        return misfit(b, r, predictInto(trial, b, world, ia, noLoadIa, withUncoupled), speedTolerance);
      }, lo, hi);
      searched.set(key, value);
    }
    return value;
  };

  // Every fit is written out whole, with its keys in one order: objects of one shape, made fast.
  const fitOf = (h: Hypothesis, value: number, plausible: boolean, residuals: Residual[], worstZ: number, explains: boolean, verdict: FitVerdict, prediction: Prediction | undefined): HypothesisFit => ({
    id: h.id,
    kind: h.kind,
    parameter: h.parameter,
    unit: h.unit,
    value,
    healthyValue: h.healthy(b),
    plausible,
    residuals,
    worstShare: verdict === 'unfit' ? NaN : worst(residuals, 'share'),
    worstZ,
    explains,
    verdict,
    contradictedBy: verdict === 'contradicted' ? worstReading(residuals) : undefined,
    prediction,
  });
  const unfit = (h: Hypothesis) => fitOf(h, NaN, false, [], NaN, false, 'unfit', undefined);

  const fits = HYPOTHESES.map((h): HypothesisFit => {
    if (!h.applies(b, r)) return unfit(h);
    if (h.kind === 'load') {
      const value = h.measure!(b, r, healthy.torquePu);
      if (value === undefined) return unfit(h);
      const plausible = h.plausible(value, b, r);
      return fitOf(h, value, plausible, healthyResiduals, healthy.worstZ, healthy.explains, !healthy.explains ? 'contradicted' : plausible ? 'explains' : 'not-needed', healthyPrediction);
    }
    const [lo, hi] = h.search(b, r);
    const value = bestValue(h.acts!, lo, hi);
    const prediction = predict(b, worldWith(h.acts!, value), ia, noLoadIa);
    const rs = residuals(prediction);
    // The load this fault would leave on the shaft: beyond rating, the current is not explained.
    if (prediction.torquePu > LOAD_WITHIN_RATING) {
      const share = (prediction.torquePu - LOAD_WITHIN_RATING) / LOAD_WITHIN_RATING;
      rs.push({ reading: 'armatureCurrent', predicted: (ia * LOAD_WITHIN_RATING) / prediction.torquePu, measured: ia, share, z: share / FIT_READINGS.armatureCurrent.tolerance });
    }
    const worstZ = worst(rs, 'z');
    const explains = worstZ <= 1;
    const plausible = h.plausible(value, b, r);
    return fitOf(h, value, plausible, rs, worstZ, explains, healthy.explains ? 'not-needed' : !plausible ? 'implausible' : explains ? 'explains' : 'contradicted', prediction);
  });

  const explaining = fits.filter((f) => f.verdict === 'explains');
  const bestZ = Math.min(...explaining.map((f) => f.worstZ));
  for (const f of explaining) if (f.worstZ <= bestZ + TIE_Z) f.verdict = 'best';
  const best = fits.filter((f) => f.verdict === 'best');
  const ties: FitReport['ties'] = [];
  for (let i = 0; i < best.length; i++) {
    for (let j = i + 1; j < best.length; j++) ties.push({ a: best[i]!.id, b: best[j]!.id, separatedBy: separators(b, r, best[i]!, best[j]!) });
  }
  return { healthy, hypotheses: fits, ties, basis: b };
}

function worstReading(rs: Residual[]): FitReading | undefined {
  return rs.reduce<Residual | undefined>((m, x) => (m === undefined || Math.abs(x.z) > Math.abs(m.z) ? x : m), undefined)?.reading;
}

/** Readings not yet taken, and the no-load speed, on which two fitted hypotheses disagree by more than their tolerance. */
function separators(b: FitBasis, r: Readings, x: HypothesisFit, y: HypothesisFit): string[] {
  const px = x.prediction;
  const py = y.prediction;
  if (!px || !py) return [];
  const out: string[] = [];
  const differ = (a: number | undefined, c: number | undefined, scale: number, tol: number) => a !== undefined && c !== undefined && Number.isFinite(a) && Number.isFinite(c) && Math.abs(a - c) / scale > tol;
  if (r.fieldCurrent === undefined && b.shuntField && differ(px.fieldCurrent, py.fieldCurrent, b.ratedFieldAmps!, FIT_READINGS.fieldCurrent.tolerance)) out.push('fieldCurrent');
  if (r.supplyVoltage === undefined && differ(px.supplyVoltage, py.supplyVoltage, b.ratedVolts, FIT_READINGS.supplyVoltage.tolerance)) out.push('supplyVoltage');
  if (r.uncoupledSpeed === undefined && !b.voltageFree && differ(px.uncoupledSpeed, py.uncoupledSpeed, Math.max(px.uncoupledSpeed, py.uncoupledSpeed), FIT_READINGS.speed.tolerance)) out.push('uncoupledSpeed');
  return out;
}
