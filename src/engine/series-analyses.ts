/**
 * The job's test series through their analysers (src/model/series/), and what the rules see of
 * them: a list of finding codes (`testFindings`) and sentences the rules' `says` can quote as
 * {tests:barToBar}, {tests:poleDrop}, {tests:runout}, {tests:insulation}.
 */
import type { CaseFile } from '../knowledge/case-schema.js';
import { computeExpectations } from '../model/expected.js';
import { insulationMinimum, polarizationIndexMinimum } from '../model/insulation.js';
import { analyseBarToBar, type BarToBarAnalysis } from '../model/series/bar-to-bar.js';
import { analyseInsulationCurve, INSULATION_SYSTEMS, type InsulationCurveAnalysis, type InsulationSystem } from '../model/series/insulation-curve.js';
import { analysePoleDrop, type PoleDropAnalysis } from '../model/series/pole-drop.js';
import { analyseRunout, RUNOUT_SHAPE_WORDS, type RunoutAnalysis } from '../model/series/runout.js';
import { parseQuantity } from '../units/quantity.js';
import type { TestFinding } from '../model/series/findings.js';

export interface Analyses {
  barToBar?: Omit<BarToBarAnalysis, 'ratios' | 'median'> & { unit: string };
  poleDrop?: Omit<PoleDropAnalysis, 'ratios' | 'median'> & { supply: 'ac' | 'dc'; winding: string };
  runout?: RunoutAnalysis & { unit: string; limit: number; withinLimit: boolean; limitSource: string };
  insulation?: InsulationCurveAnalysis & { insulationSystem: InsulationSystem; minimumAt40C: number; polarizationIndexMinimum: number };
}

export type SeriesJob = Pick<CaseFile, 'machine' | 'tests'>;

/** The machine's insulation system; the field comes with the machine model's insulation work, thermosetting when absent. */
export function insulationSystemOf(machine: CaseFile['machine']): InsulationSystem {
  const given: unknown = 'insulationSystem' in machine ? machine.insulationSystem : undefined;
  return INSULATION_SYSTEMS.find((s) => s === given) ?? 'thermosetting';
}

export function analyseTests(job: SeriesJob): Analyses {
  const t = job.tests;
  if (!t) return {};
  const out: Analyses = {};
  if (t.barToBar) {
    const { ratios: _r, median: _m, ...a } = analyseBarToBar(t.barToBar);
    out.barToBar = { ...a, unit: t.barToBar.unit };
  }
  if (t.poleDrop) {
    const { ratios: _r, median: _m, ...a } = analysePoleDrop(t.poleDrop);
    out.poleDrop = { ...a, supply: t.poleDrop.supply, winding: t.poleDrop.winding };
  }
  if (t.runout) {
    const perUnit = parseQuantity(`1 ${t.runout.unit}`, 'length');
    const mmPerUnit = perUnit.ok ? perUnit.value : 1;
    const values = t.runout.values;
    const tirMm = (Math.max(...values) - Math.min(...values)) * mmPerUnit;
    // The limit the model already judges a runout reading by, with its source.
    const q = computeExpectations({ machine: job.machine, readings: { commutatorRunout: tirMm } }).quantities.commutatorRunout;
    const limitMm = q?.value ?? 0.05;
    const limit = Number((limitMm / mmPerUnit).toPrecision(6));
    const a = analyseRunout(t.runout, limit);
    out.runout = { ...a, unit: t.runout.unit, limit, withinLimit: a.tir <= limit, limitSource: q?.formula ?? 'runout limit (common practice)' };
  }
  if (t.insulation) {
    const system = insulationSystemOf(job.machine);
    const np = job.machine.nameplate ?? {};
    const armature = np.armatureVoltage ?? 1000;
    const field = np.fieldVoltage ?? np.armatureVoltage ?? 1000;
    out.insulation = {
      ...analyseInsulationCurve(t.insulation, system),
      insulationSystem: system,
      minimumAt40C: insulationMinimum(t.insulation.winding, { armature, field }),
      polarizationIndexMinimum: polarizationIndexMinimum(np.insulationClass ?? 'B'),
    };
  }
  return out;
}

export interface SeriesFacts {
  testFindings: TestFinding[];
  testWords: Record<string, string>;
}

export function seriesFacts(a: Analyses): SeriesFacts {
  const codes: TestFinding[] = [];
  const words: Record<string, string> = {};
  if (a.barToBar) {
    const kinds = new Set(a.barToBar.suspects.map((s) => s.kind));
    if (kinds.size === 0 && a.barToBar.usable) codes.push('bar-to-bar-even');
    for (const k of kinds) codes.push(`bar-to-bar-${k}`);
    words.barToBar = a.barToBar.pattern;
  }
  if (a.poleDrop) {
    const p = a.poleDrop;
    codes.push(`pole-drop-${p.winding}` as TestFinding, `pole-drop-${p.supply}`);
    if (p.suspects.length === 0 && p.usable) codes.push('pole-drop-even');
    if (p.suspects.some((s) => s.kind === 'shorted-turns')) codes.push('pole-drop-shorted-turns');
    if (p.suspects.some((s) => s.kind === 'shorted')) codes.push('pole-drop-coil-shorted');
    if (p.suspects.some((s) => s.kind === 'open')) codes.push('pole-drop-coil-open');
    words.poleDrop = p.suspects.length
      ? p.suspects.map((s) => `coil ${s.coil} ${s.kind.replace('-', ' ')} (${percent(s.deviation)} against the median)`).join(', ')
      : 'every coil within 8 % of the median';
  }
  if (a.runout) {
    const r = a.runout;
    codes.push(r.withinLimit ? 'runout-within-limit' : 'runout-over-limit');
    if (r.barStep) codes.push('runout-bar-step');
    words.runout = `TIR ${r.tir} ${r.unit} against ${r.limit} ${r.unit}, ${RUNOUT_SHAPE_WORDS[r.shape]}${r.barStep ? `, a step of ${r.maxStep} ${r.unit} between readings ${r.maxStepAt.join(' and ')}` : ''}`;
  }
  if (a.insulation) {
    const c = a.insulation;
    if (c.shape === 'rising') codes.push('insulation-curve-rising');
    if (c.shape === 'flattens-early') codes.push('insulation-curve-flattens');
    if (c.shape === 'falls') codes.push('insulation-curve-falls');
    if (c.oneMinuteAt40C !== null && c.oneMinuteAt40C < c.minimumAt40C) codes.push('insulation-below-minimum');
    if (c.polarizationIndex !== null && c.polarizationIndexMeaningful && c.polarizationIndex < c.polarizationIndexMinimum) codes.push('insulation-pi-low');
    words.insulation = [
      c.oneMinuteAt40C !== null ? `${c.oneMinuteAt40C} MΩ at 1 min (40 °C; minimum ${c.minimumAt40C})` : undefined,
      c.polarizationIndex !== null ? `PI ${c.polarizationIndex}` : undefined,
      `the curve ${c.says}`,
    ]
      .filter(Boolean)
      .join(', ');
  }
  return { testFindings: codes, testWords: words };
}

const percent = (d: number) => `${d >= 0 ? '+' : ''}${Math.round(d * 100)} %`;
