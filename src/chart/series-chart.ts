/**
 * Test series as small terminal charts: one block character per reading, scaled to the series,
 * with the suspects marked underneath. Pure: returns lines of text.
 */
const LEVELS = ['▁', '▂', '▃', '▄', '▅', '▆', '▇', '█'] as const;
export const SUSPECT_MARK = '▲';

export interface MarkedSeries {
  values: readonly number[];
  /** Positions (from 0) to mark, with a short label. */
  marks: readonly { at: number; label: string }[];
  /** The level drawn at mid height: the median for bar-to-bar (so one outlier does not flatten the rest). */
  reference?: number;
  /** First reading's number, for row labels. */
  firstNumber?: number;
}

/** A block chart of the readings, wrapped in rows of at most `columns`, each with its first reading's number and marks below. */
export function blockChart(s: MarkedSeries, columns = 60): string[] {
  const v = s.values;
  const lo = s.reference !== undefined ? 0 : Math.min(...v);
  const hi = s.reference !== undefined ? 2 * s.reference : Math.max(...v);
  const level = (x: number) => {
    if (!(hi > lo)) return LEVELS[3];
    const f = (x - lo) / (hi - lo);
    return LEVELS[Math.max(0, Math.min(LEVELS.length - 1, Math.floor(f * LEVELS.length)))]!;
  };
  const first = s.firstNumber ?? 1;
  const labelWidth = String(first + v.length - 1).length;
  const out: string[] = [];
  for (let start = 0; start < v.length; start += columns) {
    const row = v.slice(start, start + columns);
    out.push(`${String(first + start).padStart(labelWidth)} ${row.map(level).join('')}`);
    const marks = s.marks.filter((m) => m.at >= start && m.at < start + columns);
    if (marks.length) {
      const line = Array.from({ length: row.length }, () => ' ');
      for (const m of marks) line[m.at - start] = SUSPECT_MARK;
      out.push(`${' '.repeat(labelWidth)} ${line.join('').trimEnd()}  ${marks.map((m) => m.label).join(', ')}`);
    }
  }
  return out;
}

/** One line per item: a label, a horizontal bar scaled to the largest value, the value. */
export function barRows(items: readonly { label: string; value: number; text: string; mark?: string | undefined }[], width = 30): string[] {
  const top = Math.max(...items.map((i) => i.value), 0);
  const labelWidth = Math.max(...items.map((i) => i.label.length));
  return items.map((i) => {
    const n = top > 0 ? Math.round((i.value / top) * width) : 0;
    return `${i.label.padEnd(labelWidth)} ${'█'.repeat(n)}${' '.repeat(width - n)} ${i.text}${i.mark ? `  ${SUSPECT_MARK} ${i.mark}` : ''}`;
  });
}
