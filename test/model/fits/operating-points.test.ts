/**
 * Several operating points of one machine, fitted together: a textbook worked example for the
 * least-squares fit of R and kΦ, the job's points as the fit finds them (running, uncoupled,
 * those worked checks read), and what the second point is worth on jobs generated from the
 * machine equations.
 */
import { describe, expect, it } from 'vitest';
import { fitArmatureCircuit } from '../../../src/model/fits/measured-constants.js';
import { circuitFacts, operatingPoints } from '../../../src/model/fits/points.js';
import { fitFacts, fitReadings } from '../../../src/model/fits/index.js';
import { generatedFaultCases } from '../../../src/model/fits/generate.js';
import { diagnose } from '../../../src/engine/diagnose.js';
import { buildEngine } from '../../../src/engine/run-rules.js';
import type { ModelMachine } from '../../../src/model/families/context.js';
import { builtInRules } from '../../support/rules.js';

const rpmOf = (radS: number) => (radS * 60) / (2 * Math.PI);

describe('R and kΦ from several operating points (textbook worked example)', () => {
  // Chapman, Electric Machinery Fundamentals, 4th ed., Example 9-1 (from memory): a 250 V shunt
  // motor, RA 0.06 Ω, 1200 r/min at no load; at 95, 195 and 295 A of armature current it runs at
  // 1173, 1144 and 1115 r/min (E = 250 − IA·RA, n = E/250 × 1200). Speeds as the book rounds them.
  const points = [
    { volts: 250, amps: 95, rpm: 1173 },
    { volts: 250, amps: 195, rpm: 1144 },
    { volts: 250, amps: 295, rpm: 1115 },
  ];

  it('fits RA = 0.06 Ω and kΦ = 250 V at 1200 r/min from the three loaded points, with residuals under the rounding', () => {
    const fit = fitArmatureCircuit(points, 0)!;
    expect(fit.resistance).toBeCloseTo(0.06, 2);
    expect(fit.machineConstant).toBeCloseTo(250 / ((1200 * 2 * Math.PI) / 60), 2);
    // The book rounds speeds to 1 r/min: about 0.1 % of the voltage at most.
    expect(fit.worstResidualShare).toBeLessThan(0.002);
    expect(fit.residualVolts).toHaveLength(3);
  });
});

describe("the job's own operating points", () => {
  const machine: ModelMachine = {
    connection: 'shunt',
    drive: 'fixed-supply',
    nameplate: { armatureVoltage: 220, armatureCurrent: 40, speed: 1500, fieldCurrent: 1 },
    resistances: { armature: 0.3 },
    brushDrop: 2,
  };
  const kPhi = (220 - 40 * 0.3 - 2) / ((1500 * 2 * Math.PI) / 60);
  /** The speed of this machine with `extra` ohms in its armature circuit. */
  const speed = (amps: number, extra: number) => rpmOf((220 - amps * (0.3 + extra) - 2) / kPhi);

  it('collects the running point, the uncoupled one and those worked checks read, once each', () => {
    const readings = { armatureVoltage: 220, armatureCurrent: 40, speed: 1400, noLoadArmatureCurrent: 3, uncoupledSpeed: 1590 };
    const points = operatingPoints(readings, [
      { label: 'first readings', readings },
      { label: 'live-coupled-load-current', readings: { armatureCurrent: 20, speed: 1500 } },
    ]);
    expect(points.map((p) => p.label)).toEqual(['first readings', 'live-coupled-load-current', 'uncoupled']);
    expect(points[1]).toEqual({ label: 'live-coupled-load-current', volts: 220, amps: 20, rpm: 1500 });
  });

  it('measures an extra 0.6 Ω as three times the circuit, with kΦ where it should be, and says so in numbers', () => {
    const readings = { armatureVoltage: 220, armatureCurrent: 40, speed: speed(40, 0.6), fieldCurrent: 1, noLoadArmatureCurrent: 3, uncoupledSpeed: speed(3, 0.6) };
    const c = circuitFacts(machine, readings, operatingPoints(readings))!;
    expect(c.resistance).toBeCloseTo(0.9, 6);
    expect(c.fluxRatio).toBeCloseTo(1, 6);
    expect(c.resistanceRatio).toBeCloseTo(3, 6);
    expect(c.says).toBe('from 2 operating points (running, uncoupled) the armature circuit measures 0.9 Ω, 3 × the 0.3 Ω it should have, with kΦ at 100 % of healthy');
    expect(fitFacts(machine, readings).fit.circuit?.resistanceRatio).toBeCloseTo(c.resistanceRatio, 9);
  });

  it('takes a supply (line) current read instead of the armature current, less the shunt field it feeds', () => {
    const readings = { armatureVoltage: 220, speed: speed(40, 0.6), fieldCurrent: 1 };
    const byLine = fitReadings(machine, { ...readings, lineCurrent: 41 })!;
    const byArmature = fitReadings(machine, { ...readings, armatureCurrent: 40 })!;
    const extra = (r: typeof byLine) => r.hypotheses.find((h) => h.id === 'extraResistance')!;
    expect(extra(byLine).value).toBeCloseTo(extra(byArmature).value, 9);
    expect(extra(byLine).value).toBeCloseTo(0.6, 3);
  });

  it('a worked check that reads current and speed at another load is a second point in the diagnosis', async () => {
    const base = builtInRules();
    const readings = { armatureVoltage: 220, armatureCurrent: 40, speed: speed(40, 0.6), fieldCurrent: 1 };
    const check = { id: 'live-coupled-load-current', result: 'inconclusive' as const, readings: { armatureCurrent: 12, speed: speed(12, 0.6) } };
    const d = await diagnose({ machine, readings, checks: [check] } as never, base, buildEngine(base));
    const circuit = (d.facts.fit as { circuit?: { points: number; resistanceRatio: number } }).circuit;
    expect(circuit?.points).toBe(2);
    expect(circuit?.resistanceRatio).toBeCloseTo(3, 6);
    expect(d.causes[0]?.evidence.map((e) => e.says)).toContain('from 2 operating points (first readings, live-coupled-load-current) the armature circuit measures 0.9 Ω, 3 × the 0.3 Ω it should have, with kΦ at 100 % of healthy');
  });

  it('needs two points far enough apart in current, and a fixed supply', () => {
    const readings = { armatureVoltage: 220, armatureCurrent: 40, speed: speed(40, 0) };
    expect(circuitFacts(machine, readings, operatingPoints(readings))).toBeUndefined();
    const close = { ...readings, noLoadArmatureCurrent: 35, uncoupledSpeed: speed(35, 0) };
    expect(circuitFacts(machine, close, operatingPoints(close))).toBeUndefined();
    const converter = { ...readings, noLoadArmatureCurrent: 3, uncoupledSpeed: speed(3, 0) };
    expect(circuitFacts({ ...machine, drive: 'controlled-converter' }, converter, operatingPoints(converter))).toBeUndefined();
  });
});

describe('what the uncoupled point is worth, readings only, with the field current not read', () => {
  const base = builtInRules();
  const engine = buildEngine(base);
  const rankAll = async (uncoupled: boolean) => {
    let top1 = 0;
    let n = 0;
    for (const g of generatedFaultCases({ seed: 31, count: 160, uncoupled })) {
      // Fixed supplies, not series machines (never run uncoupled); shorted field turns need the field current to show.
      if (g.job.machine.drive !== 'fixed-supply' || g.job.machine.connection === 'series' || g.cause === 'field-shorted-turns') continue;
      const { fieldCurrent: _unread, ...readings } = g.job.readings;
      const d = await diagnose({ machine: { ...g.job.machine, magnetization: undefined }, readings } as never, base, engine);
      n++;
      if (d.causes[0]?.id === g.cause) top1++;
    }
    return top1 / n;
  };

  it('the same jobs name their cause first far more often with the speed run uncoupled', async () => {
    const without = await rankAll(false);
    const withPoint = await rankAll(true);
    expect(withPoint).toBeGreaterThanOrEqual(0.93);
    expect(withPoint - without).toBeGreaterThanOrEqual(0.08);
  });
});
