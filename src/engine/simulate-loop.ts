/**
 * A simulated fitter working the troubleshooting loop on a job whose cause is known: each time
 * the tool names a next check, the fitter does it and reports abnormal when that check shows the
 * true cause, normal otherwise, until the tool confirms a cause or has nothing left to offer.
 * Pure: used by the benchmark and by `cases check` for the recorded cases.
 */
import type { CaseFile, WorkedCheck } from '../knowledge/case-schema.js';
import type { RuleBase } from '../knowledge/load-rules.js';
import type { RuleEngines } from './run-rules.js';
import { checksShow, diagnose } from './diagnose.js';

export interface LoopRun {
  truth: string;
  /** The cause the tool confirmed, if any. */
  confirmed: string | null;
  /** Confirmed the true cause (or a cause that refines it, or the one it refines). */
  correct: boolean;
  minutes: number;
  checks: string[];
  /** Minutes through the first list the tool gave, worked in order without feedback, to the first check that shows the cause (null: none does). */
  staticMinutes: number | null;
  /** The cheapest single check in the catalogue that shows the cause. */
  idealMinutes: number | null;
}

const MAX_CHECKS = 40;

export async function simulateLoop(job: CaseFile, truth: string, base: RuleBase, engine: RuleEngines, sameCause: (a: string, b: string) => boolean = (a, b) => a === b): Promise<LoopRun> {
  const shows = checksShow(base);
  const minutesOf = new Map(base.checks.map((c) => [c.id, c.minutes]));
  const showsTruth = (check: string) => (shows.get(check) ?? []).some((c) => sameCause(c, truth));
  const start = { ...job, checks: [] as WorkedCheck[] };
  delete (start as Partial<CaseFile>).outcome;
  const first = await diagnose(start, base, engine);
  let elapsed = 0;
  let staticMinutes: number | null = null;
  for (const c of first.checks) {
    elapsed += c.minutes;
    if (showsTruth(c.id)) {
      staticMinutes = elapsed;
      break;
    }
  }
  const showing = base.checks.filter((c) => showsTruth(c.id)).map((c) => c.minutes);
  const worked: WorkedCheck[] = [];
  let minutes = 0;
  let d = first;
  for (let k = 0; k < MAX_CHECKS && d.status === 'open' && d.next; k++) {
    const id = d.next;
    worked.push({ id, result: showsTruth(id) ? 'abnormal' : 'normal' });
    minutes += minutesOf.get(id) ?? 0;
    d = await diagnose({ ...start, checks: [...worked] }, base, engine);
  }
  return {
    truth,
    confirmed: d.confirmed,
    correct: d.confirmed !== null && sameCause(d.confirmed, truth),
    minutes,
    checks: worked.map((w) => w.id),
    staticMinutes,
    idealMinutes: showing.length ? Math.min(...showing) : null,
  };
}
