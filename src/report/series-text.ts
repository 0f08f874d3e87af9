/** The job's test series for the terminal: each as a small chart with its suspects marked, and what it shows. */
import { barRows, blockChart } from '../chart/series-chart.js';
import { RUNOUT_SHAPE_WORDS } from '../model/series/runout.js';
import type { Analyses } from '../engine/series-analyses.js';
import type { CaseFile } from '../knowledge/case-schema.js';

const fmt = (x: number) => String(Number(x.toPrecision(4)));

export function formatSeries(tests: CaseFile['tests'], a: Analyses, columns = 60): string | undefined {
  if (!tests) return undefined;
  const parts: string[] = [];
  if (tests.barToBar && a.barToBar) {
    const b = a.barToBar;
    const values = tests.barToBar.values;
    const sorted = [...values].sort((x, y) => x - y);
    const median = sorted.length % 2 ? sorted[sorted.length >> 1]! : (sorted[sorted.length / 2 - 1]! + sorted[sorted.length / 2]!) / 2;
    parts.push(
      [
        `Bar-to-bar (${tests.barToBar.method}, ${values.length} pairs, ${tests.barToBar.winding} winding, median ${fmt(median)} ${tests.barToBar.unit}; half height = median)`,
        ...blockChart({ values, reference: median, marks: b.suspects.filter((s) => s.kind !== 'ground').map((s) => ({ at: s.bars[0] - 1, label: `${s.bars[0]}–${s.bars[1]} ${s.kind}` })) }, columns),
        ...(tests.barToBar.toShaft
          ? ['Bar to shaft:', ...blockChart({ values: tests.barToBar.toShaft, marks: b.suspects.filter((s) => s.kind === 'ground').map((s) => ({ at: s.bars[0] - 1, label: `bar ${s.bars[0]} ground` })) }, columns)]
          : []),
        `  ${b.pattern}`,
        ...b.next.map((n) => `  next: ${n}`),
      ].join('\n'),
    );
  }
  if (tests.poleDrop && a.poleDrop) {
    const p = a.poleDrop;
    parts.push(
      [
        `Pole drop (${tests.poleDrop.winding}, ${tests.poleDrop.supply.toUpperCase()})`,
        ...barRows(
          tests.poleDrop.values.map((v, i) => {
            const s = p.suspects.find((x) => x.coil === i + 1);
            return { label: `coil ${i + 1}`, value: v, text: `${fmt(v)} V`, mark: s ? `${s.kind} (${Math.round(s.deviation * 100)} %)` : undefined };
          }),
        ),
        ...p.notes.map((n) => `  ${n}`),
      ].join('\n'),
    );
  }
  if (tests.runout && a.runout) {
    const r = a.runout;
    const marks = r.spotAt !== undefined ? [{ at: r.spotAt - 1, label: `reading ${r.spotAt}` }] : r.barStep ? [{ at: r.maxStepAt[1] - 1, label: `step ${fmt(r.maxStep)} ${r.unit}` }] : [];
    parts.push(
      [
        `Runout (${tests.runout.values.length} readings round one turn, ${r.unit})`,
        ...blockChart({ values: tests.runout.values, marks }, columns),
        `  TIR ${fmt(r.tir)} ${r.unit} against ${fmt(r.limit)} ${r.unit}, ${r.limitSource}: ${r.withinLimit ? 'within' : 'over'}; largest step ${fmt(r.maxStep)} ${r.unit} between readings ${r.maxStepAt.join(' and ')}; ${RUNOUT_SHAPE_WORDS[r.shape]}`,
      ].join('\n'),
    );
  }
  if (tests.insulation && a.insulation) {
    const c = a.insulation;
    parts.push(
      [
        `Insulation curve (${tests.insulation.winding}, ${fmt(tests.insulation.temperature)} °C, ${c.insulationSystem})`,
        ...barRows(tests.insulation.values.map(([t, r]) => ({ label: `${fmt(t)} min`, value: r, text: `${fmt(r)} MΩ` }))),
        `  1 min at 40 °C ${c.oneMinuteAt40C === null ? '?' : fmt(c.oneMinuteAt40C)} MΩ (IEEE 43-2013 minimum ${fmt(c.minimumAt40C)}); PI ${c.polarizationIndex === null ? '?' : fmt(c.polarizationIndex)}${c.polarizationIndexMeaningful ? ` (minimum ${c.polarizationIndexMinimum})` : ' (not judged above 5000 MΩ)'}; DAR ${c.dielectricAbsorptionRatio === null ? '?' : fmt(c.dielectricAbsorptionRatio)}`,
        `  the curve ${c.says}`,
      ].join('\n'),
    );
  }
  return parts.length ? parts.join('\n\n') : undefined;
}
