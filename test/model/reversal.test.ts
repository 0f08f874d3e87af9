import { describe, expect, it } from 'vitest';
import { afterSwap } from '../../src/model/reversal.js';

// Reversing rules: torque ∝ Φ·Ia, so reverse either the armature or the field current, never
// both (physics; EASA handbook NEMA DC connections: interchange A1 and A2 to reverse).
describe('reversal physics', () => {
  it('does not reverse a wound-field machine when its supply is reversed', () => {
    for (const c of ['shunt', 'series', 'compound-cumulative'] as const) expect(afterSwap(c, 'supply').reversed).toBe(false);
  });
  it('reverses a wound-field machine when the armature or the field alone is swapped', () => {
    expect(afterSwap('shunt', 'armature').reversed).toBe(true);
    expect(afterSwap('shunt', 'shunt-field').reversed).toBe(true);
    expect(afterSwap('series', 'series-field').reversed).toBe(true);
    expect(afterSwap('separately-excited', 'armature').reversed).toBe(true);
  });
  it('reverses a permanent-magnet machine with its supply polarity', () => {
    expect(afterSwap('permanent-magnet', 'supply').reversed).toBe(true);
  });
  it('keeps a compound machine cumulative when it is reversed at the armature', () => {
    expect(afterSwap('compound-cumulative', 'armature')).toEqual({ reversed: true, cumulative: true });
  });
  it('turns a cumulative compound differential when only one of its fields is swapped', () => {
    expect(afterSwap('compound-cumulative', 'series-field').cumulative).toBe(false);
    expect(afterSwap('compound-cumulative', 'shunt-field')).toEqual({ reversed: true, cumulative: false });
    expect(afterSwap('compound-cumulative', 'both-fields')).toEqual({ reversed: true, cumulative: true });
  });
});
