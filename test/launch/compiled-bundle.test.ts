import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { runBundle } from '../../src/launch/compiled-bundle.js';
import { installCopy, ROOT, runCli } from '../support/cli.js';

const answer = (n: number) => `module.exports.answer = function () { return ${n}; }; module.exports.answer();\n`;

/** A one-function bundle in a fresh folder. */
function bundleAnswering(n: number): { dir: string; file: string } {
  const dir = mkdtempSync(join(tmpdir(), 'dctriage-bundle-'));
  const file = join(dir, 'b.cjs');
  writeFileSync(file, answer(n));
  return { dir, file };
}

/** Runs module code in a fresh node with TypeScript sources importable, and gives its stdout. */
function inFreshNode(code: string): string {
  const r = spawnSync(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', code], { cwd: ROOT, encoding: 'utf8' });
  if (r.status !== 0) throw new Error(r.stderr);
  return r.stdout;
}
const LOADER = JSON.stringify(join(ROOT, 'src/launch/compiled-bundle.ts'));

/**
 * Runs the bundle in a fresh node, as the launcher does: within one process V8 reuses what it
 * compiled before and would take any cache for source it has already seen.
 */
function runFresh(file: string, cacheFile: string | undefined): { cacheUsed: boolean; answer: number } | undefined {
  const out = inFreshNode(`const { runBundle } = await import(${LOADER});
    const b = runBundle(${JSON.stringify(file)}, ${JSON.stringify(cacheFile)});
    console.log(JSON.stringify(b ? { cacheUsed: b.cacheUsed, answer: b.exports.answer() } : null));`);
  return JSON.parse(out) ?? undefined;
}

/** A cache for the bundle as it is now, made in a fresh node like the build's. */
function makeCache(file: string, cacheFile: string): Buffer {
  inFreshNode(`const { runBundle, codeCacheBytes } = await import(${LOADER});
    const { writeFileSync } = await import('node:fs');
    const b = runBundle(${JSON.stringify(file)}, undefined);
    b.exports.answer();
    writeFileSync(${JSON.stringify(cacheFile)}, codeCacheBytes(b));`);
  return readFileSync(cacheFile);
}

describe('running a bundle with a code cache', () => {
  it('uses a cache made from the same source', () => {
    const { dir, file } = bundleAnswering(41);
    expect(runFresh(file, join(dir, 'none.cache'))).toEqual({ cacheUsed: false, answer: 41 });
    makeCache(file, join(dir, 'b.cache'));
    expect(runFresh(file, join(dir, 'b.cache'))).toEqual({ cacheUsed: true, answer: 41 });
  });

  // V8 in Node 20 takes a cache made for other source of the same length and runs the old code
  // (measured: it returned 41 for source that returns 42), hence the digest.
  it('refuses a cache made from other source of the same length', () => {
    const { dir, file } = bundleAnswering(41);
    makeCache(file, join(dir, 'b.cache'));
    writeFileSync(file, answer(42));
    expect(runFresh(file, join(dir, 'b.cache'))).toEqual({ cacheUsed: false, answer: 42 });
  });

  it('runs without the cache when it is shorter than its digest, or missing', () => {
    const { dir, file } = bundleAnswering(7);
    writeFileSync(join(dir, 'b.cache'), Buffer.alloc(16));
    expect(runFresh(file, join(dir, 'b.cache'))).toEqual({ cacheUsed: false, answer: 7 });
    expect(runFresh(file, join(dir, 'none.cache'))).toEqual({ cacheUsed: false, answer: 7 });
  });

  it('runs without the cache when its compiled code is cut short after the right digest', () => {
    const { dir, file } = bundleAnswering(7);
    const whole = makeCache(file, join(dir, 'b.cache'));
    writeFileSync(join(dir, 'b.cache'), whole.subarray(0, 32 + Math.floor((whole.length - 32) / 2)));
    expect(runFresh(file, join(dir, 'b.cache'))).toEqual({ cacheUsed: false, answer: 7 });
  });

  it('gives nothing for a bundle that is missing or cut short, so the launcher can fall back', () => {
    const { dir, file } = bundleAnswering(7);
    expect(runBundle(join(dir, 'missing.cjs'), undefined)).toBeUndefined();
    writeFileSync(file, answer(7).slice(0, 30));
    expect(runBundle(file, undefined)).toBeUndefined();
  });

  it('the build made a cache that this Node takes for dist/core.cjs', () => {
    const core = runBundle(join(ROOT, 'dist', 'core.cjs'), join(ROOT, 'dist', 'core.cjs.cache'))!;
    expect(core.cacheUsed).toBe(true);
    expect(typeof core.exports.runCli).toBe('function');
  });
});

describe('the launcher', () => {
  const someCase = join(ROOT, 'cases', '2026-10-14-press-feed-field-weak.json');

  const runInstalled = (install: string) => spawnSync(process.execPath, [join(install, 'dist', 'cli.mjs'), 'diagnose', someCase, '--json'], { encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });

  it('gives the same answer from the ES module build when the CommonJS bundle is missing or cut short', () => {
    const usual = runCli(['diagnose', someCase, '--json']);
    expect(usual.code).toBe(0);
    expect(JSON.parse(usual.stdout).causes[0].id).toBe('field-weak');
    const missing = installCopy();
    rmSync(join(missing, 'dist', 'core.cjs'));
    const cut = installCopy();
    const bundle = readFileSync(join(cut, 'dist', 'core.cjs'));
    writeFileSync(join(cut, 'dist', 'core.cjs'), bundle.subarray(0, bundle.length >> 1));
    for (const install of [missing, cut]) {
      const fallback = runInstalled(install);
      expect(fallback.stderr).toBe('');
      expect(fallback.status).toBe(0);
      expect(fallback.stdout).toBe(usual.stdout);
    }
  });
});

describe('a code cache V8 refuses', () => {
  const someCase = join(ROOT, 'cases', '2026-10-14-press-feed-field-weak.json');

  it('is written afresh by the first run, so the next run uses it (as after a Node upgrade)', () => {
    const install = installCopy();
    const cacheFile = join(install, 'dist', 'core.cjs.cache');
    const good = readFileSync(cacheFile);
    // The same length, the right digest, other compiled data: as a cache from another V8 would be.
    const foreign = Buffer.concat([good.subarray(0, 32), Buffer.alloc(good.length - 32, 7)]);
    writeFileSync(cacheFile, foreign);
    const used = () =>
      JSON.parse(
        inFreshNode(`const { runBundle } = await import(${LOADER});
          const b = runBundle(${JSON.stringify(join(install, 'dist', 'core.cjs'))}, ${JSON.stringify(cacheFile)});
          console.log(JSON.stringify({ cacheUsed: b.cacheUsed, runCli: typeof b.exports.runCli }));`),
      );
    expect(used()).toEqual({ cacheUsed: false, runCli: 'function' });
    const first = spawnSync(process.execPath, [join(install, 'dist', 'cli.mjs'), 'diagnose', someCase, '--json'], { encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
    expect(first.status, first.stderr).toBe(0);
    expect(readFileSync(cacheFile).equals(foreign)).toBe(false);
    expect(used()).toEqual({ cacheUsed: true, runCli: 'function' });
  });
});
