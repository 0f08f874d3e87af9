import { describe, expect, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadRuleBase } from '../../src/knowledge/load-rules.js';
import { copyOfRules, diagnoseJob } from '../support/rules.js';

const shunt = { connection: 'shunt' as const, drive: 'fixed-supply' as const, nameplate: { armatureVoltage: 220, armatureCurrent: 48, speed: 1500, power: 9000, fieldVoltage: 220, fieldCurrent: 0.88 } };
const even = Array.from({ length: 48 }, (_, i) => 1.9 * (1 + 0.02 * Math.sin(i)));

describe('test series in the diagnosis', () => {
  it('raises an open armature coil with its bars named in the evidence', async () => {
    const values = even.map((x, i) => (i === 36 ? 41 : x));
    const d = await diagnoseJob({ machine: shunt, symptoms: ['sparking'], tests: { barToBar: { method: 'voltage-drop', unit: 'mV', winding: 'lap', poles: 4, values } } });
    expect(d.causes[0]?.id).toBe('armature-coil-open');
    expect(d.causes[0]?.evidence.map((e) => e.says).join(' ')).toContain('bars 37 and 38');
    expect(d.analyses.barToBar?.suspects).toEqual([expect.objectContaining({ bars: [37, 38], kind: 'open' })]);
  });

  it('raises a shorted armature coil for a low pair', async () => {
    const values = even.map((x, i) => (i === 10 ? 0.9 : x));
    const d = await diagnoseJob({ machine: shunt, symptoms: ['sparking'], tests: { barToBar: { method: 'voltage-drop', unit: 'mV', winding: 'lap', values } } });
    expect(d.causes[0]?.id).toBe('armature-coil-shorted');
  });

  it('lowers the armature coil causes when the series is even', async () => {
    const job = { machine: shunt, symptoms: ['sparking' as const], observations: { 'sparking-where': 'one-spot-on-commutator' as const } };
    const without = await diagnoseJob(job);
    const withEven = await diagnoseJob({ ...job, tests: { barToBar: { method: 'voltage-drop', unit: 'mV', winding: 'lap', values: even } } });
    const score = (d: typeof without, id: string) => d.causes.find((c) => c.id === id)?.score ?? 0;
    expect(score(withEven, 'armature-coil-open')).toBeLessThan(score(without, 'armature-coil-open'));
    expect(withEven.analyses.barToBar?.suspects).toEqual([]);
  });

  it('raises shorted field turns from an AC pole drop', async () => {
    const d = await diagnoseJob({ machine: shunt, tests: { poleDrop: { supply: 'ac', winding: 'shunt-field', values: [60, 61, 38, 60.5] } } });
    expect(d.causes[0]?.id).toBe('field-shorted-turns');
    expect(d.causes[0]?.evidence[0]?.says).toContain('coil 3 shorted turns');
  });

  it('judges runout against the limit the model uses', async () => {
    const values = Array.from({ length: 24 }, (_, i) => 0.05 * Math.cos((2 * Math.PI * i) / 24));
    const d = await diagnoseJob({ machine: shunt, symptoms: ['sparking'], tests: { runout: { unit: 'mm', values } } });
    expect(d.analyses.runout).toEqual(expect.objectContaining({ shape: 'eccentric', withinLimit: false, limit: 0.05 }));
    expect(d.causes[0]?.id).toBe('commutator-surface');
  });

  it('refuses a rule that tests an unknown test finding', () => {
    const dir = copyOfRules();
    writeFileSync(join(dir, 'extra.json'), JSON.stringify({ family: 'x', rules: [{ name: 'x1', kind: 'evidence', cause: 'armature-coil-open', weight: 0.5, conditions: { all: [{ fact: 'testFindings', operator: 'contains', value: 'bar-to-bar-wobbly' }] } }] }));
    const r = loadRuleBase(dir);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]?.message).toContain('"bar-to-bar-wobbly" is not a test finding');
  });
});

describe('series that say more about the test than the machine', () => {
  it('do not count against any cause', async () => {
    const d = await diagnoseJob({ machine: shunt, symptoms: ['sparking'], tests: { barToBar: { method: 'voltage-drop', unit: 'mV', winding: 'lap', values: [0, 0, 0, 1.9, 0] }, poleDrop: { supply: 'dc', winding: 'shunt-field', values: [0, 0, 0, 0] } } });
    expect(d.facts.testFindings).toEqual(['pole-drop-shunt-field', 'pole-drop-dc']);
  });
});
