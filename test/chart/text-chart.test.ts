import { stripVTControlCharacters } from 'node:util';
import { describe, expect, it } from 'vitest';
import { FIELD_GLYPH, FIELD_SAMPLE, HEALTHY_SAMPLE, MEASURED_MARKER, renderSpeedChart, speedChartLayout, summarizeSpeedChart } from '../../src/chart/text-chart.js';
import type { SpeedCurves } from '../../src/model/curve.js';
import { interpolate, seriesCurves, shuntCurves } from './machines.js';

const ESC = '\u001b';
const BRAILLE = /[\u2801-\u28ff]/;
const dotsIn = (ch: string) => {
  let bits = ch.codePointAt(0)! - 0x2800;
  let n = 0;
  for (; bits; bits >>= 1) n += bits & 1;
  return n;
};

function findAll(text: string, glyph: string): Array<{ line: number; column: number }> {
  return text.split('\n').flatMap((l, line) => [...l].flatMap((ch, column) => (ch === glyph ? [{ line, column }] : [])));
}

describe('renderSpeedChart', () => {
  const cases: Array<[string, () => SpeedCurves]> = [
    ['shunt', shuntCurves],
    ['series', seriesCurves],
  ];
  for (const [name, make] of cases)
    for (const width of [60, 40])
      for (const color of [false, true])
        it(`fits ${width} columns for the ${name} machine${color ? ' in colour' : ''}`, () => {
          const out = renderSpeedChart(make(), { width, color });
          const lines = out.split('\n');
          expect(lines.length).toBeGreaterThan(12);
          for (const l of lines) expect([...stripVTControlCharacters(l)].length, l).toBeLessThanOrEqual(width);
        });

  it('writes no escape codes without colour, the default', () => {
    expect(renderSpeedChart(shuntCurves())).not.toContain(ESC);
    expect(renderSpeedChart(shuntCurves(), { color: false, width: 40 })).not.toContain(ESC);
  });

  it('adds colour and nothing else when asked', () => {
    const colour = renderSpeedChart(shuntCurves(), { color: true });
    expect(colour).toContain(`${ESC}[`);
    expect(stripVTControlCharacters(colour)).toBe(renderSpeedChart(shuntCurves()));
  });

  it('plots the healthy curve in braille within the plot rows', () => {
    const layout = speedChartLayout(shuntCurves());
    const plotRows = renderSpeedChart(shuntCurves()).split('\n').slice(layout.firstPlotLine, layout.firstPlotLine + layout.rows);
    expect(plotRows.filter((l) => BRAILLE.test(l)).length).toBeGreaterThanOrEqual(2);
  });

  for (const width of [60, 40])
    it(`puts the measured marker once, in the cell of 9.5 A and 2010 rpm, at ${width} columns`, () => {
      const curves = shuntCurves();
      const out = renderSpeedChart(curves, { width });
      const found = findAll(out, MEASURED_MARKER).filter((f) => f.line < out.split('\n').length - 2);
      expect(found).toHaveLength(1);
      const { axes, columns, rows, gutter, firstPlotLine } = speedChartLayout(curves, { width });
      const dotX = Math.round(((9.5 - axes.current.min) / (axes.current.max - axes.current.min)) * (2 * columns - 1));
      const dotY = Math.round(((axes.speed.max - 2010) / (axes.speed.max - axes.speed.min)) * (4 * rows - 1));
      expect(found[0]).toEqual({ line: firstPlotLine + Math.floor(dotY / 4), column: gutter + Math.floor(dotX / 2) });
    });

  it('puts the marker where the printed axis labels say 9.5 A and 2010 rpm are', () => {
    const lines = renderSpeedChart(shuntCurves()).split('\n');
    const marker = findAll(lines.join('\n'), MEASURED_MARKER)[0]!;
    const speedLabels = lines.flatMap((l, line) => {
      const m = /^\s*(\d+(?:\.\d+)?) \+/.exec(l);
      return m ? [{ line, value: Number(m[1]) }] : [];
    });
    const top = speedLabels[0]!;
    const bottom = speedLabels[speedLabels.length - 1]!;
    const lineFor2010 = top.line + ((top.value - 2010) / (top.value - bottom.value)) * (bottom.line - top.line);
    expect(Math.abs(marker.line - lineFor2010)).toBeLessThanOrEqual(1);

    const axisLine = lines.findIndex((l) => /^\s*\+-+/.test(l));
    const currentLabels = [...lines[axisLine + 1]!.matchAll(/\d+(?:\.\d+)?/g)].map((m) => ({ column: m.index + (m[0].length - 1) / 2, value: Number(m[0]) }));
    const first = currentLabels[0]!;
    const last = currentLabels[currentLabels.length - 1]!;
    const columnFor9p5 = first.column + ((9.5 - first.value) / (last.value - first.value)) * (last.column - first.column);
    expect(Math.abs(marker.column - columnFor9p5)).toBeLessThanOrEqual(1);
  });

  it('draws the measured point above the healthy curve, since it runs 29 % fast', () => {
    const lines = renderSpeedChart(shuntCurves()).split('\n');
    const marker = findAll(lines.join('\n'), MEASURED_MARKER)[0]!;
    const healthyBelow = lines.slice(marker.line + 1).some((l) => BRAILLE.test([...l][marker.column] ?? ''));
    expect(healthyBelow).toBe(true);
  });

  it('draws the measured-field curve in its own glyph, so it reads apart from the healthy one without colour', () => {
    const flat = (speed: number) => [0, 5, 10, 15, 20].map((current) => ({ current, speed }));
    const curves: SpeedCurves = { voltage: 200, ratedCurrent: 10, healthy: flat(1000), withMeasuredField: flat(2000) };
    const layout = speedChartLayout(curves);
    const lines = renderSpeedChart(curves).split('\n');
    const plotCells = (speed: number) => {
      const row = layout.firstPlotLine + Math.floor(Math.round(((layout.axes.speed.max - speed) / layout.axes.speed.max) * (4 * layout.rows - 1)) / 4);
      return [...lines[row]!].slice(layout.gutter);
    };
    const solid = plotCells(1000);
    const dotted = plotCells(2000);
    expect(solid).toHaveLength(layout.columns);
    expect(dotted).toHaveLength(layout.columns);
    expect(solid.every((ch) => dotsIn(ch) === 2)).toBe(true);
    expect(dotted.every((ch) => ch === FIELD_GLYPH)).toBe(true);
    // Without colour codes, as NO_COLOR draws it.
    expect(lines.join('\n')).not.toContain('\u001b[');
  });

  it('names each series in the legend with its own glyph', () => {
    const out = renderSpeedChart(shuntCurves(), { width: 40 });
    expect(out).toContain(`${HEALTHY_SAMPLE} healthy at 221 V`);
    expect(out).toContain(`${FIELD_SAMPLE} with measured field`);
    expect(out).toContain(`${MEASURED_MARKER} measured 2010 rpm at 9.5 A`);
    expect(new Set([HEALTHY_SAMPLE, FIELD_SAMPLE, MEASURED_MARKER]).size).toBe(3);
    const series = renderSpeedChart(seriesCurves());
    expect(series).not.toContain('measured');
    expect(series).not.toContain(MEASURED_MARKER);
  });

  it('labels both axes with their units', () => {
    const out = renderSpeedChart(shuntCurves());
    expect(out.split('\n')[0]).toContain('rpm');
    expect(out).toContain('(A)');
  });

  it('says so when the speed axis is clipped', () => {
    expect(renderSpeedChart(seriesCurves()).split('\n')[0]).toContain('clipped');
    expect(renderSpeedChart(shuntCurves())).not.toContain('clipped');
  });

  it('refuses a width it cannot fit', () => {
    expect(() => renderSpeedChart(shuntCurves(), { width: 12 })).toThrow(RangeError);
    expect(() => renderSpeedChart(shuntCurves(), { height: 1 })).toThrow(RangeError);
  });
});

describe('summarizeSpeedChart', () => {
  it('gives the measured speed and the healthy speed at the measured current', () => {
    const curves = shuntCurves();
    const expected = interpolate(curves.healthy, 9.5);
    const line = summarizeSpeedChart(curves);
    expect(line).not.toContain('\n');
    expect(line).toContain('221 V');
    expect(line).toContain('measured 2010 rpm at 9.5 A');
    expect(line).toContain(`${Math.round(expected)} rpm a healthy machine runs at that current`);
    expect(line).toContain(`${Math.round((100 * 2010) / expected)} %`);
    expect(line).toContain(`${Math.round(curves.healthy[0]!.speed)} rpm at 0 A falling to ${Math.round(curves.healthy.at(-1)!.speed)} rpm at 36 A`);
    expect(line).toContain(`with the measured field current: ${Math.round(curves.withMeasuredField![0]!.speed)} rpm at 0 A`);
    expect(line).not.toContain('clipped');
  });

  it('says clipped for the series curve', () => {
    expect(summarizeSpeedChart(seriesCurves())).toMatch(/clipped at \d+ rpm/);
  });

  it('gives no percentage when the measured current is off the curve', () => {
    const line = summarizeSpeedChart({ ...shuntCurves(), measured: { current: 50, speed: 1400 } });
    expect(line).toContain('outside');
    expect(line).not.toContain('%');
  });
});
