/**
 * An asset's history: the recorded jobs with the same `job.asset`, in date order, and its trends:
 * insulation resistance at 40 °C with its rate of fall and the date a straight-line trend would
 * reach the IEEE 43-2013 minimum, winding resistance at 20 °C, and what was found each time.
 * A job's date is its `outcome.date`, else the day of `job.startedAt`. Pure: takes loaded cases.
 */
import type { CaseFile } from '../knowledge/case-schema.js';
import type { TestedWinding } from '../model/machine.js';
import { insulationMinimum } from '../model/insulation.js';
import { resistanceAt } from '../model/resistance.js';
import { analyseInsulationCurve, correctTo40C } from '../model/series/insulation-curve.js';
import { insulationSystemOf } from './series-analyses.js';

export interface RecordedJob {
  file: string;
  job: CaseFile;
}

export interface HistoryJob {
  file: string;
  date: string | null;
  workOrder?: string | undefined;
  cause?: string | undefined;
  causeTitle?: string | undefined;
  fix?: string | undefined;
  /** 1-minute insulation resistance corrected to 40 °C, MΩ, the winding it was taken on, and the winding temperature then. */
  insulationAt40C?: number | undefined;
  insulationWinding?: TestedWinding | undefined;
  insulationTestC?: number | undefined;
  /** Armature circuit resistance at 20 °C, Ω. */
  armatureAt20C?: number | undefined;
  /** Shunt field resistance at 20 °C, Ω. */
  shuntFieldAt20C?: number | undefined;
}

export type DatedPoint = [string, number];

export interface AssetHistory {
  asset: string;
  jobs: HistoryJob[];
  trends: {
    insulation: {
      /** The winding of the latest test: only tests on it make the trend. */
      winding: TestedWinding | null;
      points: DatedPoint[];
      perYear: number | null;
      minimum: number | null;
      projectedMinimumDate: string | null;
      /** Why the trend is rougher than it looks (tests far apart in temperature). */
      cautions: string[];
    };
    armatureResistance: { points: DatedPoint[] };
    shuntFieldResistance: { points: DatedPoint[] };
  };
}

/** The job's date as YYYY-MM-DD, or null when it has none. */
export function jobDate(c: CaseFile): string | null {
  const d = c.outcome?.date ?? c.job?.startedAt?.slice(0, 10);
  return d && /^\d{4}-\d{2}-\d{2}$/.test(d) && !Number.isNaN(Date.parse(d)) ? d : null;
}

const REFERENCE_C = 20;
/** Tests further apart in winding temperature than this make a rough trend (shared check-values 2.3). */
const TREND_TEMPERATURE_SPAN_C = 10;

function insulationOf(c: CaseFile): Pick<HistoryJob, 'insulationAt40C' | 'insulationWinding' | 'insulationTestC'> {
  const system = insulationSystemOf(c.machine);
  const curve = c.tests?.insulation;
  if (curve) {
    const at40 = analyseInsulationCurve(curve, system).oneMinuteAt40C;
    if (at40 !== null) return { insulationAt40C: at40, insulationWinding: curve.winding, insulationTestC: curve.temperature };
  }
  const r = c.readings;
  const ir1 = r?.insulationResistance1min;
  const t = r?.insulationTestTemperature ?? r?.ambientTemperature;
  if (ir1 === undefined || t === undefined) return {};
  return { insulationAt40C: round(correctTo40C(ir1, t, system)), insulationWinding: r?.insulationTestedWinding ?? 'whole-machine', insulationTestC: t };
}

function at20(ohms: number | undefined, c: CaseFile): number | undefined {
  if (ohms === undefined) return undefined;
  const at = c.machine.resistances?.at;
  return round(at === undefined ? ohms : resistanceAt(ohms, at, REFERENCE_C));
}

export function assetHistory(asset: string, recorded: readonly RecordedJob[], causeTitles: ReadonlyMap<string, string>): AssetHistory {
  const mine = recorded.filter((r) => r.job.job?.asset === asset);
  const jobs: HistoryJob[] = mine
    .map(({ file, job: c }) => {
      const cause = c.outcome?.cause ?? c.outcome?.newCause?.id;
      return {
        file,
        date: jobDate(c),
        workOrder: c.job?.workOrder,
        cause,
        causeTitle: cause ? (causeTitles.get(cause) ?? c.outcome?.newCause?.title) : undefined,
        fix: c.outcome?.fix,
        ...insulationOf(c),
        armatureAt20C: at20(c.machine.resistances?.armature, c),
        shuntFieldAt20C: at20(c.machine.resistances?.shuntField, c),
      };
    })
    // Dated jobs in order, undated ones after them by file name.
    .sort((a, b) => (a.date ?? '9999') < (b.date ?? '9999') ? -1 : (a.date ?? '9999') > (b.date ?? '9999') ? 1 : a.file < b.file ? -1 : a.file > b.file ? 1 : 0);

  const points = (pick: (j: HistoryJob) => number | undefined): DatedPoint[] =>
    jobs.flatMap((j) => {
      const v = pick(j);
      return j.date !== null && v !== undefined ? [[j.date, v] as DatedPoint] : [];
    });
  // One winding's tests make a trend: the latest test's winding.
  const lastTested = [...jobs].reverse().find((j) => j.date !== null && j.insulationAt40C !== undefined);
  const winding = lastTested?.insulationWinding ?? null;
  const insulation = points((j) => (j.insulationWinding === winding ? j.insulationAt40C : undefined));
  const latest = mine.find((r) => r.file === lastTested?.file)?.job;
  const minimum = latest && winding ? minimumFor(latest, winding) : null;
  const temperatures = jobs.filter((j) => j.date !== null && j.insulationWinding === winding && j.insulationTestC !== undefined).map((j) => j.insulationTestC!);
  const cautions: string[] = [];
  // EASA, Revisiting insulation resistance temperature correction (2013): retest near the same temperature when trending.
  if (temperatures.length > 1 && Math.max(...temperatures) - Math.min(...temperatures) > TREND_TEMPERATURE_SPAN_C) {
    cautions.push(`tests between ${Math.min(...temperatures)} and ${Math.max(...temperatures)} °C: correcting over more than ${TREND_TEMPERATURE_SPAN_C} °C is rough; test near the same winding temperature to trend`);
  }
  const trend = lineOf(insulation);
  let projected: string | null = null;
  if (trend && trend.perYear < 0 && minimum !== null) projected = dateAt((minimum - trend.intercept) / trend.perYear);
  return {
    asset,
    jobs,
    trends: {
      insulation: { winding, points: insulation, perYear: trend ? round(trend.perYear) : null, minimum, projectedMinimumDate: projected, cautions },
      armatureResistance: { points: points((j) => j.armatureAt20C) },
      shuntFieldResistance: { points: points((j) => j.shuntFieldAt20C) },
    },
  };
}

function minimumFor(c: CaseFile, winding: TestedWinding): number {
  const np = c.machine.nameplate ?? {};
  return insulationMinimum(winding, { armature: np.armatureVoltage ?? 1000, field: np.fieldVoltage ?? np.armatureVoltage ?? 1000 });
}

const DAY_MS = 86_400_000;
const YEAR_DAYS = 365.25;
const yearsOf = (date: string) => Date.parse(`${date}T00:00:00Z`) / DAY_MS / YEAR_DAYS;
const dateAt = (years: number) => new Date(Math.round(years * YEAR_DAYS) * DAY_MS).toISOString().slice(0, 10);

/** Least-squares straight line through dated values: change per year and the value at year 0 (1970). */
function lineOf(points: readonly DatedPoint[]): { perYear: number; intercept: number } | undefined {
  const xs = points.map(([d]) => yearsOf(d));
  const ys = points.map(([, v]) => v);
  if (new Set(xs).size < 2) return undefined;
  const mx = xs.reduce((a, x) => a + x, 0) / xs.length;
  const my = ys.reduce((a, y) => a + y, 0) / ys.length;
  const sxx = xs.reduce((a, x) => a + (x - mx) ** 2, 0);
  const sxy = xs.reduce((a, x, i) => a + (x - mx) * (ys[i]! - my), 0);
  const perYear = sxy / sxx;
  return { perYear, intercept: my - perYear * mx };
}

const round = (x: number) => Number(x.toPrecision(6));

const ORDINALS = ['first', 'second', 'third', 'fourth', 'fifth', 'sixth', 'seventh', 'eighth', 'ninth', 'tenth'];
const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

/**
 * One line for the dialogue when a fitter names an asset with jobs on record, e.g.
 * "KF-2: third job this year; last on 2026-03-10 (March): Field circuit open — field coil replaced."
 * Undefined when the asset has no earlier jobs.
 */
export function earlierJobsNote(h: AssetHistory, today: string): string | undefined {
  const dated = h.jobs.filter((j) => j.date !== null && j.date <= today);
  if (h.jobs.length === 0) return undefined;
  const year = today.slice(0, 4);
  const thisYear = dated.filter((j) => j.date!.startsWith(year)).length;
  const nth = ORDINALS[thisYear] ?? `${thisYear + 1}th`;
  const parts = [`${h.asset}: ${nth} job this year, ${h.jobs.length} earlier on record`];
  const last = dated[dated.length - 1] ?? h.jobs[h.jobs.length - 1]!;
  const when = last.date ? `${last.date} (${MONTHS[Number(last.date.slice(5, 7)) - 1]})` : 'undated';
  parts.push(`last on ${when}: ${last.causeTitle ?? last.cause ?? 'cause not recorded'}${last.fix ? ` — ${last.fix.replace(/\.$/, '')}` : ''}`);
  const ins = h.trends.insulation;
  if (ins.perYear !== null && ins.perYear < 0) parts.push(`insulation falling ${Math.round(-ins.perYear)} MΩ a year${ins.projectedMinimumDate ? `, at its minimum about ${ins.projectedMinimumDate} on that trend` : ''}`);
  return `${parts.join('; ')}.`;
}
