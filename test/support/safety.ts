/** The safety properties every diagnosis holds, whatever the job: shared by the safety and loop tests. */
import { expect } from 'vitest';
import type { Diagnosis } from '../../src/engine/diagnose.js';
import type { CaseFile } from '../../src/knowledge/case-schema.js';
import { formatDiagnosis } from '../../src/shell/format-diagnosis.js';
import { builtInRules } from './rules.js';

const base = builtInRules();
const five = base.safety.isolation.steps;
const says = (id: string) => [...five, ...base.safety.isolation.dcSpecific].find((s) => s.id === id)!.says;

/** The properties every diagnosis holds, whatever the job. */
export function assertSafe(d: Diagnosis, job: CaseFile, label: string) {
  const obs = (job.observations ?? {}) as Record<string, string | undefined>;
  // What is offered is what is still to do: checks already worked are the record.
  const offeredChecks = d.checks.filter((c) => !c.result);
  const offered = new Set(offeredChecks.map((c) => c.id));
  const checkOf = (id: string) => base.checks.find((c) => c.id === id)!;
  const loadKind = obs['load-kind'];
  const context = `${label}: ${job.machine.connection}, ${job.machine.drive ?? 'drive unknown'}, load ${loadKind ?? 'unknown'}, coupled ${obs['load-coupled'] ?? 'unknown'}`;

  // Reversing: never on a series machine, a load that must not run backwards, an unknown load, or a raised hoist load.
  const reverses = offeredChecks.filter((c) => checkOf(c.id).hazards.includes('reversing'));
  const mayReverse = job.machine.connection !== 'series' && (loadKind === 'general' || loadKind === 'bench-test' || (['hoisting', 'incline'].includes(loadKind ?? '') && obs['load-landed'] === 'yes'));
  if (!mayReverse) expect(reverses.map((c) => c.id), context).toEqual([]);
  // Running light: only on a machine already uncoupled (or on the bench), and never a series machine.
  if (offered.has('live-no-load-current')) {
    expect(job.machine.connection, context).not.toBe('series');
    expect(obs['load-coupled'] === 'no' || loadKind === 'bench-test', context).toBe(true);
  }
  // A series machine is loaded in steps only with its load known to be coupled.
  if (offered.has('obs-speed-with-load') && job.machine.connection === 'series') expect(obs['load-coupled'], context).toBe('yes');
  // A machine that may be differentially compounded carries that warning wherever load is brought on.
  const compound = job.machine.connection.startsWith('compound');
  for (const c of offeredChecks) if (compound && c.id === 'obs-speed-with-load') expect(c.hazards, context).toContain('differential-compound');
  // Turning or uncoupling a shaft whose load may be suspended says to land or block it first.
  for (const c of offeredChecks) if (['iso-turn-by-hand', 'iso-coupling'].includes(c.id) && !['general', 'non-reversible', 'bench-test'].includes(loadKind ?? '')) expect(c.hazards, context).toContain('suspended-load');
  // Every live test names its PPE and approach boundaries, and DC arc flash.
  for (const c of offeredChecks) if (c.state === 'live-test') expect(c.hazards, context).toEqual(expect.arrayContaining(['live-dc', 'arc-flash']));

  // After a runaway warning, nothing is offered that needs the machine running.
  const runaway = d.warnings.some((w) => base.safety.warnings.find((x) => x.id === w.id)?.runaway);
  if (runaway) expect(offeredChecks.filter((c) => c.running).map((c) => c.id), context).toEqual([]);
  // Warnings first: the readable output opens with them, dangers before cautions.
  if (d.warnings.length) {
    const text = formatDiagnosis(d, { readings: false });
    expect(text.startsWith(d.warnings[0]!.severity === 'danger' ? '!! ' : '!  CAUTION'), context).toBe(true);
    const severities = d.warnings.map((w) => w.severity);
    expect(severities.lastIndexOf('danger'), context).toBeLessThan(severities.includes('caution') ? severities.indexOf('caution') : Infinity);
  }
  // Isolate once: after the first isolated check, only isolated ones — unless a fault-clearing order puts them first.
  // Checks already worked stand first; the order is of the ones still to do.
  const worked = d.checks.filter((c) => c.result);
  const toDo = d.checks.filter((c) => !c.result);
  const states = toDo.map((c) => c.state);
  const standsIsolated = worked.at(-1)?.state === 'isolated';
  const firstIsolated = toDo.find((c) => c.state === 'isolated');
  expect(d.isolation.beforeCheck, context).toBe(standsIsolated ? null : (firstIsolated?.id ?? null));
  const isolateFirst = d.warnings.some((w) => base.safety.warnings.find((x) => x.id === w.id)?.isolateFirst);
  if ((isolateFirst || standsIsolated) && firstIsolated) expect(states[0] === 'isolated' || (toDo[0]!.state === 'observe' && !toDo[0]!.running), context).toBe(true);
  else if (firstIsolated) expect(states.slice(states.indexOf('isolated')).every((s) => s === 'isolated'), context).toBe(true);

  // The isolation: armature off before the field comes down, stored energy released before verifying and earthing.
  if (d.isolation.beforeCheck) {
    const steps = d.isolation.steps;
    const at = (id: string) => steps.indexOf(says(id));
    expect(five.map((s) => at(s.id)).every((k, j, all) => k >= 0 && (j === 0 || k > all[j - 1]!)), context).toBe(true);
    expect(at('armature-off-first'), context).toBeLessThan(at('disconnect'));
    if (at('field-circuit') >= 0) expect(at('armature-off-first'), context).toBeLessThan(at('field-circuit'));
    for (const stored of ['dc-link', 'field-energy', 'battery-supply']) {
      if (at(stored) < 0) continue;
      expect(at(stored), `${context}: ${stored}`).toBeLessThan(at('verify'));
      expect(at(stored), `${context}: ${stored}`).toBeLessThan(at('earth'));
    }
    expect(at('dc-link') >= 0, context).toBe(job.machine.drive !== 'fixed-supply' && job.machine.drive !== 'battery');
    expect(at('battery-supply') >= 0, context).toBe(job.machine.drive === 'battery');
    expect(at('field-energy') >= 0, context).toBe(job.machine.connection !== 'series' && job.machine.connection !== 'permanent-magnet');
  }
}

