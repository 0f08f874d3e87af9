/**
 * cases check as it runs: each case printed as it is ranked (text rows of fixed width, or the
 * JSON report written piece by piece, its `cases` first and the counts after), and on a terminal
 * a count on stderr. Nothing grows with the number of cases.
 */
import type { CaseCheckReport, CaseRank, CaseStream } from '../engine/check-cases.js';
import type { Result } from '../knowledge/result.js';

export interface CaseCheckPrinter {
  stream: CaseStream;
  /** Closes the output; returns whether any case fell outside its top 3. */
  end(report: Result<CaseCheckReport>): boolean;
}

const isOut = (c: CaseRank) => c.rank === 0 || c.rank > 3;
const indent = (text: string, by: string) => text.replace(/\n/g, `\n${by}`);

export function caseCheckPrinter(format: 'json' | 'text', write: (text: string) => void, progress?: (text: string) => void): CaseCheckPrinter {
  let count = 0;
  let out = false;
  let shownAt = 0;
  const onProgress = progress
    ? (done: number, of: number) => {
        // A few times a second is enough to see it move.
        const now = Date.now();
        if (now - shownAt < 200 && done !== of) return;
        shownAt = now;
        progress(`\r${done} of ${of} case files`);
      }
    : undefined;
  const onCase = (c: CaseRank) => {
    out ||= isOut(c);
    if (format === 'json') write(`${count === 0 ? '{\n  "cases": [\n    ' : ',\n    '}${indent(JSON.stringify(c, null, 2), '    ')}`);
    else {
      if (count === 0) write(`${'rank'.padStart(6)}       ${'case'.padEnd(40)}  ${'confirmed cause'.padEnd(32)}  ranked first\n`);
      write(`${(c.rank === 0 ? 'absent' : String(c.rank)).padStart(6)}  ${isOut(c) ? 'OUT' : '   '}  ${c.id.padEnd(40)}  ${c.expected.padEnd(32)}  ${c.ranked.slice(0, 3).join(', ')}\n`);
    }
    count++;
  };
  return {
    stream: { onCase, ...(onProgress ? { onProgress } : {}), keep: false },
    end(report) {
      if (progress) progress('\r\u001b[K');
      if (!report.ok) {
        if (format === 'json' && count > 0) write('\n  ]\n}\n');
        return out;
      }
      const r = report.value;
      if (format === 'json') write(`${count === 0 ? '{\n  "cases": [' : '\n  ]'},\n  "total": ${r.total},\n  "top1": ${r.top1},\n  "top3": ${r.top3}\n}\n`.replace('"cases": [,', '"cases": [],'));
      else {
        const pct = (n: number) => (r.total ? `${Math.round((n / r.total) * 100)} %` : '–');
        write(`${count ? '\n' : ''}${r.total} cases: ${r.top1} ranked first (${pct(r.top1)}), ${r.top3} in the top 3 (${pct(r.top3)}).\n`);
      }
      return out;
    },
  };
}
