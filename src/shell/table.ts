/** Plain-text tables for the terminal: fixed columns, right-aligned numbers, no colour. */

export function renderTable(header: string[], rows: string[][], rightAligned: ReadonlySet<number> = new Set()): string {
  const widths = header.map((h, c) => Math.max(h.length, ...rows.map((r) => (r[c] ?? '').length)));
  const line = (cells: string[]) =>
    cells
      .map((cell, c) => (rightAligned.has(c) ? cell.padStart(widths[c]!) : cell.padEnd(widths[c]!)))
      .join('  ')
      .trimEnd();
  return [line(header), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}

/** A number as a fitter reads it: 3 significant figures, no float noise. */
export function num(x: number | null | undefined): string {
  if (x === null || x === undefined) return '';
  if (x !== 0 && Math.abs(x) < 0.01) return x.toExponential(2);
  const digits = Math.abs(x) >= 100 ? 0 : Math.abs(x) >= 10 ? 1 : 2;
  return x.toFixed(digits);
}
