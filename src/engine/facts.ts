/**
 * The facts of one job as the rules see them: machine kind, symptoms, observations (unknown
 * answers left out), findings, and the model's quantities as three maps (value, measured,
 * ratio), all plain numbers in the units the model declares.
 */
import type { CaseFile } from '../knowledge/case-schema.js';
import { CONNECTION_TRAITS } from '../model/machine.js';
import type { Expectation } from '../model/expected.js';
import { afterSwap } from '../model/reversal.js';
import { analyseTests, seriesFacts, type Analyses } from './series-analyses.js';
import { fitFacts } from '../model/fits/index.js';

export type Facts = Record<string, unknown>;

export function jobFacts(
  c: Pick<CaseFile, 'machine' | 'symptoms' | 'observations' | 'tests'> & { readings?: CaseFile['readings'] },
  e: Expectation,
  analyses: Analyses = analyseTests(c),
  /** Readings taken at other operating points (before the worked checks, and by them), for the circuit fit. */
  otherPoints: readonly { label: string; readings: NonNullable<CaseFile['readings']> }[] = [],
): Facts {
  const traits = CONNECTION_TRAITS[c.machine.connection];
  const facts: Facts = {
    connection: c.machine.connection,
    drive: c.machine.drive ?? 'unknown',
    feedback: c.machine.feedback ?? 'unknown',
    cooling: c.machine.cooling ?? 'unknown',
    hasShuntField: traits.shuntField,
    hasSeriesField: traits.seriesField,
    symptoms: c.symptoms ?? [],
    findings: e.findings.map((f) => f.code),
    value: {},
    measured: {},
    ratio: {},
    // Which swaps reverse this machine: the reversal model is the one source of that physics.
    swapReverses: {
      supply: afterSwap(c.machine.connection, 'supply').reversed,
      armature: afterSwap(c.machine.connection, 'armature').reversed,
      shuntField: afterSwap(c.machine.connection, 'shunt-field').reversed,
      seriesField: afterSwap(c.machine.connection, 'series-field').reversed,
      bothFields: afterSwap(c.machine.connection, 'both-fields').reversed,
    },
    // Test series: finding codes for the rules, sentences for their `says` ({tests:barToBar}).
    ...seriesFacts(analyses),
    // Each fault hypothesis fitted to the readings (src/model/fits): its verdict, value and words.
    ...fitFacts(c.machine, c.readings ?? {}, otherPoints),
  };
  for (const [name, q] of Object.entries(e.quantities)) {
    (facts.value as Record<string, number>)[name] = q.value;
    if (q.measured !== null) (facts.measured as Record<string, number>)[name] = q.measured;
    if (q.ratio !== null) (facts.ratio as Record<string, number>)[name] = q.ratio;
  }
  for (const [name, answer] of Object.entries(c.observations ?? {})) {
    if (answer !== undefined && answer !== 'unknown') facts[name] = answer;
  }
  return facts;
}
