/**
 * In-process: from an answer to the next question (diagnose the job, pick the question), over
 * the recorded cases, with the built-in rule base or a folder given as the first argument.
 * Prints the median and 90th percentile in ms as JSON.
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { loadRuleBase } from '../src/knowledge/load-rules.js';
import { loadCase } from '../src/knowledge/load-case.js';
import { buildEngine } from '../src/engine/run-rules.js';
import { diagnose } from '../src/engine/diagnose.js';
import { buildFlow, nextStep } from '../src/dialogue/flow.js';
import type { Answer } from '../src/dialogue/job.js';

const rulesDir = process.argv[2] ?? 'rules';
const casesDir = process.argv[3] ?? 'cases';
const r = loadRuleBase(rulesDir);
if (!r.ok) throw new Error(JSON.stringify(r.issues.slice(0, 3)));
const base = r.value;
const engine = buildEngine(base);
const flow = buildFlow(base);
const opening: Answer[] = [
  { questionId: 'present-state', target: { section: 'observations', name: 'present-state' }, value: { kind: 'unknown' }, shown: '', at: '' },
  { questionId: 'drive-fault', target: { section: 'observations', name: 'drive-fault-kind' }, value: { kind: 'unknown' }, shown: '', at: '' },
  { questionId: 'symptoms', target: { section: 'symptoms' }, value: { kind: 'many', values: [] }, shown: '', at: '' },
];
const times: number[] = [];
for (const f of readdirSync(casesDir).filter((n) => n.endsWith('.json')).sort()) {
  const c = loadCase(join(casesDir, f));
  if (!c.ok) continue;
  for (let k = 0; k < 3; k++) {
    const t0 = performance.now();
    const d = await diagnose(c.value, base, engine);
    nextStep(flow, { answers: opening, machineGiven: true, jobGiven: true, diagnosis: d, job: c.value });
    times.push(performance.now() - t0);
  }
}
times.sort((a, b) => a - b);
const at = (q: number) => times[Math.min(times.length - 1, Math.floor(times.length * q))]!;
process.stdout.write(JSON.stringify({ rules: base.rules.length, samples: times.length, median: at(0.5), p90: at(0.9) }) + '\n');
