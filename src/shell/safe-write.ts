/**
 * Writing files so that an interrupted write never leaves half a file under a final name:
 * `writeNewFile` never replaces another file (temporary file, sync, link to the final name, which
 * fails if it exists, then the next suffix -2, -3, …); `replaceFile` replaces one on purpose
 * (temporary file, sync, rename over it).
 */
import { closeSync, fsyncSync, linkSync, openSync, renameSync, unlinkSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';

function writeSynced(file: string, text: string, flags: string, mode = 0o644): void {
  const fd = openSync(file, flags, mode);
  try {
    writeSync(fd, text);
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
}

export function replaceFile(file: string, text: string, mode = 0o644): void {
  const tmp = join(dirname(file), `.${basename(file)}.${process.pid}.tmp`);
  writeSynced(tmp, text, 'w', mode);
  renameSync(tmp, file);
}

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
    writeSynced(tmp, text, 'wx');
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
