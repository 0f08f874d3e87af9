import { readFileSync, renameSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadRuleBase } from '../../src/knowledge/load-rules.js';
import { builtInRules, copyOfRules, diagnoseJob } from '../support/rules.js';

describe('the built-in rule base', () => {
  const base = builtInRules();

  it('validates, with every cause reachable by a rule that speaks for it and owning a check', () => {
    for (const cause of base.causes) {
      const supporting = base.rules.filter(({ rule }) => rule.kind === 'evidence' && rule.cause === cause.id && rule.weight > 0);
      expect(supporting.length, cause.id).toBeGreaterThan(0);
      expect(cause.checks.length, cause.id).toBeGreaterThan(0);
    }
  });

  it('gives every check a machine state and its hazards', () => {
    for (const check of base.checks) {
      expect(['observe', 'live-test', 'isolated']).toContain(check.state);
      if (check.state !== 'observe') expect(check.hazards.length + (check.state === 'isolated' ? 1 : 0), check.id).toBeGreaterThan(0);
    }
  });

  it('catalogues the causes the trade needs, ids exactly as published in the case contract', () => {
    expect(base.causes.map((c) => c.id)).toEqual(expect.arrayContaining([
      'field-circuit-open', 'field-weak', 'series-motor-unloaded', 'differential-compound', 'speed-feedback-lost',
      'supply-reversal-ineffective', 'pm-supply-polarity', 'winding-ground-fault', 'converter-thyristor-fault', 'series-field-shorted',
    ]));
    expect(base.causes.length).toBeGreaterThanOrEqual(33);
  });
});

describe('forward chaining', () => {
  const job = {
    machine: { connection: 'shunt' as const, nameplate: { armatureVoltage: 220, armatureCurrent: 24, speed: 1500, power: 4500, fieldVoltage: 220, fieldCurrent: 0.8 }, resistances: { armature: 0.55, shuntField: 260 } },
    symptoms: ['overspeed' as const],
    readings: { armatureVoltage: 221, armatureCurrent: 9.5, fieldCurrent: 0.42, speed: 2010 },
  };

  it('lets a rule build on a derived fact whatever order the files load in', async () => {
    const dir = copyOfRules();
    // Rename so the file holding the derivations loads last instead of in the middle.
    renameSync(join(dir, 'deviations.json'), join(dir, 'zz-deviations.json'));
    renameSync(join(dir, 'field.json'), join(dir, 'aa-field.json'));
    const reordered = loadRuleBase(dir);
    expect(reordered.ok).toBe(true);
    if (!reordered.ok) return;
    const a = await diagnoseJob(job);
    const b = await diagnoseJob(job, reordered.value);
    expect(a.causes[0]?.id).toBe('field-weak');
    expect(b.causes).toEqual(a.causes);
    // The evidence came through a derived fact (field-current-low), not a direct reading.
    expect(b.facts['field-current-low']).toBe(true);
  });

  it('reports a cycle among derived facts instead of looping on it', () => {
    const dir = copyOfRules();
    writeFileSync(join(dir, 'loop.json'), JSON.stringify({
      family: 'loop',
      rules: [
        { name: 'egg', kind: 'derive', derive: 'egg-fact', conditions: { all: [{ fact: 'hen-fact', operator: 'equal', value: true }] } },
        { name: 'hen', kind: 'derive', derive: 'hen-fact', conditions: { all: [{ fact: 'egg-fact', operator: 'equal', value: true }] } },
      ],
    }));
    const r = loadRuleBase(dir);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues[0]).toMatchObject({ code: 'cycle', file: join(dir, 'loop.json') });
    expect(r.issues[0]?.message).toMatch(/egg-fact → hen-fact → egg-fact|hen-fact → egg-fact → hen-fact/);
  });

  it('names the file, the rule and the field of a bad rule', () => {
    const dir = copyOfRules();
    const file = join(dir, 'field.json');
    const data = JSON.parse(readFileSync(file, 'utf8'));
    data.rules[1].cause = 'no-such-cause';
    writeFileSync(file, JSON.stringify(data));
    const r = loadRuleBase(dir);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues).toContainEqual(expect.objectContaining({ file, path: `rules[1] (${data.rules[1].name}).cause` }));
  });
});
