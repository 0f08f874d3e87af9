import { describe, expect, it } from 'vitest';
import { fromSvgPoint, speedChartSvg, svgFrame, toSvgPoint } from '../../src/chart/svg-chart.js';
import { summarizeSpeedChart } from '../../src/chart/text-chart.js';
import type { CurvePoint } from '../../src/model/curve.js';
import { interpolate, seriesCurves, shuntCurves } from './machines.js';

function polylineVertices(svg: string, series: string): Array<{ x: number; y: number }> {
  const tag = new RegExp(`<polyline[^>]*data-series="${series}"[^>]*>`).exec(svg)?.[0];
  if (!tag) throw new Error(`no ${series} polyline`);
  const points = /points="([^"]*)"/.exec(tag)![1]!;
  return points.split(' ').map((pair) => {
    const [x, y] = pair.split(',').map(Number);
    return { x: x!, y: y! };
  });
}

/** Open and close tags must pair up, or a browser would not show the file. */
function unbalancedTag(svg: string): string | undefined {
  const open: string[] = [];
  for (const m of svg.matchAll(/<(\/?)([a-zA-Z]+)[^>]*?(\/?)>/g)) {
    const [, closing, name, selfClosing] = m;
    if (selfClosing) continue;
    if (!closing) open.push(name!);
    else if (open.pop() !== name) return name;
  }
  return open[0];
}

describe('speedChartSvg', () => {
  const opts = { width: 640, height: 400 };

  it('maps the axis corners of the data window onto the plot corners', () => {
    const frame = svgFrame(shuntCurves(), opts);
    const { current, speed } = frame.axes;
    expect(toSvgPoint(frame, { current: current.min, speed: speed.min })).toEqual({ x: frame.left, y: frame.top + frame.plotHeight });
    expect(toSvgPoint(frame, { current: current.max, speed: speed.max })).toEqual({ x: frame.left + frame.plotWidth, y: frame.top });
    expect(frame.left + frame.plotWidth).toBeLessThanOrEqual(640);
    expect(frame.top + frame.plotHeight).toBeLessThanOrEqual(400);
  });

  for (const [name, make] of [['shunt', shuntCurves], ['series', seriesCurves]] as const)
    it(`draws every ${name} curve point as a polyline vertex that maps back to it`, () => {
      const curves = make();
      const svg = speedChartSvg(curves, opts);
      const frame = svgFrame(curves, opts);
      // 0.01 px of rounding, expressed in amps and rpm.
      const ampsTolerance = (0.006 * (frame.axes.current.max - frame.axes.current.min)) / frame.plotWidth;
      const rpmTolerance = (0.006 * (frame.axes.speed.max - frame.axes.speed.min)) / frame.plotHeight;
      const check = (vertices: Array<{ x: number; y: number }>, points: CurvePoint[]) => {
        expect(vertices).toHaveLength(points.length);
        vertices.forEach((v, k) => {
          const back = fromSvgPoint(frame, v);
          expect(Math.abs(back.current - points[k]!.current)).toBeLessThanOrEqual(ampsTolerance);
          expect(Math.abs(back.speed - points[k]!.speed)).toBeLessThanOrEqual(rpmTolerance);
        });
      };
      check(polylineVertices(svg, 'healthy'), curves.healthy);
      if (curves.withMeasuredField) check(polylineVertices(svg, 'measured-field'), curves.withMeasuredField);
    });

  it('dashes the measured-field curve and not the healthy one', () => {
    const svg = speedChartSvg(shuntCurves());
    expect(/<polyline[^>]*data-series="measured-field"[^>]*>/.exec(svg)?.[0]).toContain('stroke-dasharray');
    expect(/<polyline[^>]*data-series="healthy"[^>]*>/.exec(svg)?.[0]).not.toContain('stroke-dasharray');
  });

  it('marks the measured point once, above the healthy curve at its current', () => {
    const curves = shuntCurves();
    const svg = speedChartSvg(curves, opts);
    const circles = [...svg.matchAll(/<circle[^>]*data-series="measured"[^>]*>/g)];
    expect(circles).toHaveLength(1);
    const cx = Number(/cx="([^"]+)"/.exec(circles[0]![0])![1]);
    const cy = Number(/cy="([^"]+)"/.exec(circles[0]![0])![1]);
    const frame = svgFrame(curves, opts);
    const back = fromSvgPoint(frame, { x: cx, y: cy });
    expect(back.current).toBeCloseTo(9.5, 1);
    expect(back.speed).toBeCloseTo(2010, -1);
    const healthyHere = toSvgPoint(frame, { current: 9.5, speed: interpolate(curves.healthy, 9.5) });
    expect(cy).toBeLessThan(healthyHere.y);
  });

  it('leaves out the measured point and field curve when there are none', () => {
    const svg = speedChartSvg(seriesCurves());
    expect(svg).not.toContain('data-series="measured"');
    expect(svg).not.toContain('data-series="measured-field"');
    expect(svg).toContain('clipped above');
  });

  it('is self-contained, well formed and described for screen readers', () => {
    const curves = shuntCurves();
    const svg = speedChartSvg(curves);
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(svg).not.toMatch(/<script|href|url\(|@import|<image|<foreignObject/i);
    expect(svg.match(/https?:/g)).toHaveLength(1);
    expect(unbalancedTag(svg)).toBeUndefined();
    expect(svg).toMatch(/<title>[^<]*221 V<\/title>/);
    expect(svg).toContain(`<desc>${summarizeSpeedChart(curves)}</desc>`);
    expect(svg).toContain('speed (rpm)');
    expect(svg).toContain('armature current (A)');
    for (const tick of svgFrame(curves).axes.speed.ticks) expect(svg).toContain(`>${tick}</text>`);
  });

  it('refuses a size with no room to plot', () => {
    expect(() => speedChartSvg(shuntCurves(), { width: 50, height: 50 })).toThrow(RangeError);
  });
});
