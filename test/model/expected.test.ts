import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { computeExpectations, type ModelInput } from '../../src/model/expected.js';
import { froehlichFlux, fluxPerUnit } from '../../src/model/magnetization.js';
import { quantityOf, shuntMachine } from '../support/model.js';
import { outOfBand } from '../../src/model/quantity-names.js';

// Kosow, Electric Machinery and Transformers, 2nd ed., Example 4-8: 120 V shunt motor, Ra 0.2 Ω,
// Rsh 60 Ω, line current 40 A at 1800 rpm, brush drop 3 V.
const kosow48: ModelInput['machine'] = {
  connection: 'shunt',
  nameplate: { armatureVoltage: 120, lineCurrent: 40, speed: 1800 },
  resistances: { armature: 0.2, shuntField: 60 },
  brushDrop: 3,
  magnetization: 'linear',
};

describe('shunt motor speed (textbook worked examples)', () => {
  it('finds 1863 rpm at half load and 1769 rpm at 125 % load (Kosow Ex. 4-8)', () => {
    expect(quantityOf({ machine: kosow48 }, 'ratedBackEmf').value).toBeCloseTo(109.4, 6);
    expect(quantityOf({ machine: kosow48, readings: { armatureVoltage: 120, armatureCurrent: 19 } }, 'speed').value).toBeCloseTo(1862.5, 0);
    expect(quantityOf({ machine: kosow48, readings: { armatureVoltage: 120, armatureCurrent: 47.5 } }, 'speed').value).toBeCloseTo(1768.7, 0);
  });

  it('derives the armature current from line current less field current (Kosow Ex. 4-8: 38 A)', () => {
    expect(quantityOf({ machine: kosow48 }, 'ratedArmatureCurrent').value).toBe(38);
  });

  it('finds 1532 rpm with the field strengthened 12 % and 66 A line current (Kosow Ex. 4-9)', () => {
    // The book's flux rises 12 % for a 20 % rise in field current: a test-sheet curve through (1.2, 1.12).
    const machine = { ...kosow48, magnetization: [[1, 1], [1.2, 1.12]] as [number, number][] };
    const q = quantityOf({ machine, readings: { armatureVoltage: 120, lineCurrent: 66, fieldCurrent: 2.4 } }, 'speedFromMeasuredField');
    expect(q.value).toBeCloseTo(1531.9, 0);
  });

  it('finds 1110.5 rpm at 46 A and 1480.4 rpm with the field at 100 Ω (Nasar, Electric Machines and Power Systems, Ex. 6.7; computed)', () => {
    const machine: ModelInput['machine'] = {
      connection: 'shunt',
      nameplate: { armatureVoltage: 230, lineCurrent: 7, speed: 1120 },
      resistances: { armature: 0.05, shuntField: 75 },
      brushDrop: 0,
      magnetization: 'linear',
    };
    expect(quantityOf({ machine, readings: { armatureVoltage: 230, lineCurrent: 46 } }, 'speed').value).toBeCloseTo(1110.5, 0);
    const weakened = quantityOf({ machine, readings: { armatureVoltage: 230, lineCurrent: 46, fieldCurrent: 2.3 } }, 'speedFromMeasuredField');
    expect(weakened.value).toBeCloseTo(1480.4, 0);
  });
});

describe('series motor speed with flux proportional to current (Kosow Ex. 4-18)', () => {
  // 250 V series motor, Ra 0.1 Ω, Rs 0.05 Ω, brush drop 3 V, 600 rpm at 85 A.
  const machine: ModelInput['machine'] = {
    connection: 'series',
    nameplate: { armatureVoltage: 250, armatureCurrent: 85, speed: 600 },
    resistances: { armature: 0.1, seriesField: 0.05 },
    brushDrop: 3,
    magnetization: 'linear',
  };
  it('finds 505 rpm at 100 A and 1311 rpm at 40 A', () => {
    expect(quantityOf({ machine, readings: { armatureVoltage: 250, armatureCurrent: 100 } }, 'speed').value).toBeCloseTo(505.1, 0);
    expect(quantityOf({ machine, readings: { armatureVoltage: 250, armatureCurrent: 40 } }, 'speed').value).toBeCloseTo(1311.7, 0);
  });

  it('refuses a speed for a series machine at almost no current and says it would run away', () => {
    const e = computeExpectations({ machine, readings: { armatureVoltage: 250, armatureCurrent: 2 } });
    expect(e.quantities.speed).toBeUndefined();
    expect(e.findings.map((f) => f.code)).toContain('series-current-near-zero');
  });
});

describe('torque', () => {
  it('gives 42.02 lb·ft rated shaft torque for 10 hp at 1250 rpm (Kosow Ex. 4-21)', () => {
    const machine: ModelInput['machine'] = { connection: 'shunt', nameplate: { power: 7456.9987, speed: 1250 } };
    const lbft = quantityOf({ machine }, 'ratedTorque').value / 1.3558179;
    expect(lbft).toBeCloseTo(42.02, 1);
  });

  it('grows with the square of current in an unsaturated series motor: 90 lb·ft at 25 A gives 129.6 at 30 A (Kosow Ex. 4-15)', () => {
    const machine: ModelInput['machine'] = {
      connection: 'series',
      nameplate: { armatureVoltage: 250, armatureCurrent: 25, speed: 1000 },
      resistances: { armature: 0.2, seriesField: 0.1 },
      magnetization: 'linear',
    };
    const at = (ia: number) => quantityOf({ machine, readings: { armatureVoltage: 250, armatureCurrent: ia } }, 'torque').value;
    expect((90 * at(30)) / at(25)).toBeCloseTo(129.6, 2);
  });
});

describe('magnetisation curve', () => {
  it('passes through rated flux at rated current and keeps 70 % of flux at 56 % of field current', () => {
    expect(froehlichFlux(1)).toBeCloseTo(1, 12);
    expect(froehlichFlux(0.56)).toBeCloseTo(0.7, 2);
  });
  it('is concave: a linear model overstates the speed rise of a weakened field', () => {
    for (const i of [0.2, 0.4, 0.6, 0.8]) expect(fluxPerUnit(undefined, i)).toBeGreaterThan(fluxPerUnit('linear', i));
  });
});

describe('what the model cannot compute', () => {
  it('says which value would give the expected speed', () => {
    const e = computeExpectations({ machine: { connection: 'shunt', nameplate: { armatureVoltage: 220 } }, readings: { armatureVoltage: 220 } });
    expect(e.quantities.speed).toBeUndefined();
    expect(e.missing.find((m) => m.quantity === 'speed')?.needs).toContain('readings.armatureCurrent');
  });

  it('flags an estimated armature resistance as an estimate', () => {
    const e = computeExpectations({
      machine: { connection: 'shunt', nameplate: { armatureVoltage: 230, lineCurrent: 16, power: 3000, speed: 1750, fieldCurrent: 0.65 } },
      readings: { armatureVoltage: 230, armatureCurrent: 10 },
    });
    // Losses 230 × 16 − 3000 = 680 W; half of it in Ia = 15.35 A gives 1.443 Ω.
    expect(e.quantities.armatureCircuitResistance?.value).toBeCloseTo(340 / 15.35 ** 2, 3);
    expect(e.quantities.armatureCircuitResistance?.basis).toBe('estimated');
    expect(e.quantities.speed?.basis).toBe('estimated');
  });

  it('finds a field whose cold resistance disagrees with its nameplate', () => {
    const e = computeExpectations({
      machine: { connection: 'shunt', nameplate: { armatureVoltage: 220, fieldVoltage: 220, fieldCurrent: 1 }, resistances: { shuntField: 150 } },
    });
    expect(e.findings.map((f) => f.code)).toContain('field-resistance-below-plate');
  });
});

describe('model invariants (property tests)', () => {
  const current = fc.double({ min: 2, max: 60, noNaN: true });
  const speedAt = (machine: ModelInput['machine'], ia: number, fieldCurrent?: number) =>
    quantityOf({ machine, readings: { armatureVoltage: 220, armatureCurrent: ia, ...(fieldCurrent === undefined ? {} : { fieldCurrent }) } }, fieldCurrent === undefined ? 'speed' : 'speedFromMeasuredField').value;

  it('a shunt machine slows as armature current rises', () => {
    fc.assert(fc.property(current, current, (a, b) => {
      fc.pre(Math.abs(a - b) > 0.01);
      const [lo, hi] = a < b ? [a, b] : [b, a];
      expect(speedAt(shuntMachine(), hi)).toBeLessThan(speedAt(shuntMachine(), lo));
    }));
  });

  it('a series machine slows faster than a shunt machine over the same current rise', () => {
    const series = { ...shuntMachine('series'), nameplate: { armatureVoltage: 220, armatureCurrent: 40, speed: 1500 } };
    fc.assert(fc.property(current, current, (a, b) => {
      fc.pre(Math.abs(a - b) > 0.5);
      const [lo, hi] = a < b ? [a, b] : [b, a];
      const seriesFall = speedAt(series, lo) / speedAt(series, hi);
      const shuntFall = speedAt(shuntMachine(), lo) / speedAt(shuntMachine(), hi);
      expect(seriesFall).toBeGreaterThan(shuntFall);
    }));
  });

  it('weakening the field raises the expected speed', () => {
    fc.assert(fc.property(fc.double({ min: 0.1, max: 1.5, noNaN: true }), fc.double({ min: 0.1, max: 1.5, noNaN: true }), (f1, f2) => {
      fc.pre(Math.abs(f1 - f2) > 0.01);
      const [weak, strong] = f1 < f2 ? [f1, f2] : [f2, f1];
      expect(speedAt(shuntMachine(), 20, weak)).toBeGreaterThan(speedAt(shuntMachine(), 20, strong));
    }));
  });

  it('winding temperature from resistance rises with hot resistance', () => {
    const machine: ModelInput['machine'] = { connection: 'shunt', resistances: { armature: 0.4, at: 20 } };
    fc.assert(fc.property(fc.double({ min: 0.3, max: 0.8, noNaN: true }), fc.double({ min: 0.3, max: 0.8, noNaN: true }), (r1, r2) => {
      fc.pre(Math.abs(r1 - r2) > 1e-4);
      const t = (r: number) => quantityOf({ machine, readings: { armatureResistanceHot: r } }, 'armatureWindingTemperature').value;
      expect(Math.sign(t(r1) - t(r2))).toBe(Math.sign(r1 - r2));
    }));
  });
});

describe('findings from the readings', () => {
  const machine: ModelInput['machine'] = { connection: 'shunt', nameplate: { armatureVoltage: 220, armatureCurrent: 30, speed: 1450, fieldCurrent: 0.9 }, resistances: { armature: 0.5 } };

  it('says a machine with no voltage at its terminals is not energised, not that it runs away', () => {
    const e = computeExpectations({ machine, readings: { armatureVoltage: 0, armatureCurrent: 0 } });
    expect(e.findings.map((f) => f.code)).toEqual(['no-terminal-voltage']);
    expect(e.quantities.speed).toBeUndefined();
  });

  it('finds a tacho whose polarity is reversed against the rotation', () => {
    const e = computeExpectations({ machine: { ...machine, tachoVoltsPer1000Rpm: 60 }, readings: { speed: 1000, tachoVoltage: -59 } });
    expect(e.quantities.tachoVoltage).toMatchObject({ value: 60, measured: -59 });
    expect(e.findings.map((f) => f.code)).toContain('tacho-polarity-reversed');
  });
});

describe('the healthy band of the armature voltage', () => {
  // Common practice: a converter sets the armature voltage for the speed it is asked for.
  const machine = { connection: 'separately-excited' as const, nameplate: { armatureVoltage: 440, armatureCurrent: 52, speed: 1750, power: 20000 } };
  const flagged = (drive: 'fixed-supply' | 'controlled-converter', volts: number) => {
    const q = computeExpectations({ machine: { ...machine, drive }, readings: { armatureVoltage: volts } }).quantities.ratedArmatureVoltage!;
    return outOfBand('ratedArmatureVoltage', q.ratio, q.band);
  };

  it('flags a voltage below the plate on a fixed supply only', () => {
    expect(flagged('fixed-supply', 300)).toBe(true);
    expect(flagged('controlled-converter', 300)).toBe(false);
  });

  it('flags a voltage above the rating on either', () => {
    expect(flagged('fixed-supply', 480)).toBe(true);
    expect(flagged('controlled-converter', 480)).toBe(true);
  });
});
