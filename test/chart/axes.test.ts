import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { chartAxes, niceAxis, speedAt } from '../../src/chart/axes.js';
import { curvesFor, interpolate, seriesCurves, shuntCurves, shuntMachine } from './machines.js';

describe('the healthy curves from the model', () => {
  it('pass through the shunt rated point at rated voltage', () => {
    const curves = curvesFor({ machine: shuntMachine });
    expect(curves.voltage).toBe(220);
    expect(speedAt(curves.healthy, 24)).toBeCloseTo(1500, 0);
  });

  it('stay near the shunt rated point at the measured 221 V', () => {
    const curves = shuntCurves();
    expect(curves.voltage).toBe(221);
    const n = speedAt(curves.healthy, curves.ratedCurrent)!;
    expect(Math.abs(n / 1500 - 1)).toBeLessThan(0.01);
    expect(n).toBeGreaterThan(1500);
  });

  it('give the series machine 600 rpm at 85 A and 250 V', () => {
    const curves = seriesCurves();
    expect(curves.voltage).toBe(250);
    expect(curves.ratedCurrent).toBe(85);
    expect(Math.abs(speedAt(curves.healthy, 85)! - 600)).toBeLessThanOrEqual(1);
  });

  it('make a series machine fall faster than a shunt one over 0.5–1.5 per unit current', () => {
    const drop = (curves: ReturnType<typeof shuntCurves>) => {
      const rated = curves.ratedCurrent;
      return (speedAt(curves.healthy, 0.5 * rated)! - speedAt(curves.healthy, 1.5 * rated)!) / speedAt(curves.healthy, rated)!;
    };
    const shunt = drop(curvesFor({ machine: shuntMachine }));
    const series = drop(seriesCurves());
    expect(shunt).toBeGreaterThan(0);
    expect(series).toBeGreaterThan(5 * shunt);
  });
});

describe('speedAt', () => {
  it('interpolates in a straight line between curve points', () => {
    const curve = [{ current: 0, speed: 1000 }, { current: 10, speed: 900 }, { current: 20, speed: 700 }];
    expect(speedAt(curve, 5)).toBe(950);
    expect(speedAt(curve, 15)).toBe(800);
    expect(speedAt(curve, 20)).toBe(700);
    expect(speedAt(curve, -1)).toBeUndefined();
    expect(speedAt(curve, 21)).toBeUndefined();
  });

  it('agrees with a separately written interpolation on the model curve', () => {
    const curves = shuntCurves();
    for (const current of [0.7, 9.5, 23.9, 35.2]) expect(speedAt(curves.healthy, current)).toBeCloseTo(interpolate(curves.healthy, current), 9);
  });
});

describe('niceAxis', () => {
  it('covers the range in evenly spaced round steps', () => {
    fc.assert(
      fc.property(fc.integer({ min: -1e7, max: 1e7 }), fc.integer({ min: 1, max: 1e7 }), (minCents, spanCents) => {
        const min = minCents / 100;
        const max = (minCents + spanCents) / 100;
        const axis = niceAxis(min, max);
        expect(axis.min).toBeLessThanOrEqual(min);
        expect(axis.max).toBeGreaterThanOrEqual(max - 1e-9 * Math.abs(max));
        const mantissa = axis.step / 10 ** Math.floor(Math.log10(axis.step));
        expect([1, 2, 2.5, 5].some((m) => Math.abs(mantissa - m) < 1e-9)).toBe(true);
        expect(axis.ticks.length).toBeGreaterThanOrEqual(2);
        expect(axis.ticks.length).toBeLessThanOrEqual(12);
        axis.ticks.forEach((t, k) => expect(t).toBeCloseTo(axis.min + k * axis.step, 6));
      }),
    );
  });
});

describe('chartAxes', () => {
  it('shows every shunt point without clipping, from 0 rpm and 0 A', () => {
    const curves = shuntCurves();
    const axes = chartAxes(curves);
    expect(axes.clipped).toBe(false);
    expect(axes.speed.min).toBe(0);
    expect(axes.current.min).toBe(0);
    const speeds = [...curves.healthy, ...curves.withMeasuredField!, curves.measured!].map((p) => p.speed);
    expect(axes.speed.max).toBeGreaterThanOrEqual(Math.max(...speeds));
    expect(axes.current.max).toBeGreaterThanOrEqual(36);
  });

  it('clips the series curve near 0 A but keeps twice the rated-point speed', () => {
    const curves = seriesCurves();
    const axes = chartAxes(curves);
    expect(axes.clipped).toBe(true);
    expect(axes.speed.max).toBeGreaterThanOrEqual(2 * 600);
    expect(axes.speed.max).toBeLessThan(Math.max(...curves.healthy.map((p) => p.speed)));
  });

  it('keeps a runaway measured point on the chart with headroom', () => {
    const curves = { ...seriesCurves(), measured: { current: 20, speed: 3000 } };
    expect(chartAxes(curves).speed.max).toBeGreaterThanOrEqual(1.3 * 3000);
  });
});
