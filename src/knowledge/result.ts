import { oneLine } from '../units/quote.js';

/**
 * Errors are data: every loader returns a Result, each issue names its file and field path.
 * Only the CLI turns issues into text on stderr and picks the exit code.
 */
export interface Issue {
  code: 'unreadable' | 'too-large' | 'not-json' | 'invalid' | 'unknown-cause' | 'rule-base' | 'cycle' | 'unwritable';
  file: string;
  /** Field path inside the file, e.g. "readings.armatureVoltage" or "rules[3].conditions". */
  path: string;
  message: string;
  /** A line that stands for this many further issues of the file, not shown. */
  more?: number;
}

export type Result<T> = { ok: true; value: T } | { ok: false; issues: Issue[] };

export const ok = <T>(value: T): Result<T> => ({ ok: true, value });
export const failed = <T = never>(...issues: Issue[]): Result<T> => ({ ok: false, issues });

/** One line per issue: `file: at path: message`, each safe for a terminal line. */
export function formatIssues(issues: Issue[]): string {
  return issues.map((i) => oneLine(`${i.file}${i.path ? `: at ${i.path}` : ''}: ${i.message}`, 800)).join('\n');
}

/** Exit code for refused work: 74 when what failed was writing the output, else 2 (bad input). */
export function exitCodeOf(issues: Issue[]): number {
  return issues.length > 0 && issues.every((i) => i.code === 'unwritable') ? 74 : 2;
}

/** Issues shown per file; the rest are counted in one line. */
export const ISSUES_PER_FILE = 20;

/**
 * A failure with at most ISSUES_PER_FILE issues per file, each file's followed by one line
 * counting the rest (a line that already counts some is added in, so this can be applied twice).
 * Takes the array whole: spreading a hundred thousand issues into a call overflows the stack.
 */
export function failedWith<T = never>(issues: readonly Issue[]): Result<T> {
  const byFile = new Map<string, { kept: Issue[]; more: number; code: Issue['code'] }>();
  for (const i of issues) {
    let f = byFile.get(i.file);
    if (!f) byFile.set(i.file, (f = { kept: [], more: 0, code: i.code }));
    if (i.more) f.more += i.more;
    else if (f.kept.length < ISSUES_PER_FILE) f.kept.push(i);
    else f.more++;
  }
  const out: Issue[] = [];
  for (const [file, f] of byFile) {
    out.push(...f.kept);
    if (f.more) out.push({ code: f.code, file, path: '', message: `and ${f.more} more issue${f.more === 1 ? '' : 's'} in this file`, more: f.more });
  }
  return { ok: false, issues: out };
}
