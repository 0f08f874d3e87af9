/**
 * A lock file: created complete (a temporary file holding our process id, linked to the lock's
 * name, which fails if it exists), so a reader never sees an empty one. A lock whose process is
 * gone is stale and is taken over. Guards a session against a second dialogue, and a cases
 * folder while an id is chosen and its file written.
 */
import { readFileSync, unlinkSync } from 'node:fs';
import { createFile } from './safe-write.js';

/** Held by a live process. */
export class Locked extends Error {
  constructor(
    readonly file: string,
    readonly pid: number,
  ) {
    super(`${file} is held by process ${pid}`);
  }
}

export interface Lock {
  release(): void;
}

function holder(file: string): number | undefined {
  try {
    const pid = Number(readFileSync(file, 'utf8').trim());
    return Number.isInteger(pid) && pid > 0 ? pid : undefined;
  } catch {
    return undefined;
  }
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    // EPERM: it exists, under another user.
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** Takes the lock or throws Locked; other errors (an unwritable folder) are thrown as they come. */
export function takeLock(file: string): Lock {
  for (let attempt = 0; attempt < 3; attempt++) {
    try {
      createFile(file, `${process.pid}\n`);
      return {
        release() {
          if (holder(file) === process.pid) unlinkSync(file);
        },
      };
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
    }
    const pid = holder(file);
    if (pid !== undefined && pid !== process.pid && alive(pid)) throw new Locked(file, pid);
    // Stale (its process is gone) or unreadable: remove it, unless it changed hands meanwhile.
    if (holder(file) === pid) {
      try {
        unlinkSync(file);
      } catch {
        // someone else removed it first
      }
    }
  }
  throw new Locked(file, holder(file) ?? 0);
}

const sleep = (ms: number) => Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);

/** Waits for a lock held briefly by another process (filing one case takes milliseconds). */
export function waitForLock(file: string, timeoutMs = 15_000): Lock {
  const until = Date.now() + timeoutMs;
  for (;;) {
    try {
      return takeLock(file);
    } catch (e) {
      if (!(e instanceof Locked) || Date.now() > until) throw e;
      sleep(10 + Math.random() * 40);
    }
  }
}
