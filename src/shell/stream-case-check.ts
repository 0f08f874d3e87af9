/**
 * cases check as it runs: each case printed as it is ranked (text rows laid out to fit the
 * terminal, or the JSON report written piece by piece: its format, then `cases`, then the counts),
 * and on a terminal a count on stderr. Nothing grows with the number of cases but the short
 * tallies of the replayed checks and the list of skipped files.
 */
import type { CaseCheckReport, CaseRank, CaseStream, SkippedCase } from '../engine/check-cases.js';
import type { Result } from '../knowledge/result.js';
import { basename, dirname, join } from 'node:path';
import { wrapText } from './wrap.js';

export interface CaseCheckPrinter {
  stream: CaseStream;
  /** Closes the output; returns whether any case fell outside its top 3 or its replay confirmed another cause. */
  end(report: Result<CaseCheckReport>): boolean;
}

export interface PrinterOptions {
  /** The JSON format name, written first. */
  format?: string;
  /** Terminal width for the text rows. */
  width?: number;
  /** How a file is named in the output (relative to where the user is). */
  shownPath?: (file: string) => string;
}

const isOut = (c: CaseRank) => c.rank === 0 || c.rank > 3 || (c.loop !== undefined && c.loop.confirmed !== null && !c.loop.correct);
const indent = (text: string, by: string) => text.replace(/\n/g, `\n${by}`);
const shorten = (s: string, n: number) => (s.length > n ? `${s.slice(0, Math.max(1, n - 1))}…` : s);
const loopWords = (c: CaseRank) => (!c.loop ? '' : c.loop.correct ? `found, ${c.loop.minutes} min` : c.loop.confirmed ? `WRONG: ${c.loop.confirmed}` : 'not found');

/** Output is held until there is this much, or this long has passed, or a count is shown, or the check ends: one write for many cases. */
const FLUSH_AT = 32 * 1024;
const FLUSH_AFTER_MS = 100;

export function caseCheckPrinter(mode: 'json' | 'text', writeOut: (text: string) => void, progress?: (text: string) => void, opts: PrinterOptions = {}): CaseCheckPrinter {
  let held = '';
  let heldSince = 0;
  const flush = () => {
    if (held) writeOut(held);
    held = '';
  };
  const write = (text: string) => {
    if (!held) heldSince = Date.now();
    held += text;
    if (held.length >= FLUSH_AT || Date.now() - heldSince >= FLUSH_AFTER_MS) flush();
  };
  // Files of one folder are shown as that folder is: worked out once per folder.
  const shownPath = opts.shownPath ?? ((f: string) => f);
  const shownFolders = new Map<string, string>();
  const shown = (file: string) => {
    const folder = dirname(file);
    let as = shownFolders.get(folder);
    if (as === undefined) shownFolders.set(folder, (as = dirname(shownPath(file))));
    return join(as, basename(file));
  };
  const width = opts.width ?? 100;
  // rank and flag take 12 columns with their gaps, the two gaps between the names 4, the replay
  // of recorded checks 18 on a wide terminal; the rest is shared by the case, its cause and the leader.
  const loopColumn = width >= 80;
  const room = Math.max(24, width - 12 - 4 - (loopColumn ? 18 : 0));
  const [caseWidth, causeWidth] = [Math.floor(room * 0.4), Math.max(15, Math.floor(room * 0.3))];
  const leaderWidth = room - caseWidth - causeWidth;
  let count = 0;
  let out = false;
  let shownAt = 0;
  const replay = { cases: 0, found: 0, minutes: 0, other: 0, none: 0 };
  const onProgress = progress
    ? (done: number, of: number) => {
        // A few times a second is enough to see it move.
        const now = Date.now();
        if (now - shownAt < 200 && done !== of) return;
        shownAt = now;
        flush();
        progress(`\r${done} of ${of} case files`);
      }
    : undefined;
  const onCase = (c: CaseRank) => {
    out ||= isOut(c);
    if (c.loop) {
      replay.cases++;
      if (c.loop.correct) {
        replay.found++;
        replay.minutes += c.loop.minutes;
      } else if (c.loop.confirmed) replay.other++;
      else replay.none++;
    }
    if (mode === 'json') {
      const head = count === 0 ? `{\n${opts.format ? `  "format": ${JSON.stringify(opts.format)},\n` : ''}  "cases": [\n    ` : ',\n    ';
      write(`${head}${indent(JSON.stringify({ ...c, file: shown(c.file) }, null, 2), '    ')}`);
    } else {
      const cells = (rank: string, flag: string, id: string, cause: string, leader: string, loop: string) =>
        `${rank.padStart(6)} ${flag.padEnd(3)}  ${id.padEnd(caseWidth)}  ${cause.padEnd(causeWidth)}  ${loopColumn ? `${leader.padEnd(leaderWidth)}  ${loop}` : leader}`.trimEnd() + '\n';
      if (count === 0) write(cells('rank', '', 'case', 'confirmed cause', 'led by', loopColumn ? 'recorded checks' : ''));
      write(cells(c.rank === 0 ? 'absent' : String(c.rank), c.rank >= 1 && c.rank <= 3 ? '' : 'OUT', shorten(c.id, caseWidth), shorten(c.expected, causeWidth), c.rank === 1 ? '' : shorten(c.ranked[0] ?? '', leaderWidth), shorten(loopWords(c), 16)));
    }
    count++;
  };
  return {
    stream: { onCase, ...(onProgress ? { onProgress } : {}), keep: false },
    end(report) {
      flush();
      if (progress) progress('\r\u001b[K');
      if (!report.ok) {
        if (mode === 'json' && count > 0) writeOut('\n  ]\n}\n');
        return out;
      }
      const r = report.value;
      const skipped = r.skipped.map((s) => ({ ...s, file: shown(s.file) }));
      if (mode === 'json') {
        const opening = count === 0 ? `{\n${opts.format ? `  "format": ${JSON.stringify(opts.format)},\n` : ''}  "cases": []` : '\n  ]';
        writeOut(`${opening},\n  "total": ${r.total},\n  "top1": ${r.top1},\n  "top3": ${r.top3},\n  "skipped": ${indent(JSON.stringify(skipped, null, 2), '  ')}\n}\n`);
      } else {
        const pct = (n: number) => (r.total ? `${Math.round((n / r.total) * 100)} %` : '–');
        const lines = [`${r.total} cases: ${r.top1} ranked first (${pct(r.top1)}), ${r.top3} in the top 3 (${pct(r.top3)}).`];
        if (replay.cases) {
          lines.push(`${replay.cases} cases record the checks worked: replayed, ${replay.found} confirm their recorded cause${replay.found ? ` (after ${Math.round(replay.minutes / replay.found)} min of checks on average)` : ''}, ${replay.other} confirm another, ${replay.none} confirm nothing.`);
        }
        lines.push(...skippedLines(skipped));
        writeOut(`${count ? '\n' : ''}${wrapText(lines.join('\n'), width)}\n`);
      }
      return out;
    },
  };
}

/** Why files were not run, so a lead knows the count above is not every file. */
function skippedLines(skipped: readonly SkippedCase[]): string[] {
  if (!skipped.length) return [];
  const WHY = { 'no-outcome': 'no confirmed cause recorded', 'new-cause': 'a new cause not yet adopted into the catalogue' } as const;
  const lines = [`Skipped ${skipped.length} file${skipped.length === 1 ? '' : 's'}:`];
  for (const why of ['no-outcome', 'new-cause'] as const) {
    const files = skipped.filter((s) => s.why === why).map((s) => s.file);
    if (files.length) lines.push(`  ${files.length} with ${WHY[why]}: ${files.join(', ')}`);
  }
  return lines;
}
