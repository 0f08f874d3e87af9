/** The characteristic for a terminal: the braille chart and its one-line summary, or nothing when the model cannot draw it. */
import { renderSpeedChart, summarizeSpeedChart } from '../chart/text-chart.js';
import type { ModelInput } from '../model/expected.js';
import { speedCurves } from '../model/curve.js';

export function chartText(input: ModelInput, width: number, color: boolean): string | undefined {
  const curves = speedCurves(input);
  if (!curves) return undefined;
  return `${renderSpeedChart(curves, { width: Math.min(60, Math.max(40, width)), color })}\n${summarizeSpeedChart(curves)}`;
}
