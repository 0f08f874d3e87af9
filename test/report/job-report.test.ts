import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/knowledge/load-case.js';
import { diagnose } from '../../src/engine/diagnose.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { jobReport } from '../../src/report/job-report.js';
import { QUANTITY_LABELS } from '../../src/model/quantity-names.js';
import { readingRows, rowLabel } from '../../src/report/reading-rows.js';
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
    for (const row of readingRows(d.expectation)) {
      // A further comparison of a reading already in the table is a row without the value again.
      if (row.sameReading) expect(text).toMatch(new RegExp(`\\| ↳ ${rowLabel(row)} \\|  \\| [^|]+ \\|`));
      else expect(text).toMatch(new RegExp(`\\| ${QUANTITY_LABELS[row.name]} \\| [^|]+ \\| [^|]+ \\|`));
    }
    expect(readingRows(d.expectation).length).toBe(Object.values(d.expectation.quantities).filter((q) => q.measured !== null).length);
    d.checks.forEach((c, k) => expect(text).toMatch(new RegExp(`### Check ${k + 1}: ${c.title.replace(/[()]/g, '\\$&')}\n\n- (Observe|Live test|Isolated)`)));
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
    expect(text).toContain('### Check 1: Check the field circuit for continuity — abnormal');
    expect(text).toContain('- Isolated (after isolation and lockout): **abnormal**. Found: rheostat track burnt.');
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

  it('numbers the checks and the isolation steps apart', async () => {
    const { d, text } = await reportFor('2026-10-14-press-feed-field-weak.json');
    const checks = [...text.matchAll(/^### Check (\d+): /gm)].map((m) => Number(m[1]));
    expect(checks).toEqual(d.checks.map((_c, k) => k + 1));
    const isolation = text.slice(text.indexOf('### Isolation, before check'), text.indexOf('### Check'));
    expect([...isolation.matchAll(/^(\d+)\. /gm)].map((m) => Number(m[1]))).toEqual(d.isolation.steps.map((_s, k) => k + 1));
  });

  it('shows each reading once: the field current against a healthy field, and under it against the rating', async () => {
    const { text } = await reportFor('2026-10-14-press-feed-field-weak.json');
    const table = text.slice(text.indexOf('## Readings against'), text.indexOf('## Likely causes'));
    expect(table.match(/0\.54 A/g)).toHaveLength(1);
    expect(text).toContain('| field current | 0.54 A | 0.8036 A | 67 % | outside the healthy band |\n| ↳ vs rating |  | 0.8 A | 68 % |  |');
  });

  it('shows nameplate values and readings after the repair in the units the tool used, not as typed', async () => {
    const { d } = await reportFor('2026-10-14-press-feed-field-weak.json');
    const { caseSchema } = await import('../../src/knowledge/case-schema.js');
    const job = caseSchema.parse({ format: 'dc-case/1', machine: { connection: 'shunt', nameplate: { armatureVoltage: '220', fieldCurrent: '1200mA', power: '4,5 kW' } }, outcome: { cause: 'field-weak', readingsAfter: { speed: '1595 r/min' } } });
    const text = jobReport({ job, diagnosis: d, safety: base.safety, generatedAt: '2026-12-01T21:00:00Z' });
    expect(text).toContain('| armature voltage | 220 V |');
    expect(text).toContain('| field current | 1.2 A |');
    expect(text).toContain('| power | 4.5 kW |');
    expect(text).toContain('| speed | 1595 rpm |');
  });

  it('ends with signature and date lines, the outcome date and what produced the diagnosis', async () => {
    const file = join(CASES_DIR, '2026-10-14-press-feed-field-weak.json');
    const c = loadCase(file);
    if (!c.ok) throw new Error('demo');
    const d = await diagnose(c.value, base, engine);
    const text = jobReport({ job: c.value, diagnosis: d, safety: base.safety, generatedAt: '2026-12-01T21:00:00Z', producedBy: { version: '9.9.9', rules: '/srv/knowledge/rules', revision: 'abc1234 2026-11-30' } });
    expect(text).toContain('| | Name | Signature | Date |');
    for (const who of ['Fitter | night fitter', 'Supervisor', 'Returned to service by']) expect(text).toMatch(new RegExp(`\\| ${who} \\|[^\n]*\\| \\| \\|$`, 'm'));
    expect(text).toContain('- Date: 2026-10-14');
    expect(text).toContain('Diagnosis by dctriage 9.9.9 with the rules in /srv/knowledge/rules (revision abc1234 2026-11-30).');
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
