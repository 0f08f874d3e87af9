/**
 * The fits reach the ranking: rules read the nested fact `fit` ("$.extraResistance.verdict"),
 * and with symptoms and observations stripped the readings alone name the cause. The generated
 * cases come from the machine equations with ±2 % noise (src/model/fits/generate.ts), not from
 * any recorded case.
 */
import { describe, expect, it } from 'vitest';
import { diagnose } from '../../src/engine/diagnose.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { loadCaseFile } from '../../src/knowledge/load-case.js';
import { DESIGNS, generatedFaultCases, machineOf, random, steadyState } from '../../src/model/fits/generate.js';
import { builtInRules } from '../support/rules.js';
import { computeExpectations } from '../../src/model/expected.js';
import { typicalEfficiency } from '../../src/model/families/rated-point.js';

const base = builtInRules();
const engine = buildEngine(base);

describe('fitted hypotheses as evidence', () => {
  it('a burnt crimp, readings only: the fit rule for extra resistance fires and names the cause first', async () => {
    const c = loadCaseFile('cases/2025-07-29-resaw-brush-lead-crimp.json');
    if (!c.ok) throw new Error('case');
    const d = await diagnose({ machine: c.value.job.machine, readings: c.value.job.readings ?? {} }, base, engine);
    expect(d.causes[0]?.id).toBe('armature-circuit-high-resistance');
    expect(d.causes[0]?.evidence.map((e) => e.rule)).toContain('fit-extra-resistance-best-high-resistance');
    expect(d.causes[0]?.evidence.find((e) => e.rule === 'fit-extra-resistance-best-high-resistance')?.says).toMatch(/^an extra 0\.279 Ω in the armature circuit/);
  });

  it.each([
    ['with the winding resistances measured', 'resistances'],
    ['from the plate alone (no resistances, no output: a usual efficiency for the size)', 'plate'],
    ['from a plate giving output but no current, as a book often does', 'output'],
  ])('names the cause of generated fault cases from readings alone, %s: top-3 at least 95 %, top-1 at least 90 %', async (_, given) => {
    const cases = generatedFaultCases({ seed: 4711, count: 120 });
    let top1 = 0;
    let top3 = 0;
    for (const g of cases) {
      const plate = g.job.machine.nameplate!;
      const machine = {
        ...g.job.machine,
        magnetization: undefined,
        ...(given === 'plate' ? { resistances: undefined } : {}),
        ...(given === 'output' ? { nameplate: { ...plate, armatureCurrent: undefined, power: 0.85 * plate.armatureVoltage! * plate.armatureCurrent! } } : {}),
      };
      const d = await diagnose({ machine, readings: g.job.readings } as never, base, engine);
      const rank = d.causes.findIndex((x) => x.id === g.cause) + 1;
      if (rank === 1) top1++;
      if (rank >= 1 && rank <= 3) top3++;
    }
    expect(top3 / cases.length).toBeGreaterThanOrEqual(0.95);
    expect(top1 / cases.length).toBeGreaterThanOrEqual(0.9);
  });

  it('estimates the armature circuit from the size when the plate gives neither resistance nor output, and says so', () => {
    // Usual full-load efficiencies (from memory of makers' lists): about 84 % at 5 kW input, 90 % at 50 kW.
    expect(typicalEfficiency(5000)).toBeCloseTo(0.84, 6);
    expect(typicalEfficiency(50_000)).toBeCloseTo(0.9, 6);
    expect(typicalEfficiency(15_000)).toBeGreaterThan(0.84);
    expect(typicalEfficiency(15_000)).toBeLessThan(0.9);
    const e = computeExpectations({ machine: { connection: 'shunt', drive: 'fixed-supply', nameplate: { armatureVoltage: 220, armatureCurrent: 24, speed: 1500, fieldCurrent: 0.8 } }, readings: {} });
    // 220 V × (24 A armature + 0.8 A shunt field) = 5,456 W in: efficiency about 85 %, half the losses in the armature circuit.
    expect(e.quantities.armatureCircuitResistance?.value).toBeCloseTo((0.5 * 5456 * (1 - typicalEfficiency(5456))) / 576, 3);
    expect(e.quantities.armatureCircuitResistance?.basis).toBe('estimated');
    expect(e.assumptions.join(' ')).toMatch(/no resistance or output on the plate, so the efficiency is taken as 84 %/);
  });

  it('never makes a confident fault of a healthy machine with ±2 % on its readings: with and without the uncoupled point, with and without its resistances', async () => {
    const rnd = random(2026);
    for (let i = 0; i < 120; i++) {
      const design = DESIGNS[i % DESIGNS.length]!;
      const exact = steadyState(design, { cause: null, size: 0 }, { load: 0.5 + 0.5 * rnd(), speedRef: 0.8 })!;
      const light = design.connection !== 'series' && design.drive === 'fixed-supply' ? steadyState(design, { cause: null, size: 0 }, { load: 0.05, speedRef: 0.8 }) : undefined;
      const noisy = (x: number) => x * (1 + 0.02 * (2 * rnd() - 1));
      const readings: Record<string, number> = Object.fromEntries(Object.entries(exact).map(([k, x]) => [k, noisy(x as number)]));
      if (light && i % 2) Object.assign(readings, { noLoadArmatureCurrent: noisy(light.armatureCurrent!), uncoupledSpeed: noisy(light.speed!) });
      const machine = { ...machineOf(design), magnetization: undefined, ...(i % 4 === 3 ? { resistances: undefined } : {}) };
      const d = await diagnose({ machine, readings } as never, base, engine);
      expect(d.causes[0]?.score ?? 0, `${design.connection}/${design.drive}: ${d.causes[0]?.id}`).toBeLessThan(0.5);
    }
  });
});
