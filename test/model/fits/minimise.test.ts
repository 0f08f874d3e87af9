/**
 * The fits' one-parameter search (src/model/fits/minimise.ts): a grid, then Brent's method.
 * Checked on functions whose minimum is known in closed form.
 */
import { describe, expect, it } from 'vitest';
import { brent, minimise } from '../../../src/model/fits/minimise.js';

/** f with a count of its evaluations. */
function counted(f: (x: number) => number): { f: (x: number) => number; calls: () => number } {
  let n = 0;
  return { f: (x) => (n++, f(x)), calls: () => n };
}

describe('minimise', () => {
  it('finds the vertex of a parabola to about √ε, in few evaluations past the grid', () => {
    const c = counted((x) => (x - 0.3) ** 2 + 2);
    expect(minimise(c.f, 0, 2)).toBeCloseTo(0.3, 7);
    // The grid's 65 points, then Brent's method: the parabolic step lands on the vertex at once,
    // and a few steps of the tolerance's size confirm it.
    expect(c.calls()).toBeLessThan(65 + 25);
  });

  it('finds the minimum of x − ln x at x = 1 (derivative 1 − 1/x)', () => {
    expect(minimise((x) => x - Math.log(x), 0.1, 5)).toBeCloseTo(1, 6);
  });

  it('takes the lower of two basins, wherever the search would start', () => {
    // Minima near 0.4 (value 0.5) and at 1.6 (value 0): the grid picks the second's basin.
    const f = (x: number) => Math.min((x - 0.4) ** 2 + 0.5, 3 * (x - 1.6) ** 2);
    expect(minimise(f, 0, 2)).toBeCloseTo(1.6, 6);
  });

  it('ends at the edge of the range when the function falls all the way to it', () => {
    expect(minimise((x) => -x, -1, 3)).toBeCloseTo(3, 6);
    expect(minimise((x) => Math.exp(x), -2, 1)).toBeCloseTo(-2, 6);
  });

  it('closes in on a smooth minimum in far fewer steps than golden section alone', () => {
    // Golden section shrinks the bracket by 0.618 a step: from 2 to √ε (1.5e-8) takes 39 steps.
    const c = counted((x) => Math.cosh(x - 0.123456));
    expect(brent(c.f, -1, 1, 1e-12)).toBeCloseTo(0.123456, 7);
    expect(c.calls()).toBeLessThan(30);
  });
});
