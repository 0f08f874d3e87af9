/**
 * How well the readings alone name the cause. Strips symptoms and observations from every
 * recorded case whose cause shows in steady-state readings and reports top-1/top-3; then does
 * the same on fault cases generated from the machine equations (several connections, faults of
 * known size, ±2 % noise on every reading) that no rule was tuned on.
 *
 *   npx tsx scripts/readings-only.ts [--verbose]
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadRuleBase } from '../src/knowledge/load-rules.js';
import { loadCaseFile } from '../src/knowledge/load-case.js';
import { buildEngine } from '../src/engine/run-rules.js';
import { diagnose, type JobInput } from '../src/engine/diagnose.js';
import { generatedFaultCases } from '../src/model/fits/generate.js';
import { fitReadings } from '../src/model/fits/index.js';

const verbose = process.argv.includes('--verbose');
const root = new URL('..', import.meta.url).pathname;
const loaded = loadRuleBase(process.env.RULES_DIR ?? join(root, 'rules'));
if (!loaded.ok) throw new Error(JSON.stringify(loaded.issues));
const base = loaded.value;
const engine = buildEngine(base);
// Causes with a steady-state signature: those the fit rules support when a fit is best.
const fitRules = JSON.parse(readFileSync(join(root, 'rules', 'fits.json'), 'utf8')) as { rules: { cause?: string; weight?: number; name: string }[] };
const STEADY_STATE_CAUSES = [...new Set(fitRules.rules.filter((r) => (r.weight ?? 0) > 0 && r.name.includes('-best-')).map((r) => r.cause!))];

async function rankOf(job: JobInput, cause: string): Promise<{ rank: number; ranked: string[] }> {
  const ranked = (await diagnose(job, base, engine)).causes.map((c) => c.id);
  return { rank: ranked.indexOf(cause) + 1, ranked };
}

function tally(label: string, ranks: { id: string; cause: string; rank: number; ranked: string[] }[]) {
  const top1 = ranks.filter((r) => r.rank === 1).length;
  const top3 = ranks.filter((r) => r.rank >= 1 && r.rank <= 3).length;
  const pct = (k: number) => `${Math.round((100 * k) / Math.max(1, ranks.length))} %`;
  console.log(`${label}: ${ranks.length} cases, top-1 ${top1} (${pct(top1)}), top-3 ${top3} (${pct(top3)})`);
  if (verbose) for (const r of ranks.filter((x) => x.rank !== 1)) console.log(`   rank ${r.rank}  ${r.id}  want ${r.cause}  got ${r.ranked.slice(0, 3).join(', ')}`);
}

const recorded = [];
const skipped: string[] = [];
const dir = join(root, 'cases');
for (const name of readdirSync(dir).filter((f) => f.endsWith('.json')).sort()) {
  const c = loadCaseFile(join(dir, name));
  if (!c.ok) throw new Error(JSON.stringify(c.issues));
  const job = c.value.job;
  const cause = job.outcome?.cause;
  if (!cause || !STEADY_STATE_CAUSES.includes(cause)) continue;
  // Only a job with a running operating point (voltage, current, speed) shows a steady-state fault.
  if (!fitReadings(job.machine, job.readings ?? {})) {
    skipped.push(job.id ?? name);
    continue;
  }
  const stripped: JobInput = { machine: job.machine, readings: job.readings ?? {} };
  recorded.push({ id: job.id ?? name, cause, ...(await rankOf(stripped, cause)) });
}
tally('recorded cases, readings only', recorded);
console.log(`  (${skipped.length} more have no running operating point to fit: ${skipped.join(', ')})`);

/** The generated cases ranked from their readings, the machine as `given` leaves it. */
async function rankGenerated(given: (m: JobInput['machine']) => JobInput['machine']) {
  const out = [];
  for (const g of generatedFaultCases({ seed: 20261202, count: Number(process.env.GENERATED ?? 300) })) {
    const job: JobInput = { machine: given({ ...g.job.machine, magnetization: undefined }), readings: g.job.readings };
    out.push({ id: g.label, cause: g.cause, ...(await rankOf(job, g.cause)) });
  }
  return out;
}
const generated = await rankGenerated((m) => m);
tally('generated cases, readings only (±2 % noise)', generated);
tally('the same, from the plate alone (no winding resistances)', await rankGenerated((m) => ({ ...m, resistances: undefined })));
const byCause = new Map<string, typeof generated>();
for (const g of generated) byCause.set(g.cause, [...(byCause.get(g.cause) ?? []), g]);
for (const [cause, list] of [...byCause].sort()) tally(`  ${cause}`, list);
