/** Runs every recorded case whose outcome names a cause and reports where that cause ranked. */
import type { CaseFile, CaseInput } from '../knowledge/case-schema.js';
import { loadCaseFile } from '../knowledge/load-case.js';
import type { RuleBase } from '../knowledge/load-rules.js';
import { failedWith, ok, type Issue, type Result } from '../knowledge/result.js';
import { dirname } from 'node:path';
import { diagnose } from './diagnose.js';

/** Case files whose issues are listed; the rest are counted. */
const FILES_WITH_ISSUES_SHOWN = 20;
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
  const run: CaseRunner = runner ?? (async (c) => ({ ranked: (await diagnose(c, base, engine)).causes.map((x) => x.id) }));
  const causeIds = new Set(base.causes.map((c) => c.id));
  const issues: Issue[] = [];
  const cases: CaseRank[] = [];
  let badFiles = 0;
  for (const file of files) {
    const c = loadCaseFile(file, causeIds);
    if (!c.ok) {
      // The first files' issues say what is wrong; beyond them, a count.
      if (++badFiles <= FILES_WITH_ISSUES_SHOWN) issues.push(...c.issues);
      continue;
    }
    const { job, raw } = c.value;
    const expected = job.outcome?.cause;
    if (expected === undefined) continue;
    const { ranked, questionsAsked } = await run(job, raw);
    cases.push({ id: job.id ?? file, file, expected, rank: ranked.indexOf(expected) + 1, ranked: ranked.slice(0, 5), ...(questionsAsked ? { questionsAsked } : {}) });
  }
  const more = badFiles - FILES_WITH_ISSUES_SHOWN;
  if (more > 0) issues.push({ code: 'invalid', file: dirname(files[0]!), path: '', message: `and ${more} more case file${more === 1 ? '' : 's'} with issues` });
  if (issues.length) return failedWith(issues);
  return ok({
    total: cases.length,
    top1: cases.filter((c) => c.rank === 1).length,
    top3: cases.filter((c) => c.rank >= 1 && c.rank <= 3).length,
    cases,
  });
}
