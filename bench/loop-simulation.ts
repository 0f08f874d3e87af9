/**
 * npm run bench (part): the troubleshooting loop worked by a simulated fitter on every recorded
 * case (see src/engine/simulate-loop.ts). Prints the share confirmed correctly, false
 * confirmations, and the mean minutes of checks worked against the first list worked in order
 * and against the ideal (the single cheapest check that shows the cause). Not a test.
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadCase } from '../src/knowledge/load-case.js';
import { loadRuleBase } from '../src/knowledge/load-rules.js';
import { buildEngine } from '../src/engine/run-rules.js';
import { simulateLoop, type LoopRun } from '../src/engine/simulate-loop.js';
import { sameCause } from '../src/engine/check-cases.js';

const root = fileURLToPath(new URL('..', import.meta.url));
const loaded = loadRuleBase(join(root, 'rules'));
if (!loaded.ok) throw new Error('rules do not load');
const base = loaded.value;
const engine = buildEngine(base);
const runs: (LoopRun & { name: string })[] = [];
for (const name of readdirSync(join(root, 'cases')).filter((f) => f.endsWith('.json')).sort()) {
  const c = loadCase(join(root, 'cases', name));
  if (!c.ok || !c.value.outcome?.cause) continue;
  runs.push({ name, ...(await simulateLoop(c.value, c.value.outcome.cause, base, engine, sameCause(base))) });
}
const mean = (xs: number[]) => (xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : NaN);
const correct = runs.filter((r) => r.correct);
const wrong = runs.filter((r) => r.confirmed !== null && !r.correct);
const withIdeal = correct.filter((r) => r.idealMinutes !== null);
const loopMinutes = mean(withIdeal.map((r) => r.minutes));
const ideal = mean(withIdeal.map((r) => r.idealMinutes!));
const staticRuns = runs.filter((r) => r.staticMinutes !== null && r.idealMinutes !== null);
console.log(`Troubleshooting loop, simulated fitter, ${runs.length} recorded cases`);
console.log(`  confirmed correctly   ${correct.length}/${runs.length} (${Math.round((100 * correct.length) / runs.length)} %)`);
console.log(`  false confirmations   ${wrong.length}${wrong.length ? `: ${wrong.map((r) => `${r.name} → ${r.confirmed}`).join(', ')}` : ''}`);
console.log(`  not confirmed         ${runs.length - correct.length - wrong.length}${runs.length - correct.length - wrong.length ? `: ${runs.filter((r) => r.confirmed === null).map((r) => r.name).join(', ')}` : ''}`);
console.log(`  mean minutes, loop            ${loopMinutes.toFixed(1)} (${(loopMinutes / ideal).toFixed(2)} × ideal), over the ${withIdeal.length} confirmed`);
console.log(`  mean minutes, first list      ${mean(staticRuns.map((r) => r.staticMinutes!)).toFixed(1)} (${(mean(staticRuns.map((r) => r.staticMinutes!)) / mean(staticRuns.map((r) => r.idealMinutes!))).toFixed(2)} × ideal), over the ${staticRuns.length} whose first list holds a check that shows the cause`);
console.log(`  mean minutes, ideal           ${ideal.toFixed(1)}`);
if (process.argv.includes('--each')) for (const r of runs) console.log(`  ${r.correct ? 'ok ' : r.confirmed ? 'BAD' : '-- '} ${r.name}: ${r.minutes} min (ideal ${r.idealMinutes}, first list ${r.staticMinutes}) ${r.checks.join(' → ')}`);
