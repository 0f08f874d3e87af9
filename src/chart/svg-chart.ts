/**
 * The speed–current chart as a self-contained SVG for reports: no scripts, no external references.
 * Curves carry data-series attributes so a page (or a test) can find them.
 */
import type { CurvePoint, SpeedCurves } from '../model/curve.js';
import { chartAxes, formatAmps, formatTick, type ChartAxes } from './axes.js';
import { summarizeSpeedChart } from './text-chart.js';

export interface SvgChartOptions {
  width?: number;
  height?: number;
}

/** Where the plot sits in the SVG and which data window it shows. */
export interface SvgFrame {
  axes: ChartAxes;
  width: number;
  height: number;
  left: number;
  top: number;
  plotWidth: number;
  plotHeight: number;
}

export const DEFAULT_SVG_WIDTH = 640;
export const DEFAULT_SVG_HEIGHT = 400;
const MARGIN = { left: 64, right: 20, top: 36, bottom: 92 } as const;
const COLOURS = { healthy: '#1f6f43', field: '#b35c00', measured: '#b3122e', axis: '#333333', grid: '#dddddd' } as const;

export function svgFrame(curves: SpeedCurves, opts: SvgChartOptions = {}): SvgFrame {
  const width = opts.width ?? DEFAULT_SVG_WIDTH;
  const height = opts.height ?? DEFAULT_SVG_HEIGHT;
  const plotWidth = width - MARGIN.left - MARGIN.right;
  const plotHeight = height - MARGIN.top - MARGIN.bottom;
  if (!(plotWidth > 0 && plotHeight > 0)) throw new RangeError(`SVG ${width}×${height} leaves no room to plot`);
  return { axes: chartAxes(curves), width, height, left: MARGIN.left, top: MARGIN.top, plotWidth, plotHeight };
}

/** Two decimals are far below a pixel and keep the markup short. */
const px = (v: number) => Number(v.toFixed(2));

/** Data (A, rpm) to SVG user units; y grows downwards in SVG, so speed is flipped. */
export function toSvgPoint(frame: SvgFrame, point: CurvePoint): { x: number; y: number } {
  const { current, speed } = frame.axes;
  return {
    x: px(frame.left + ((point.current - current.min) / (current.max - current.min)) * frame.plotWidth),
    y: px(frame.top + ((speed.max - point.speed) / (speed.max - speed.min)) * frame.plotHeight),
  };
}

/** The inverse of toSvgPoint, for reading a drawn vertex back as a current and speed. */
export function fromSvgPoint(frame: SvgFrame, at: { x: number; y: number }): CurvePoint {
  const { current, speed } = frame.axes;
  return {
    current: current.min + ((at.x - frame.left) / frame.plotWidth) * (current.max - current.min),
    speed: speed.max - ((at.y - frame.top) / frame.plotHeight) * (speed.max - speed.min),
  };
}

const escapeXml = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

function polyline(frame: SvgFrame, curve: readonly CurvePoint[], series: string, extra: string): string {
  const points = curve.map((p) => {
    const at = toSvgPoint(frame, p);
    return `${at.x},${at.y}`;
  });
  return `<polyline data-series="${series}" points="${points.join(' ')}" fill="none" ${extra}/>`;
}

export function speedChartSvg(curves: SpeedCurves, opts: SvgChartOptions = {}): string {
  const frame = svgFrame(curves, opts);
  const { axes, left, top, plotWidth, plotHeight, width, height } = frame;
  const bottom = top + plotHeight;
  const right = left + plotWidth;
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" font-family="sans-serif" font-size="12">`);
  out.push(`<title>Speed against armature current at ${formatAmps(curves.voltage)} V</title>`);
  out.push(`<desc>${escapeXml(summarizeSpeedChart(curves))}</desc>`);
  out.push(`<rect width="${width}" height="${height}" fill="#ffffff"/>`);

  for (const tick of axes.speed.ticks) {
    const y = toSvgPoint(frame, { current: axes.current.min, speed: tick }).y;
    out.push(`<line x1="${left}" y1="${y}" x2="${right}" y2="${y}" stroke="${COLOURS.grid}"/>`);
    out.push(`<text x="${left - 6}" y="${y}" text-anchor="end" dominant-baseline="middle">${formatTick(tick, axes.speed.step)}</text>`);
  }
  for (const tick of axes.current.ticks) {
    const x = toSvgPoint(frame, { current: tick, speed: axes.speed.min }).x;
    out.push(`<line x1="${x}" y1="${bottom}" x2="${x}" y2="${bottom + 5}" stroke="${COLOURS.axis}"/>`);
    out.push(`<text x="${x}" y="${bottom + 18}" text-anchor="middle">${formatTick(tick, axes.current.step)}</text>`);
  }
  out.push(`<path d="M${left},${top} V${bottom} H${right}" fill="none" stroke="${COLOURS.axis}"/>`);
  out.push(`<text x="8" y="${top - 14}">speed (rpm)</text>`);
  out.push(`<text x="${right}" y="${bottom + 36}" text-anchor="end">armature current (A)</text>`);
  if (axes.clipped) out.push(`<text x="${right}" y="${top - 14}" text-anchor="end">clipped above ${formatTick(axes.speed.max, axes.speed.step)} rpm</text>`);

  // An inner svg clips to the plot without ids (which could clash when several charts share a page);
  // its viewBox equals its place, so coordinates inside are the outer ones.
  out.push(`<svg x="${left}" y="${top}" width="${plotWidth}" height="${plotHeight}" viewBox="${left} ${top} ${plotWidth} ${plotHeight}">`);
  out.push(polyline(frame, curves.healthy, 'healthy', `stroke="${COLOURS.healthy}" stroke-width="2"`));
  if (curves.withMeasuredField) out.push(polyline(frame, curves.withMeasuredField, 'measured-field', `stroke="${COLOURS.field}" stroke-width="2" stroke-dasharray="6 4"`));
  out.push('</svg>');
  if (curves.measured) {
    const at = toSvgPoint(frame, curves.measured);
    out.push(`<circle data-series="measured" cx="${at.x}" cy="${at.y}" r="5" fill="${COLOURS.measured}" stroke="#000000"/>`);
  }

  // Legend: line style and shape tell the series apart as well as colour does.
  const legendY = height - 24;
  const legend: string[] = [
    `<line x1="${left}" y1="${legendY}" x2="${left + 28}" y2="${legendY}" stroke="${COLOURS.healthy}" stroke-width="2"/>`,
    `<text x="${left + 34}" y="${legendY}" dominant-baseline="middle">healthy</text>`,
  ];
  let x = left + 110;
  if (curves.withMeasuredField) {
    legend.push(`<line x1="${x}" y1="${legendY}" x2="${x + 28}" y2="${legendY}" stroke="${COLOURS.field}" stroke-width="2" stroke-dasharray="6 4"/>`);
    legend.push(`<text x="${x + 34}" y="${legendY}" dominant-baseline="middle">with measured field</text>`);
    x += 170;
  }
  if (curves.measured) {
    legend.push(`<circle cx="${x + 14}" cy="${legendY}" r="5" fill="${COLOURS.measured}" stroke="#000000"/>`);
    legend.push(`<text x="${x + 34}" y="${legendY}" dominant-baseline="middle">measured</text>`);
  }
  out.push(`<g>${legend.join('')}</g>`);
  out.push('</svg>');
  return out.join('\n');
}
