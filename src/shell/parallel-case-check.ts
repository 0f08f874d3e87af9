/**
 * cases check on every core: the files go out in batches, worked by this thread and by one helper
 * thread for each further core, each with its own rule engine; the results are reported in file
 * order as they arrive, so only a few batches are ever held. A helper is this same command started
 * again in a thread (the launcher, then runCli, which sees the helper's data and serves batches).
 */
import { isMainThread, parentPort, Worker, workerData } from 'node:worker_threads';
import { dirname } from 'node:path';
import { CaseIssues, CaseTally, checkCases, loopReplayer, rankCaseFile, sameCause, wholeCaseRunner, type CaseCheckReport, type CaseRank, type CaseStream, type SkippedCase } from '../engine/check-cases.js';
import { buildEngine } from '../engine/run-rules.js';
import type { RuleBase } from '../knowledge/load-rules.js';
import { ok, type Issue, type Result } from '../knowledge/result.js';
import { HELPER_LIMITS, threadsWanted } from '../launch/threads.js';

/** Files per message: large enough that messages cost little, small enough that order costs no memory. */
const BATCH = 50;
/** Below this, starting threads costs more than it saves. */
const MIN_FILES = 200;
/** Batches a helper holds at once: it starts the next while this thread, busy with its own, has not yet read the last. */
const IN_FLIGHT = 2;

type Ranked = CaseRank | { skipped: SkippedCase } | { issues: Issue[] };
interface WorkerJob {
  dctriageCaseCheck: { rules: string };
}
type ToWorker = { batch: number; files: string[] } | { done: true };
type FromWorker = { batch: number; results: Ranked[] } | { failed: string };

/** The job, when this thread is a cases-check worker. */
export function caseCheckWorkerJob(): { rules: string } | undefined {
  return !isMainThread && (workerData as WorkerJob | undefined)?.dctriageCaseCheck ? (workerData as WorkerJob).dctriageCaseCheck : undefined;
}

/** The worker's side: rank each batch it is sent, until told it is done. */
export function runCaseCheckWorker(job: { rules: string }, loadRules: (dir: string) => Result<RuleBase>): Promise<void> {
  const port = parentPort!;
  const base = loadRules(job.rules);
  if (!base.ok) {
    port.postMessage({ failed: `${job.rules}: the rule folder did not load in a worker` } satisfies FromWorker);
    return Promise.resolve();
  }
  const engine = buildEngine(base.value);
  const run = wholeCaseRunner(base.value, engine);
  const replay = loopReplayer(base.value, engine);
  const same = sameCause(base.value);
  const causeIds = new Set(base.value.causes.map((c) => c.id));
  // Batches are worked one after the other, in the order they came.
  let queue = Promise.resolve();
  return new Promise((resolve) => {
    port.on('message', (m: ToWorker) => {
      if ('done' in m) {
        port.close();
        resolve();
        return;
      }
      queue = queue.then(async () => {
        const results: Ranked[] = [];
        for (const file of m.files) results.push(await rankCaseFile(file, causeIds, run, replay, same));
        port.postMessage({ batch: m.batch, results } satisfies FromWorker);
      });
    });
  });
}

/** Like checkCases, with helper threads when there are enough files and cores; in this thread alone otherwise. */
export async function checkCasesInParallel(files: string[], base: RuleBase, rulesDir: string, stream: CaseStream, script = process.argv[1]): Promise<Result<CaseCheckReport>> {
  const batches: string[][] = [];
  for (let k = 0; k < files.length; k += BATCH) batches.push(files.slice(k, k + BATCH));
  const threads = Math.min(threadsWanted(), batches.length);
  if (threads < 2 || files.length < MIN_FILES || !script) return checkCases(files, base, undefined, stream);

  const issues = new CaseIssues();
  const tally = new CaseTally();
  const skipped: SkippedCase[] = [];
  const arrived = new Map<number, Ranked[]>();
  const pending = batches.map((_, k) => k);
  let nextToReport = 0;
  let filesDone = 0;
  const helpers: Worker[] = [];
  try {
    await new Promise<void>((resolve, reject) => {
      const report = () => {
        for (let r = arrived.get(nextToReport); r; r = arrived.get(nextToReport)) {
          arrived.delete(nextToReport++);
          for (const x of r) {
            if ('issues' in x) issues.add(x.issues);
            else if ('skipped' in x) skipped.push(x.skipped);
            else {
              tally.add(x);
              stream.onCase?.(x);
            }
            stream.onProgress?.(++filesDone, files.length);
          }
        }
        if (nextToReport === batches.length) resolve();
      };
      // This thread works batches too, and between two lets the helpers' results in.
      const engineHere = buildEngine(base);
      const here = wholeCaseRunner(base, engineHere);
      const replayHere = loopReplayer(base, engineHere);
      const sameHere = sameCause(base);
      const causeIds = new Set(base.causes.map((c) => c.id));
      let working = false;
      const workHere = async () => {
        if (working) return;
        working = true;
        for (let batch = pending.shift(); batch !== undefined; batch = pending.shift()) {
          const results: Ranked[] = [];
          for (const file of batches[batch]!) results.push(await rankCaseFile(file, causeIds, here, replayHere, sameHere));
          arrived.set(batch, results);
          report();
          await new Promise((next) => setImmediate(next));
        }
        working = false;
      };
      const start = () => {
        // The same command in a thread: argv keeps the launcher on its fast build. Its heap is
        // kept small, so that garbage is collected rather than held (memory stays flat).
        const w = new Worker(script, { argv: ['cases', 'check'], workerData: { dctriageCaseCheck: { rules: rulesDir } } satisfies WorkerJob, stdout: false, stderr: false, resourceLimits: HELPER_LIMITS });
        helpers.push(w);
        const inFlight = new Set<number>();
        const send = () => {
          while (inFlight.size < IN_FLIGHT) {
            const batch = pending.shift();
            if (batch === undefined) return;
            inFlight.add(batch);
            w.postMessage({ batch, files: batches[batch]! } satisfies ToWorker);
          }
        };
        w.on('message', (m: FromWorker) => {
          if ('failed' in m) return reject(new Error(m.failed));
          inFlight.delete(m.batch);
          arrived.set(m.batch, m.results);
          send();
          report();
        });
        // A helper that fails (out of its memory on a large rule base, say): its batches go back, for this thread.
        w.on('error', () => {
          pending.unshift(...inFlight);
          inFlight.clear();
          workHere().catch(reject);
        });
        send();
      };
      try {
        for (let k = 1; k < threads; k++) start();
      } catch {
        // No helper could start: this thread works alone.
      }
      workHere().catch(reject);
    });
  } finally {
    for (const w of helpers) w.postMessage({ done: true } satisfies ToWorker);
  }
  const failure = issues.result(dirname(files[0]!));
  if (failure) return failure;
  return ok({ total: tally.total, top1: tally.top1, top3: tally.top3, cases: [], skipped });
}
