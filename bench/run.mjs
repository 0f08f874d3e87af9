/**
 * npm run bench: whole-process timings beside bare `node -e 0` measured in the same run, so the
 * figures are ratios that survive a noisy machine; in-process timings where that is the honest
 * measure. Prints a table of medians. Not a test: nothing here fails on a slow machine.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { cpSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { generateCases, timeCasesCheck } from './cases-scale.mjs';

const root = fileURLToPath(new URL('..', import.meta.url));
const cli = join(root, 'dist', 'cli.mjs');
const demo = join(root, 'cases', '2026-10-14-press-feed-field-weak.json');
const runs = Number(process.env.BENCH_RUNS ?? 11);
const median = (xs) => [...xs].sort((a, b) => a - b)[xs.length >> 1];

function timeProcess(args, opts = {}) {
  const t0 = process.hrtime.bigint();
  const r = spawnSync(process.execPath, args, { stdio: ['ignore', 'ignore', 'pipe'], ...opts });
  if (r.status !== 0 && r.status !== 1) throw new Error(`${args.join(' ')} exited ${r.status}: ${r.stderr}`);
  return Number(process.hrtime.bigint() - t0) / 1e6;
}

const rows = [];
const bare = median(Array.from({ length: runs }, () => timeProcess(['-e', '0'])));
rows.push(['bare node -e 0 (whole process)', bare, null, '']);

const diag = median(Array.from({ length: runs }, () => timeProcess([cli, 'diagnose', demo, '--json'])));
rows.push(['diagnose FILE --json (whole process)', diag, diag / bare, 'target ≤ 2.5×']);

const state = mkdtempSync(join(tmpdir(), 'dctriage-bench-state-'));
const ttffRuns = Array.from({ length: Math.min(runs, 7) }, () => Number(execFileSync('python3', [join(root, 'bench', 'ttff.py'), cli, 'Press Enter to begin', state], { encoding: 'utf8' }).trim())).filter(Number.isFinite);
if (ttffRuns.length) rows.push(['dialogue: first frame in an 80×24 pty', median(ttffRuns), median(ttffRuns) / bare, 'target ≤ 5× (aim 4×)']);

const tsx = join(root, 'node_modules', '.bin', 'tsx');
const latency = (rulesDir) => JSON.parse(execFileSync(tsx, [join(root, 'bench', 'latency.ts'), rulesDir, join(root, 'cases')], { cwd: root, encoding: 'utf8' }));
const builtIn = latency(join(root, 'rules'));
rows.push([`answer → next question, built-in rules (${builtIn.rules} rules, in-process)`, builtIn.median, null, `p90 ${builtIn.p90.toFixed(1)} ms; target median ≤ 100 ms (aim 50)`]);

// A synthetic 1,000-rule base: the built-in folder plus evidence rules cloned with shifted thresholds.
const big = mkdtempSync(join(tmpdir(), 'dctriage-bench-rules-'));
cpSync(join(root, 'rules'), big, { recursive: true });
const families = readdirSync(big).filter((f) => f.endsWith('.json') && !['causes.json', 'checks.json', 'questions.json', 'safety.json', 'conditions.json'].includes(f));
const evidence = families.flatMap((f) => JSON.parse(readFileSync(join(big, f), 'utf8')).rules.filter((r) => r.kind === 'evidence'));
const total = families.reduce((n, f) => n + JSON.parse(readFileSync(join(big, f), 'utf8')).rules.length, 0);
const shift = (c, k) => (Array.isArray(c.all) ? { all: c.all.map((x) => shift(x, k)) } : Array.isArray(c.any) ? { any: c.any.map((x) => shift(x, k)) } : c.not ? { not: shift(c.not, k) } : typeof c.value === 'number' ? { ...c, value: c.value * (1 + ((k % 7) - 3) / 100) } : c);
const clones = Array.from({ length: 1000 - total }, (_, k) => {
  const r = evidence[k % evidence.length];
  return { ...r, name: `${r.name}-bench-${k}`, weight: Math.max(-0.9, Math.min(0.9, r.weight * 0.5)), conditions: shift(r.conditions, k) };
});
writeFileSync(join(big, 'bench-clones.json'), JSON.stringify({ family: 'bench clones', rules: clones }));
const synthetic = latency(big);
rows.push([`answer → next question, synthetic ${synthetic.rules} rules (in-process)`, synthetic.median, null, `p90 ${synthetic.p90.toFixed(1)} ms; target ≤ 500 ms`]);

// 20,000 cases made from the recorded ones (bench/cases-scale.mjs): one run each way, a run is long.
const CASES = Number(process.env.BENCH_CASES ?? 20000);
const many = mkdtempSync(join(tmpdir(), 'dctriage-bench-cases-'));
generateCases(CASES, many);
for (const threads of ['', '1']) {
  const r = timeCasesCheck(many, threads);
  rows.push([`cases check over ${CASES} generated cases, ${threads ? 'one thread' : 'all cores'}`, r.wall * 1000, null, `top-3 ${r.top3}/${r.total}; CPU ${r.cpu.toFixed(1)} s; peak RSS ${r.peakMb.toFixed(0)} MB; targets < 20 s, < 150 MB`]);
}

const pad = (s, n) => String(s).padEnd(n);
console.log(`dctriage bench (${runs} runs each, medians; node ${process.version}, ${new Date().toISOString()})\n`);
console.log(`${pad('what', 64)}${pad('ms', 10)}${pad('× bare', 9)}note`);
for (const [what, ms, ratio, note] of rows) console.log(`${pad(what, 64)}${pad(ms.toFixed(1), 10)}${pad(ratio === null ? '' : ratio.toFixed(2), 9)}${note}`);

// Not timings: how often the series analysers find an inserted fault, on 500 generated series of each kind.
console.log(`\nseries analysers on generated series (bench/series-detection.ts)\n${execFileSync(tsx, [join(root, 'bench', 'series-detection.ts'), '500'], { cwd: root, encoding: 'utf8' })}`);

// Not timings: the troubleshooting loop worked by a simulated fitter on every recorded case.
console.log(`\n${execFileSync(tsx, [join(root, 'bench', 'loop-simulation.ts')], { cwd: root, encoding: 'utf8' })}`);

// The generated rule base, cases and dialogue state are only for this run.
for (const dir of [state, big, many]) rmSync(dir, { recursive: true, force: true });
