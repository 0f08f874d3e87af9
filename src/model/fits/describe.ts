/**
 * Each fit in a fitter's words, with its numbers: "an extra 0.92 Ω in the armature circuit
 * explains the speed, field current and terminal voltage within 2 % — about 3 × the circuit's
 * own 0.31 Ω". One sentence per hypothesis, whatever its verdict.
 */
import type { FitReport, FitReading, HypothesisFit, Residual } from './fit.js';
import { FIT_READINGS } from './fit.js';

const READING_UNITS: Record<FitReading, string> = { speed: 'rpm', fieldCurrent: 'A', armatureVoltage: 'V', supplyVoltage: 'V', armatureCurrent: 'A', uncoupledSpeed: 'rpm' };
const SEPARATOR_WORDS: Record<string, string> = {
  fieldCurrent: 'the field current',
  supplyVoltage: 'the voltage at the supply end',
  uncoupledSpeed: 'the speed run uncoupled (no load)',
};
/** What the fault is not, when its parameter lands outside its range. */
const NOT_THIS: Record<string, string> = {
  weakField: 'that is not a weak field',
  strongField: 'that is not a strong field',
  fieldTurnsShorted: 'too few or too many turns to be shorted turns',
  extraResistance: 'not a resistance a joint or brushes could add',
  lowSupply: 'that is not a low supply',
  highSupply: 'that is not a supply above rating',
  cableDrop: 'not a cable drop',
  seriesFieldShorted: 'that is not a shorted series field',
  seriesFieldOpposing: 'that is not a series field opposing the shunt field',
  weakMagnets: 'that is not weakened magnets',
};

function num(x: number): string {
  const abs = Math.abs(x);
  const digits = abs >= 100 ? 0 : abs >= 10 ? 1 : abs >= 1 ? 2 : 3;
  return String(Number(x.toFixed(digits)));
}
const pct = (x: number) => `${Math.round(x * 100)} %`;

function valueWords(f: HypothesisFit, report: FitReport): string {
  const b = report.basis;
  const p = f.prediction;
  switch (f.id) {
    case 'weakField':
    case 'strongField':
      return `a field current of ${num(p?.fieldCurrent ?? 0)} A (${pct(f.value)} of the healthy field)`;
    case 'fieldTurnsShorted':
      return `about ${pct(f.value)} of the field turns shorted in one coil (${b.fieldRegulated ? 'the regulator holds the current, so that pole loses its ampere-turns' : `the field then draws ${num(p?.fieldCurrent ?? 0)} A`})`;
    case 'extraResistance':
      return `an extra ${num(f.value)} Ω in the armature circuit (about ${num(f.value / b.circuitOhms)} × the circuit's own ${num(b.circuitOhms)} Ω)`;
    case 'lowSupply':
    case 'highSupply':
      return `a supply of ${num(f.value)} V (${pct(f.value / b.ratedVolts)} of the rated ${num(b.ratedVolts)} V)`;
    case 'cableDrop':
      return `${num(f.value)} Ω in the supply cable (a drop of ${num(p ? p.supplyVoltage - p.armatureVoltage : 0)} V)`;
    case 'seriesFieldShorted':
      return `the series field giving ${pct(f.value)} of its healthy ampere-turns`;
    case 'seriesFieldOpposing':
      return `the series field opposing the shunt field (${pct(-f.value)} of its ampere-turns, reversed)`;
    case 'weakMagnets':
      return `magnets at ${pct(f.value)} of their healthy flux`;
    case 'overload':
    case 'lightLoad':
      return `a load of ${pct(f.value)} of rated torque at the measured current and field`;
    case 'currentLimit':
      return `the current held at a ${num(f.value)} A limit (${pct(f.value / b.ratedAmps)} of rated)`;
    default:
      return `${f.parameter} ${num(f.value)} ${f.unit}`;
  }
}

function listWords(rs: Residual[]): string {
  const names = [...new Set(rs.map((r) => FIT_READINGS[r.reading].words))];
  if (names.length <= 1) return names[0] ?? 'readings';
  return `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

function reading(r: Residual): string {
  const u = READING_UNITS[r.reading];
  return `${num(r.measured)} ${u} measured against the ${num(r.predicted)} ${u} it would give`;
}

/** The sentence for one hypothesis, with the readings and checks that would separate it from a tied one. */
export function describeFit(f: HypothesisFit, report: FitReport): string {
  const within = `within ${Math.max(1, Math.round(f.worstShare * 100))} %`;
  switch (f.verdict) {
    case 'unfit':
      return `${f.parameter}: not fitted (it does not apply to this machine, or the readings it needs are missing)`;
    case 'not-needed':
      return f.kind === 'load'
        ? `${valueWords(f, report)}: within what this fault means, and a healthy machine explains the ${listWords(f.residuals)} ${within}`
        : `a healthy machine explains the ${listWords(report.healthy.residuals)} within ${Math.max(1, Math.round(Math.max(...report.healthy.residuals.map((r) => Math.abs(r.share)), 0) * 100))} %: no fault of this kind is needed`;
    case 'implausible':
      return `only ${valueWords(f, report)} would fit the readings — ${NOT_THIS[f.id] ?? 'outside what this fault can do'}`;
    case 'contradicted': {
      const worst = f.residuals.find((r) => r.reading === f.contradictedBy);
      return `${valueWords(f, report)} is the best this fault can do, but the ${FIT_READINGS[f.contradictedBy ?? 'speed'].words} contradicts it${worst ? `: ${reading(worst)}` : ''}`;
    }
    default: {
      const tied = report.ties.filter((t) => t.a === f.id || t.b === f.id);
      const apart = tied.map((t) => {
        const other = t.a === f.id ? t.b : t.a;
        const check = t.separatedBy.map((s) => SEPARATOR_WORDS[s] ?? s).join(' or ');
        return `${valueWords(report.hypotheses.find((h) => h.id === other)!, report)} explains them as well${check ? ` — ${check} would tell them apart` : ' — no reading taken so far tells them apart'}`;
      });
      return `${valueWords(f, report)} explains the ${listWords(f.residuals)} ${within}${apart.length ? `; ${apart.join('; ')}` : ''}`;
    }
  }
}

export function describeFits(report: FitReport): Record<string, string> {
  return Object.fromEntries(report.hypotheses.map((f) => [f.id, describeFit(f, report)]));
}
