/**
 * The rows of a readings table: each reading once. A reading the model sets against more than
 * one expectation (the field current against a healthy field and against the rating) gets one
 * row with its value, and the other comparisons as rows under it without the value again.
 * Quantities nothing was measured for are not readings: they are listed apart, if at all.
 */
import type { Expectation, Quantity } from '../model/expected.js';
import { outOfBand, QUANTITY_LABELS, type QuantityName } from '../model/quantity-names.js';

export interface ReadingRow {
  name: QuantityName;
  label: string;
  quantity: Quantity & { measured: number };
  /** A further comparison of the reading in the row above: its value is not repeated. */
  sameReading: boolean;
  outOfBand: boolean;
}

/** "field current vs rating" → "field current": what is read, before what it is compared with. */
const readingOf = (label: string) => label.split(/ (?:vs|with|at) /)[0]!;

export function readingRows(e: Expectation): ReadingRow[] {
  const rows: ReadingRow[] = [];
  const entries = Object.entries(e.quantities) as [QuantityName, Quantity][];
  const seen = new Map<string, number>();
  for (const [name, q] of entries) {
    if (q.measured === null) continue;
    const label = QUANTITY_LABELS[name];
    const key = `${readingOf(label)}|${q.unit}|${q.measured}`;
    const row = { name, label, quantity: q as Quantity & { measured: number }, sameReading: seen.has(key), outOfBand: outOfBand(name, q.ratio, q.band) };
    if (!seen.has(key)) {
      seen.set(key, rows.length);
      rows.push(row);
    } else {
      // Under the first row of the same reading, after the comparisons already there.
      let at = seen.get(key)! + 1;
      while (rows[at]?.sameReading) at++;
      rows.splice(at, 0, row);
      for (const [k, i] of seen) if (i >= at) seen.set(k, i + 1);
    }
  }
  return rows;
}

/** The quantities computed without a reading to set against them (constants, limits, ratings). */
export function computedOnly(e: Expectation): [QuantityName, Quantity][] {
  return (Object.entries(e.quantities) as [QuantityName, Quantity][]).filter(([, q]) => q.measured === null);
}

/** The row's words: a further comparison says only what the reading is compared with ("vs rating"). */
export function rowLabel(row: ReadingRow): string {
  return row.sameReading ? row.label.slice(readingOf(row.label).length).trim() : row.label;
}
