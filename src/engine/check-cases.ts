/** Runs every recorded case whose outcome names a cause and reports where that cause ranked. */
import type { CaseFile, CaseInput } from '../knowledge/case-schema.js';
import { loadCaseFile } from '../knowledge/load-case.js';
import type { RuleBase } from '../knowledge/load-rules.js';
import { failedWith, ok, type Issue, type Result } from '../knowledge/result.js';
import { dirname } from 'node:path';
import { rankCauses } from './diagnose.js';

/** Case files whose issues are listed; the rest are counted. */
const FILES_WITH_ISSUES_SHOWN = 20;
import { buildEngine, type RuleEngines } from './run-rules.js';

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

/** A case file not run, and why: no confirmed cause recorded, or a cause not yet in the catalogue. */
export interface SkippedCase {
  file: string;
  why: 'no-outcome' | 'new-cause';
}

/** How a case is put to the engine: whole, or through the dialogue's questions. */
export type CaseRunner = (c: CaseFile, raw: CaseInput) => Promise<{ ranked: string[]; questionsAsked?: string[] }>;

export interface CaseCheckReport {
  total: number;
  top1: number;
  top3: number;
  cases: CaseRank[];
  skipped: SkippedCase[];
}

/** Replays a case's recorded checks: given to rankCaseFile to add `loop` to a case that has them. */
export type LoopReplayer = (job: CaseFile, expected: string) => Promise<LoopReplay>;

/** How a check reports as it goes, for a long run: each case as it is ranked, and the count done. */
export interface CaseStream {
  /** Told each case as it is ranked, in file order. */
  onCase?: (c: CaseRank) => void;
  /** Told after each file how many are done. */
  onProgress?: (done: number, of: number) => void;
  /** Keep every case in the report (the default); false keeps memory flat in the number of cases. */
  keep?: boolean;
}

/** Tallies of ranks, kept as cases come so no list of them is needed. */
export class CaseTally {
  total = 0;
  top1 = 0;
  top3 = 0;
  add(c: CaseRank): void {
    this.total++;
    if (c.rank === 1) this.top1++;
    if (c.rank >= 1 && c.rank <= 3) this.top3++;
  }
}

/** Ranks one case file: a case, a file skipped with why, or its issues. */
export async function rankCaseFile(file: string, causeIds: ReadonlySet<string>, run: CaseRunner, replay?: LoopReplayer, same: (a: string, b: string) => boolean = (a, b) => a === b): Promise<CaseRank | { skipped: SkippedCase } | { issues: Issue[] }> {
  const c = loadCaseFile(file, causeIds);
  if (!c.ok) return { issues: c.issues };
  const { job, raw } = c.value;
  const expected = job.outcome?.cause;
  if (expected === undefined) return { skipped: { file, why: job.outcome?.newCause ? 'new-cause' : 'no-outcome' } };
  const { ranked, questionsAsked } = await run(job, raw);
  const loop = replay && job.checks?.length ? await replay(job, expected) : undefined;
  return { id: job.id ?? file, file, expected, rank: ranked.findIndex((c) => same(c, expected)) + 1, ranked: ranked.slice(0, 5), ...(questionsAsked ? { questionsAsked } : {}), ...(loop ? { loop } : {}) };
}

/** The runner that diagnoses a whole case with one engine for all: the rules' own ranking, its recorded checks replayed apart. */
export function wholeCaseRunner(base: RuleBase, engine: RuleEngines = buildEngine(base)): CaseRunner {
  return async (c) => ({ ranked: (await rankCauses({ ...c, checks: [] }, base, engine)).causes.map((x) => x.id) });
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
export function loopReplayer(base: RuleBase, engine: RuleEngines = buildEngine(base)): LoopReplayer {
  const same = sameCause(base);
  const minutesOf = new Map(base.checks.map((c) => [c.id, c.minutes]));
  return async (job, expected) => {
    const checks = job.checks ?? [];
    let minutes = 0;
    for (let k = 1; k <= checks.length; k++) {
      minutes += minutesOf.get(checks[k - 1]!.id) ?? 0;
      const d = await rankCauses({ ...job, checks: checks.slice(0, k) }, base, engine);
      if (d.confirmed !== null) return { worked: checks.length, confirmed: d.confirmed, correct: same(d.confirmed, expected), minutes, after: k };
    }
    return { worked: checks.length, confirmed: null, correct: false, minutes, after: checks.length };
  };
}

/** Collects the issues of broken case files: those of the first files, then a count. */
export class CaseIssues {
  private readonly issues: Issue[] = [];
  private bad = 0;
  add(issues: readonly Issue[]): void {
    if (++this.bad <= FILES_WITH_ISSUES_SHOWN) this.issues.push(...issues);
  }
  /** A failure, if any file was broken; `folder` is named for the count. */
  result(folder: string): Result<never> | undefined {
    const more = this.bad - FILES_WITH_ISSUES_SHOWN;
    if (more > 0) this.issues.push({ code: 'invalid', file: folder, path: '', message: `and ${more} more case file${more === 1 ? '' : 's'} with issues` });
    return this.issues.length ? failedWith(this.issues) : undefined;
  }
}

export async function checkCases(files: string[], base: RuleBase, runner?: CaseRunner, stream: CaseStream = {}): Promise<Result<CaseCheckReport>> {
  // One set of engines for the ranking and the replays: runs share no state.
  const engine = buildEngine(base);
  const run = runner ?? wholeCaseRunner(base, engine);
  const replay = loopReplayer(base, engine);
  const same = sameCause(base);
  const causeIds = new Set(base.causes.map((c) => c.id));
  const issues = new CaseIssues();
  const tally = new CaseTally();
  const cases: CaseRank[] = [];
  const skipped: SkippedCase[] = [];
  for (const [k, file] of files.entries()) {
    const r = await rankCaseFile(file, causeIds, run, replay, same);
    if ('issues' in r) issues.add(r.issues);
    else if ('skipped' in r) skipped.push(r.skipped);
    else {
      tally.add(r);
      stream.onCase?.(r);
      if (stream.keep !== false) cases.push(r);
    }
    stream.onProgress?.(k + 1, files.length);
  }
  const failure = issues.result(files[0] ? dirname(files[0]) : '.');
  if (failure) return failure;
  return ok({ total: tally.total, top1: tally.top1, top3: tally.top3, cases, skipped });
}
