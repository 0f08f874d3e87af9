/** The cases check report for a workshop lead. */
import type { CaseCheckReport } from '../engine/check-cases.js';
import { renderTable } from './table.js';

export function formatCaseCheck(r: CaseCheckReport): string {
  const pct = (n: number) => (r.total ? `${Math.round((n / r.total) * 100)} %` : '–');
  const rows = r.cases.map((c) => [c.rank === 0 ? 'absent' : String(c.rank), c.rank >= 1 && c.rank <= 3 ? '' : 'OUT', c.id, c.expected, c.ranked.slice(0, 3).join(', ')]);
  return [
    renderTable(['rank', '', 'case', 'confirmed cause', 'ranked first'], rows, new Set([0])),
    '',
    `${r.total} cases: ${r.top1} ranked first (${pct(r.top1)}), ${r.top3} in the top 3 (${pct(r.top3)}).`,
  ].join('\n');
}
