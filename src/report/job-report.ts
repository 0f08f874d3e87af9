/**
 * The job report a workshop staples to the work order: readable without the tool, every cause
 * and check by its title, who did what and when, the safety notices that were shown.
 */
import type { CaseFile } from '../knowledge/case-schema.js';
import type { Safety } from '../knowledge/rulebase-schema.js';
import type { Diagnosis } from '../engine/diagnose.js';
import { CONNECTION_TRAITS } from '../model/machine.js';
import { readingRows, rowLabel } from './reading-rows.js';
import { evidenceLines } from './evidence-lines.js';
import { DIMENSIONS } from '../units/quantity.js';
import { READING_FIELDS, type ReadingName } from '../knowledge/case-schema.js';
import { OBSERVATIONS, SYMPTOMS, type ObservationName } from '../knowledge/vocabulary.js';
import type { Role, WorkEntry } from '../dialogue/work.js';
import { clockTime } from './clock-time.js';
import type { AssetHistory } from '../engine/asset-history.js';
import { formatSeries } from './series-text.js';
import { formatHistory } from './history-text.js';
import { spacedControls } from '../knowledge/visible-text.js';

export interface ReportInput {
  job: CaseFile;
  /** The job as typed, for readings shown the way the meters read them. */
  raw?: Record<string, unknown>;
  diagnosis: Diagnosis;
  safety: Safety;
  work?: readonly WorkEntry[];
  role?: Role;
  generatedAt: string;
  /** The IANA time zone where the job was done, for its times; UTC when not given. */
  timeZone?: string;
  /** Where an SVG of the characteristic sits beside the report, when there is one. */
  chartFile?: string;
  /** Titles of causes not in the ranking, for checks that name them. */
  causeTitles?: ReadonlyMap<string, string>;
  /** The asset's recorded jobs, when it has any. */
  history?: AssetHistory | undefined;
  /** Which tool and which rules made the diagnosis. */
  producedBy?: ProducedBy;
}

export interface ProducedBy {
  version: string;
  /** "built-in rules", or the rule folder as given. */
  rules: string;
  /** The rule folder's commit, where it is a git repository. */
  revision?: string;
}

const UNIT: Record<string, string> = { degC: '°C', ohm: 'Ω', Mohm: 'MΩ', '1': '', 'N m': 'N·m' };
/** The unit each nameplate value is held in (the default unit of its dimension). */
const NAMEPLATE_UNITS: Record<string, string> = { armatureVoltage: 'V', armatureCurrent: 'A', lineCurrent: 'A', speed: 'rpm', noLoadSpeed: 'rpm', power: 'W', fieldVoltage: 'V', fieldCurrent: 'A' };
const readingUnit = (name: string) => (name in READING_FIELDS ? DIMENSIONS[READING_FIELDS[name as ReadingName].dimension].unit : '');
/** "armatureVoltage" → "armature voltage". */
const words = (key: string) => key.replace(/([A-Z])/g, ' $1').toLowerCase();
const n = (x: number) => String(Number(x.toPrecision(4)));
const withUnit = (x: number, u: string) => (u === 'W' && x >= 1000 ? `${n(x / 1000)} kW` : `${n(x)}${UNIT[u] === '' || u === '' ? '' : ` ${UNIT[u] ?? u}`}`);
/**
 * Text people typed, kept as text: one line (a newline cannot start a heading or leave its table
 * cell or paragraph), no HTML, and no Markdown (links, images, emphasis, code) in the report.
 */
const esc = (s: string) => spacedControls(s).replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/[\\`*_[\]!|~#]/g, '\\$&');
const cell = esc;
/** A sentence ends with one full stop, even after initials ("P.R."). */
const sentence = (text: string) => (text.endsWith('.') ? text : `${text}.`);
const STATE_WORDS = { observe: 'observe (running, no contact)', 'live-test': 'live test (qualified person)', isolated: 'isolated (after isolation and lockout)' } as const;

export function jobReport(r: ReportInput): string {
  const { job, diagnosis: d } = r;
  const when = (iso: string) => clockTime(iso, r.timeZone);
  const j = job.job ?? {};
  // Isolation recorded while working the checks stands in for the job file's, when that has none.
  const recorded = r.work?.find((w) => w.isolation)?.isolation;
  const isolation = j.isolation ?? (recorded ? { points: recorded.points ? [recorded.points] : undefined, locks: recorded.locks ? [recorded.locks] : undefined, provedDeadBy: recorded.provedDeadBy, tester: recorded.tester } : undefined);
  const m = job.machine;
  const causeTitle = new Map(d.causes.map((c) => [c.id, c.title]));
  const lines: string[] = [];
  const title = [j.asset, j.workOrder].filter(Boolean).join(' — ') || 'DC machine job';
  lines.push(`# Job report: ${esc(title)}`, '');
  lines.push('| Job | |', '|---|---|');
  const row = (k: string, v: string | undefined) => v && lines.push(`| ${k} | ${cell(v)} |`);
  row('Work order', j.workOrder);
  row('Asset', j.asset);
  row('Site', j.site);
  row('Fitter', j.fitter);
  row('Role', r.role);
  row('Started', j.startedAt);
  row('Permit', j.permit);
  row('Isolation points', isolation?.points?.join(', '));
  row('Locks', isolation?.locks?.join(', '));
  row('Proved dead by', isolation?.provedDeadBy);
  row('Tester', isolation?.tester);
  row('Closed by', j.closedBy && `${j.closedBy}${j.closedAt ? ` at ${when(j.closedAt)}` : ''}`);
  row('Report written', when(r.generatedAt));
  lines.push('');

  if (d.warnings.length) {
    lines.push('## Dangers found', '');
    for (const w of d.warnings) lines.push(`- **${w.says}**`);
    lines.push('');
  }

  lines.push('## Machine', '');
  const kind = CONNECTION_TRAITS[m.connection].label;
  lines.push(`${kind.charAt(0).toUpperCase()}${kind.slice(1)} DC machine; ${m.drive === 'controlled-converter' ? 'controlled converter' : m.drive === 'fixed-supply' ? 'fixed DC supply' : 'supply not known'}${m.feedback && m.feedback !== 'unknown' ? `, ${m.feedback} feedback` : ''}${m.cooling && m.cooling !== 'unknown' ? `, ${m.cooling}` : ''}.`, '');
  // The values the tool worked with, in its units: "220" and "1200mA" as 220 V and 1.2 A.
  const plate = Object.entries(m.nameplate ?? {}).filter(([, v]) => v !== undefined);
  if (plate.length) {
    lines.push('| Nameplate | |', '|---|--:|');
    for (const [k, v] of plate) lines.push(`| ${words(k)} | ${typeof v === 'number' ? withUnit(v, NAMEPLATE_UNITS[k] ?? '') : cell(String(v))} |`);
    lines.push('');
  }

  lines.push('## Symptoms', '');
  lines.push(...((job.symptoms ?? []).length ? job.symptoms!.map((s) => `- ${SYMPTOMS[s]}`) : ['- none reported (routine test)']), '');
  const obs = Object.entries(job.observations ?? {}).filter(([, v]) => v !== undefined && v !== 'unknown');
  if (obs.length) {
    lines.push('## What was observed', '');
    for (const [k, v] of obs) {
      const spec = OBSERVATIONS[k as ObservationName];
      lines.push(`- ${spec.says}: ${(spec.values as Record<string, string>)[v as string] ?? v}`);
    }
    lines.push('');
  }

  const readings = readingRows(d.expectation);
  lines.push('## Readings against a healthy machine', '');
  if (readings.length) {
    lines.push('| Reading | Measured | Expected | Ratio | |', '|---|---:|---:|---:|---|');
    for (const row of readings) {
      const q = row.quantity;
      lines.push(`| ${row.sameReading ? `↳ ${rowLabel(row)}` : rowLabel(row)} | ${row.sameReading ? '' : withUnit(q.measured, q.unit)} | ${withUnit(q.value, q.unit)}${q.basis === 'estimated' ? ' (estimate)' : ''} | ${q.ratio === null ? '' : `${Math.round(q.ratio * 100)} %`} | ${row.outOfBand ? 'outside the healthy band' : ''} |`);
    }
  } else lines.push('No readings were taken that the model could set against a healthy machine.');
  lines.push('');
  if (r.chartFile) lines.push(`![Speed against armature current: the healthy machine and the measured point](${r.chartFile})`, '');
  if (d.expectation.findings.length) lines.push(...d.expectation.findings.map((f) => `- ${f.says}`), '');
  if (d.expectation.assumptions.length) lines.push('Assumed: ' + d.expectation.assumptions.join('; ') + '.', '');

  lines.push('## Likely causes', '');
  if (!d.causes.length) lines.push('No cause stood out from what was known.');
  d.causes.slice(0, 6).forEach((c, k) => {
    lines.push(`${k + 1}. **${c.title}** (score ${c.score.toFixed(2)})`);
    for (const e of evidenceLines(c.evidence)) lines.push(`   - ${e.supports ? 'for' : 'against'}: ${e.says}`);
  });
  lines.push('');

  const work = r.work ?? [];
  const iso = r.safety.isolation;
  const workedRecords = job.checks ?? [];
  const worked = d.checks.filter((c) => c.result);
  const titleOf = (id: string) => causeTitle.get(id) ?? r.causeTitles?.get(id) ?? id;
  if (worked.length) {
    lines.push('## The checks worked, in order', '');
    worked.forEach((c, k) => {
      const w = workedRecords.filter((x) => x.id === c.id).at(-1);
      lines.push(`### Check ${k + 1}: ${c.title} — ${c.result}`, '');
      lines.push(`- ${sentence(`${STATE_WORDS[c.state].charAt(0).toUpperCase()}${STATE_WORDS[c.state].slice(1)}: **${c.result}**${c.finding ? `. Found: ${esc(c.finding)}` : ''}`)}`);
      if (w?.startedAt || w?.at) lines.push(`- ${sentence(`${w.startedAt ? `Started ${when(w.startedAt)}, ` : ''}done ${w.at ? when(w.at) : ''} by ${esc(w.by ?? 'not named')}${w.authorisedBy ? `, authorised by ${esc(w.authorisedBy)} (${w.authorisation === 'remote' ? 'remotely, not present' : 'present at the machine'})` : r.role === 'apprentice' && c.state === 'observe' ? ', looking only: no authorisation needed' : `, on the ${r.role ?? 'fitter'}'s own authority`}${w.signedOffBy ? `; signed off by ${esc(w.signedOffBy)}` : ''}`)}`);
      const readings = Object.entries(w?.readings ?? {}).filter(([, v]) => v !== undefined);
      if (readings.length) lines.push(`- Readings: ${readings.map(([name, v]) => `${name.replace(/([A-Z])/g, ' $1').toLowerCase()} ${typeof v === 'number' ? n(v) : cell(String(v))}`).join('; ')}`);
      const observed = Object.entries(w?.observations ?? {}).filter(([, v]) => v !== undefined && v !== 'unknown');
      if (observed.length) lines.push(`- Saw: ${observed.map(([name, v]) => `${OBSERVATIONS[name as ObservationName]?.says ?? name}: ${OBSERVATIONS[name as ObservationName]?.values[v as never] ?? v}`).join('; ')}`);
      const effect = d.effects.find((e) => e.check === c.id)?.effects ?? [];
      const moved = effect.filter((e) => Math.abs(e.weight) >= 0.1).sort((a, b) => b.weight - a.weight);
      if (moved.length) lines.push(`- It weighed ${moved.map((e) => `${e.weight > 0 ? 'for' : 'against'} ${e.title} (${e.weight > 0 ? '+' : '−'}${Math.abs(e.weight).toFixed(2)})`).join(', ')}.`);
      lines.push('');
    });
  }
  lines.push('## What was found', '');
  if (d.found) lines.push(`**${d.found.title}**, confirmed by the checks. ${d.found.means}`);
  else if (d.status === 'exhausted') lines.push('**Not found**: every check worth doing was done and no cause was confirmed. Specialist tests and a second opinion are the next step; the job is kept as an open case.');
  else lines.push(`Not yet confirmed: ${worked.length ? `${worked.length} check${worked.length > 1 ? 's' : ''} worked, ` : ''}${d.checks.length - worked.length} still to do.`);
  lines.push('');

  const toDo = d.checks.filter((c) => !c.result);
  if (toDo.length) {
    lines.push(worked.length ? '## Checks still to do, the most useful first' : '## Checks, in order', '');
    // Each check and the isolation are headings numbered in their own words, so no renderer
    // runs the isolation steps and the checks together as one list.
    toDo.forEach((c, j) => {
      const k = worked.length + j;
      if (c.id === d.isolation.beforeCheck) {
        lines.push(`### Isolation, before check ${k + 1}`, '', `Isolate in this order (${iso.source}):`, '');
        d.isolation.steps.forEach((s, i) => lines.push(`${i + 1}. ${s}`));
        lines.push('');
      }
      const started = work.find((w) => w.check === c.id && w.kind === 'started');
      lines.push(`### Check ${k + 1}: ${c.title}`, '');
      lines.push(`- ${sentence(`${STATE_WORDS[c.state].charAt(0).toUpperCase()}${STATE_WORDS[c.state].slice(1)}, about ${c.minutes} min; for: ${c.causes.map(titleOf).join('; ')}`)}`);
      lines.push(`- How: ${c.how} Instrument: ${c.instrument}.`);
      const hazards = c.hazards.map((h) => r.safety.hazards.find((x) => x.id === h)?.says).filter(Boolean);
      if (hazards.length) lines.push(`- Hazards: ${hazards.join(' ')}`);
      if (started) lines.push(`- ${sentence(`Started ${when(started.at)} by ${esc(started.by)}${started.authorisedBy ? `, authorised by ${esc(started.authorisedBy)} (${started.authorisation === 'remote' ? 'remotely, not present' : 'present at the machine'})` : r.role === 'apprentice' ? ', looking only: no authorisation needed' : `, on the ${r.role ?? 'fitter'}'s own authority`}`)}`);
      else lines.push('- Not done.');
      lines.push('');
    });
  }
  if (!d.checks.length) lines.push('No checks: no cause stood out.', '');

  lines.push('## Safety notices shown', '');
  lines.push(`- ${r.safety.notice}`);
  for (const w of d.warnings) lines.push(`- ${w.says}`);
  if (d.isolation.beforeCheck) lines.push(`- The isolation steps above (${iso.source}). ${iso.usEquivalent}`);
  lines.push('');

  lines.push(...chartSections(r));
  lines.push('## Return to service', '');
  for (const s of r.safety.returnToService) lines.push(`- [ ] ${s.says}`);
  const after = Object.entries(job.outcome?.readingsAfter ?? {}).filter(([, v]) => v !== undefined);
  if (after.length) {
    lines.push('', '| Reading after the repair | |', '|---|--:|');
    for (const [k, v] of after) lines.push(`| ${words(k)} | ${typeof v === 'number' ? withUnit(v, readingUnit(k)) : cell(String(v))} |`);
  }
  const o = job.outcome;
  if (o) {
    lines.push('', '## Outcome', '');
    const cause = o.cause ? (d.causes.find((c) => c.id === o.cause)?.title ?? o.cause) : o.newCause ? `${esc(o.newCause.title)} (new cause)` : undefined;
    if (cause) lines.push(`- Confirmed cause: ${cause}`);
    if (o.date) lines.push(`- Date: ${o.date}`);
    if (o.fix) lines.push(`- Fix: ${esc(o.fix)}`);
    if (o.notes) lines.push(`- Notes: ${esc(o.notes)}`);
    if (o.recordedBy) lines.push(`- Recorded by: ${esc(o.recordedBy)}`);
    if (o.returnedToServiceBy) lines.push(`- Returned to service by: ${esc(o.returnedToServiceBy)}`);
  }
  lines.push('', '## Sign-off', '');
  lines.push('| | Name | Signature | Date |', '|---|---|---|---|');
  lines.push(`| Fitter | ${cell(j.fitter ?? '')} | | |`);
  lines.push(`| Supervisor | ${cell(r.work?.find((w) => w.signedOffBy)?.signedOffBy ?? '')} | | |`);
  lines.push(`| Returned to service by | ${cell(o?.returnedToServiceBy ?? '')} | | |`);
  const by = r.producedBy;
  const made = by ? `Diagnosis by dctriage ${by.version} with ${by.rules === 'built-in rules' ? 'its built-in rules' : `the rules in ${esc(by.rules)}`}${by.revision ? ` (revision ${esc(by.revision)})` : ''}. ` : '';
  lines.push('', '---', '', made + 'Names and times are recorded as they were given; dctriage does not verify them. dctriage advises; it does not make equipment safe. Local regulations, site procedures and licensed practice prevail.', '');
  return lines.join('\n');
}

/** The test series and the asset's history as the terminal draws them, in fixed-width blocks. */
function chartSections(r: ReportInput): string[] {
  // Text people typed may hold backticks: they must not close the block.
  const block = (text: string) => ['```text', text.replace(/`/g, "'"), '```', ''];
  const out: string[] = [];
  const series = formatSeries(r.job.tests, r.diagnosis.analyses);
  if (series) out.push('## Test series', '', ...block(series));
  if (r.history && r.history.jobs.length > 0) out.push('## Asset history', '', ...block(formatHistory(r.history)));
  return out;
}
