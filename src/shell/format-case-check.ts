/** The cases check report for a workshop lead, laid out to fit the terminal. */
import type { CaseCheckReport } from '../engine/check-cases.js';
import { renderTable } from './table.js';

const shorten = (s: string, n: number) => (s.length > n ? `${s.slice(0, n - 1)}…` : s);

/** `skipped` lists files not run and why; see checkCases. */
export function formatCaseCheck(r: CaseCheckReport, width = 100): string {
  const pct = (n: number) => (r.total ? `${Math.round((n / r.total) * 100)} %` : '–');
  const loopWords = (c: CaseCheckReport['cases'][number]) =>
    !c.loop ? '' : c.loop.correct ? `found, ${c.loop.minutes} min` : c.loop.confirmed ? `WRONG: ${c.loop.confirmed}` : `not found`;
  const replayed = r.cases.filter((c) => c.loop);
  // rank, flag and the gaps take 17 columns; on a wide enough terminal the replay of recorded checks 17 more; the rest is shared.
  const loopColumn = replayed.length > 0 && width >= 80;
  const room = Math.max(30, width - 17 - (loopColumn ? 17 : 0));
  const [caseWidth, causeWidth] = [Math.floor(room * 0.4), Math.max(15, Math.floor(room * 0.3))];
  const leaderWidth = room - caseWidth - causeWidth;
  const rows = r.cases.map((c) => [
    c.rank === 0 ? 'absent' : String(c.rank),
    c.rank >= 1 && c.rank <= 3 ? '' : 'OUT',
    shorten(c.id, caseWidth),
    shorten(c.expected, causeWidth),
    c.rank === 1 ? '' : shorten(c.ranked[0] ?? '', leaderWidth),
    ...(loopColumn ? [shorten(loopWords(c), 15)] : []),
  ]);
  const found = replayed.filter((c) => c.loop!.correct);
  const meanMinutes = found.length ? Math.round(found.reduce((t, c) => t + c.loop!.minutes, 0) / found.length) : 0;
  return [
    renderTable(['rank', '', 'case', 'confirmed cause', 'led by', ...(loopColumn ? ['recorded checks'] : [])], rows, new Set([0])),
    '',
    `${r.total} cases: ${r.top1} ranked first (${pct(r.top1)}), ${r.top3} in the top 3 (${pct(r.top3)}).`,
    ...(replayed.length
      ? [`${replayed.length} cases record the checks worked: replayed, ${found.length} confirm their recorded cause${found.length ? ` (after ${meanMinutes} min of checks on average)` : ''}, ${replayed.filter((c) => c.loop!.confirmed && !c.loop!.correct).length} confirm another, ${replayed.filter((c) => !c.loop!.confirmed).length} confirm nothing.`]
      : []),
    ...skippedLines(r.skipped),
  ].join('\n');
}

/** Why files were not run, so a lead knows the count above is not every file. */
function skippedLines(skipped: CaseCheckReport['skipped']): string[] {
  if (!skipped.length) return [];
  const WHY = { 'no-outcome': 'no confirmed cause recorded', 'new-cause': 'a new cause not yet adopted into the catalogue' } as const;
  const lines = [`Skipped ${skipped.length} file${skipped.length === 1 ? '' : 's'}:`];
  for (const why of ['no-outcome', 'new-cause'] as const) {
    const files = skipped.filter((s) => s.why === why).map((s) => s.file);
    if (files.length) lines.push(`  ${files.length} with ${WHY[why]}: ${files.join(', ')}`);
  }
  return lines;
}
