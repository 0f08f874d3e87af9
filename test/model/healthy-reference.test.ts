import { describe, expect, it } from 'vitest';
import { computeExpectations, type ModelInput } from '../../src/model/expected.js';
import { outOfBand } from '../../src/model/quantity-names.js';
import { quantityOf } from '../support/model.js';
import { caseSchema } from '../../src/knowledge/case-schema.js';

// An invented separately excited drive motor: 440 V, 52 A, 1750/2300 rpm, field 310 V 2.1 A.
const driveMotor: ModelInput['machine'] = {
  connection: 'separately-excited',
  drive: 'controlled-converter',
  nameplate: { armatureVoltage: 440, armatureCurrent: 52, speed: 1750, maxSpeed: 2300, power: 20000, fieldVoltage: 310, fieldCurrent: 2.1, insulationClass: 'F' },
  resistances: { armature: 0.42, shuntField: 118, at: 20 },
};
const codes = (input: ModelInput) => computeExpectations(input).findings.map((f) => f.code);

describe('the healthy field is the plate, not the measured field voltage', () => {
  it('shows a low field supply as a weak field: 255 V on a 310 V field is not "100 % of expected"', () => {
    // The field draws in proportion to its voltage: 2.1 A × 255/310 = 1.727 A.
    const q = quantityOf({ machine: driveMotor, readings: { fieldVoltage: 255, fieldCurrent: 1.727 } }, 'fieldCurrent');
    expect(q.value).toBe(2.1);
    expect(q.ratio).toBeCloseTo(0.822, 3);
    expect(outOfBand('fieldCurrent', q.ratio)).toBe(true);
    // The winding itself is healthy at the voltage across it, and the low voltage shows on its own.
    expect(quantityOf({ machine: driveMotor, readings: { fieldVoltage: 255, fieldCurrent: 1.727 } }, 'fieldCurrentAtMeasuredVoltage').ratio).toBeCloseTo(1, 3);
    expect(outOfBand('ratedFieldVoltage', quantityOf({ machine: driveMotor, readings: { fieldVoltage: 255 } }, 'ratedFieldVoltage').ratio)).toBe(true);
  });

  it("takes the field regulator's set point as the reference where it is known", () => {
    expect(quantityOf({ machine: driveMotor, readings: { fieldCurrentSetting: 1.9, fieldCurrent: 1.88 } }, 'fieldCurrent').value).toBe(1.9);
  });

  it('expects a cold voltage-fed field to draw more than its hot plate current (resistance ratio, copper k = 234.5, IEEE 118)', () => {
    // Working temperature for class F is 115 °C; at 20 °C: × (234.5 + 115)/(234.5 + 20) = 1.3733.
    const q = quantityOf({ machine: driveMotor, readings: { fieldTemperature: 20 } }, 'fieldCurrent');
    expect(q.value).toBeCloseTo(2.1 * (349.5 / 254.5), 4);
  });

  it('follows the terminal voltage on a shunt machine, whose field is fed from the same supply', () => {
    const shunt: ModelInput['machine'] = { connection: 'shunt', nameplate: { armatureVoltage: 220, armatureCurrent: 30, speed: 1450, fieldCurrent: 0.9 } };
    expect(quantityOf({ machine: shunt, readings: { armatureVoltage: 198 } }, 'fieldCurrent').value).toBeCloseTo(0.81, 6);
  });
});

describe('field weakening is normal operation', () => {
  it('reads a 1750/2300 r/min plate as base and top speed', () => {
    const c = caseSchema.parse({ format: 'dc-case/1', machine: { connection: 'separately-excited', nameplate: { speed: '1750/2300 r/min' } } });
    expect(c.machine.nameplate?.speed).toBe(1750);
    expect(c.machine.nameplate?.maxSpeed).toBe(2300);
  });

  it('above base speed takes a field below rating as the drive weakening it, not a fault', () => {
    // At 2100 rpm, 440 V and 40 A the healthy drive has weakened the field to keep the armature at its rating.
    const readings = { armatureVoltage: 438, armatureCurrent: 40, speed: 2100, fieldCurrent: 1.3 };
    const e = computeExpectations({ machine: driveMotor, readings });
    const field = e.quantities.fieldCurrent!;
    expect(field.value).toBeLessThan(2.1);
    expect(field.value).toBeGreaterThan(1.0);
    expect(outOfBand('speed', e.quantities.speed!.ratio)).toBe(false);
    expect(outOfBand('maxSpeed', e.quantities.maxSpeed!.ratio)).toBe(false);
    expect(e.assumptions.join(' ')).toMatch(/field-weakening range/);
  });

  it('flags a speed above the top of the range', () => {
    const q = computeExpectations({ machine: driveMotor, readings: { speed: 2600 } }).quantities.maxSpeed!;
    expect(outOfBand('maxSpeed', q.ratio)).toBe(true);
  });
});

describe('temperature limits are rises over the coolant (IEC 60034-1)', () => {
  const classB: ModelInput['machine'] = { connection: 'shunt', nameplate: { insulationClass: 'B' }, resistances: { armature: 0.4, at: 20 } };
  // 115 °C by resistance: R = 0.4 × (234.5 + 115)/(234.5 + 20).
  const hotAt115 = 0.4 * (349.5 / 254.5);

  it('judges a class B winding at 115 °C in 20 °C air as 95 K over coolant: over the 80 K limit', () => {
    const e = computeExpectations({ machine: classB, readings: { armatureResistanceHot: hotAt115, ambientTemperature: 20 } });
    expect(e.quantities.armatureWindingTemperature!.value).toBeCloseTo(115, 3);
    expect(e.quantities.armatureTemperatureRise).toMatchObject({ value: 80 });
    expect(e.quantities.armatureTemperatureRise!.measured).toBeCloseTo(95, 3);
    expect(codes({ machine: classB, readings: { armatureResistanceHot: hotAt115, ambientTemperature: 20 } })).toContain('armature-rise-over-limit');
  });

  it('assumes a 40 °C coolant only where ambient is unknown, and says so', () => {
    const e = computeExpectations({ machine: classB, readings: { armatureResistanceHot: hotAt115 } });
    expect(e.quantities.armatureTemperatureLimit!.value).toBe(120);
    expect(e.findings.map((f) => f.code)).not.toContain('armature-rise-over-limit');
    expect(e.assumptions.join(' ')).toMatch(/taken as the 40 °C reference coolant/);
  });
});

describe('smaller corrections', () => {
  it('takes torque at a changed field from the measured field flux', () => {
    const shunt: ModelInput['machine'] = { connection: 'shunt', nameplate: { armatureVoltage: 220, armatureCurrent: 30, speed: 1450, fieldCurrent: 0.9 }, resistances: { armature: 0.5 }, magnetization: 'linear' };
    const full = quantityOf({ machine: shunt, readings: { armatureVoltage: 220, armatureCurrent: 20, fieldCurrent: 0.9 } }, 'torque').value;
    const half = quantityOf({ machine: shunt, readings: { armatureVoltage: 220, armatureCurrent: 20, fieldCurrent: 0.45 } }, 'torque').value;
    expect(half / full).toBeCloseTo(0.5, 6);
  });

  it('does not add the brush drop again to a resistance estimated from the plate losses, which already hold it', () => {
    const machine: ModelInput['machine'] = { connection: 'separately-excited', nameplate: { armatureVoltage: 230, armatureCurrent: 40, power: 8000, speed: 1500 } };
    // Losses 230 × 40 − 8000 = 1200 W; half in 40 A gives R = 0.375 Ω; E = 230 − 40 × 0.375 = 215 V exactly.
    expect(quantityOf({ machine }, 'ratedBackEmf').value).toBeCloseTo(215, 9);
  });

  it('corrects aluminium windings with k = 225 °C (IEEE machine usage)', () => {
    const machine: ModelInput['machine'] = { connection: 'shunt', windingMaterial: 'aluminium', resistances: { armature: 1, at: 20 } };
    // 1 K rise from 20 °C in aluminium: R rises by 1/245.
    expect(quantityOf({ machine, readings: { armatureResistanceHot: 1 + 60 / 245 } }, 'armatureWindingTemperature').value).toBeCloseTo(80, 6);
  });
});

describe('readings far from the plate', () => {
  const shunt: ModelInput['machine'] = { connection: 'shunt', nameplate: { armatureVoltage: 220, armatureCurrent: 24, speed: 1450, fieldCurrent: 0.8 } };
  it('finds 1900 V on a 220 V plate, 80 A on a 0.8 A field and 1450 A on a 24 A armature', () => {
    const e = computeExpectations({ machine: shunt, readings: { armatureVoltage: 1900, fieldCurrent: 80, armatureCurrent: 1450 } });
    const says = e.findings.filter((f) => f.code === 'reading-far-from-plate').map((f) => f.says);
    expect(says).toHaveLength(3);
    expect(says[0]).toMatch(/8\.6 × the plate's 220 V/);
  });
  it('leaves plausible readings alone', () => {
    expect(codes({ machine: shunt, readings: { armatureVoltage: 231, fieldCurrent: 0.7, armatureCurrent: 30 } })).not.toContain('reading-far-from-plate');
  });
});

describe('a starter resistance in the armature circuit', () => {
  // An invented 220 V shunt motor on a fixed supply, field 1.0 A hot at 220 V.
  const shunt: ModelInput['machine'] = { connection: 'shunt', drive: 'fixed-supply', nameplate: { armatureVoltage: 220, armatureCurrent: 40, speed: 1500, fieldVoltage: 220, fieldCurrent: 1 } };

  it('feeds the shunt field from the supply side of the starter, not the terminals (three- and four-point starters: NEETS Module 5, NAVEDTRA 14177)', () => {
    // 225 V at the supply, 1.3 Ω left in by the starter at 38 A: 176 V at the terminals. The field sees 225 V: 1.0 A × 225/220.
    const q = quantityOf({ machine: shunt, readings: { supplyVoltage: 225, armatureVoltage: 176, armatureCurrent: 38, starterResistance: 1.3 } }, 'fieldCurrent');
    expect(q.value).toBeCloseTo(225 / 220, 4);
    expect(q.formula).toMatch(/ahead of the starter/);
  });

  it('follows the terminals again once every step is cut out', () => {
    expect(quantityOf({ machine: shunt, readings: { supplyVoltage: 225, armatureVoltage: 176, starterResistance: 0 } }, 'fieldCurrent').value).toBeCloseTo(176 / 220, 4);
  });

  it('reads the steps and the resistance left in from a case file', () => {
    const parsed = caseSchema.parse({ format: 'dc-case/1', machine: { ...shunt, starterSteps: ['1.3 ohm', '0.8 ohm', '0.5 ohm'] }, readings: { starterResistance: '1.3 ohm' } });
    expect(parsed.machine.starterSteps).toEqual([1.3, 0.8, 0.5]);
    expect(parsed.readings?.starterResistance).toBe(1.3);
  });
});

describe('the no-load reference point', () => {
  it("takes the plate's no-load current as the reference for any connection, before the 10 % rule of thumb (common practice)", () => {
    const plate = { armatureVoltage: 230, armatureCurrent: 60, speed: 1150, fieldCurrent: 1.4 };
    const compound: ModelInput['machine'] = { connection: 'compound-cumulative', nameplate: { ...plate, noLoadCurrent: 4.2 } };
    expect(quantityOf({ machine: compound, readings: { noLoadArmatureCurrent: 4.4 } }, 'noLoadCurrent').value).toBe(4.2);
    // Without it: 10 % of the rated 60 A.
    expect(quantityOf({ machine: { ...compound, nameplate: plate }, readings: { noLoadArmatureCurrent: 4.4 } }, 'noLoadCurrent').value).toBeCloseTo(6, 4);
  });
});
