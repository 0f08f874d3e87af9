import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { Locked, takeLock } from '../../src/shell/lock.js';

const lockIn = () => join(mkdtempSync(join(tmpdir(), 'dctriage-lock-')), 'session.json.lock');
/** The id of a process that has ended. */
const deadPid = () => spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' }).stdout;

describe('a lock file', () => {
  it('is refused to a second taker while its process lives, and free once released', () => {
    const file = lockIn();
    writeFileSync(file, `${process.ppid}\n`);
    expect(() => takeLock(file)).toThrow(Locked);
    expect(readFileSync(file, 'utf8')).toBe(`${process.ppid}\n`);
  });

  it('is taken over when the process that held it is gone', () => {
    const file = lockIn();
    writeFileSync(file, `${deadPid()}\n`);
    const lock = takeLock(file);
    expect(readFileSync(file, 'utf8')).toBe(`${process.pid}\n`);
    lock.release();
    expect(existsSync(file)).toBe(false);
  });
});
