import { cpSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { codeCacheBytes, runBundle } from '../../src/launch/compiled-bundle.js';
import { ROOT, runCli } from '../support/cli.js';

const answer = (n: number) => `module.exports.answer = function () { return ${n}; }; module.exports.answer();\n`;

/** A one-function bundle in a fresh folder. */
function bundleAnswering(n: number): { dir: string; file: string } {
  const dir = mkdtempSync(join(tmpdir(), 'dctriage-bundle-'));
  const file = join(dir, 'b.cjs');
  writeFileSync(file, answer(n));
  return { dir, file };
}

describe('running a bundle with a code cache', () => {
  it('uses a cache made from the same source', () => {
    const { dir, file } = bundleAnswering(41);
    const first = runBundle(file, join(dir, 'none.cache'))!;
    expect(first.cacheUsed).toBe(false);
    writeFileSync(join(dir, 'b.cache'), codeCacheBytes(first));
    const second = runBundle(file, join(dir, 'b.cache'))!;
    expect(second.cacheUsed).toBe(true);
    expect((second.exports.answer as () => number)()).toBe(41);
  });

  it('refuses a cache made from other source of the same length, which V8 alone would take', () => {
    const { dir, file } = bundleAnswering(41);
    writeFileSync(join(dir, 'b.cache'), codeCacheBytes(runBundle(file, undefined)!));
    writeFileSync(file, answer(42));
    const edited = runBundle(file, join(dir, 'b.cache'))!;
    expect(edited.cacheUsed).toBe(false);
    expect((edited.exports.answer as () => number)()).toBe(42);
  });

  it('runs without the cache when it is truncated or missing', () => {
    const { dir, file } = bundleAnswering(7);
    writeFileSync(join(dir, 'b.cache'), Buffer.alloc(16));
    expect(runBundle(file, join(dir, 'b.cache'))!.cacheUsed).toBe(false);
    expect(runBundle(join(dir, 'missing.cjs'), undefined)).toBeUndefined();
  });

  it('the build made a cache that this Node takes for dist/core.cjs', () => {
    const core = runBundle(join(ROOT, 'dist', 'core.cjs'), join(ROOT, 'dist', 'core.cjs.cache'))!;
    expect(core.cacheUsed).toBe(true);
    expect(typeof core.exports.runCli).toBe('function');
  });
});

describe('the launcher', () => {
  const someCase = join(ROOT, 'cases', '2026-10-14-press-feed-field-weak.json');

  it('gives the same answer from the ES module build when the CommonJS bundle is missing', () => {
    const install = mkdtempSync(join(tmpdir(), 'dctriage-install-'));
    for (const d of ['dist', 'rules', 'cases']) cpSync(join(ROOT, d), join(install, d), { recursive: true });
    rmSync(join(install, 'dist', 'core.cjs'));
    const fallback = spawnSync(process.execPath, [join(install, 'dist', 'cli.mjs'), 'diagnose', someCase, '--json'], { encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
    const usual = runCli(['diagnose', someCase, '--json']);
    expect(fallback.status).toBe(0);
    expect(usual.code).toBe(0);
    expect(fallback.stdout).toBe(usual.stdout);
    expect(JSON.parse(usual.stdout).causes[0].id).toBe('field-weak');
  });
});
