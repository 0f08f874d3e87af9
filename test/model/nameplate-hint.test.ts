import { describe, expect, it } from 'vitest';
import { computeExpectations, nameplateHint } from '../../src/model/expected.js';

// A motor's efficiency lies between about 50 % and 97 % (common practice); outside it a plate value is wrong.
describe('the hint for a nameplate whose output and input disagree', () => {
  it('says kW typed as W only when the output is a thousandth of a plausible one', () => {
    expect(nameplateHint(4.5 / 5.28)).not.toContain('kW typed as W'); // plausible: never asked
    expect(nameplateHint(0.0045 / 5.28)).toContain('kW typed as W');
  });

  it('for an output above the input points at hp, decimal slips and the wrong rated values instead', () => {
    const hint = nameplateHint(1.34);
    expect(hint).not.toContain('kW typed as W');
    expect(hint).toContain('cannot exceed the input');
    expect(hint).toContain('hp');
  });

  it('reaches the finding: 220 V × 24 A is 5.28 kW in, so 7.5 kW out is impossible', () => {
    const e = computeExpectations({ machine: { connection: 'shunt', nameplate: { armatureVoltage: 220, armatureCurrent: 24, power: 7500, speed: 1500 } }, readings: {} });
    const f = e.findings.find((x) => x.code === 'nameplate-power-implausible');
    expect(f?.says).toContain('142 % of the 5280 W input');
    expect(f?.says).toContain('cannot exceed the input');
    expect(f?.says).not.toContain('kW typed as W');
  });
});
