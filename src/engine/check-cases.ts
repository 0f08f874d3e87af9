/** Runs every recorded case whose outcome names a cause and reports where that cause ranked. */
import type { CaseFile, CaseInput } from '../knowledge/case-schema.js';
import { loadCaseFile } from '../knowledge/load-case.js';
import type { RuleBase } from '../knowledge/load-rules.js';
import { failed, ok, type Issue, type Result } from '../knowledge/result.js';
import { diagnose } from './diagnose.js';
import { buildEngine } from './run-rules.js';

export interface CaseRank {
  id: string;
  file: string;
  expected: string;
  /** 1-based rank of the confirmed cause; 0 when it is not ranked at all. */
  rank: number;
  ranked: string[];
  /** With an adaptive run: the question ids the dialogue's policy asked, in order. */
  questionsAsked?: string[];
  /** For a case that records the checks worked: the loop replayed on them. */
  loop?: LoopReplay;
}

export interface LoopReplay {
  /** Checks the case records. */
  worked: number;
  /** The cause the replay confirmed, or null. */
  confirmed: string | null;
  /** It confirmed the recorded cause. */
  correct: boolean;
  /** Minutes of checks worked until it confirmed (all of them when it did not). */
  minutes: number;
  /** How many checks it took to confirm. */
  after: number;
}

/** How a case is put to the engine: whole, or through the dialogue's questions. */
export type CaseRunner = (c: CaseFile, raw: CaseInput) => Promise<{ ranked: string[]; questionsAsked?: string[] }>;

export interface CaseCheckReport {
  total: number;
  top1: number;
  top3: number;
  cases: CaseRank[];
}

export async function checkCases(files: string[], base: RuleBase, runner?: CaseRunner): Promise<Result<CaseCheckReport>> {
  const engine = buildEngine(base);
  // The rules' own ranking, before any check result: the recorded checks are replayed apart.
  const run: CaseRunner = runner ?? (async (c) => ({ ranked: (await diagnose({ ...c, checks: [] }, base, engine)).causes.map((x) => x.id) }));
  const causeIds = new Set(base.causes.map((c) => c.id));
  const same = sameCause(base);
  const issues: Issue[] = [];
  const cases: CaseRank[] = [];
  for (const file of files) {
    const c = loadCaseFile(file, causeIds);
    if (!c.ok) {
      issues.push(...c.issues);
      continue;
    }
    const { job, raw } = c.value;
    const expected = job.outcome?.cause;
    if (expected === undefined) continue;
    const { ranked, questionsAsked } = await run(job, raw);
    const loop = job.checks?.length ? await replayChecks(job, expected, base, engine, same) : undefined;
    cases.push({ id: job.id ?? file, file, expected, rank: ranked.findIndex((c) => same(c, expected)) + 1, ranked: ranked.slice(0, 5), ...(questionsAsked ? { questionsAsked } : {}), ...(loop ? { loop } : {}) });
  }
  if (issues.length) return failed(...issues);
  return ok({
    total: cases.length,
    top1: cases.filter((c) => c.rank === 1).length,
    top3: cases.filter((c) => c.rank >= 1 && c.rank <= 3).length,
    cases,
  });
}

/**
 * Whether two cause ids name the same fault for scoring a recorded job: the same id, or one that
 * refines the other (a job filed under the broader cause keeps its meaning when a narrower one is added).
 */
export function sameCause(base: RuleBase): (a: string, b: string) => boolean {
  const broader = new Map(base.causes.flatMap((c) => (c.refines ? [[c.id, c.refines] as const] : [])));
  return (a, b) => a === b || broader.get(a) === b || broader.get(b) === a;
}

/** Replays a case's recorded checks in order: where the loop confirmed a cause, and after how many minutes. */
async function replayChecks(job: CaseFile, expected: string, base: RuleBase, engine: ReturnType<typeof buildEngine>, same: (a: string, b: string) => boolean): Promise<LoopReplay> {
  const checks = job.checks ?? [];
  const minutesOf = new Map(base.checks.map((c) => [c.id, c.minutes]));
  let minutes = 0;
  for (let k = 1; k <= checks.length; k++) {
    minutes += minutesOf.get(checks[k - 1]!.id) ?? 0;
    const d = await diagnose({ ...job, checks: checks.slice(0, k) }, base, engine);
    if (d.status === 'confirmed') return { worked: checks.length, confirmed: d.confirmed, correct: d.confirmed !== null && same(d.confirmed, expected), minutes, after: k };
  }
  return { worked: checks.length, confirmed: null, correct: false, minutes, after: checks.length };
}
