/**
 * Writes the job report: Markdown with the characteristic as an SVG file beside it, or one HTML
 * page (a path ending .html) with the SVG inline. A path the fitter names is replaced atomically;
 * without one, a new file that replaces nothing is made in the working folder.
 */
import { basename, dirname, join } from 'node:path';
import { speedCurves } from '../model/curve.js';
import { speedChartSvg } from '../chart/svg-chart.js';
import { jobReport, type ReportInput } from '../report/job-report.js';
import { htmlReport } from '../report/html-report.js';
import { replaceFile, writeNewFile } from './safe-write.js';
import { localDate } from '../report/clock-time.js';

/** Returns where the report went. Throws on a file system error, for the caller to word. */
export async function writeReport(path: string | undefined, input: Omit<ReportInput, 'chartFile'>, cwd: string): Promise<string> {
  const curves = speedCurves({ machine: input.job.machine, readings: input.job.readings });
  const svg = curves ? speedChartSvg(curves) : undefined;
  const html = path?.endsWith('.html') ?? false;
  const target = path ?? writeNewFile(cwd, `dctriage-report-${localDate(new Date(input.generatedAt), input.timeZone)}`, '.md', '').file;
  // In HTML the image line is replaced by the drawing itself (see htmlReport).
  const chartFile = svg ? `${basename(target).replace(/\.[^.]+$/, '')}.svg` : undefined;
  const markdown = jobReport({ ...input, ...(chartFile ? { chartFile } : {}) });
  if (chartFile && svg && !html) replaceFile(join(dirname(target), chartFile), svg);
  const job = input.job.job;
  const header = [job?.workOrder, job?.asset].filter(Boolean).join(' · ') || 'DC machine job';
  replaceFile(target, html ? await htmlReport(markdown, `Job report ${job?.asset ?? ''}`.trim(), svg, header) : markdown);
  return target;
}
