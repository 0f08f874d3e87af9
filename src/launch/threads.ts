/**
 * How many threads `cases check` works on, and the heap each worker thread gets. Kept apart from
 * the tool so that the launcher can read it before loading anything else.
 */
import { availableParallelism } from 'node:os';

const MAX_THREADS = 8;

/** One per core, at most 8; DCTRIAGE_THREADS=1 keeps everything on one thread (to compare, or on a machine shared with other work). */
export function threadsWanted(): number {
  return Math.min(Number(process.env.DCTRIAGE_THREADS) || availableParallelism(), MAX_THREADS);
}

/**
 * A helper thread's heap: enough for the built-in rules with room to spare, and small, so that
 * garbage is collected rather than held (memory stays flat). DCTRIAGE_WORKER_HEAP_MB changes it
 * (a test starves helpers with it); a helper that runs out hands its batches back. A young
 * generation of 6 MB keeps 20,000 cases under 150 MB for the process with no loss of speed
 * measured against 8 MB (bench/cases-scale.mjs).
 */
export const HELPER_LIMITS = { maxOldGenerationSizeMb: Number(process.env.DCTRIAGE_WORKER_HEAP_MB) || 48, maxYoungGenerationSizeMb: 6 };

/** The thread the whole command runs in (see off-thread.ts): a helper's heap, and room for the order of results it keeps. */
export const COMMAND_LIMITS = { maxOldGenerationSizeMb: 64, maxYoungGenerationSizeMb: 6 };
