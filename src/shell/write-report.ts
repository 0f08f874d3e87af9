/**
 * Writes the job report: Markdown with the characteristic as an SVG file beside it, or one HTML
 * page (a path ending .html) with the SVG inline. A path the fitter names must be new, or a
 * regular file replaced only when asked (--force); a device, a folder, a link or a file being
 * read for this job is never written over. Without a path, a new file that replaces nothing is
 * made in the working folder. Either both files are written in full or neither is left behind.
 */
import { lstatSync, statSync, unlinkSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { speedCurves } from '../model/curve.js';
import { speedChartSvg } from '../chart/svg-chart.js';
import { jobReport, type ReportInput } from '../report/job-report.js';
import { htmlReport } from '../report/html-report.js';
import { stageFile, writeNewFile, type IoOptions } from './safe-write.js';
import { localDate } from '../report/clock-time.js';

/** The report would go somewhere it must not: bad input (exit 2), nothing written. */
export class ReportRefused extends Error {
  constructor(
    readonly file: string,
    readonly reason: string,
  ) {
    super(`${file}: ${reason}`);
  }
}

export interface ReportTarget extends IoOptions {
  /** Replace an existing regular file. */
  force?: boolean | undefined;
  /** Files read for this job (the case, the machine, the session): never written over. */
  inputs?: readonly (string | undefined)[];
  /** Reports this run wrote (a dialogue writes its report again as the work goes on): these it may replace. Filled in here. */
  ours?: Set<string>;
}

function sameFile(a: string, b: string): boolean {
  try {
    const x = statSync(a);
    const y = statSync(b);
    return x.dev === y.dev && x.ino === y.ino;
  } catch {
    return false;
  }
}

/** Throws ReportRefused when `file` may not be written; returns whether it exists. */
function checkTarget(file: string, target: ReportTarget): boolean {
  let st;
  try {
    st = lstatSync(file);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') return false;
    throw new ReportRefused(file, `cannot be checked (${(e as Error).message})`);
  }
  if (target.inputs?.some((input) => input !== undefined && sameFile(input, file))) throw new ReportRefused(file, 'is a file this job reads: the report never replaces it; name a new file');
  if (!st.isFile()) throw new ReportRefused(file, 'is not a regular file (a folder, a link or a device): the report goes only to a new file, or with --force over a regular file');
  if (!target.force && !target.ours?.has(resolve(file))) throw new ReportRefused(file, 'already exists: name a new file, or add --force to replace it');
  return true;
}

function removeQuietly(file: string): void {
  try {
    unlinkSync(file);
  } catch {
    // already gone
  }
}

/** Returns where the report went. Throws ReportRefused, or WriteFailed on a file system error. */
export async function writeReport(path: string | undefined, input: Omit<ReportInput, 'chartFile'>, cwd: string, target: ReportTarget = {}): Promise<string> {
  const curves = speedCurves({ machine: input.job.machine, readings: input.job.readings });
  const svg = curves ? speedChartSvg(curves) : undefined;
  const html = path?.endsWith('.html') ?? false;
  if (path !== undefined) checkTarget(path, target);
  // Without a path, the name is claimed by an empty file that this run then owns and fills.
  const claimed = path === undefined ? writeNewFile(cwd, `dctriage-report-${localDate(new Date(input.generatedAt), input.timeZone)}`, '.md', '', target).file : undefined;
  const file = path ?? claimed!;
  // In HTML the image line is replaced by the drawing itself (see htmlReport).
  const chartFile = svg ? `${basename(file).replace(/\.[^.]+$/, '')}.svg` : undefined;
  const chartPath = chartFile && !html ? join(dirname(file), chartFile) : undefined;
  try {
    const chartExisted = chartPath ? checkTarget(chartPath, target) : false;
    const markdown = jobReport({ ...input, ...(chartFile ? { chartFile } : {}) });
    const job = input.job.job;
    const header = [job?.workOrder, job?.asset].filter(Boolean).join(' · ') || 'DC machine job';
    const text = html ? await htmlReport(markdown, `Job report ${job?.asset ?? ''}`.trim(), svg, header) : markdown;
    const report = stageFile(file, text, { ...target, exclusive: path !== undefined && !target.force && !target.ours?.has(resolve(file)) });
    try {
      if (chartPath && svg) stageFile(chartPath, svg, { ...target, exclusive: !chartExisted }).publish();
    } catch (e) {
      report.abort();
      throw e;
    }
    try {
      report.publish();
    } catch (e) {
      // No drawing without its report.
      if (chartPath && !chartExisted) removeQuietly(chartPath);
      throw e;
    }
    for (const written of [file, chartPath]) if (written) target.ours?.add(resolve(written));
  } catch (e) {
    if (claimed) removeQuietly(claimed);
    throw e;
  }
  return file;
}
