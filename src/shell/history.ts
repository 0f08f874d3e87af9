/** The history command's reading and text: recorded jobs of one asset from a cases folder. */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { barRows } from '../chart/series-chart.js';
import { assetHistory, type AssetHistory, type RecordedJob } from '../engine/asset-history.js';
import { loadCase } from '../knowledge/load-case.js';
import { failed, ok, type Issue, type Result } from '../knowledge/result.js';

/** Every case file of a folder, validated; a bad one is refused with its file and field named. */
export function readRecordedJobs(dir: string): Result<RecordedJob[]> {
  let names: string[];
  try {
    names = readdirSync(dir).filter((f) => f.endsWith('.json')).sort();
  } catch {
    return failed({ code: 'unreadable', file: dir, path: '', message: 'cases folder cannot be read' });
  }
  const jobs: RecordedJob[] = [];
  const issues: Issue[] = [];
  for (const name of names) {
    const c = loadCase(join(dir, name));
    if (c.ok) jobs.push({ file: name, job: c.value });
    else issues.push(...c.issues);
  }
  return issues.length ? failed(...issues) : ok(jobs);
}

export function historyOf(asset: string, dir: string, causeTitles: ReadonlyMap<string, string>): Result<AssetHistory> {
  const jobs = readRecordedJobs(dir);
  return jobs.ok ? ok(assetHistory(asset, jobs.value, causeTitles)) : jobs;
}

const fmt = (x: number) => String(Number(x.toPrecision(4)));

export function formatHistory(h: AssetHistory): string {
  const lines = [`${h.asset}: ${h.jobs.length} recorded job${h.jobs.length === 1 ? '' : 's'}`, ''];
  for (const j of h.jobs) {
    lines.push(`${j.date ?? 'undated   '}  ${j.workOrder ?? ''}${j.workOrder ? '  ' : ''}${j.causeTitle ?? j.cause ?? 'cause not recorded'}`);
    if (j.fix) lines.push(`            ${j.fix}`);
  }
  const ins = h.trends.insulation;
  if (ins.points.length) {
    lines.push('', 'Insulation resistance at 1 min, corrected to 40 °C (IEEE 43-2013)');
    lines.push(...barRows(ins.points.map(([d, v]) => ({ label: d, value: v, text: `${fmt(v)} MΩ` }))));
    if (ins.perYear !== null) lines.push(`  trend ${ins.perYear < 0 ? 'falling' : 'not falling'}: ${fmt(ins.perYear)} MΩ a year (straight line through the points)`);
    if (ins.minimum !== null) {
      lines.push(
        ins.projectedMinimumDate
          ? `  on that line it reaches the ${fmt(ins.minimum)} MΩ minimum about ${ins.projectedMinimumDate}`
          : `  no projection: the trend is not falling, or there are too few dated tests (minimum ${fmt(ins.minimum)} MΩ)`,
      );
    }
  }
  for (const [title, t] of [
    ['Armature circuit resistance at 20 °C', h.trends.armatureResistance],
    ['Shunt field resistance at 20 °C', h.trends.shuntFieldResistance],
  ] as const) {
    if (t.points.length < 2) continue;
    lines.push('', title, ...barRows(t.points.map(([d, v]) => ({ label: d, value: v, text: `${fmt(v)} Ω` }))));
  }
  return lines.join('\n');
}
