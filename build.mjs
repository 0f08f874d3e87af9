// Bundles the CLI into one ESM file so start-up does not pay for thousands of module loads.
import { build } from 'esbuild';
import { chmodSync, readFileSync } from 'node:fs';

const pkg = JSON.parse(readFileSync(new URL('./package.json', import.meta.url), 'utf8'));

await build({
  entryPoints: ['src/cli.tsx'],
  outfile: 'dist/cli.mjs',
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  splitting: false,
  logLevel: 'warning',
  define: { 'process.env.NODE_ENV': '"production"', DCTRIAGE_VERSION: JSON.stringify(pkg.version) },
  // ink imports react-devtools-core statically; it is never used at run time.
  alias: { 'react-devtools-core': './stubs/react-devtools-core.js' },
  // CJS dependencies (signal-exit, json-rules-engine) call require() inside the ESM bundle.
  banner: { js: '#!/usr/bin/env node\nimport { createRequire as __createRequire } from "node:module"; const require = __createRequire(import.meta.url);' },
});
chmodSync('dist/cli.mjs', 0o755);
