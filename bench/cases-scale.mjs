/**
 * cases check over many generated cases: wall time, CPU time and peak memory from /usr/bin/time,
 * all cores and one thread. The cases are the recorded ones with new ids and readings nudged by up
 * to ±2 %. `node bench/cases-scale.mjs [COUNT] [DIR]` keeps DIR (made once, reused) for profiling;
 * without DIR they go to a temporary folder removed afterwards. Not a test: nothing fails on a slow machine.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
const cli = join(root, 'dist', 'cli.mjs');

/** Writes `count` cases into `dir` (unless it already holds that many). */
export function generateCases(count, dir) {
  mkdirSync(dir, { recursive: true });
  if (existsSync(join(dir, `${count - 1}.json`)) && !existsSync(join(dir, `${count}.json`))) return;
  const recorded = readdirSync(join(root, 'cases')).filter((f) => f.endsWith('.json')).map((f) => JSON.parse(readFileSync(join(root, 'cases', f), 'utf8')));
  const nudge = (v, k) => (typeof v === 'string' ? v.replace(/^(-?\d+(\.\d+)?)/, (n) => String(Number((Number(n) * (1 + (((k * 37) % 9) - 4) / 200)).toPrecision(4)))) : typeof v === 'number' ? v * (1 + (((k * 37) % 9) - 4) / 200) : v);
  for (let k = 0; k < count; k++) {
    const c = structuredClone(recorded[k % recorded.length]);
    c.id = `${c.id}-b${k}`;
    if (c.readings) for (const key of Object.keys(c.readings)) if (key !== 'insulationTestedWinding') c.readings[key] = nudge(c.readings[key], k);
    writeFileSync(join(dir, `${k}.json`), JSON.stringify(c));
  }
}

/** One run of cases check; threads '' for all cores, '1' for one. */
export function timeCasesCheck(dir, threads) {
  const out = spawnSync('/usr/bin/time', ['-f', '%e %U %S %M', process.execPath, cli, 'cases', 'check', dir, '--json', '--rules', join(root, 'rules')], { encoding: 'utf8', maxBuffer: 256 * 1024 * 1024, env: { ...process.env, DCTRIAGE_THREADS: threads } });
  const [wall, user, sys, peakKb] = out.stderr.trim().split('\n').at(-1).split(' ').map(Number);
  const report = JSON.parse(out.stdout);
  return { wall, cpu: user + sys, peakMb: peakKb / 1024, top3: report.top3, total: report.total };
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const count = Number(process.argv[2] ?? process.env.BENCH_CASES ?? 20000);
  const keep = process.argv[3];
  const dir = keep ?? mkdtempSync(join(tmpdir(), 'dctriage-bench-cases-'));
  generateCases(count, dir);
  for (const threads of (process.env.BENCH_THREADS ?? ',1').split(',')) {
    const r = timeCasesCheck(dir, threads);
    console.log(`${count} cases, ${threads ? `${threads} thread` : 'all cores'}: wall ${r.wall.toFixed(1)} s, CPU ${r.cpu.toFixed(1)} s, peak RSS ${r.peakMb.toFixed(0)} MB, top-3 ${r.top3}/${r.total}`);
  }
  if (!keep) rmSync(dir, { recursive: true, force: true });
}
