/**
 * The fits as the rule base sees them: per hypothesis its verdict, fitted value, worst residual
 * (a share), whether the value is plausible and whether it explains every reading; and per
 * hypothesis the sentence that carries the numbers. Rules read `{ "fact": "fit", "path":
 * "$.extraResistance.verdict", "operator": "equal", "value": "best" }` and say `{fit:extraResistance}`.
 */
import type { Readings } from '../machine.js';
import type { ModelMachine } from '../families/context.js';
import { fitReadings, type FitVerdict } from './fit.js';
import { describeFits } from './describe.js';
import { HYPOTHESIS_IDS } from './hypotheses.js';
import { circuitFacts, operatingPoints } from './points.js';

export { fitReadings, FIT_INPUTS } from './fit.js';
export { HYPOTHESIS_IDS } from './hypotheses.js';

/** The fields of each hypothesis a rule can read, and the healthy machine's. */
export const FIT_FACT_FIELDS = ['verdict', 'value', 'worstShare', 'plausible', 'explains', 'contradictedBy'] as const;
export const HEALTHY_FIT_FIELDS = ['explains', 'worstShare'] as const;
/** The fields of the circuit fit over the job's operating points (`$.circuit.resistanceRatio`). */
export const CIRCUIT_FIT_FIELDS = ['points', 'resistance', 'resistanceRatio', 'fluxRatio', 'worstResidualShare'] as const;

export interface HypothesisFacts {
  verdict: FitVerdict;
  value?: number | undefined;
  worstShare?: number | undefined;
  plausible: boolean;
  explains: boolean;
  /** The reading that disagrees most, when the verdict is contradicted (`speed`, `fieldCurrent`, …). */
  contradictedBy?: string | undefined;
}

export interface FitFacts {
  fit: Record<string, HypothesisFacts> & {
    healthy?: { explains: boolean; worstShare: number };
    circuit?: { points: number; resistance: number; resistanceRatio: number; fluxRatio: number; worstResidualShare: number };
  };
  fitSays: Record<string, string>;
  /** Hypotheses tied as best, with the readings not yet taken that would tell each pair apart. */
  fitTies: { a: string; b: string; separatedBy: string[] }[];
}

/**
 * Facts for a job; every hypothesis is present ("unfit" where the readings do not allow a fit).
 * `fromChecks`: readings worked checks took at other operating points, for the circuit fit.
 */
export function fitFacts(machine: ModelMachine, readings: Readings, fromChecks: readonly { label: string; readings: Readings }[] = []): FitFacts {
  const report = fitReadings(machine, readings);
  const fit: FitFacts['fit'] = {};
  const circuit = circuitFacts(machine, readings, operatingPoints(readings, fromChecks));
  const circuitSays = circuit ? { circuit: circuit.says } : {};
  if (circuit) fit.circuit = { points: circuit.points, resistance: circuit.resistance, resistanceRatio: circuit.resistanceRatio, fluxRatio: circuit.fluxRatio, worstResidualShare: circuit.worstResidualShare };
  if (!report) {
    for (const id of HYPOTHESIS_IDS) fit[id] = { verdict: 'unfit', plausible: false, explains: false };
    return { fit, fitSays: circuitSays, fitTies: [] };
  }
  for (const h of report.hypotheses) {
    // Every key written, in one order (a value that is not there is undefined, as a rule reads it).
    fit[h.id] = {
      verdict: h.verdict,
      value: Number.isFinite(h.value) ? h.value : undefined,
      worstShare: Number.isFinite(h.worstShare) ? h.worstShare : undefined,
      plausible: h.plausible,
      explains: h.explains,
      contradictedBy: h.contradictedBy,
    };
  }
  fit.healthy = { explains: report.healthy.explains, worstShare: Math.max(0, ...report.healthy.residuals.map((r) => Math.abs(r.share))) };
  return { fit, fitSays: { ...describeFits(report), ...circuitSays }, fitTies: report.ties };
}
