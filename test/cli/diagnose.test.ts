import { describe, expect, it } from 'vitest';
import { runCli } from '../support/cli.js';
import { copyOfRules } from '../support/rules.js';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';

const demo = 'cases/2026-10-14-press-feed-field-weak.json';

describe('dctriage diagnose', () => {
  it('prints causes, checks, isolation and quantities as JSON', () => {
    const r = runCli(['diagnose', demo, '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(Object.keys(j)).toEqual(['format', 'status', 'confirmed', 'next', 'warnings', 'causes', 'checks', 'withheld', 'tellApart', 'isolation', 'quantities', 'analyses']);
    expect(j.format).toBe('dctriage-diagnosis/1');
    expect(j.causes[0]).toMatchObject({ id: 'field-weak', title: 'Field weak' });
    expect(j.causes[0].evidence).toContainEqual({ rule: expect.any(String), says: expect.stringContaining('field current') });
    for (const c of j.checks) expect(['observe', 'live-test', 'isolated']).toContain(c.state);
    // The recorded job worked the field continuity check and found the rheostat burnt: the loop is closed.
    expect(j).toMatchObject({ status: 'confirmed', confirmed: 'field-weak', next: null });
    expect(j.checks[0]).toMatchObject({ id: 'iso-field-continuity', result: 'abnormal' });
    expect(j.quantities.speed.measured).toBe(2010);
  });

  it('stops on a bad rule file with the file and the rule named, exit 2', () => {
    const dir = copyOfRules();
    writeFileSync(join(dir, 'broken.json'), JSON.stringify({ family: 'x', rules: [{ name: 'odd', kind: 'evidence', cause: 'field-weak', weight: 0.5, conditions: { all: [{ fact: 'colour', operator: 'is', value: 'red' }] } }] }));
    const r = runCli(['diagnose', demo, '--rules', dir]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain(`${join(dir, 'broken.json')}: at rules[0] (odd).conditions.all[0].fact: unknown fact "colour"`);
  });

  it('refuses a case whose confirmed cause is not in the catalogue', () => {
    const dir = copyOfRules();
    const file = join(dir, '..', 'odd-case.json');
    writeFileSync(file, JSON.stringify({ format: 'dc-case/1', machine: { connection: 'shunt' }, outcome: { cause: 'gremlins' } }));
    const r = runCli(['diagnose', file]);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('outcome.cause: "gremlins" is not a cause of the catalogue in use');
  });
});

describe('dctriage cases check', () => {
  it('reports top-1 and top-3 over the recorded cases as JSON', () => {
    const r = runCli(['cases', 'check', 'cases', '--json']);
    const j = JSON.parse(r.stdout);
    expect(j.total).toBeGreaterThan(0);
    expect(j.cases[0]).toEqual({ id: expect.any(String), file: expect.any(String), expected: expect.any(String), rank: expect.any(Number), ranked: expect.any(Array) });
    expect(r.code).toBe(j.cases.some((c: { rank: number }) => c.rank === 0 || c.rank > 3) ? 1 : 0);
  });
});

describe('dctriage with no terminal', () => {
  it('says the dialogue needs a terminal and points to diagnose, exit 2', () => {
    const r = runCli([]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain('the dialogue needs a terminal');
    expect(r.stderr).toContain('dctriage diagnose FILE');
  });
});

describe('dctriage diagnose --adaptive', () => {
  it('lists the questions the dialogue would have asked', () => {
    const r = runCli(['diagnose', demo, '--adaptive', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j.questionsAsked.slice(0, 2)).toEqual(['present-state', 'drive-fault']);
    expect(j.causes.slice(0, 3).map((c: { id: string }) => c.id)).toContain('field-weak');
  });
});
