/**
 * Fault cases generated from the machine equations, for measuring the diagnosis on cases no rule
 * was tuned on: a machine from a few plate designs, a fault of known size (or none), a load, and
 * the steady state found by balancing torque — not by the fits' own equations — then ±2 % noise
 * on every reading. Deterministic for a seed.
 */
import type { Connection, Readings } from '../machine.js';
import type { ModelMachine } from '../families/context.js';
import { fluxPerUnit } from '../magnetization.js';
import { radSToRpm, rpmToRadS } from '../families/context.js';
import { DEFAULT_BRUSH_DROP_V } from '../families/rated-point.js';

/** Series-field share of rated excitation of a generated compound machine (the model's default). */
const COMPOUND_SERIES_SHARE = 0.2;
/** The most a converter gives the armature, as a share of its rating. */
const CONVERTER_CEILING = 1.05;
/** Poles a shorted field coil sits among. */
const POLES = 4;

export interface Fault {
  cause: string | null;
  /** The fault's size in its own terms (see FAULT_KINDS). */
  size: number;
}

export interface GeneratedCase {
  label: string;
  cause: string;
  size: number;
  job: { machine: ModelMachine; readings: Readings };
}

/** Small deterministic generator (mulberry32). */
export function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export interface Design {
  connection: Connection;
  drive: 'fixed-supply' | 'controlled-converter';
  volts: number;
  amps: number;
  rpm: number;
  /** Armature circuit resistance as a share of V/I. */
  rShare: number;
  fieldVolts?: number;
  fieldAmps?: number;
}

export function machineOf(d: Design): ModelMachine {
  const r = (d.rShare * d.volts) / d.amps;
  const series = d.connection === 'series' ? r * 0.4 : d.connection.startsWith('compound') ? r * 0.15 : 0;
  return {
    connection: d.connection,
    drive: d.drive,
    nameplate: {
      armatureVoltage: d.volts,
      armatureCurrent: d.amps,
      speed: d.rpm,
      ...(d.fieldAmps !== undefined ? { fieldCurrent: d.fieldAmps, fieldVoltage: d.fieldVolts ?? d.volts } : {}),
    },
    resistances: { armature: r - series, ...(series > 0 ? { seriesField: series } : {}), ...(d.fieldAmps !== undefined ? { shuntField: (d.fieldVolts ?? d.volts) / d.fieldAmps } : {}) },
  };
}

export interface Operating {
  /** Load torque per unit of rated electromagnetic torque. */
  load: number;
  /** Converter speed reference per unit of rated (converter drives). */
  speedRef: number;
}

/** The steady state of a machine with a fault: torque balance on a fixed supply, speed held by a converter. */
export function steadyState(d: Design, fault: Fault, op: Operating): Readings | undefined {
  const r = (d.rShare * d.volts) / d.amps;
  const vb = DEFAULT_BRUSH_DROP_V;
  const kPhi = (d.volts - d.amps * r - vb) / rpmToRadS(d.rpm);
  const shunt = d.fieldAmps !== undefined;
  const seriesWound = d.connection === 'series' || d.connection.startsWith('compound');
  const sense = d.connection === 'compound-differential' ? -1 : 1;
  const f = fault.cause;
  const converter = d.drive === 'controlled-converter';
  let source = d.volts;
  if (f === 'low-supply-voltage' || f === 'armature-overvoltage') source = fault.size * d.volts;
  const cable = f === 'cable-drop' ? fault.size : 0;
  const extra = f === 'armature-circuit-high-resistance' ? fault.size * r : 0;
  const seriesFactor = f === 'series-field-shorted' ? fault.size : f === 'differential-compound' ? -1 : 1;
  const shorted = f === 'field-shorted-turns' ? fault.size : 0;
  const fieldScale = f === 'field-weak' || f === 'field-overvoltage' ? fault.size : 1;
  const magnets = f === 'pm-magnets-weakened' ? fault.size : 1;

  const fieldAt = (terminal: number) => {
    if (!shunt) return { amps: undefined, pu: 0 };
    const across = d.connection === 'shunt' || d.connection.startsWith('compound');
    const supplied = d.fieldAmps! * fieldScale * (across ? terminal / d.volts : 1);
    const amps = supplied / (1 - shorted);
    return { amps, pu: amps / d.fieldAmps! };
  };
  const phiOf = (fieldPu: number, ia: number) => {
    const iaPu = (ia / d.amps) * seriesFactor;
    const mmf = (x: number) => (!shunt ? iaPu : !seriesWound ? x : x * (1 - sense * COMPOUND_SERIES_SHARE) + sense * COMPOUND_SERIES_SHARE * iaPu);
    if (!shunt && !seriesWound) return magnets;
    if (shorted === 0) return fluxPerUnit(undefined, mmf(fieldPu));
    const faulty = 1 - Math.min(1, POLES * shorted);
    return ((POLES - 1) * fluxPerUnit(undefined, mmf(fieldPu)) + fluxPerUnit(undefined, mmf(fieldPu * faulty))) / POLES;
  };
  // The first current at which the torque meets the load (a differential machine's torque peaks and falls).
  const firstRoot = (g: (x: number) => number, hi: number): number | undefined => {
    const steps = 4000;
    for (let k = 0; k < steps; k++) {
      const a = (hi * k) / steps;
      const b = (hi * (k + 1)) / steps;
      if (g(a) * g(b) <= 0) return bisect(g, a, b);
    }
    return undefined;
  };
  const bisect = (g: (x: number) => number, lo: number, hi: number) => {
    for (let k = 0; k < 100; k++) {
      const mid = (lo + hi) / 2;
      if (g(lo) * g(mid) <= 0) hi = mid;
      else lo = mid;
    }
    return (lo + hi) / 2;
  };

  if (!converter) {
    // Torque balance: kΦ·φ(Ia)·Ia = load·kΦ·Ia,rated, with the terminal voltage (and so the shunt field) depending on Ia through the cable.
    const torque = (ia: number) => phiOf(fieldAt(source - ia * cable).pu, ia) * ia - op.load * d.amps;
    const ia = firstRoot(torque, 20 * d.amps);
    if (ia === undefined) return undefined;
    const terminal = source - ia * cable;
    const field = fieldAt(terminal);
    const e = terminal - ia * (r + extra) - vb;
    return {
      armatureVoltage: terminal,
      armatureCurrent: ia,
      speed: radSToRpm(e / (kPhi * phiOf(field.pu, ia))),
      ...(field.amps !== undefined ? { fieldCurrent: field.amps } : {}),
      ...(cable > 0 ? { supplyVoltage: source } : {}),
    };
  }
  // Converter: the speed loop holds the reference; the current follows the load, up to the limit.
  const limit = f === 'current-limit-low' ? fault.size * d.amps : 1.5 * d.amps;
  const field = fieldAt(d.volts);
  let n = op.speedRef * d.rpm;
  let ia = firstRoot((x) => phiOf(field.pu, x) * x - op.load * d.amps, 20 * d.amps);
  if (ia === undefined) return undefined;
  if (ia > limit) {
    // Held at the limit, a fan-like load (torque ∝ n²) settles where the limited torque meets it.
    ia = limit;
    n *= Math.sqrt((phiOf(field.pu, ia) * ia) / (op.load * d.amps));
  }
  const phi = phiOf(field.pu, ia);
  let volts = kPhi * phi * rpmToRadS(n) + ia * (r + extra) + vb;
  if (volts > d.volts * CONVERTER_CEILING && f !== 'armature-overvoltage') {
    // The converter runs out of voltage: the speed falls below the reference.
    volts = d.volts * CONVERTER_CEILING;
    n = radSToRpm((volts - ia * (r + extra) - vb) / (kPhi * phi));
  }
  return {
    armatureVoltage: f === 'armature-overvoltage' ? volts * fault.size : volts,
    armatureCurrent: ia,
    speed: f === 'armature-overvoltage' ? radSToRpm((volts * fault.size - ia * r - vb) / (kPhi * phi)) : n,
    ...(field.amps !== undefined ? { fieldCurrent: field.amps } : {}),
    ...(f === 'current-limit-low' ? { currentLimitSetting: limit } : {}),
  };
}

/** Which faults each kind of machine can have, with the size range: [cause, lo, hi]. */
function faultsFor(d: Design): [string, number, number][] {
  const shunt = d.fieldAmps !== undefined;
  const fixed = d.drive === 'fixed-supply';
  const out: [string, number, number][] = [['armature-circuit-high-resistance', 1, 5]];
  if (shunt) out.push(['field-weak', 0.45, 0.85], ['field-shorted-turns', 0.1, 0.2]);
  if (shunt && d.connection === 'separately-excited') out.push(['field-overvoltage', 1.15, 1.4]);
  if (fixed) out.push(['low-supply-voltage', 0.72, 0.88], ['cable-drop', 0, 0], ['overload', 1.2, 1.6], ['armature-overvoltage', 1.12, 1.3]);
  if (d.connection === 'series') out.push(['series-field-shorted', 0.4, 0.75], ['series-motor-unloaded', 0.06, 0.15]);
  if (d.connection === 'compound-cumulative') out.push(['series-field-shorted', 0, 0.3], ['differential-compound', 0, 0]);
  if (!fixed) out.push(['current-limit-low', 0.5, 0.8]);
  if (d.connection === 'permanent-magnet') out.push(['pm-magnets-weakened', 0.6, 0.9]);
  return out;
}

export const DESIGNS: Design[] = [
  { connection: 'shunt', drive: 'fixed-supply', volts: 220, amps: 24, rpm: 1500, rShare: 0.06, fieldAmps: 0.8 },
  { connection: 'shunt', drive: 'fixed-supply', volts: 440, amps: 95, rpm: 1150, rShare: 0.045, fieldAmps: 2.4 },
  { connection: 'separately-excited', drive: 'fixed-supply', volts: 230, amps: 40, rpm: 1750, rShare: 0.05, fieldVolts: 110, fieldAmps: 1.5 },
  { connection: 'separately-excited', drive: 'controlled-converter', volts: 460, amps: 120, rpm: 1750, rShare: 0.04, fieldVolts: 300, fieldAmps: 4 },
  { connection: 'separately-excited', drive: 'controlled-converter', volts: 500, amps: 300, rpm: 1000, rShare: 0.03, fieldVolts: 310, fieldAmps: 8 },
  { connection: 'compound-cumulative', drive: 'fixed-supply', volts: 230, amps: 70, rpm: 1150, rShare: 0.06, fieldAmps: 1.9 },
  { connection: 'series', drive: 'fixed-supply', volts: 250, amps: 80, rpm: 1000, rShare: 0.06 },
  { connection: 'series', drive: 'fixed-supply', volts: 110, amps: 40, rpm: 1800, rShare: 0.08 },
  { connection: 'permanent-magnet', drive: 'fixed-supply', volts: 90, amps: 10, rpm: 1750, rShare: 0.1 },
  { connection: 'permanent-magnet', drive: 'controlled-converter', volts: 180, amps: 9, rpm: 1750, rShare: 0.08 },
];

/** ±`share` uniform noise. */
const noisy = (x: number, rnd: () => number, share: number) => x * (1 + share * (2 * rnd() - 1));

/**
 * Fault cases of known size with ±2 % noise on every reading. The cable-drop fault is labelled
 * with its cause (low supply voltage), and its size is the drop as a share of the supply.
 */
export function generatedFaultCases({ seed, count, noise = 0.02, uncoupled = false }: { seed: number; count: number; noise?: number; uncoupled?: boolean }): GeneratedCase[] {
  const rnd = random(seed);
  const out: GeneratedCase[] = [];
  for (let k = 0; k < count; k++) {
    const d = DESIGNS[Math.floor(rnd() * DESIGNS.length)]!;
    const options = faultsFor(d);
    const [kind, lo, hi] = options[Math.floor(rnd() * options.length)]!;
    let size = lo + (hi - lo) * rnd();
    const op: Operating = { load: d.connection === 'series' ? 0.5 + 0.5 * rnd() : 0.4 + 0.6 * rnd(), speedRef: 0.5 + 0.45 * rnd() };
    if (kind === 'overload') op.load = size;
    if (kind === 'series-motor-unloaded') op.load = size;
    if (kind === 'current-limit-low') op.load = 1;
    if (kind === 'differential-compound') op.load = 0.2 + 0.4 * rnd();
    const fault: Fault = { cause: kind === 'overload' || kind === 'series-motor-unloaded' ? null : kind, size };
    if (kind === 'cable-drop') {
      // A cable run that drops 8–20 % of the supply at this load.
      const share = 0.08 + 0.12 * rnd();
      fault.size = (share * d.volts) / (op.load * d.amps);
      size = share;
    }
    const exact = steadyState(d, fault, op);
    // A load the faulty machine cannot carry stalls it: no steady state to read.
    if (!exact || !(exact.speed! > 0) || !Number.isFinite(exact.speed!)) {
      k--;
      continue;
    }
    const readings: Readings = Object.fromEntries(Object.entries(exact).map(([name, x]) => [name, name === 'currentLimitSetting' ? x : noisy(x as number, rnd, noise)]));
    // Run uncoupled as well (never a series machine; a converter would hold its speed reference): a second operating point.
    // Its noise is drawn either way, so the same seed gives the same jobs with and without it.
    const light = d.connection !== 'series' && d.drive === 'fixed-supply' ? steadyState(d, fault, { ...op, load: 0.05 }) : undefined;
    const lightNoise = [noisy(1, rnd, noise), noisy(1, rnd, noise)] as const;
    if (uncoupled && light?.speed !== undefined && light.armatureCurrent !== undefined && light.speed > 0 && Number.isFinite(light.speed)) {
      readings.noLoadArmatureCurrent = light.armatureCurrent * lightNoise[0];
      readings.uncoupledSpeed = light.speed * lightNoise[1];
    }
    const cause = kind === 'cable-drop' ? 'low-supply-voltage' : kind;
    out.push({ label: `${d.connection}/${d.drive} ${kind} ${Number(size.toPrecision(3))}`, cause, size, job: { machine: machineOf(d), readings } });
  }
  return out;
}
