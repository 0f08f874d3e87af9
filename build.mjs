// Builds the dctriage command from the same sources twice (see src/bin.ts):
//   dist/cli.mjs + dist/chunks/  ES modules: the launcher, and the dialogue with its screens;
//   dist/core.cjs (+ .cache)      one CommonJS bundle with a V8 code cache, for every command.
// Then seals the built-in rules (src/knowledge/rule-seal.ts) and writes the code cache.
import { build } from 'esbuild';
import { spawnSync } from 'node:child_process';
import { chmodSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

// Every path below is the project's: build from here whatever the caller's folder (esbuild is
// told too, as it takes its folder when it is imported).
const root = dirname(fileURLToPath(import.meta.url));
process.chdir(root);
const pkg = JSON.parse(readFileSync(new URL('./package.json', import.meta.url), 'utf8'));
const common = {
  absWorkingDir: root,
  bundle: true,
  platform: 'node',
  target: 'node20',
  logLevel: 'warning',
  define: { 'process.env.NODE_ENV': '"production"', DCTRIAGE_VERSION: JSON.stringify(pkg.version) },
  // json-rules-engine's deep copy, without its linear search for repeated objects (see the stub).
  alias: { clone: './stubs/clone.cjs' },
};

// Old chunks would pile up under their hashed names.
rmSync('dist', { recursive: true, force: true });

await build({
  ...common,
  entryPoints: { cli: 'src/bin.ts' },
  outdir: 'dist',
  chunkNames: 'chunks/[name]-[hash]',
  outExtension: { '.js': '.mjs' },
  format: 'esm',
  // The launcher stays small; the shell and the screens (Ink, React) are chunks loaded when needed.
  // A single file would also keep all of mathjs, which a lazily loaded part defeats tree-shaking for.
  splitting: true,
  // ink imports react-devtools-core statically; it is never used at run time.
  alias: { ...common.alias, 'react-devtools-core': './stubs/react-devtools-core.js' },
  // CJS dependencies (signal-exit, json-rules-engine) call require() inside the ESM bundle.
  banner: { js: '#!/usr/bin/env node\nimport { createRequire as __createRequire } from "node:module"; const require = __createRequire(import.meta.url);' },
});
chmodSync('dist/cli.mjs', 0o755);

await build({
  ...common,
  entryPoints: ['src/main.tsx'],
  outfile: 'dist/core.cjs',
  format: 'cjs',
});

// Build-time steps written in TypeScript: bundled to a temporary file and run with this node.
const tmp = mkdtempSync(join(tmpdir(), 'dctriage-build-'));
function runScript(entry, args, failure) {
  const out = join(tmp, entry.replace(/\W/g, '_') + '.mjs');
  return build({ ...common, entryPoints: [entry], outfile: out, format: 'esm' }).then(() => {
    const run = spawnSync(process.execPath, [out, ...args], { stdio: ['ignore', 'ignore', 'inherit'] });
    if (run.status !== 0) console.warn(`build: ${failure}`);
  });
}
try {
  // The seal of the built-in rules: validated here in full, so a run need not validate them again.
  await runScript('scripts/write-rule-seal.ts', ['rules', 'dist/rules.seal.json'], 'no rule seal written; every run will validate the built-in rules in full');
  // The code cache, made after the bundle has run typical commands, so it holds their compiled functions.
  await runScript('scripts/write-code-cache.ts', ['dist/core.cjs', 'dist/core.cjs.cache', 'cases/2026-10-14-press-feed-field-weak.json'], 'no code cache written; commands will start more slowly');
} finally {
  rmSync(tmp, { recursive: true, force: true });
}
