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
