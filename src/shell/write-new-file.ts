/**
 * Writes a file that never replaces another: the content goes to a temporary file first (and
 * is synced), then is linked to the final name, which fails if that name exists; the next
 * suffix (-2, -3, …) is tried. An interrupted write leaves no half-written file under a final name.
 */
import { closeSync, fsyncSync, linkSync, openSync, unlinkSync, writeSync } from 'node:fs';
import { join } from 'node:path';

export interface Written {
  file: string;
  /** 1 for the plain name, 2 for "-2", and so on. */
  suffix: number;
}

export interface WriteOptions {
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
    const tmp = join(dir, `.${name}.${process.pid}.${Date.now()}.tmp`);
    const fd = openSync(tmp, 'wx', 0o644);
    try {
      writeSync(fd, text);
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    try {
      link(tmp, join(dir, name));
      return { file: join(dir, name), suffix: n };
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
    } finally {
      unlinkSync(tmp);
    }
  }
  throw new Error(`no free name for ${stem}${ext} after ${maxTries} tries`);
}
