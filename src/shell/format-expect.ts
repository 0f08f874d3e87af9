/** The expect command's readable output, and the readings table of the dialogue's result. */
import type { Expectation } from '../model/expected.js';
import { outOfBand, type QuantityName } from '../model/quantity-names.js';
import { num, renderTable } from './table.js';

const UNIT_LABEL: Record<string, string> = { degC: '°C', ohm: 'Ω', Mohm: 'MΩ', '1': '', 'N m': 'N·m' };
const unitOf = (u: string) => UNIT_LABEL[u] ?? u;

/** Full table at 80 columns and more; a compact one (units beside the numbers) below that. */
export function formatExpectation(e: Expectation, width = 100): string {
  const entries = Object.entries(e.quantities);
  const ratio = (r: number | null) => (r === null ? '' : `${Math.round(r * 100)} %`);
  const flag = (name: string, r: number | null) => (outOfBand(name as QuantityName, r) ? '!' : '');
  const table =
    width >= 80
      ? renderTable(
          ['quantity', 'expected', 'measured', 'ratio', '', 'unit', 'basis'],
          entries.map(([name, q]) => [name, num(q.value), q.measured === null ? '' : num(q.measured), ratio(q.ratio), flag(name, q.ratio), unitOf(q.unit), q.basis === 'estimated' ? 'estimate' : '']),
          new Set([1, 2, 3]),
        )
      : renderTable(
          ['quantity', 'expected', 'measured', 'ratio', ''],
          entries.map(([name, q]) => [name.slice(0, 22), `${num(q.value)} ${unitOf(q.unit)}`.trim(), q.measured === null ? '' : num(q.measured), ratio(q.ratio), flag(name, q.ratio)]),
          new Set([1, 2, 3]),
        );
  const parts = [table];
  if (entries.some(([name, q]) => outOfBand(name as QuantityName, q.ratio))) parts.push('! outside what a healthy machine reads');
  if (e.findings.length) parts.push('Findings:\n' + e.findings.map((f) => `  ! ${f.says}`).join('\n'));
  if (e.missing.length) parts.push('Not computed:\n' + e.missing.map((m) => `  - ${m.quantity}: needs ${m.needs.join(' and ')}`).join('\n'));
  if (e.assumptions.length) parts.push('Assumed:\n' + e.assumptions.map((a) => `  - ${a}`).join('\n'));
  return parts.join('\n\n');
}
