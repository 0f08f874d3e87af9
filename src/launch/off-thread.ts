/**
 * `cases check` runs in a worker thread with a bounded heap, and the process's main thread only
 * launches it and passes its output on. A main thread that checked cases would keep a heap sized
 * for its busiest moment, unbounded; a worker's is capped, so memory stays flat. The worker
 * checks cases itself and starts a helper for each further core (src/shell/parallel-case-check.ts).
 */
import { isMainThread, Worker, workerData } from 'node:worker_threads';
import type { CommandLine } from '../shell/cli-options.js';
import { COMMAND_LIMITS, threadsWanted } from './threads.js';
import { watchStdout } from './watch-stdout.js';

/** What the command thread cannot see for itself: its output goes through the main thread, not to the terminal. */
export interface TerminalFacts {
  stdoutColumns: number | undefined;
  stderrIsTTY: boolean;
}

interface CommandJob {
  dctriageCommand: { terminal: TerminalFacts };
}

/** Whether this command line runs in a thread of its own: cases check on a machine with cores to spare (not --adaptive, which asks one case at a time). */
export function runsOffThread(line: CommandLine): boolean {
  return isMainThread && line.kind === 'run' && line.command === 'cases check' && !line.opts.adaptive && threadsWanted() >= 2;
}

/** The terminal as the main thread sees it, in the command thread; the streams' own, elsewhere. */
export function terminalFacts(): TerminalFacts {
  const job = isMainThread ? undefined : (workerData as CommandJob | undefined)?.dctriageCommand;
  return job?.terminal ?? ownTerminal();
}

const ownTerminal = (): TerminalFacts => ({ stdoutColumns: process.stdout.columns, stderrIsTTY: process.stderr.isTTY === true });

/**
 * Runs the command line in a worker thread started on `script` (this launcher again) and waits
 * for it; its output reaches this thread's streams, and its exit code becomes the process's.
 */
export function runOffThread(script: string, argv: string[]): Promise<void> {
  return new Promise((resolve) => {
    const job: CommandJob = { dctriageCommand: { terminal: ownTerminal() } };
    const worker = new Worker(script, { argv, workerData: job, resourceLimits: COMMAND_LIMITS });
    // The output is written here, so its failures are met here as a command in this thread meets them.
    watchStdout();
    worker.on('error', (e: Error & { code?: string }) => {
      const why = e.code === 'ERR_WORKER_OUT_OF_MEMORY' ? `the check ran out of its ${COMMAND_LIMITS.maxOldGenerationSizeMb} MB of memory (DCTRIAGE_THREADS=1 runs it without that limit)` : e.message;
      process.stderr.write(`dctriage: internal error: ${why}\nPlease report this with the folder you gave.\n`);
      process.exitCode = 70;
    });
    worker.on('exit', (code) => {
      process.exitCode ??= code;
      resolve();
    });
  });
}
