import { describe, expect, it } from 'vitest';
import { afterSwap } from '../../src/model/reversal.js';
import { formatDiagnosis } from '../../src/shell/format-diagnosis.js';
import { diagnoseJob, topIds } from '../support/rules.js';

const shunt = { connection: 'shunt' as const, drive: 'fixed-supply' as const, nameplate: { armatureVoltage: 220, armatureCurrent: 30, speed: 1450, power: 5500, fieldVoltage: 220, fieldCurrent: 0.9 } };

describe('reversal rules agree with the physics', () => {
  it('a wound-field machine whose supply was reversed does not reverse', async () => {
    expect(afterSwap('shunt', 'supply').reversed).toBe(false);
    const d = await diagnoseJob({ machine: shunt, symptoms: ['will-not-reverse'], observations: { 'supply-reversed': 'yes', 'recent-work': 'rewired' } });
    expect(d.causes[0]?.id).toBe('supply-reversal-ineffective');
  });

  it('swapping the armature leads alone reverses it', async () => {
    expect(afterSwap('shunt', 'armature').reversed).toBe(true);
    const d = await diagnoseJob({ machine: shunt, symptoms: ['reversed-rotation'], observations: { 'recent-work': 'rewired', 'leads-disturbed': 'armature' } });
    expect(d.causes[0]?.id).toBe('armature-leads-reversed');
  });

  it('swapping the field leads alone reverses it', async () => {
    expect(afterSwap('series', 'series-field').reversed).toBe(true);
    const d = await diagnoseJob({ machine: { connection: 'series' }, symptoms: ['reversed-rotation'], observations: { 'recent-work': 'rewired', 'leads-disturbed': 'series-field' } });
    expect(d.causes[0]?.id).toBe('field-leads-reversed');
  });

  it('a permanent-magnet machine reverses with its supply polarity, and has no field leads to blame', async () => {
    expect(afterSwap('permanent-magnet', 'supply').reversed).toBe(true);
    const d = await diagnoseJob({ machine: { connection: 'permanent-magnet' }, symptoms: ['reversed-rotation'], observations: { 'supply-reversed': 'yes' } });
    expect(d.causes[0]?.id).toBe('pm-supply-polarity');
    expect(d.ruledOut.map((r) => r.id)).toContain('field-leads-reversed');
  });

  it('a compound machine reversed at the armature stays cumulative; one swapped field makes it differential', async () => {
    expect(afterSwap('compound-cumulative', 'armature').cumulative).toBe(true);
    const atArmature = await diagnoseJob({ machine: { connection: 'compound-cumulative' }, symptoms: ['reversed-rotation'], observations: { 'leads-disturbed': 'armature', 'recent-work': 'rewired', 'speed-with-load': 'falls-slightly' } });
    expect(atArmature.causes[0]?.id).toBe('armature-leads-reversed');
    expect(topIds(atArmature, 10)).not.toContain('differential-compound');
    expect(afterSwap('compound-cumulative', 'series-field').cumulative).toBe(false);
    const seriesSwapped = await diagnoseJob({ machine: { connection: 'compound-cumulative' }, symptoms: ['speed-unstable'], observations: { 'leads-disturbed': 'series-field', 'recent-work': 'rewired', 'speed-with-load': 'rises' } });
    expect(seriesSwapped.causes[0]?.id).toBe('differential-compound');
  });

  it('asks which terminations were re-made only when work may have been done', async () => {
    const asked = async (work?: string) => (await diagnoseJob({ machine: shunt, symptoms: ['reversed-rotation'], observations: work ? { 'recent-work': work } : {} })).askable.has('leads-disturbed');
    expect(await asked('none')).toBe(false);
    expect(await asked('rewired')).toBe(true);
    expect(await asked('brushes-replaced')).toBe(true);
    expect(await asked()).toBe(true);
  });

  it('on tacho feedback a lead swap without re-polarising the feedback runs away instead of reversing', async () => {
    const d = await diagnoseJob({
      machine: { ...shunt, drive: 'controlled-converter', feedback: 'tacho' },
      symptoms: ['overspeed'],
      observations: { 'present-state': 'tripped', 'drive-fault-kind': 'overspeed', 'recent-work': 'rewired', 'leads-disturbed': 'armature' },
    });
    expect(d.causes[0]?.id).toBe('armature-leads-reversed');
    expect(d.warnings.map((w) => w.id)).toContain('feedback-lead-swap');
  });
});

describe('warnings come before the causes', () => {
  it('warns of an uncoupled series machine', async () => {
    const d = await diagnoseJob({ machine: { connection: 'series', nameplate: { armatureVoltage: 110, armatureCurrent: 40, speed: 900 } }, symptoms: ['overspeed'], observations: { 'load-coupled': 'no' } });
    expect(d.warnings.map((w) => w.id)).toContain('series-uncoupled');
    expect(d.causes[0]?.id).toBe('series-motor-unloaded');
    const text = formatDiagnosis(d);
    expect(text.indexOf('series motor running without its load')).toBeLessThan(text.indexOf('Likely causes'));
  });

  it('warns of a lost field', async () => {
    const d = await diagnoseJob({ machine: shunt, symptoms: ['overspeed'], readings: { armatureVoltage: 220, armatureCurrent: 6, fieldCurrent: 0.01 } });
    expect(d.warnings.map((w) => w.id)).toContain('field-loss');
    expect(d.causes[0]?.id).toBe('field-circuit-open');
  });

  it('after an earth-fault trip puts the insulation test before any energised check', async () => {
    const d = await diagnoseJob({ machine: shunt, symptoms: ['trips-earth-fault'], observations: { 'present-state': 'tripped', 'drive-fault-kind': 'earth-fault' } });
    expect(d.warnings.map((w) => w.id)).toContain('earth-fault');
    const states = d.checks.map((c) => c.state);
    const insulation = d.checks.findIndex((c) => c.id === 'iso-insulation-test');
    expect(insulation).toBeGreaterThanOrEqual(0);
    expect(states.slice(0, insulation + 1).every((s) => s === 'isolated')).toBe(true);
    expect(d.isolation.beforeCheck).toBe(d.checks[0]?.id);
  });

  it('without a fault trip, observes and tests live before isolating, and isolates once', async () => {
    const d = await diagnoseJob({ machine: shunt, symptoms: ['sparking'], observations: { 'present-state': 'running', 'sparking-where': 'all-brushes', 'sparking-with-load': 'grows-with-load' } });
    const states = d.checks.map((c) => c.state);
    const firstIsolated = states.indexOf('isolated');
    expect(firstIsolated).toBeGreaterThan(0);
    expect(states.slice(firstIsolated).every((s) => s === 'isolated')).toBe(true);
    expect(d.isolation.beforeCheck).toBe(d.checks[firstIsolated]?.id);
  });
});

describe('evidence in the fitter\'s words', () => {
  it('quotes the field current against what a healthy field draws', async () => {
    const d = await diagnoseJob({ machine: shunt, symptoms: ['overspeed'], readings: { armatureVoltage: 220, armatureCurrent: 10, fieldCurrent: 0.45, speed: 1900 } });
    const weak = d.causes.find((c) => c.id === 'field-weak');
    expect(weak?.evidence.map((e) => e.says)).toContain('field current 0.45 A is 50 % of the 0.9 A a healthy field draws at 220 V');
  });
});

describe('armature voltage below the plate', () => {
  // Common practice: a converter sets the armature voltage for the speed it is asked for, so a
  // voltage below the plate says nothing of the supply; on a fixed supply it is the supply.
  const hunting = { symptoms: ['speed-unstable' as const], readings: { armatureVoltage: 190 } };

  it('points at the supply on a fixed supply', async () => {
    const d = await diagnoseJob({ machine: shunt, ...hunting });
    expect(d.causes.find((c) => c.id === 'low-supply-voltage')?.score ?? 0).toBeGreaterThanOrEqual(0.5);
  });

  it('is not evidence of a low supply on a controlled converter', async () => {
    const d = await diagnoseJob({ machine: { ...shunt, drive: 'controlled-converter', feedback: 'tacho' }, ...hunting });
    expect(d.causes.find((c) => c.id === 'low-supply-voltage')?.score ?? 0).toBeLessThan(0.3);
  });
});
