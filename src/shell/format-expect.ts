/** The expect command's readable output, and the readings table of the dialogue's result. */
import type { Expectation, Quantity } from '../model/expected.js';
import { outOfBand, QUANTITY_LABELS, type QuantityName } from '../model/quantity-names.js';
import { num, renderTable } from './table.js';

const UNIT_LABEL: Record<string, string> = { degC: '°C', ohm: 'Ω', Mohm: 'MΩ', '1': '', 'N m': 'N·m' };
const unitOf = (u: string) => UNIT_LABEL[u] ?? u;

/** Full table at 100 columns and more; a compact one (units beside the numbers) below that. */
export function formatExpectation(e: Expectation, width = 100): string {
  const entries = Object.entries(e.quantities);
  const ratio = (r: number | null) => (r === null ? '' : `${Math.round(r * 100)} %`);
  const flag = (name: string, q: Quantity) => (outOfBand(name as QuantityName, q.ratio, q.band) ? '!' : '');
  const table =
    width >= 100
      ? renderTable(
          ['quantity', 'expected', 'measured', 'ratio', '', 'unit', 'basis'],
          entries.map(([name, q]) => [QUANTITY_LABELS[name as QuantityName], num(q.value), q.measured === null ? '' : num(q.measured), ratio(q.ratio), flag(name, q), unitOf(q.unit), q.basis === 'estimated' ? 'estimate' : '']),
          new Set([1, 2, 3]),
        )
      : renderTable(
          ['quantity', 'expected', 'measured', 'ratio', ''],
          entries.map(([name, q]) => [shorten(QUANTITY_LABELS[name as QuantityName], 28), `${num(q.value)} ${unitOf(q.unit)}`.trim(), q.measured === null ? '' : num(q.measured), ratio(q.ratio), flag(name, q)]),
          new Set([1, 2, 3]),
        );
  const parts = [table];
  if (entries.some(([name, q]) => outOfBand(name as QuantityName, q.ratio, q.band))) parts.push('! outside what a healthy machine reads');
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
