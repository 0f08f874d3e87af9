import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fitArmatureCircuit, measuredMachineConstant } from '../../../src/model/fits/measured-constants.js';
import { fitReadings } from '../../../src/model/fits/fit.js';
import { fitFacts } from '../../../src/model/fits/index.js';
import { DESIGNS, generatedFaultCases, machineOf, random, steadyState, type Design } from '../../../src/model/fits/generate.js';
import { loadCaseFile } from '../../../src/knowledge/load-case.js';
import { fluxPerUnit } from '../../../src/model/magnetization.js';

describe('measured machine constants (textbook worked examples)', () => {
  // Wildi, Electrical Machines, Drives and Power Systems, Example 5-1 (from memory): a permanent-
  // magnet machine with a 1 Ω armature generates 50 V at 500 r/min; on a 150 V supply it draws
  // 50 A at 1000 r/min and 4 A at 1460 r/min.
  const wildi = [
    { volts: 150, amps: 50, rpm: 1000 },
    { volts: 150, amps: 4, rpm: 1460 },
  ];
  const kPhiWildi = 50 / ((500 * 2 * Math.PI) / 60);

  it('measures kΦ = (V − Ia·R − Vb)/ω at a loaded point (Wildi Ex. 5-1, from memory: 100 V at 1000 r/min)', () => {
    expect(measuredMachineConstant(wildi[0]!, 1, 0)).toBeCloseTo(kPhiWildi, 6);
    expect(measuredMachineConstant(wildi[1]!, 1, 0)).toBeCloseTo(kPhiWildi, 6);
  });

  it('measures kΦ = ZPΦ/(2πA) from a shunt motor at 250 V, 12 A (FOSSEE Scilab textbook companion, book 1445, ch. 8 example 16: 4 poles, 500 conductors, 2 paths, 0.02 Wb, Ra 0.25 Ω)', () => {
    // E = 250 − 12·0.25 = 247 V; n = E·A·60/(Φ·Z·P) = 741 r/min; kΦ = 500·4·0.02/(2π·2) = 3.183 V·s/rad.
    const kPhi = (500 * 4 * 0.02) / (2 * Math.PI * 2);
    const rpm = (247 * 2 * 60) / (0.02 * 500 * 4);
    expect(measuredMachineConstant({ volts: 250, amps: 12, rpm }, 0.25, 0)).toBeCloseTo(kPhi, 6);
    expect(kPhi).toBeCloseTo(3.183, 3);
  });

  it('fits the armature circuit resistance and kΦ from two operating points, with no residual (Wildi Ex. 5-1, from memory)', () => {
    const fit = fitArmatureCircuit(wildi, 0)!;
    expect(fit.resistance).toBeCloseTo(1, 6);
    expect(fit.machineConstant).toBeCloseTo(kPhiWildi, 6);
    expect(fit.worstResidualShare).toBeLessThan(1e-9);
  });

  it('fits R and kΦ(I) of a series machine with the flux shape of its current', () => {
    // Points generated from the equations: kΦ = 1.2·Φ(I/80) per unit on the Fröhlich curve, R = 0.15 Ω, 2 V brushes.
    const shape = (i: number) => fluxPerUnit(undefined, i / 80);
    const points = [40, 80, 110].map((amps) => ({ amps, volts: 250, rpm: (((250 - amps * 0.15 - 2) / (1.2 * shape(amps))) * 60) / (2 * Math.PI) }));
    const fit = fitArmatureCircuit(points, 2, shape)!;
    expect(fit.resistance).toBeCloseTo(0.15, 6);
    expect(fit.machineConstant).toBeCloseTo(1.2, 6);
  });

  it('refuses two points at the same current (R and kΦ cannot be separated)', () => {
    expect(fitArmatureCircuit([{ volts: 150, amps: 10, rpm: 1000 }, { volts: 150, amps: 10, rpm: 1000 }], 0)).toBeUndefined();
  });
});

/** The hypothesis that carries each generated fault, and its value for a fault of size `size` on design `d`. */
const FIT_OF: Record<string, { hypothesis: string; value: (size: number, d: Design) => number }> = {
  'field-weak': { hypothesis: 'weakField', value: (s) => s },
  'field-overvoltage': { hypothesis: 'strongField', value: (s) => s },
  'field-shorted-turns': { hypothesis: 'fieldTurnsShorted', value: (s) => s },
  'armature-circuit-high-resistance': { hypothesis: 'extraResistance', value: (s, d) => (s * d.rShare * d.volts) / d.amps },
  'low-supply-voltage': { hypothesis: 'lowSupply', value: (s, d) => s * d.volts },
  'armature-overvoltage': { hypothesis: 'highSupply', value: (s, d) => s * d.volts },
  'series-field-shorted': { hypothesis: 'seriesFieldShorted', value: (s) => s },
  'pm-magnets-weakened': { hypothesis: 'weakMagnets', value: (s) => s },
};

const SIZES: Record<string, [number, number]> = {
  'field-weak': [0.5, 0.9],
  'field-overvoltage': [1.15, 1.4],
  'field-shorted-turns': [0.1, 0.2],
  'armature-circuit-high-resistance': [1, 5],
  'low-supply-voltage': [0.72, 0.9],
  'armature-overvoltage': [1.1, 1.3],
  'series-field-shorted': [0.4, 0.75],
  'pm-magnets-weakened': [0.6, 0.9],
};

function applies(cause: string, d: Design): boolean {
  const shunt = d.fieldAmps !== undefined;
  const fixed = d.drive === 'fixed-supply';
  switch (cause) {
    case 'field-weak':
    case 'field-shorted-turns':
      return shunt;
    case 'field-overvoltage':
      return d.connection === 'separately-excited';
    case 'low-supply-voltage':
    case 'armature-overvoltage':
      return fixed;
    case 'series-field-shorted':
      return d.connection === 'series';
    case 'pm-magnets-weakened':
      return d.connection === 'permanent-magnet';
    default:
      return true;
  }
}

describe('fitting the readings under every fault (properties over connection, size and load)', () => {
  it('finds no fault on a healthy machine generated from the equations, for every connection and drive', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: DESIGNS.length - 1 }), fc.double({ min: 0.5, max: 1, noNaN: true }), fc.double({ min: 0.5, max: 0.95, noNaN: true }), (k, load, speedRef) => {
        const d = DESIGNS[k]!;
        const readings = steadyState(d, { cause: null, size: 0 }, { load, speedRef })!;
        const report = fitReadings(machineOf(d), readings)!;
        expect(report.healthy.explains).toBe(true);
        expect(report.hypotheses.filter((h) => h.verdict === 'best')).toEqual([]);
      }),
    );
  });

  it('fits a fault of known size back within 1 %', () => {
    const cases = DESIGNS.flatMap((d) => Object.keys(FIT_OF).filter((c) => applies(c, d)).map((cause) => ({ d, cause })));
    fc.assert(
      fc.property(fc.integer({ min: 0, max: cases.length - 1 }), fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0.5, max: 0.95, noNaN: true }), (k, at, load) => {
        const { d, cause } = cases[k]!;
        const [lo, hi] = SIZES[cause]!;
        const size = lo + (hi - lo) * at;
        const readings = steadyState(d, { cause, size }, { load, speedRef: 0.8 });
        fc.pre(readings !== undefined && readings.speed! > 0);
        const report = fitReadings(machineOf(d), readings!)!;
        const { hypothesis, value } = FIT_OF[cause]!;
        const fit = report.hypotheses.find((h) => h.id === hypothesis)!;
        expect(Math.abs(fit.value - value(size, d)) / Math.abs(value(size, d))).toBeLessThan(0.01);
        // A fault small enough to stay within a healthy machine's tolerances is sized, not named.
        expect(fit.verdict).toBe(report.healthy.explains ? 'not-needed' : 'best');
      }),
    );
  });

  it('fits a series field reversed on a cumulative compound machine back as −1, and an overload as its torque', () => {
    const d = DESIGNS.find((x) => x.connection === 'compound-cumulative')!;
    const reversed = fitReadings(machineOf(d), steadyState(d, { cause: 'differential-compound', size: 0 }, { load: 0.4, speedRef: 1 })!)!;
    expect(reversed.hypotheses.find((h) => h.id === 'seriesFieldOpposing')!.value).toBeCloseTo(-1, 2);
    const overloaded = fitReadings(machineOf(d), steadyState(d, { cause: null, size: 0 }, { load: 1.4, speedRef: 1 })!)!;
    expect(overloaded.hypotheses.find((h) => h.id === 'overload')!.value).toBeCloseTo(1.4, 2);
  });

  it('never turns a healthy machine with ±2 % noise on its readings into a confident fault', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: DESIGNS.length - 1 }), fc.double({ min: 0.5, max: 1, noNaN: true }), fc.integer({ min: 1, max: 2 ** 30 }), (k, load, seed) => {
        const d = DESIGNS[k]!;
        const exact = steadyState(d, { cause: null, size: 0 }, { load, speedRef: 0.8 })!;
        const rnd = random(seed);
        const readings = Object.fromEntries(Object.entries(exact).map(([name, x]) => [name, (x as number) * (1 + 0.02 * (2 * rnd() - 1))]));
        const report = fitReadings(machineOf(d), readings)!;
        expect(report.hypotheses.filter((h) => h.verdict === 'best').map((h) => h.id)).toEqual([]);
      }),
    );
  });

  it('generates the same cases for the same seed, each with a fault the fits can name', () => {
    const a = generatedFaultCases({ seed: 7, count: 20 });
    expect(generatedFaultCases({ seed: 7, count: 20 })).toEqual(a);
    expect(a).toHaveLength(20);
  });
});

describe('each hypothesis on a recorded case, in the words a fitter reads', () => {
  const says = (file: string) => {
    const c = loadCaseFile(`cases/${file}`);
    if (!c.ok) throw new Error(file);
    return fitFacts(c.value.job.machine, c.value.job.readings ?? {});
  };

  it('finds the extra resistance of a burnt crimp and sizes it against the circuit', () => {
    const f = says('2025-07-29-resaw-brush-lead-crimp.json');
    expect(f.fit.extraResistance!.verdict).toBe('best');
    expect(f.fitSays.extraResistance).toBe("an extra 0.279 Ω in the armature circuit (about 1.63 × the circuit's own 0.172 Ω) explains the speed, field current and terminal voltage within 1 %");
    expect(f.fitSays.overload).toBe('a load of 85 % of rated torque at the measured current and field is the best this fault can do, but the speed contradicts it: 1070 rpm measured against the 1159 rpm it would give');
  });

  it('finds a weak field and says a strong one is not what the readings need', () => {
    const f = says('2026-10-14-press-feed-field-weak.json');
    expect(f.fitSays.weakField).toBe('a field current of 0.536 A (67 % of the healthy field) explains the speed, field current and terminal voltage within 1 %');
    expect(f.fitSays.strongField).toBe('only a field current of 0.536 A (67 % of the healthy field) would fit the readings — that is not a strong field');
  });

  it('tells shorted turns on a voltage-fed field (more current, nearly the same flux) from a field fed above its rating', () => {
    const f = says('2025-06-09-raw-water-pump-3-field-coil.json');
    expect(f.fit.fieldTurnsShorted!.verdict).toBe('best');
    expect(f.fitSays.fieldTurnsShorted).toBe('about 18 % of the field turns shorted in one coil (the field then draws 1.46 A) explains the speed, field current and terminal voltage within 1 %');
    expect(f.fit.strongField!.verdict).toBe('contradicted');
  });

  it('finds a cable drop from the supply-end and terminal voltages', () => {
    const f = says('2026-07-07-borehole-4-cable-drop.json');
    expect(f.fitSays.cableDrop).toBe('0.727 Ω in the supply cable (a drop of 31.2 V) explains the speed, field current, terminal voltage and supply voltage within 1 %');
    expect(f.fit.lowSupply!.verdict).toBe('contradicted');
    // The supply-end voltage was read at its rating: a low supply cannot be what drops the terminals.
    expect(f.fit.lowSupply!.contradictedBy).toBe('supplyVoltage');
  });

  it('finds a current held at a low limit on a converter, and a supply above rating', () => {
    expect(says('2025-08-26-clinker-cooler-fan-current-limit.json').fit.currentLimit!.verdict).toBe('best');
    const high = says('2026-03-09-scrubber-brush-motor-36v-pack.json');
    expect(high.fit.highSupply!.verdict).toBe('best');
    expect(high.fitSays.highSupply).toMatch(/^a supply of 36\.4 V \(\d+ % of the rated \d+ V\) explains the speed/);
  });
});
