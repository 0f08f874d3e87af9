import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/knowledge/load-case.js';
import { diagnose } from '../../src/engine/diagnose.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { builtInRules, CASES_DIR } from '../support/rules.js';

const base = builtInRules();
const engine = buildEngine(base);

describe('the isolation sequence', () => {
  it("is EN 50110-1's five safety rules, in their order (clause 6.2)", () => {
    const iso = base.safety.isolation;
    expect(iso.source).toContain('EN 50110-1, clause 6.2');
    expect(iso.steps.map((s) => s.id)).toEqual(['disconnect', 'secure', 'verify', 'earth', 'protect']);
    const keyTerms = ['Disconnect completely', 'Secure against reconnection', 'Verify the absence of voltage', 'Earth and short-circuit', 'Protect against adjacent live parts'];
    iso.steps.forEach((s, k) => expect(s.says.startsWith(keyTerms[k]!)).toBe(true));
  });

  it('names the US equivalents, with the tester proved before and after, and says local rules prevail', () => {
    const iso = base.safety.isolation;
    expect(iso.usEquivalent).toMatch(/NFPA 70E/);
    expect(iso.usEquivalent).toMatch(/1910\.333\(b\)\(2\)/);
    expect(iso.usEquivalent).toMatch(/1910\.147/);
    expect(iso.usEquivalent).toMatch(/before and after/);
    expect(iso.prevails).toMatch(/Local regulations, site procedures and licensed practice prevail/);
  });

  it('gives the DC hazards, the shaft and the field before disconnecting and the DC link after', () => {
    const when = Object.fromEntries(base.safety.isolation.dcSpecific.map((s) => [s.id, s.when]));
    expect(when).toEqual({ 'turning-shaft': 'before', 'field-circuit': 'before', 'dc-link': 'after' });
  });

  it('gives the DC hazards: stored charge, a turning shaft generating, never opening a live field', () => {
    const says = base.safety.isolation.dcSpecific.map((s) => s.says).join(' ');
    expect(says).toMatch(/DC link/);
    expect(says).toMatch(/generator/);
    expect(says).toMatch(/field circuit/);
  });

  it('lists the return to service: earths off, locks accounted for, guards on, field before armature, series coupled, readings after', () => {
    expect(base.safety.returnToService.map((s) => s.id)).toEqual(['remove-earths', 'locks-accounted', 'guards-on', 'field-first', 'series-coupled', 'readings-after']);
  });

  it('makes the insulation test carry the disconnect-the-electronics and discharge steps', () => {
    const ir = base.checks.find((c) => c.id === 'iso-insulation-test')!;
    expect(ir.state).toBe('isolated');
    expect(ir.hazards).toEqual(expect.arrayContaining(['disconnect-electronics', 'ir-test-charge']));
    expect(ir.how).toMatch(/disconnect/i);
    expect(ir.how).toMatch(/discharge and earth/);
  });
});

describe('every recorded case', () => {
  for (const name of readdirSync(CASES_DIR).filter((f) => f.endsWith('.json')).sort()) {
    it(`${name}: isolation comes right before the first isolated check, never before a check done running`, async () => {
      const c = loadCase(join(CASES_DIR, name));
      if (!c.ok) throw new Error(name);
      const d = await diagnose(c.value, base, engine);
      const firstIsolated = d.checks.find((x) => x.state === 'isolated');
      expect(d.isolation.beforeCheck).toBe(firstIsolated?.id ?? null);
      if (firstIsolated) {
        // Shaft and field made safe first, then the five rules in their order, then the drive's DC link.
        const five = base.safety.isolation.steps.map((s) => s.says);
        const at = d.isolation.steps.indexOf(five[0]!);
        expect(d.isolation.steps.slice(at, at + 5)).toEqual(five);
        expect(d.isolation.steps.slice(0, at).some((s) => /restrain the load/.test(s))).toBe(true);
        expect(d.isolation.steps.some((s) => /DC link/.test(s))).toBe(c.value.machine.drive !== 'fixed-supply');
      }
      const safetyFirst = d.warnings.some((w) => base.safety.warnings.find((x) => x.id === w.id)?.isolateFirst);
      const states = d.checks.map((x) => x.state);
      if (safetyFirst) expect(states[0]).toBe('isolated');
      else if (firstIsolated) expect(states.slice(states.indexOf('isolated')).every((s) => s === 'isolated')).toBe(true);
    });
  }
});
