/** An asset's history as text: its jobs, what was found, and its trends as bar charts. */
import { barRows } from '../chart/series-chart.js';
import type { AssetHistory } from '../engine/asset-history.js';

const fmt = (x: number) => String(Number(x.toPrecision(4)));

export function formatHistory(h: AssetHistory): string {
  const lines = [`${h.asset}: ${h.jobs.length} recorded job${h.jobs.length === 1 ? '' : 's'}`, ''];
  for (const j of h.jobs) {
    lines.push(`${j.date ?? 'undated   '}  ${j.workOrder ?? ''}${j.workOrder ? '  ' : ''}${j.causeTitle ?? j.cause ?? 'cause not recorded'}`);
    if (j.fix) lines.push(`            ${j.fix}`);
  }
  const ins = h.trends.insulation;
  if (ins.points.length) {
    lines.push('', `Insulation resistance at 1 min, corrected to 40 °C (IEEE 43-2013), ${ins.winding ?? ''}`.trimEnd());
    lines.push(...barRows(ins.points.map(([d, v]) => ({ label: d, value: v, text: `${fmt(v)} MΩ` }))));
    if (ins.perYear !== null) lines.push(`  trend ${ins.perYear < 0 ? 'falling' : 'not falling'}: ${fmt(ins.perYear)} MΩ a year (straight line through the points)`);
    if (ins.minimum !== null) {
      lines.push(
        ins.projectedMinimumDate
          ? `  on that line it reaches the ${fmt(ins.minimum)} MΩ minimum about ${ins.projectedMinimumDate}`
          : `  no projection: the trend is not falling, or there are too few dated tests (minimum ${fmt(ins.minimum)} MΩ)`,
      );
    }
    for (const c of ins.cautions) lines.push(`  caution: ${c}`);
  }
  for (const [title, t] of [
    ['Armature circuit resistance at 20 °C', h.trends.armatureResistance],
    ['Shunt field resistance at 20 °C', h.trends.shuntFieldResistance],
  ] as const) {
    if (t.points.length < 2) continue;
    lines.push('', title, ...barRows(t.points.map(([d, v]) => ({ label: d, value: v, text: `${fmt(v)} Ω` }))));
  }
  return lines.join('\n');
}
