import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/knowledge/load-case.js';
import { diagnose } from '../../src/engine/diagnose.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { CONNECTIONS } from '../../src/model/machine.js';
import { DRIVES, observationValues } from '../../src/knowledge/vocabulary.js';
import type { CaseFile } from '../../src/knowledge/case-schema.js';
import { builtInRules, CASES_DIR, diagnoseJob } from '../support/rules.js';
import { assertSafe } from '../support/safety.js';

const base = builtInRules();
const engine = buildEngine(base);
const five = base.safety.isolation.steps;
const recorded: [string, CaseFile][] = readdirSync(CASES_DIR)
  .filter((f) => f.endsWith('.json'))
  .sort()
  .map((name) => {
    const c = loadCase(join(CASES_DIR, name));
    if (!c.ok) throw new Error(name);
    return [name, c.value];
  });

describe('the isolation sequence', () => {
  it("keeps EN 50110-1's five safety rules in their order (clause 6.2)", () => {
    expect(base.safety.isolation.source).toContain('EN 50110-1, clause 6.2');
    expect(five.map((s) => s.id)).toEqual(['disconnect', 'secure', 'verify', 'earth', 'protect']);
    const seq = base.safety.isolation.sequence.filter((id) => five.some((s) => s.id === id));
    expect(seq).toEqual(['disconnect', 'secure', 'verify', 'earth', 'protect']);
    const keyTerms = ['Disconnect completely', 'Secure against reconnection', 'Verify the absence of voltage', 'Earth and short-circuit', 'Protect against adjacent live parts'];
    five.forEach((s, k) => expect(s.says.startsWith(keyTerms[k]!)).toBe(true));
  });

  it('names the US equivalents, with the tester proved before and after, and says local rules prevail', () => {
    const iso = base.safety.isolation;
    expect(iso.usEquivalent).toMatch(/NFPA 70E/);
    expect(iso.usEquivalent).toMatch(/release stored electrical and mechanical energy/);
    expect(iso.usEquivalent).toMatch(/1910\.333\(b\)\(2\)/);
    expect(iso.usEquivalent).toMatch(/before and after/);
    expect(iso.prevails).toMatch(/Local regulations, site procedures and licensed practice prevail/);
  });

  it('lists the return to service with the field proved before the armature is energised', () => {
    const ids = base.safety.returnToService.map((s) => s.id);
    expect(ids).toEqual(['remove-earths', 'locks-accounted', 'guards-on', 'field-first', 'series-coupled', 'readings-after']);
    expect(base.safety.returnToService.find((s) => s.id === 'field-first')!.says).toMatch(/field before energising the armature/);
  });

  it('keeps a winding earthed for four times the test duration after an insulation test (IEEE 43-2013, from memory)', () => {
    expect(base.safety.hazards.find((h) => h.id === 'ir-test-charge')!.says).toMatch(/four times the test's duration/);
    expect(base.checks.find((c) => c.id === 'iso-insulation-test')!.how).toMatch(/four times the test duration/);
  });

  it('names DC arc flash, battery supplies, approach boundaries and the stroboscope (NFPA 70E 130.4, 130.5)', () => {
    const hazard = (id: string) => base.safety.hazards.find((h) => h.id === id)?.says ?? '';
    expect(hazard('arc-flash')).toMatch(/NFPA 70E/);
    expect(hazard('battery')).toMatch(/hydrogen/);
    expect(hazard('live-dc')).toMatch(/approach boundaries/);
    expect(hazard('stroboscope')).toMatch(/look still/);
    expect(base.checks.find((c) => c.id === 'obs-commutator-running')!.hazards).toContain('stroboscope');
  });

  it('retires the running field-coil drop check for the isolated AC pole-drop test, and never reuses its id', () => {
    expect(base.checks.some((c) => c.id === 'live-field-coil-drops')).toBe(false);
    expect(base.retiredChecks?.find((r) => r.id === 'live-field-coil-drops')?.replacedBy).toBe('iso-pole-drop');
    const pd = base.checks.find((c) => c.id === 'iso-pole-drop')!;
    expect(pd.state).toBe('isolated');
    expect(pd.how).toMatch(/AC/);
  });
});

describe('safety properties over every recorded case', () => {
  for (const [name, job] of recorded) {
    it(`${name}: no unsafe check, stored energy before proving dead, warnings first`, async () => {
      assertSafe(await diagnose(job, base, engine), job, name);
    });
  }
});

describe('safety properties over generated variants of the recorded cases', () => {
  const answer = (name: Parameters<typeof observationValues>[0]) => fc.constantFrom(...observationValues(name));
  it('hold for any connection, drive, load kind and coupling (fast-check, fixed seed)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom(...recorded),
        fc.constantFrom(...CONNECTIONS),
        fc.constantFrom(...DRIVES),
        answer('load-kind'),
        answer('load-coupled'),
        answer('load-landed'),
        answer('present-state'),
        async ([name, job], connection, drive, loadKind, coupled, landed, presentState) => {
          const observations = { ...job.observations, 'load-kind': loadKind, 'load-coupled': coupled, 'load-landed': landed, 'present-state': presentState } as CaseFile['observations'];
          const variant: CaseFile = { ...job, machine: { ...job.machine, connection, drive }, observations };
          assertSafe(await diagnose(variant, base, engine), variant, `${name} variant`);
        },
      ),
      { seed: 20261202, numRuns: 400 },
    );
  });
});

describe('each correction, on a job of its own', () => {
  it('never tells a series machine to run uncoupled, and offers the coupled-load current instead', async () => {
    const d = await diagnoseJob({
      machine: { connection: 'series', drive: 'fixed-supply', nameplate: { armatureVoltage: 230, armatureCurrent: 60, speed: 900 } },
      symptoms: ['speed-low', 'low-torque', 'noise-vibration'],
      observations: { 'load-coupled': 'yes', 'bearing-noise': 'yes' },
    });
    expect(d.checks.map((c) => c.id)).not.toContain('live-no-load-current');
    expect(d.withheld.find((w) => w.id === 'live-no-load-current')?.because).toMatch(/series machine must never run uncoupled/);
  });

  it('warns of a runaway at once from the complaint alone, before any live reading, and asks nothing running after it', async () => {
    const d = await diagnoseJob({
      machine: { connection: 'shunt', drive: 'fixed-supply' },
      symptoms: ['overspeed'],
      observations: { 'present-state': 'running' },
    });
    expect(d.warnings.map((w) => w.id)).toContain('overspeed');
    expect(d.checks.filter((c) => c.running)).toEqual([]);
    expect(d.withheld.some((w) => w.id === 'live-field-current')).toBe(true);
  });

  it('bars reversing a hoist with its load up, and asks what the machine drives before it would offer it', async () => {
    const raised = await diagnoseJob({
      machine: { connection: 'compound-cumulative', drive: 'fixed-supply' },
      symptoms: ['will-not-reverse'],
      observations: { 'load-kind': 'hoisting', 'load-landed': 'no' },
    });
    expect(raised.checks.map((c) => c.id)).not.toContain('obs-speed-direction');
    const unknown = await diagnoseJob({ machine: { connection: 'compound-cumulative', drive: 'fixed-supply' }, symptoms: ['will-not-reverse'] });
    expect(unknown.askFirst.has('load-kind')).toBe(true);
    const general = await diagnoseJob({ machine: { connection: 'compound-cumulative', drive: 'fixed-supply' }, symptoms: ['will-not-reverse'], observations: { 'load-kind': 'general' } });
    expect(general.checks.map((c) => c.id)).toContain('obs-speed-direction');
  });

  it('takes reversal physics from the model: reversing the armature supply does reverse a separately excited machine', async () => {
    const d = await diagnoseJob({
      machine: { connection: 'separately-excited', drive: 'fixed-supply' },
      symptoms: ['will-not-reverse'],
      observations: { 'supply-reversed': 'yes' },
    });
    expect(d.causes.map((c) => c.id)).not.toContain('supply-reversal-ineffective');
    expect(d.ruledOut.find((r) => r.id === 'supply-reversal-ineffective')?.because.join(' ')).toMatch(/does reverse this machine/);
    const shunt = await diagnoseJob({ machine: { connection: 'shunt', drive: 'fixed-supply' }, symptoms: ['will-not-reverse'], observations: { 'supply-reversed': 'yes' } });
    expect(shunt.causes[0]!.id).toBe('supply-reversal-ineffective');
  });

  it('gives a battery supply its own isolation and no drive DC link', async () => {
    const d = await diagnoseJob({
      machine: { connection: 'series', drive: 'battery' },
      symptoms: ['trips-earth-fault'],
    });
    expect(d.isolation.steps.some((s) => /battery supply cannot be isolated upstream/.test(s))).toBe(true);
    expect(d.isolation.steps.some((s) => /DC link/.test(s))).toBe(false);
  });
});
