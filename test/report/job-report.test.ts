import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/knowledge/load-case.js';
import { diagnose } from '../../src/engine/diagnose.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { jobReport } from '../../src/report/job-report.js';
import { QUANTITY_LABELS, type QuantityName } from '../../src/model/quantity-names.js';
import { checksFromWork, type WorkEntry } from '../../src/dialogue/work.js';
import { caseSchema } from '../../src/knowledge/case-schema.js';
import { builtInRules, CASES_DIR, diagnoseJob } from '../support/rules.js';

const base = builtInRules();
const engine = buildEngine(base);

/** A recorded job's report; given a work log, the job's checks are the ones that log records, as in the dialogue. */
async function reportFor(name: string, work: WorkEntry[] = [], timeZone?: string) {
  const file = join(CASES_DIR, name);
  const c = loadCase(file);
  if (!c.ok) throw new Error(name);
  const job = work.length ? caseSchema.parse({ ...JSON.parse(readFileSync(file, 'utf8')), checks: checksFromWork(work) }) : c.value;
  const d = await diagnose(job, base, engine);
  return { d, text: jobReport({ job, raw: JSON.parse(readFileSync(file, 'utf8')), diagnosis: d, safety: base.safety, work, generatedAt: '2026-12-01T21:00:00Z', ...(timeZone ? { timeZone } : {}) }) };
}

describe('the job report', () => {
  it('has every reading with its expected value, and every check with its state', async () => {
    const { d, text } = await reportFor('2025-05-06-booster-pump-bus-low.json');
    for (const [name, q] of Object.entries(d.expectation.quantities)) {
      if (q.measured === null) continue;
      expect(text).toMatch(new RegExp(`\\| ${QUANTITY_LABELS[name as QuantityName]} \\| [^|]+ \\| [^|]+ \\|`));
    }
    for (const c of d.checks) expect(text).toMatch(new RegExp(`\\*\\*${c.title.replace(/[()]/g, '\\$&')}\\*\\* — (observe|live test|isolated)`));
    expect(text).toContain('| Reading | Measured | Expected | Ratio |');
    expect(text).toMatch(/\| speed \| \d+ rpm \| \d+ rpm \| \d+ % \|/);
  });

  it('names causes and checks by their titles', async () => {
    const { text } = await reportFor('2026-10-14-press-feed-field-weak.json');
    expect(text).toContain('**Field weak**');
    expect(text).not.toMatch(/for: [a-z]+-[a-z-]+$/m);
  });

  it('tells the checks worked in order: who, when, how authorised, the result and what it found, then what was found', async () => {
    const work: WorkEntry[] = [
      { check: 'iso-field-continuity', kind: 'started', at: '2026-12-01T21:05:00Z', by: 'T. Apprentice', authorisedBy: 'R. Lead', authorisation: 'present', isolation: { provedDeadBy: 'R. Lead', locks: 'L-12' } },
      { check: 'iso-field-continuity', kind: 'done', at: '2026-12-01T21:25:00Z', by: 'T. Apprentice', signedOffBy: 'R. Lead', finding: 'rheostat track burnt', result: 'abnormal' },
    ];
    const { text } = await reportFor('2026-10-14-press-feed-field-weak.json', work);
    expect(text).toContain('## The checks worked, in order');
    expect(text).toContain('1. **Check the field circuit for continuity** — isolated (after isolation and lockout): **abnormal**. Found: rheostat track burnt.');
    expect(text).toContain('Started 2026-12-01 21:05 UTC, done 2026-12-01 21:25 UTC by T. Apprentice, authorised by R. Lead (present at the machine); signed off by R. Lead.');
    expect(text).toMatch(/It weighed for Field weak \(\+0\.\d\d\)/);
    expect(text).toContain('**Field weak**, confirmed by the checks.');
    expect(text).toContain('| Proved dead by | R. Lead |');
    // Where the job was done, the times are local with UTC beside them (IANA: Berlin is UTC+1 in December).
    const { text: local } = await reportFor('2026-10-14-press-feed-field-weak.json', work, 'Europe/Berlin');
    expect(local).toContain('Started 2026-12-01 22:05 UTC+1 (21:05 UTC), done');
    expect(local).toContain('| Report written | 2026-12-01 22:00 UTC+1 (21:00 UTC) |');
    expect(text).toContain('not verify them');
  });

  it('puts the dangers found before any cause', async () => {
    for (const job of [
      { machine: { connection: 'series' as const }, symptoms: ['overspeed' as const], observations: { 'load-coupled': 'no' as const } },
      { machine: { connection: 'shunt' as const, nameplate: { armatureVoltage: 220, armatureCurrent: 30, speed: 1450, fieldCurrent: 0.9 } }, symptoms: ['overspeed' as const], readings: { armatureVoltage: 220, armatureCurrent: 6, fieldCurrent: 0.01 } },
      { machine: { connection: 'shunt' as const }, symptoms: ['trips-earth-fault' as const] },
    ]) {
      const d = await diagnoseJob(job);
      const { caseSchema } = await import('../../src/knowledge/case-schema.js');
      const text = jobReport({ job: caseSchema.parse({ format: 'dc-case/1', ...job }), diagnosis: d, safety: base.safety, generatedAt: 'now' });
      expect(d.warnings.length).toBeGreaterThan(0);
      expect(text.indexOf('## Dangers found')).toBeGreaterThan(0);
      expect(text.indexOf('## Dangers found')).toBeLessThan(text.indexOf('## Likely causes'));
    }
  });

  it('keeps typed text from becoming HTML', async () => {
    const { d } = await reportFor('2026-10-14-press-feed-field-weak.json');
    const check = d.checks[0]!;
    const { text } = await reportFor('2026-10-14-press-feed-field-weak.json', [
      { check: check.id, kind: 'started', at: 't', by: '<script>x</script>' },
    ]);
    expect(text).not.toContain('<script>');
    expect(text).toContain('&lt;script&gt;');
  });
});
