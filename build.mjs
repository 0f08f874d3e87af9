// Bundles the CLI into one ESM file so start-up does not pay for thousands of module loads.
import { build } from 'esbuild';
import { spawnSync } from 'node:child_process';
import { chmodSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const pkg = JSON.parse(readFileSync(new URL('./package.json', import.meta.url), 'utf8'));

// Old chunks would pile up under their hashed names.
rmSync('dist', { recursive: true, force: true });

await build({
  entryPoints: ['src/cli.tsx'],
  outdir: 'dist',
  entryNames: '[name]',
  chunkNames: 'chunks/[name]-[hash]',
  outExtension: { '.js': '.mjs' },
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  // The dialogue's screens (Ink, React) are a chunk of their own, loaded only for the dialogue;
  // a single file would also keep all of mathjs, which a lazily loaded part defeats tree-shaking for.
  splitting: true,
  logLevel: 'warning',
  define: { 'process.env.NODE_ENV': '"production"', DCTRIAGE_VERSION: JSON.stringify(pkg.version) },
  // ink imports react-devtools-core statically; it is never used at run time.
  alias: { 'react-devtools-core': './stubs/react-devtools-core.js' },
  // CJS dependencies (signal-exit, json-rules-engine) call require() inside the ESM bundle.
  banner: { js: '#!/usr/bin/env node\nimport { createRequire as __createRequire } from "node:module"; const require = __createRequire(import.meta.url);' },
});
chmodSync('dist/cli.mjs', 0o755);

// The seal of the built-in rules: validated here in full, so a run need not validate them again.
const tmp = mkdtempSync(join(tmpdir(), 'dctriage-build-'));
try {
  const sealer = join(tmp, 'write-rule-seal.mjs');
  await build({ entryPoints: ['scripts/write-rule-seal.ts'], outfile: sealer, bundle: true, platform: 'node', format: 'esm', target: 'node20', logLevel: 'warning' });
  const run = spawnSync(process.execPath, [sealer, 'rules', 'dist/rules.seal.json'], { stdio: 'inherit' });
  if (run.status !== 0) console.warn('build: no rule seal written; every run will validate the built-in rules in full');
} finally {
  rmSync(tmp, { recursive: true, force: true });
}
