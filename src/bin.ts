/**
 * The dctriage command. Commands run from dist/core.cjs with its code cache (fast start); the
 * dialogue runs from the ES module build, whose chunks load the screens only when it opens.
 * Both builds are made from the same sources by build.mjs. From source (npm run dev), or when
 * the CommonJS bundle is missing, everything runs from the ES modules.
 */
import { fileURLToPath } from 'node:url';
import { readCommandLine } from './shell/cli-options.js';
import { helpFor } from './shell/help.js';
import module, { createRequire } from 'node:module';
import { refreshCodeCache, runBundle, type CompiledBundle } from './launch/compiled-bundle.js';
import { withoutFetch } from './launch/without-fetch.js';
import { runOffThread, runsOffThread } from './launch/off-thread.js';
import type { Install, runCli as RunCli } from './main.js';

// This file is always dist/cli.mjs (or src/bin.ts from source): paths are relative to it.
const here = (path: string) => fileURLToPath(new URL(path, import.meta.url));
const install: Install = {
  rules: here('../rules/'),
  cases: here('../cases/'),
  ruleSeal: here('./rules.seal.json'),
  loadScreens: () => withoutFetch(() => import('./ui/run-dialogue.js')),
};
const argv = process.argv.slice(2);
const line = readCommandLine(argv);

declare const DCTRIAGE_VERSION: string;

/**
 * Node 22.1 and later keep a compile cache of their own, for CommonJS and ES modules alike: there
 * the bundle is simply required. Node 20 has none, and runs it with this project's code cache.
 */
const enableCompileCache = (module as { enableCompileCache?: () => unknown }).enableCompileCache;
if (typeof enableCompileCache === 'function') enableCompileCache();

/** The CommonJS bundle as run with this project's code cache, when it was (Node 20). */
let cached: CompiledBundle | undefined;

// Both builds run the same shell (main.tsx); opensDialogue only picks the faster one for the
// arguments, so if it and main's own reading ever disagreed, the result would be the same.
async function pickRunCli(): Promise<typeof RunCli> {
  const opensDialogue = line.kind === 'run' && (line.command === '' || line.command === 'resume');
  if (!opensDialogue && typeof enableCompileCache === 'function') {
    try {
      const core = createRequire(import.meta.url)(here('./core.cjs')) as { runCli?: unknown };
      if (typeof core.runCli === 'function') return core.runCli as typeof RunCli;
    } catch {
      // missing or cut short: the ES modules below
    }
  } else if (!opensDialogue) {
    cached = runBundle(here('./core.cjs'), here('./core.cjs.cache'));
    if (cached && typeof cached.exports.runCli === 'function') return cached.exports.runCli as typeof RunCli;
  }
  return (await import('./main.js')).runCli;
}

// Help and the version are answered here, without loading the tool.
if (line.kind === 'help') process.stdout.write(helpFor(line.commands, process.stdout.columns || Number(process.env.COLUMNS) || 80) + '\n');
else if (line.kind === 'version') process.stdout.write((typeof DCTRIAGE_VERSION === 'string' ? DCTRIAGE_VERSION : 'dev') + '\n');
// cases check runs in a thread of its own with a bounded heap; this thread only passes its output on.
else if (runsOffThread(line)) await runOffThread(fileURLToPath(import.meta.url), argv);
else {
  await (await pickRunCli())(argv, install);
  if (cached && !cached.cacheUsed) refreshCodeCache(cached, here('./core.cjs.cache'));
}
