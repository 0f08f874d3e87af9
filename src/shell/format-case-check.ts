/** The cases check report for a workshop lead. */
import type { CaseCheckReport } from '../engine/check-cases.js';
import { renderTable } from './table.js';

export function formatCaseCheck(r: CaseCheckReport): string {
  const pct = (n: number) => (r.total ? `${Math.round((n / r.total) * 100)} %` : '–');
  const loopWords = (c: CaseCheckReport['cases'][number]) =>
    !c.loop ? '' : c.loop.correct ? `found in ${c.loop.minutes} min` : c.loop.confirmed ? `WRONG: ${c.loop.confirmed}` : `not found (${c.loop.worked} checks)`;
  const rows = r.cases.map((c) => [c.rank === 0 ? 'absent' : String(c.rank), c.rank >= 1 && c.rank <= 3 ? '' : 'OUT', c.id, c.expected, c.ranked.slice(0, 3).join(', '), loopWords(c)]);
  const replayed = r.cases.filter((c) => c.loop);
  const found = replayed.filter((c) => c.loop!.correct);
  const meanMinutes = found.length ? Math.round(found.reduce((t, c) => t + c.loop!.minutes, 0) / found.length) : 0;
  return [
    renderTable(['rank', '', 'case', 'confirmed cause', 'ranked first', 'its recorded checks'], rows, new Set([0])),
    '',
    `${r.total} cases: ${r.top1} ranked first (${pct(r.top1)}), ${r.top3} in the top 3 (${pct(r.top3)}).`,
    ...(replayed.length
      ? [`${replayed.length} cases record the checks worked: replayed, ${found.length} confirm their recorded cause${found.length ? ` (after ${meanMinutes} min of checks on average)` : ''}, ${replayed.filter((c) => c.loop!.confirmed && !c.loop!.correct).length} confirm another, ${replayed.filter((c) => !c.loop!.confirmed).length} confirm nothing.`]
      : []),
  ].join('\n');
}
