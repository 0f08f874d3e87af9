/** The expect command's readable output, and the readings table of the dialogue's result. */
import type { Expectation, Quantity } from '../model/expected.js';
import { QUANTITY_LABELS } from '../model/quantity-names.js';
import { computedOnly, readingRows, rowLabel } from '../report/reading-rows.js';
import { num, renderTable } from './table.js';

const UNIT_LABEL: Record<string, string> = { degC: '°C', ohm: 'Ω', Mohm: 'MΩ', '1': '', 'N m': 'N·m' };
const unitOf = (u: string) => UNIT_LABEL[u] ?? u;

/**
 * The readings table (each reading once, with what a healthy machine would read), then, when
 * `computed` is set, the values computed for this machine that no reading is set against.
 */
export function formatExpectation(e: Expectation, width = 100, opts: { computed?: boolean } = {}): string {
  const ratio = (r: number | null) => (r === null ? '' : `${Math.round(r * 100)} %`);
  const withUnit = (x: number, q: Quantity) => `${num(x)} ${unitOf(q.unit)}`.trim();
  const rows = readingRows(e);
  // The label column gets what the numbers leave of the width.
  const labelWidth = Math.max(14, Math.min(34, width - 32));
  const parts: string[] = [];
  if (rows.length) {
    parts.push(
      renderTable(
        ['reading', 'measured', 'expected', 'ratio', ''],
        rows.map((r) => [
          shorten(r.sameReading ? `  ${rowLabel(r)}` : rowLabel(r), labelWidth),
          r.sameReading ? '' : withUnit(r.quantity.measured, r.quantity),
          `${withUnit(r.quantity.value, r.quantity)}${r.quantity.basis === 'estimated' ? ' (est.)' : ''}`,
          ratio(r.quantity.ratio),
          r.outOfBand ? '!' : '',
        ]),
        new Set([1, 2, 3]),
      ),
    );
    if (rows.some((r) => r.outOfBand)) parts.push('! outside what a healthy machine reads');
  } else parts.push('No readings to set against a healthy machine.');
  const computed = computedOnly(e);
  if (opts.computed !== false && computed.length) {
    parts.push(renderTable(['computed for this machine', 'value', ''], computed.map(([name, q]) => [shorten(QUANTITY_LABELS[name], labelWidth), withUnit(q.value, q), q.basis === 'estimated' ? 'estimate' : '']), new Set([1])));
  }
  if (e.findings.length) parts.push('Findings:\n' + e.findings.map((f) => `  ! ${f.says}`).join('\n'));
  if (e.missing.length) parts.push('Not computed:\n' + e.missing.map((m) => `  - ${QUANTITY_LABELS[m.quantity]}: needs ${m.needs.map(fieldWords).join(' and ')}`).join('\n'));
  if (e.assumptions.length) parts.push('Assumed:\n' + e.assumptions.map((a) => `  - ${a}`).join('\n'));
  return parts.join('\n\n');
}

function shorten(s: string, n: number): string {
  return s.length > n ? `${s.slice(0, n - 1)}…` : s;
}

/** "readings.armatureCurrent" → "the armature current reading"; "machine.nameplate.speed" → "the nameplate speed". */
function fieldWords(path: string): string {
  return path
    .split(' or ')
    .map((p) => {
      const parts = p.split('.');
      const last = (parts.at(-1) ?? p).replace(/([A-Z])/g, ' $1').toLowerCase();
      if (parts[0] === 'readings') return `the ${last} reading`;
      if (parts[1] === 'nameplate') return `the nameplate ${last}`;
      if (parts[1] === 'resistances') return last === 'at' ? 'the temperature the resistances were measured at' : `the measured ${last} resistance`;
      return p;
    })
    .join(' or ');
}
