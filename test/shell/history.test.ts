import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readRecordedJobs } from '../../src/shell/history.js';
import { formatHistory } from '../../src/report/history-text.js';
import { assetHistory } from '../../src/engine/asset-history.js';
import { runCli } from '../support/cli.js';

/** Four invented jobs on one invented asset, and one job on another. */
const DIR = fileURLToPath(new URL('./history-jobs/', import.meta.url));
const ASSET = 'CT-4 cooling tower fan drive';

function history() {
  const jobs = readRecordedJobs(DIR);
  if (!jobs.ok) throw new Error(JSON.stringify(jobs.issues));
  return assetHistory(ASSET, jobs.value, new Map([['insulation-damp-or-dirty', 'Windings damp or contaminated']]));
}

describe('an asset\'s history', () => {
  it('lists only that asset\'s jobs, in date order', () => {
    expect(history().jobs.map((j) => [j.date, j.workOrder])).toEqual([
      ['2022-03-10', 'DM-22-101'],
      ['2023-04-02', 'DM-23-077'],
      ['2024-05-15', 'DM-24-140'],
      ['2025-06-20', 'DM-25-093'],
    ]);
  });

  it('trends insulation corrected to 40 °C by halving per 10 °C (IEEE 43, clause 6.3), a curve giving its 1-minute value', () => {
    const ins = history().trends.insulation;
    // 900 MΩ at 20 °C, 600 at 22 °C, a curve reading 350 at 1 min at 25 °C, 180 at 20 °C.
    expect(ins.points.map(([, v]) => v)).toEqual([225, 172.305, 123.744, 45]);
    // Least squares through the four points by hand (days / 365.25): −53.71 MΩ a year.
    expect(ins.perYear).toBeCloseTo(-53.713, 2);
    // The DC armature minimum of IEEE 43-2013 is 5 MΩ; the line reaches it in May 2026.
    expect(ins.minimum).toBe(5);
    expect(ins.projectedMinimumDate).toBe('2026-05-12');
  });

  it('gives no projection when the trend is not falling', () => {
    const jobs = readRecordedJobs(DIR);
    if (!jobs.ok) throw new Error('fixture');
    const rising = jobs.value.map((j) => (j.job.readings?.insulationResistance1min === 180 ? { ...j, job: { ...j.job, readings: { ...j.job.readings, insulationResistance1min: 2000 } } } : j));
    expect(assetHistory(ASSET, rising, new Map()).trends.insulation.projectedMinimumDate).toBeNull();
  });

  it('trends winding resistance at 20 °C (copper, 234.5 °C, IEEE 118)', () => {
    // 0.32 Ω at 25 °C is 0.32 × 254.5 / 259.5 = 0.3138 Ω at 20 °C.
    expect(history().trends.armatureResistance.points[1]).toEqual(['2023-04-02', 0.313834]);
  });

  it('shows the jobs, what was found and the trend as text with a chart', () => {
    const text = formatHistory(history());
    expect(text).toContain('DM-25-093  Windings damp or contaminated');
    expect(text).toContain('2025-06-20 ');
    expect(text).toMatch(/█+ +45 MΩ/);
    expect(text).toContain('reaches the 5 MΩ minimum about 2026-05-12');
  });

  it('runs as a command with --cases and --json', () => {
    const r = runCli(['history', ASSET, '--cases', DIR, '--json']);
    expect(r.code).toBe(0);
    const h = JSON.parse(r.stdout);
    expect(h.asset).toBe(ASSET);
    expect(h.jobs).toHaveLength(4);
    expect(h.trends.insulation).toEqual(expect.objectContaining({ perYear: expect.any(Number), projectedMinimumDate: '2026-05-12' }));
    expect(h.trends.insulation.points[0]).toEqual(['2022-03-10', 225]);
  });

  it('says so when the asset has no jobs', () => {
    const r = runCli(['history', 'No such asset', '--cases', DIR]);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('no recorded jobs for asset "No such asset"');
  });

  it('puts the asset\'s history in the HTML job report', () => {
    const report = join(mkdtempSync(join(tmpdir(), 'dctriage-history-')), 'job.html');
    const r = runCli(['diagnose', join(DIR, '2025-06-20-ct4-2025.json'), '--cases', DIR, '--report', report]);
    expect(r.code).toBe(0);
    const html = readFileSync(report, 'utf8');
    expect(html).toContain('<h2>Asset history</h2>');
    expect(html).toMatch(/2025-06-20 █+ +45 MΩ/);
  });

  it('trends one winding only, the latest test\'s, and cautions when tests lie far apart in temperature (EASA 2013; check-values 2.3)', () => {
    const jobs = readRecordedJobs(DIR);
    if (!jobs.ok) throw new Error('fixture');
    const changed = jobs.value.map((j) => {
      if (j.job.outcome?.date === '2023-04-02') return { ...j, job: { ...j.job, readings: { ...j.job.readings, insulationTestedWinding: 'shunt-field' as const } } };
      if (j.job.outcome?.date === '2025-06-20') return { ...j, job: { ...j.job, readings: { ...j.job.readings, insulationTestTemperature: 45 } } };
      return j;
    });
    const ins = assetHistory(ASSET, changed, new Map()).trends.insulation;
    expect(ins.winding).toBe('armature');
    expect(ins.points.map(([d]) => d)).toEqual(['2022-03-10', '2024-05-15', '2025-06-20']);
    expect(ins.cautions[0]).toContain('tests between 20 and 45 °C');
  });
});

