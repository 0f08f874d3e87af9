/**
 * Speed against armature current for the terminal: curves in braille dots (2 × 4 per cell), the
 * measured point as its own glyph, numbered axes and a legend. Pure: returns the lines as one string.
 */
import type { CurvePoint, SpeedCurves } from '../model/curve.js';
import { chartAxes, formatAmps, formatRpm, formatTick, speedAt, type ChartAxes } from './axes.js';

export interface TextChartOptions {
  /** Total columns including the axis labels. */
  width?: number;
  /** Rows of plot, not counting axes and legend. */
  height?: number;
  color?: boolean;
}

export interface TextChartLayout {
  axes: ChartAxes;
  width: number;
  /** Columns before the plot: right-aligned speed labels, a space and the axis. */
  gutter: number;
  columns: number;
  rows: number;
  /** Index of the output line holding the top plot row. */
  firstPlotLine: number;
}

export const DEFAULT_WIDTH = 60;
export const DEFAULT_HEIGHT = 12;
const MIN_WIDTH = 20;
const MIN_HEIGHT = 4;
const MIN_COLUMNS = 8;

/** Neutral East Asian width, so the column count holds in every terminal. */
export const MEASURED_MARKER = '◉';
/** Legend samples: the same glyphs a flat stretch of each curve leaves. */
export const HEALTHY_SAMPLE = '⠤⠤';
/**
 * The measured-field curve is drawn in its own glyph, one per cell it passes, not in braille: dots
 * of another density read apart only on a flat stretch, and two braille curves merge where they
 * meet. Where both curves share a cell, the healthy one is drawn.
 */
export const FIELD_GLYPH = '·';
export const FIELD_SAMPLE = FIELD_GLYPH.repeat(2);

const BRAILLE_BASE = 0x2800;
/** Bit for dot (column 0–1, row 0–3) of a braille cell. */
const BRAILLE_BITS = [
  [0x01, 0x02, 0x04, 0x40],
  [0x08, 0x10, 0x20, 0x80],
] as const;

const SGR = {
  healthy: '\u001b[32m',
  field: '\u001b[33m',
  measured: '\u001b[1;31m',
  reset: '\u001b[0m',
} as const;
type Style = Exclude<keyof typeof SGR, 'reset'>;

export function speedChartLayout(curves: SpeedCurves, opts: TextChartOptions = {}): TextChartLayout {
  const width = Math.floor(opts.width ?? DEFAULT_WIDTH);
  const rows = Math.floor(opts.height ?? DEFAULT_HEIGHT);
  if (!(width >= MIN_WIDTH)) throw new RangeError(`chart width ${width} is below ${MIN_WIDTH} columns`);
  if (!(rows >= MIN_HEIGHT)) throw new RangeError(`chart height ${rows} is below ${MIN_HEIGHT} rows`);
  const axes = chartAxes(curves);
  const labelWidth = Math.max(...axes.speed.ticks.map((t) => formatTick(t, axes.speed.step).length));
  const gutter = labelWidth + 2;
  const columns = width - gutter;
  if (columns < MIN_COLUMNS) throw new RangeError(`chart width ${width} leaves no room to plot`);
  return { axes, width, gutter, columns, rows, firstPlotLine: 1 };
}

/** The braille dot a point falls on, counted from the top-left of the plot; may lie outside it. */
export function dotOf(layout: TextChartLayout, point: CurvePoint): { x: number; y: number } {
  const { current, speed } = layout.axes;
  return {
    x: Math.round(((point.current - current.min) / (current.max - current.min)) * (2 * layout.columns - 1)),
    y: Math.round(((speed.max - point.speed) / (speed.max - speed.min)) * (4 * layout.rows - 1)),
  };
}

export function cellOf(layout: TextChartLayout, point: CurvePoint): { column: number; row: number } {
  const dot = dotOf(layout, point);
  return { column: Math.floor(dot.x / 2), row: Math.floor(dot.y / 4) };
}

/** Dots along a curve in order, clipped to the plot; a stretch above the top is simply left out. */
function traceDots(layout: TextChartLayout, curve: readonly CurvePoint[]): Array<{ x: number; y: number }> {
  const { current, speed } = layout.axes;
  const toDot = (p: CurvePoint) => ({
    x: ((p.current - current.min) / (current.max - current.min)) * (2 * layout.columns - 1),
    y: ((speed.max - p.speed) / (speed.max - speed.min)) * (4 * layout.rows - 1),
  });
  const out: Array<{ x: number; y: number }> = [];
  const maxX = 2 * layout.columns - 1;
  const maxY = 4 * layout.rows - 1;
  for (let k = 1; k < curve.length; k++) {
    const a = toDot(curve[k - 1]!);
    const b = toDot(curve[k]!);
    const span = clipSegment(a, b, maxX, maxY);
    if (!span) continue;
    const [t0, t1] = span;
    const steps = Math.max(1, Math.ceil(Math.max(Math.abs(b.x - a.x), Math.abs(b.y - a.y)) * (t1 - t0) * 2));
    for (let s = 0; s <= steps; s++) {
      const t = t0 + ((t1 - t0) * s) / steps;
      const dot = { x: Math.round(a.x + (b.x - a.x) * t), y: Math.round(a.y + (b.y - a.y) * t) };
      const last = out[out.length - 1];
      if (!last || last.x !== dot.x || last.y !== dot.y) out.push(dot);
    }
  }
  return out;
}

/** Liang–Barsky: the part (t0..t1) of segment a→b that lies within the plot's dots. */
function clipSegment(a: { x: number; y: number }, b: { x: number; y: number }, maxX: number, maxY: number): [number, number] | undefined {
  let t0 = 0;
  let t1 = 1;
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  const edges: Array<[number, number]> = [
    [-dx, a.x + 0.5],
    [dx, maxX + 0.5 - a.x],
    [-dy, a.y + 0.5],
    [dy, maxY + 0.5 - a.y],
  ];
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q < 0) return undefined;
      continue;
    }
    const r = q / p;
    if (p < 0) t0 = Math.max(t0, r);
    else t1 = Math.min(t1, r);
    if (t0 > t1) return undefined;
  }
  return [t0, t1];
}

function paint(style: Style | undefined, text: string, color: boolean): string {
  return color && style ? `${SGR[style]}${text}${SGR.reset}` : text;
}

/** Greedy wrap of legend entries; an entry wider than the chart is cut rather than overflow. */
function wrapEntries(entries: Array<{ plain: string; painted: string }>, width: number): string[] {
  const lines: string[] = [];
  let plainLine = '';
  let paintedLine = '';
  for (const e of entries) {
    const fitted = e.plain.length > width ? { plain: e.plain.slice(0, width), painted: e.plain.slice(0, width) } : e;
    if (plainLine && plainLine.length + 2 + fitted.plain.length <= width) {
      plainLine += `  ${fitted.plain}`;
      paintedLine += `  ${fitted.painted}`;
    } else {
      if (plainLine) lines.push(paintedLine);
      plainLine = fitted.plain;
      paintedLine = fitted.painted;
    }
  }
  if (plainLine) lines.push(paintedLine);
  return lines;
}

export function renderSpeedChart(curves: SpeedCurves, opts: TextChartOptions = {}): string {
  const color = opts.color ?? false;
  const layout = speedChartLayout(curves, opts);
  const { axes, width, gutter, columns, rows } = layout;
  const cellCount = columns * rows;
  const healthyBits = new Uint8Array(cellCount);
  const fieldBits = new Uint8Array(cellCount);
  const setDot = (bits: Uint8Array, dot: { x: number; y: number }) => {
    bits[Math.floor(dot.y / 4) * columns + Math.floor(dot.x / 2)]! |= BRAILLE_BITS[dot.x % 2 as 0 | 1][dot.y % 4 as 0 | 1 | 2 | 3];
  };
  for (const dot of traceDots(layout, curves.healthy)) setDot(healthyBits, dot);
  if (curves.withMeasuredField) for (const dot of traceDots(layout, curves.withMeasuredField)) setDot(fieldBits, dot);
  const marker = curves.measured ? cellOf(layout, curves.measured) : undefined;

  const speedRows = new Map<number, string>();
  let lastRow = Infinity;
  for (const tick of axes.speed.ticks) {
    const row = cellOf(layout, { current: axes.current.min, speed: tick }).row;
    if (row < 0 || row >= rows || row > lastRow - 2) continue;
    speedRows.set(row, formatTick(tick, axes.speed.step));
    lastRow = row;
  }

  const lines: string[] = [];
  const clipNote = axes.clipped ? `, clipped above ${formatTick(axes.speed.max, axes.speed.step)}` : '';
  lines.push(`speed (rpm)${clipNote}`.slice(0, width));
  for (let row = 0; row < rows; row++) {
    const label = speedRows.get(row);
    let line = `${(label ?? '').padStart(gutter - 2)} ${label === undefined ? '|' : '+'}`;
    let run: { style: Style | undefined; text: string } = { style: undefined, text: '' };
    for (let column = 0; column < columns; column++) {
      let cell: { style: Style | undefined; text: string };
      if (marker && marker.row === row && marker.column === column) cell = { style: 'measured', text: MEASURED_MARKER };
      else {
        const h = healthyBits[row * columns + column]!;
        const f = fieldBits[row * columns + column]!;
        // A blank cell as a space, so lines trim and copy cleanly.
        cell = h ? { style: 'healthy', text: String.fromCharCode(BRAILLE_BASE + h) } : f ? { style: 'field', text: FIELD_GLYPH } : { style: undefined, text: ' ' };
      }
      if (cell.style === run.style) run.text += cell.text;
      else {
        line += paint(run.style, run.text, color);
        run = cell;
      }
    }
    line += paint(run.style, run.text, color);
    lines.push(line.trimEnd());
  }

  const axisLine = [...`${' '.repeat(gutter - 1)}+${'-'.repeat(columns)}`];
  const labelLine = Array<string>(width).fill(' ');
  let labelEnd = -1;
  for (const tick of axes.current.ticks) {
    const at = gutter + cellOf(layout, { current: tick, speed: axes.speed.min }).column;
    if (at > gutter) axisLine[at] = '+';
    const text = formatTick(tick, axes.current.step);
    const start = Math.min(Math.max(0, at - Math.floor((text.length - 1) / 2)), width - text.length);
    if (start <= labelEnd + 1) continue;
    [...text].forEach((ch, k) => (labelLine[start + k] = ch));
    labelEnd = start + text.length - 1;
  }
  lines.push(axisLine.join(''), labelLine.join('').trimEnd(), 'armature current (A)'.padStart(width).slice(-width));

  const entry = (style: Style, glyph: string, text: string) => ({ plain: `${glyph} ${text}`, painted: `${paint(style, glyph, color)} ${text}` });
  const legend = [entry('healthy', HEALTHY_SAMPLE, `healthy at ${formatAmps(curves.voltage)} V`)];
  if (curves.withMeasuredField) legend.push(entry('field', FIELD_SAMPLE, 'with measured field'));
  if (curves.measured) legend.push(entry('measured', MEASURED_MARKER, `measured ${formatRpm(curves.measured.speed)} rpm at ${formatAmps(curves.measured.current)} A`));
  lines.push(...wrapEntries(legend, width));
  return lines.join('\n');
}

/** One line of plain text saying what the chart shows, for screen readers and logs. */
export function summarizeSpeedChart(curves: SpeedCurves): string {
  const describe = (curve: readonly CurvePoint[]) => {
    const first = curve[0]!;
    const last = curve[curve.length - 1]!;
    const trend = last.speed < first.speed ? 'falling' : last.speed > first.speed ? 'rising' : 'level';
    return `${formatRpm(first.speed)} rpm at ${formatAmps(first.current)} A ${trend} to ${formatRpm(last.speed)} rpm at ${formatAmps(last.current)} A`;
  };
  const parts = [`Healthy machine at ${formatAmps(curves.voltage)} V: ${describe(curves.healthy)}`];
  const m = curves.measured;
  if (m) {
    const expected = speedAt(curves.healthy, m.current);
    const head = `measured ${formatRpm(m.speed)} rpm at ${formatAmps(m.current)} A`;
    if (expected === undefined || !(expected > 0)) {
      const lo = curves.healthy[0]!.current;
      const hi = curves.healthy[curves.healthy.length - 1]!.current;
      parts.push(`${head}, outside the healthy curve's ${formatAmps(lo)}–${formatAmps(hi)} A`);
    } else {
      parts.push(`${head}, ${Math.round((100 * m.speed) / expected)} % of the ${formatRpm(expected)} rpm a healthy machine runs at that current`);
    }
  }
  if (curves.withMeasuredField) parts.push(`with the measured field current: ${describe(curves.withMeasuredField)}`);
  const axes = chartAxes(curves);
  if (axes.clipped) parts.push(`speed axis clipped at ${formatTick(axes.speed.max, axes.speed.step)} rpm`);
  return `${parts.join('; ')}.`;
}
