/**
 * Runs the program's own CommonJS bundle (dist/core.cjs) with a V8 code cache, so that a command
 * does not parse and compile a megabyte of JavaScript on every start: Node 20 keeps no compile
 * cache for ES modules. The cache is made by the build on this machine's Node (see
 * scripts/write-code-cache.ts) and begins with the SHA-256 of the source it was made from.
 * V8 itself refuses a cache from another V8 version or other flags; this file refuses one
 * from other source. Either way the bundle is then compiled as usual, only slower.
 *
 * Only the bundle next to the launcher is ever compiled here; no data file is.
 */
import { createHash } from 'node:crypto';
import { readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, resolve } from 'node:path';
import { Script } from 'node:vm';

const DIGEST_BYTES = 32;
// The same wrapper node puts around a CommonJS module. It is part of the digest, so a cache
// made for another wrapper around the same bundle is refused.
const WRAPPER_HEAD = '(function (exports, require, module, __filename, __dirname) {';
const WRAPPER_TAIL = '\n})';

export interface CompiledBundle {
  exports: Record<string, unknown>;
  script: Script;
  digest: Buffer;
  /** Whether V8 took the cache; false when there was none or it was refused. */
  cacheUsed: boolean;
}

/**
 * The bundle's exports, or undefined when the bundle cannot be read (running from source) or
 * does not compile and load (cut short by a full disk or an interrupted build): the launcher
 * then runs the ES module build instead.
 */
export function runBundle(bundleFile: string, cacheFile: string | undefined): CompiledBundle | undefined {
  const file = resolve(bundleFile);
  let bytes: Buffer;
  try {
    bytes = readFileSync(file);
  } catch {
    return undefined;
  }
  // Hashing the bytes is a quarter of the cost of hashing the decoded text.
  const digest = createHash('sha256').update(WRAPPER_HEAD).update(WRAPPER_TAIL).update(bytes).digest();
  const cachedData = cacheFile ? cacheFor(cacheFile, digest) : undefined;
  try {
    const script = new Script(WRAPPER_HEAD + bytes.toString('utf8') + WRAPPER_TAIL, { filename: file, ...(cachedData ? { cachedData } : {}) });
    const module = { exports: {} as Record<string, unknown> };
    const init = script.runInThisContext() as (e: unknown, r: NodeJS.Require, m: unknown, f: string, d: string) => void;
    init(module.exports, createRequire(file), module, file, dirname(file));
    return { exports: module.exports, script, digest, cacheUsed: cachedData !== undefined && !script.cachedDataRejected };
  } catch {
    return undefined;
  }
}

/** The cache as written by writeCodeCache: the source's digest, then V8's data. */
export function codeCacheBytes(bundle: CompiledBundle): Buffer {
  return Buffer.concat([bundle.digest, bundle.script.createCachedData()]);
}

/**
 * Writes a fresh cache after a run whose cache was missing or refused (Node was upgraded, or the
 * cache came from the machine that packed the install), so the next start is quick again without
 * a rebuild. An install folder that cannot be written is left as it is.
 */
export function refreshCodeCache(bundle: CompiledBundle, cacheFile: string): boolean {
  const tmp = `${cacheFile}.${process.pid}.tmp`;
  try {
    writeFileSync(tmp, codeCacheBytes(bundle));
    renameSync(tmp, cacheFile);
    return true;
  } catch {
    rmSync(tmp, { force: true });
    return false;
  }
}

function cacheFor(cacheFile: string, digest: Buffer): Buffer | undefined {
  let bytes: Buffer;
  try {
    bytes = readFileSync(cacheFile);
  } catch {
    return undefined;
  }
  if (bytes.length <= DIGEST_BYTES || !bytes.subarray(0, DIGEST_BYTES).equals(digest)) return undefined;
  return bytes.subarray(DIGEST_BYTES);
}
