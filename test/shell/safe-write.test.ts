/**
 * Writes that come up short (a full disk, a file-size limit) are finished or fail whole: nothing
 * half-written is published, the previous file stays as it was, no temporary file is left.
 */
import { mkdtempSync, readdirSync, readFileSync, writeFileSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createFile, replaceFile, WriteFailed, writeNewFile, type WriteBytes } from '../../src/shell/safe-write.js';

const dir = () => mkdtempSync(join(tmpdir(), 'dctriage-write-'));

/** Takes at most `chunk` bytes a call, and none after `capacity` bytes in all: a disk that fills up. */
function shortWriter(chunk: number, capacity = Infinity): WriteBytes {
  let used = 0;
  return (fd, buffer, offset, length) => {
    const n = Math.max(0, Math.min(chunk, length, capacity - used));
    used += n;
    return n === 0 ? 0 : writeSync(fd, buffer, offset, n);
  };
}

describe('safe writes', () => {
  it('writes every byte when each write takes only a few', () => {
    const d = dir();
    const text = 'ÿ-x'.repeat(1000);
    replaceFile(join(d, 'a.json'), text, 0o644, { write: shortWriter(7) });
    expect(readFileSync(join(d, 'a.json'), 'utf8')).toBe(text);
  });

  it('keeps the previous file and leaves no temporary file when the disk fills up while replacing', () => {
    const d = dir();
    const file = join(d, 'session.json');
    writeFileSync(file, 'previous');
    expect(() => replaceFile(file, 'x'.repeat(5000), 0o600, { write: shortWriter(1024, 2048) })).toThrow(WriteFailed);
    expect(() => replaceFile(file, 'x'.repeat(5000), 0o600, { write: shortWriter(1024, 2048) })).toThrow(/disk is full; nothing was written/);
    expect(readFileSync(file, 'utf8')).toBe('previous');
    expect(readdirSync(d)).toEqual(['session.json']);
  });

  it('publishes no new file when the disk fills up', () => {
    const d = dir();
    expect(() => writeNewFile(d, 'case', '.json', 'y'.repeat(4000), { write: shortWriter(4096, 100) })).toThrow(WriteFailed);
    expect(() => createFile(join(d, 'report.md'), 'y'.repeat(4000), { write: shortWriter(4096, 100) })).toThrow(WriteFailed);
    expect(readdirSync(d)).toEqual([]);
  });

  it('never replaces a file when creating one', () => {
    const d = dir();
    writeFileSync(join(d, 'report.md'), 'theirs');
    expect(() => createFile(join(d, 'report.md'), 'ours')).toThrow(/appeared meanwhile/);
    expect(readFileSync(join(d, 'report.md'), 'utf8')).toBe('theirs');
    expect(readdirSync(d)).toEqual(['report.md']);
  });
});
