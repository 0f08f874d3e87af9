/**
 * Writing files so that an interrupted or failed write never leaves half a file under a final
 * name: the content goes to a temporary file, every byte is written (a short write on a full
 * disk is retried, and fails when no byte more goes in), the file is synced, then published.
 * `writeNewFile` never replaces another file (link to the final name, which fails if it exists,
 * then the next suffix -2, -3, …); `replaceFile` replaces one on purpose (rename over it);
 * `createFile` takes one exact new name. On any failure the temporary file is removed, nothing
 * is published, the previous file is left as it was, and a `WriteFailed` says why.
 */
import { closeSync, existsSync, fsyncSync, linkSync, mkdirSync, openSync, renameSync, unlinkSync, writeSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';

/** fs.writeSync's shape for a buffer: returns how many bytes went in. Replaceable so tests can fill the disk. */
export type WriteBytes = (fd: number, buffer: Uint8Array, offset: number, length: number) => number;

/** A file could not be written; `file` is the name it was meant for. Exit 74 in the CLI. */
export class WriteFailed extends Error {
  constructor(
    readonly file: string,
    readonly reason: string,
    readonly code?: string,
  ) {
    super(`${file}: ${reason}`);
  }
}

/** A file system error in words a fitter can act on. */
export function writeProblem(e: unknown): string {
  if (e instanceof WriteFailed) return e.reason;
  const code = (e as NodeJS.ErrnoException).code;
  if (code === 'ENOSPC') return 'the disk is full';
  if (code === 'EDQUOT') return 'the disk quota is used up';
  if (code === 'EFBIG') return 'the file is larger than this process may write (file-size limit)';
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied: the folder is not writable';
  if (code === 'EROFS') return 'the file system is read-only';
  if (code === 'ENOENT') return 'the folder does not exist';
  if (code === 'ENOTDIR') return 'a part of the path is not a folder';
  if (code === 'EISDIR') return 'that is a folder, not a file';
  return (e as Error).message;
}

const failure = (file: string, e: unknown) => (e instanceof WriteFailed ? e : new WriteFailed(file, writeProblem(e), (e as NodeJS.ErrnoException).code));

/** Writes every byte of `text` or throws: a write that takes no byte more means the disk is full. */
export function writeAll(fd: number, text: string, write: WriteBytes = writeSync): void {
  const bytes = Buffer.from(text, 'utf8');
  let done = 0;
  while (done < bytes.length) {
    const n = write(fd, bytes, done, bytes.length - done);
    if (!(n > 0)) throw Object.assign(new Error(`only ${done} of ${bytes.length} bytes could be written`), { code: 'ENOSPC' });
    done += n;
  }
}

export interface IoOptions {
  /** The step that writes bytes; replaceable so tests can make it short. */
  write?: WriteBytes;
}

/** A complete, synced temporary file beside `file`, or nothing at all. Returns its name. */
function writeTemp(file: string, text: string, mode: number, io: IoOptions): string {
  const tmp = join(dirname(file), `.${basename(file)}.${process.pid}.${Date.now()}.${Math.random().toString(36).slice(2, 8)}.tmp`);
  let fd: number;
  try {
    fd = openSync(tmp, 'wx', mode);
  } catch (e) {
    throw failure(file, e);
  }
  try {
    writeAll(fd, text, io.write);
    fsyncSync(fd);
  } catch (e) {
    closeSync(fd);
    removeQuietly(tmp);
    const why = writeProblem(e);
    throw new WriteFailed(file, `${why}; nothing was written`, (e as NodeJS.ErrnoException).code);
  }
  closeSync(fd);
  return tmp;
}

function removeQuietly(file: string): void {
  try {
    unlinkSync(file);
  } catch {
    // already gone
  }
}

/** A temporary file ready to be published; `abort` removes it. */
export interface Staged {
  publish(): void;
  abort(): void;
}

/**
 * Writes `text` completely beside `file` without touching `file`: `publish` then replaces it
 * (or creates it exclusively with `exclusive`). For several files that must change together.
 */
export function stageFile(file: string, text: string, opts: IoOptions & { mode?: number; exclusive?: boolean } = {}): Staged {
  const tmp = writeTemp(file, text, opts.mode ?? 0o644, opts);
  return {
    publish() {
      try {
        if (opts.exclusive) {
          linkSync(tmp, file);
          unlinkSync(tmp);
        } else renameSync(tmp, file);
      } catch (e) {
        removeQuietly(tmp);
        throw failure(file, (e as NodeJS.ErrnoException).code === 'EEXIST' ? new WriteFailed(file, 'a file of that name appeared meanwhile; it was left as it was', 'EEXIST') : e);
      }
    },
    abort: () => removeQuietly(tmp),
  };
}

export function replaceFile(file: string, text: string, mode = 0o644, io: IoOptions = {}): void {
  stageFile(file, text, { ...io, mode }).publish();
}

/** Creates `file`, which must not exist: never replaces anything. */
export function createFile(file: string, text: string, io: IoOptions = {}): void {
  stageFile(file, text, { ...io, exclusive: true }).publish();
}

export interface Written {
  file: string;
  /** 1 for the plain name, 2 for "-2", and so on. */
  suffix: number;
}

export interface WriteOptions extends IoOptions {
  /** Suffixes known to be taken for another reason (an id already used under another name). */
  skip?: (suffix: number) => boolean;
  maxTries?: number;
  /** The step that publishes the file; replaceable so tests can fail it. */
  link?: (from: string, to: string) => void;
}

export function writeNewFile(dir: string, stem: string, ext: string, content: string | ((suffix: number) => string), opts: WriteOptions = {}): Written {
  const { skip = () => false, maxTries = 1000, link = linkSync } = opts;
  for (let n = 1; n <= maxTries; n++) {
    if (skip(n)) continue;
    const name = n === 1 ? `${stem}${ext}` : `${stem}-${n}${ext}`;
    const text = typeof content === 'function' ? content(n) : content;
    const tmp = writeTemp(join(dir, name), text, 0o644, opts);
    try {
      link(tmp, join(dir, name));
      return { file: join(dir, name), suffix: n };
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw failure(join(dir, name), e);
    } finally {
      removeQuietly(tmp);
    }
  }
  throw new WriteFailed(join(dir, `${stem}${ext}`), `no free name after ${maxTries} tries`);
}

/**
 * Makes a folder and any missing parents, one level at a time. Node's own recursive mkdir loops
 * for ever under /proc (every level reports ENOENT), so it is not used for a folder a user names.
 */
export function makeFolder(dir: string): void {
  const missing: string[] = [];
  for (let d = resolve(dir); !existsSync(d); d = dirname(d)) {
    missing.push(d);
    if (dirname(d) === d) break;
  }
  for (const d of missing.reverse()) mkdirSync(d);
}
