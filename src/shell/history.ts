/** The history command's reading: recorded jobs of one asset from a cases folder. */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
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
