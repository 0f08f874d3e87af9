/** The expect command's readable output. */
import type { Expectation } from '../model/expected.js';
import { num, renderTable } from './table.js';

const UNIT_LABEL: Record<string, string> = { degC: '°C', ohm: 'Ω', Mohm: 'MΩ', '1': '', 'N m': 'N·m' };

export function formatExpectation(e: Expectation): string {
  const rows = Object.entries(e.quantities).map(([name, q]) => [
    name,
    num(q.value),
    q.measured === null ? '' : num(q.measured),
    q.ratio === null ? '' : `${Math.round(q.ratio * 100)} %`,
    UNIT_LABEL[q.unit] ?? q.unit,
    q.basis === 'estimated' ? 'estimate' : '',
  ]);
  const parts = [renderTable(['quantity', 'expected', 'measured', 'ratio', 'unit', 'basis'], rows, new Set([1, 2, 3]))];
  if (e.findings.length) parts.push('Findings:\n' + e.findings.map((f) => `  ! ${f.says}`).join('\n'));
  if (e.missing.length) parts.push('Not computed:\n' + e.missing.map((m) => `  - ${m.quantity}: needs ${m.needs.join(' or ')}`).join('\n'));
  if (e.assumptions.length) parts.push('Assumed:\n' + e.assumptions.map((a) => `  - ${a}`).join('\n'));
  return parts.join('\n\n');
}
