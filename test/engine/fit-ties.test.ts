/**
 * When the readings cannot choose: fitted hypotheses tied as best, the reading that would tell
 * them apart, and how that feeds the question asked next and the value of the checks that take
 * that reading. The job is generated from the machine equations (a separately excited motor on a
 * fixed supply with about four times its own resistance added to the armature circuit), with the
 * field current not read.
 */
import { describe, expect, it } from 'vitest';
import { diagnose } from '../../src/engine/diagnose.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { checkValue, separationValue } from '../../src/engine/loop.js';
import { hypothesisCauses, outcomeLikelihoods } from '../../src/engine/fit-ties.js';
import { DESIGNS, machineOf, steadyState } from '../../src/model/fits/generate.js';
import { rankQuestions } from '../../src/dialogue/policy.js';
import { buildFlow } from '../../src/dialogue/flow.js';
import { builtInRules } from '../support/rules.js';

const base = builtInRules();
const engine = buildEngine(base);
const design = DESIGNS.find((d) => d.connection === 'separately-excited' && d.drive === 'fixed-supply')!;
const exact = steadyState(design, { cause: 'armature-circuit-high-resistance', size: 4 }, { load: 0.8, speedRef: 1 })!;
const { fieldCurrent: _notRead, ...readings } = exact;
const job = { machine: { ...machineOf(design), magnetization: undefined }, readings };

describe('tied fits feed the next question and the next check', () => {
  it('reads from the rule files which causes each hypothesis speaks for', () => {
    const causes = hypothesisCauses(base);
    expect(causes.get('extraResistance')).toEqual(expect.arrayContaining(['armature-circuit-high-resistance', 'brush-wear-or-pressure']));
    expect(causes.get('strongField')).toContain('field-overvoltage');
  });

  it('names the field current as the reading that tells the tied causes apart', async () => {
    const d = await diagnose(job, base, engine);
    const byField = d.tellApart.find((s) => s.reading === 'fieldCurrent');
    expect(byField).toBeDefined();
    const hypotheses = byField!.between.map((h) => h.hypothesis);
    expect(hypotheses).toContain('extraResistance');
    expect(hypotheses.length).toBeGreaterThanOrEqual(2);
    // Every cause named is still in play, and each under one hypothesis only.
    const named = byField!.between.flatMap((h) => h.causes);
    expect(new Set(named).size).toBe(named.length);
    for (const c of named) expect(d.causes.some((x) => x.id === c)).toBe(true);
  });

  it('asks for the field current first among the readings, and gains more by it than the rules alone would say', async () => {
    const d = await diagnose(job, base, engine);
    const flow = buildFlow(base);
    const ranked = rankQuestions(flow.policy, d, (q) => q.target.section === 'readings' && (job.readings as Record<string, unknown>)[q.target.name] === undefined);
    expect(ranked[0]?.question.id).toBe('field-current');
    const without = rankQuestions(flow.policy, { ...d, tellApart: [] }, (q) => q.id === 'field-current');
    expect(ranked[0]!.gain).toBeGreaterThan(without[0]!.gain);
  });

  it('a check that takes the field current is worth something for telling them apart, even with none of the tied causes listed for it', async () => {
    const d = await diagnose(job, base, engine);
    const check = base.checks.find((c) => c.id === 'live-field-current')!;
    const inPlay = new Map(d.causes.map((c) => [c.id, c.score]));
    const split = d.tellApart.find((s) => s.reading === 'fieldCurrent')!;
    expect(checkValue(check, [], inPlay)).toBe(0);
    expect(separationValue(check, outcomeLikelihoods(split, inPlay.keys()), inPlay)).toBeGreaterThan(0);
  });

  it('values the separating reading more the closer the tie', () => {
    const check = base.checks.find((c) => c.id === 'live-field-current')!;
    const split = { reading: 'fieldCurrent', between: [{ hypothesis: 'strongField', causes: ['field-overvoltage'] }, { hypothesis: 'extraResistance', causes: ['armature-circuit-high-resistance'] }] };
    const close = new Map([['field-overvoltage', 0.85], ['armature-circuit-high-resistance', 0.85], ['overload', 0.2]]);
    const apart = new Map([['field-overvoltage', 0.2], ['armature-circuit-high-resistance', 0.85], ['overload', 0.2]]);
    expect(separationValue(check, outcomeLikelihoods(split, close.keys()), close)).toBeGreaterThan(separationValue(check, outcomeLikelihoods(split, apart.keys()), apart));
  });

  it('with the field current read the tie is gone and the resistance fault leads', async () => {
    const d = await diagnose({ ...job, readings: { ...readings, fieldCurrent: exact.fieldCurrent } }, base, engine);
    expect(d.tellApart.filter((s) => s.reading === 'fieldCurrent')).toEqual([]);
    expect(d.causes[0]?.id).toBe('armature-circuit-high-resistance');
  });
});
