/**
 * The job report a workshop staples to the work order: readable without the tool, every cause
 * and check by its title, who did what and when, the safety notices that were shown.
 */
import type { CaseFile } from '../knowledge/case-schema.js';
import type { Safety } from '../knowledge/rulebase-schema.js';
import type { Diagnosis } from '../engine/diagnose.js';
import { CONNECTION_TRAITS } from '../model/machine.js';
import { outOfBand, QUANTITY_LABELS, type QuantityName } from '../model/quantity-names.js';
import { OBSERVATIONS, SYMPTOMS, type ObservationName } from '../knowledge/vocabulary.js';
import type { Role, WorkEntry } from '../dialogue/work.js';
import { clockTime } from './clock-time.js';
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
}

const UNIT: Record<string, string> = { degC: '°C', ohm: 'Ω', Mohm: 'MΩ', '1': '', 'N m': 'N·m' };
const n = (x: number) => String(Number(x.toPrecision(4)));
const withUnit = (x: number, u: string) => `${n(x)}${UNIT[u] === '' ? '' : ` ${UNIT[u] ?? u}`}`;
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
  const plate = ((r.raw?.machine as Record<string, unknown> | undefined)?.nameplate ?? {}) as Record<string, unknown>;
  if (Object.keys(plate).length) {
    lines.push('| Nameplate | |', '|---|---|');
    for (const [k, v] of Object.entries(plate)) lines.push(`| ${k.replace(/([A-Z])/g, ' $1').toLowerCase()} | ${cell(String(v))} |`);
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

  const readings = Object.entries(d.expectation.quantities).filter(([, q]) => q.measured !== null);
  lines.push('## Readings against a healthy machine', '');
  if (readings.length) {
    lines.push('| Reading | Measured | Expected | Ratio | |', '|---|---:|---:|---:|---|');
    for (const [name, q] of readings) {
      lines.push(`| ${QUANTITY_LABELS[name as QuantityName]} | ${withUnit(q.measured!, q.unit)} | ${withUnit(q.value, q.unit)}${q.basis === 'estimated' ? ' (estimate)' : ''} | ${q.ratio === null ? '' : `${Math.round(q.ratio * 100)} %`} | ${outOfBand(name as QuantityName, q.ratio, q.band) ? 'outside the healthy band' : ''} |`);
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
    for (const e of new Set(c.evidence.map((x) => `${x.weight > 0 ? 'for' : 'against'}: ${x.says}`))) lines.push(`   - ${e}`);
  });
  lines.push('');

  lines.push('## Checks, in order', '');
  const work = r.work ?? [];
  const iso = r.safety.isolation;
  d.checks.forEach((c, k) => {
    if (c.id === d.isolation.beforeCheck) {
      lines.push(`**Before check ${k + 1}, isolate** (${iso.source}):`, '');
      d.isolation.steps.forEach((s, i) => lines.push(`   ${i + 1}. ${s}`));
      lines.push('');
    }
    const started = work.find((w) => w.check === c.id && w.kind === 'started');
    const done = work.find((w) => w.check === c.id && w.kind === 'done');
    lines.push(`${k + 1}. **${c.title}** — ${STATE_WORDS[c.state]}, about ${c.minutes} min; for: ${c.causes.map((id) => causeTitle.get(id) ?? id).join('; ')}`);
    lines.push(`   - How: ${c.how} Instrument: ${c.instrument}.`);
    const hazards = c.hazards.map((h) => r.safety.hazards.find((x) => x.id === h)?.says).filter(Boolean);
    if (hazards.length) lines.push(`   - Hazards: ${hazards.join(' ')}`);
    if (started) lines.push(`   - ${sentence(`Started ${when(started.at)} by ${esc(started.by)}${started.authorisedBy ? `, authorised by ${esc(started.authorisedBy)} (${started.authorisation})` : ''}`)}`);
    if (done) lines.push(`   - ${sentence(`Done ${when(done.at)} by ${esc(done.by)}${done.signedOffBy ? `, signed off by ${esc(done.signedOffBy)}` : ''}`)}${done.finding ? ` Found: ${sentence(esc(done.finding))}` : ''}`);
    if (!started && !done) lines.push('   - Not done.');
  });
  if (!d.checks.length) lines.push('No checks: no cause stood out.');
  lines.push('');

  lines.push('## Safety notices shown', '');
  lines.push(`- ${r.safety.notice}`);
  for (const w of d.warnings) lines.push(`- ${w.says}`);
  if (d.isolation.beforeCheck) lines.push(`- The isolation steps above (${iso.source}). ${iso.usEquivalent}`);
  lines.push('');

  lines.push('## Return to service', '');
  for (const s of r.safety.returnToService) lines.push(`- [ ] ${s.says}`);
  const after = Object.entries(((r.raw?.outcome as Record<string, unknown> | undefined)?.readingsAfter ?? {}) as Record<string, unknown>);
  if (after.length) {
    lines.push('', '| Reading after the repair | |', '|---|---|');
    for (const [k, v] of after) lines.push(`| ${k.replace(/([A-Z])/g, ' $1').toLowerCase()} | ${cell(String(v))} |`);
  }
  const o = job.outcome;
  if (o) {
    lines.push('', '## Outcome', '');
    const cause = o.cause ? (d.causes.find((c) => c.id === o.cause)?.title ?? o.cause) : o.newCause ? `${esc(o.newCause.title)} (new cause)` : undefined;
    if (cause) lines.push(`- Confirmed cause: ${cause}`);
    if (o.fix) lines.push(`- Fix: ${esc(o.fix)}`);
    if (o.notes) lines.push(`- Notes: ${esc(o.notes)}`);
    if (o.recordedBy) lines.push(`- Recorded by: ${esc(o.recordedBy)}`);
    if (o.returnedToServiceBy) lines.push(`- Returned to service by: ${esc(o.returnedToServiceBy)}`);
  }
  lines.push('', '---', '', 'Names and times are recorded as they were given; dctriage does not verify them. dctriage advises; it does not make equipment safe. Local regulations, site procedures and licensed practice prevail.', '');
  return lines.join('\n');
}
