// Builds the dctriage command from the same sources twice (see src/bin.ts):
//   dist/cli.mjs + dist/chunks/  ES modules: the launcher, and the dialogue with its screens;
//   dist/core.cjs (+ .cache)      one CommonJS bundle with a V8 code cache, for every command.
// Then seals the built-in rules (src/knowledge/rule-seal.ts) and writes the code cache.
import { build } from 'esbuild';
import { spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
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

// `--if-stale` (npm start's prestart): build only when a source is newer than the last build, so
// `npm install && npm start` works in a fresh clone without building on every start.
if (process.argv.includes('--if-stale') && builtAfterSources()) process.exit(0);

function builtAfterSources() {
  const built = ['dist/cli.mjs', 'dist/core.cjs.cache'].map((f) => (existsSync(f) ? statSync(f).mtimeMs : 0));
  const newest = (path) => {
    const st = statSync(path);
    return st.isDirectory() ? Math.max(0, ...readdirSync(path).map((f) => newest(join(path, f)))) : st.mtimeMs;
  };
  return Math.min(...built) > Math.max(...['src', 'rules', 'scripts', 'build.mjs', 'package.json'].map(newest));
}

// Old chunks would pile up under their hashed names.
rmSync('dist', { recursive: true, force: true });

/**
 * Ink imports its devtools module (and react-devtools-core) only when DEV=true, but a bundler
 * still emits them as a chunk. Both become empty modules: the package ships no devtools.
 */
const noDevtools = {
  name: 'no-devtools',
  setup(b) {
    b.onResolve({ filter: /^react-devtools-core$|\/devtools(-window-polyfill)?\.js$/ }, () => ({ path: join(root, 'stubs', 'dev-only.js') }));
  },
};

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
  plugins: [noDevtools],
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
