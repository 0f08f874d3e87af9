/**
 * Run by the build: runs the CommonJS bundle through typical commands, then writes its V8 code
 * cache (see src/launch/compiled-bundle.ts), which then holds the functions those commands
 * compiled. Usage: write-code-cache BUNDLE OUT_FILE CASE_FILE
 */
import { writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { codeCacheBytes, runBundle } from '../src/launch/compiled-bundle.js';
import type { Install, runCli as RunCli } from '../src/main.js';

const [bundleFile, outFile, demo] = process.argv.slice(2);
if (!bundleFile || !outFile || !demo) {
  process.stderr.write('usage: write-code-cache BUNDLE OUT_FILE CASE_FILE\n');
  process.exit(2);
}
const bundle = runBundle(bundleFile, undefined);
if (!bundle || typeof bundle.exports.runCli !== 'function') {
  process.stderr.write(`${bundleFile}: not a dctriage bundle\n`);
  process.exit(1);
}
const runCli = bundle.exports.runCli as typeof RunCli;
// The build runs this from the package folder.
const install: Install = {
  rules: resolve('rules'),
  cases: resolve('cases'),
  ruleSeal: resolve('dist', 'rules.seal.json'),
  loadScreens: () => Promise.reject(new Error('the code cache is made without the dialogue')),
};
for (const args of [['diagnose', demo, '--json'], ['diagnose', demo], ['expect', demo]]) {
  await runCli(args, install);
  if (process.exitCode !== 0) {
    process.stderr.write(`warming the code cache: dctriage ${args.join(' ')} exited ${process.exitCode}\n`);
    process.exit(1);
  }
}
writeFileSync(outFile, codeCacheBytes(bundle));
