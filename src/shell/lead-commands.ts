/**
 * The workshop lead's commands: file a case, draft a rule from it, review a rule folder, adopt
 * a draft. Each returns what to print and the exit code; the CLI prints.
 */
import { readdirSync, unlinkSync } from 'node:fs';
import { basename, isAbsolute, join, relative } from 'node:path';
import { caseSchema, type CaseFile } from '../knowledge/case-schema.js';
import { stableJson } from '../knowledge/canonical.js';
import { loadCase, loadCaseFile } from '../knowledge/load-case.js';
import { crossCheck, loadRuleBase, type RuleBase } from '../knowledge/load-rules.js';
import { readValidated } from '../knowledge/read-json.js';
import { exitCodeOf, formatIssues, type Issue } from '../knowledge/result.js';
import { causesFile, checksFile, draftFile, ruleFile } from '../knowledge/rulebase-schema.js';
import { checkCases, type CaseCheckReport } from '../engine/check-cases.js';
import { reviewRuleBase, type RuleFinding } from '../engine/check-rules.js';
import { draftFromCase, withDraft, type DraftFile } from '../engine/draft-rule.js';
import { fileCase } from './file-case.js';
import { diagnose } from '../engine/diagnose.js';
import { buildEngine } from '../engine/run-rules.js';
import { jobReport } from '../report/job-report.js';
import { makeFolder, replaceFile, stageFile, writeNewFile, writeProblem, type Staged } from './safe-write.js';

export interface Outcome {
  code: number;
  out?: string;
  err?: string;
}

const bad = (issues: Issue[]): Outcome => ({ code: exitCodeOf(issues), err: formatIssues(issues) });
/** A path as the lead would type it: relative when it is under the working folder. */
const shown = (file: string) => {
  const r = relative(process.cwd(), file);
  return r && !r.startsWith('..') && !isAbsolute(r) ? r : file;
};
const json = (v: unknown) => JSON.stringify(v, null, 2);

export function caseFiles(dir: string): string[] {
  return readdirSync(dir).filter((f) => f.endsWith('.json')).sort().map((f) => join(dir, f));
}

export function addCase(file: string, casesDir: string, base: RuleBase, today: string): Outcome {
  const c = loadCaseFile(file, new Set(base.causes.map((x) => x.id)));
  if (!c.ok) return bad(c.issues);
  const filed = fileCase(c.value.raw, c.value.job, casesDir, today);
  if (!filed.ok) return bad(filed.issues);
  const note = filed.value.requestedId ? ` (id "${filed.value.requestedId}" was taken: filed as "${filed.value.id}")` : '';
  return { code: 0, out: `Filed ${shown(filed.value.file)}${note}` };
}

/** A lead's review of a saved job: its report on stdout, and with `closeBy` the job marked closed. */
export async function reviewJob(file: string, base: RuleBase, closeBy: string | undefined, now: string, timeZone?: string): Promise<Outcome> {
  const c = loadCaseFile(file, new Set(base.causes.map((x) => x.id)));
  if (!c.ok) return bad(c.issues);
  const { job: parsed, raw } = c.value;
  const d = await diagnose(parsed, base, buildEngine(base));
  const text = jobReport({ job: parsed, raw, diagnosis: d, safety: base.safety, generatedAt: now, ...(timeZone ? { timeZone } : {}) });
  if (closeBy === undefined) return { code: 0, out: text };
  if (closeBy.trim() === '') return bad([{ code: 'invalid', file, path: 'job.closedBy', message: 'name who closes the job: --close NAME' }]);
  try {
    replaceFile(file, stableJson({ ...raw, job: { ...raw.job, closedBy: closeBy, closedAt: now } }, caseSchema));
  } catch (e) {
    return bad([{ code: 'unwritable', file, path: '', message: `could not mark the job closed: ${writeProblem(e)}; the file is as it was` }]);
  }
  return { code: 0, out: `${text}\nClosed by ${closeBy} at ${now}; written to ${file}.` };
}

export interface RankChange {
  id: string;
  expected: string;
  before: number;
  after: number;
  /** Was in the top 3, is not any more. */
  droppedOut: boolean;
}

export function rankChanges(before: CaseCheckReport, after: CaseCheckReport): RankChange[] {
  const was = new Map(before.cases.map((c) => [c.file, c.rank]));
  const inTop3 = (r: number) => r >= 1 && r <= 3;
  return after.cases.map((c) => {
    const b = was.get(c.file) ?? 0;
    return { id: c.id, expected: c.expected, before: b, after: c.rank, droppedOut: inTop3(b) && !inTop3(c.rank) };
  });
}

async function loadCases(dir: string): Promise<{ ok: true; cases: CaseFile[]; files: string[] } | { ok: false; issues: Issue[] }> {
  const files = caseFiles(dir);
  const cases: CaseFile[] = [];
  for (const f of files) {
    const c = loadCase(f);
    if (!c.ok) return { ok: false, issues: c.issues };
    cases.push(c.value);
  }
  return { ok: true, cases, files };
}

export async function draftRule(caseFile: string, rulesDir: string, casesDir: string, base: RuleBase, asJson: boolean): Promise<Outcome> {
  const target = loadCase(caseFile, new Set(base.causes.map((c) => c.id)));
  if (!target.ok) return bad(target.issues);
  const recorded = await loadCases(casesDir);
  if (!recorded.ok) return bad(recorded.issues);
  const others = recorded.cases.filter((c, k) => basename(recorded.files[k]!) !== basename(caseFile) || c.id !== target.value.id);
  const draft = await draftFromCase(target.value, others, base);
  if ('error' in draft) return bad([{ code: 'invalid', file: caseFile, path: 'outcome', message: draft.error }]);
  const drafts = join(rulesDir, 'drafts');
  let written: string;
  try {
    makeFolder(drafts);
    written = writeNewFile(drafts, draft.name, '.json', stableJson(draft.file, draftFile)).file;
  } catch (e) {
    return bad([{ code: 'unwritable', file: drafts, path: '', message: `could not write the draft: ${writeProblem(e)}` }]);
  }
  const before = await checkCases(recorded.files, base);
  const after = await checkCases(recorded.files, withDraft(base, draft.file, written));
  if (!before.ok) return bad(before.issues);
  if (!after.ok) return bad(after.issues);
  const changes = rankChanges(before.value, after.value);
  const dropped = changes.filter((c) => c.droppedOut);
  if (asJson) return { code: 0, out: json({ file: written, draft: draft.file, conditions: draft.conditions, rankChanges: changes, flagged: dropped.map((c) => c.id) }) };
  const moved = changes.filter((c) => c.before !== c.after);
  const lines = [
    `Wrote ${shown(written)}: rule "${draft.name}" for ${draft.cause}, ${draft.conditions} condition${draft.conditions === 1 ? '' : 's'}, weight ${draft.file.rules[0]!.kind === 'evidence' ? draft.file.rules[0]!.weight : ''}.`,
    moved.length ? 'Rank changes if adopted (confirmed cause, before → after):' : 'No recorded case changes rank if adopted.',
    ...moved.map((c) => `  ${c.droppedOut ? 'FLAG ' : '     '}${c.id} (${c.expected}): ${c.before || 'absent'} → ${c.after || 'absent'}`),
  ];
  if (dropped.length) lines.push(`${dropped.length} recorded case${dropped.length === 1 ? '' : 's'} would leave the top 3: review before adopting.`);
  return { code: 0, out: lines.join('\n') };
}

export interface RuleCheckReport {
  clean: boolean;
  findings: RuleFinding[];
  cases?: CaseCheckReport;
}

export async function checkRules(rulesDir: string, casesDir: string, asJson: boolean): Promise<Outcome> {
  const loaded = loadRuleBase(rulesDir);
  let report: RuleCheckReport;
  if (!loaded.ok) {
    if (loaded.issues.some((i) => i.code === 'unreadable' || i.code === 'not-json' || i.code === 'too-large')) return bad(loaded.issues);
    report = { clean: false, findings: loaded.issues.map((i) => ({ kind: 'schema', file: i.file, about: i.path, message: i.message })) };
  } else {
    const findings = reviewRuleBase(loaded.value);
    const cases = await checkCases(caseFiles(casesDir), loaded.value);
    if (!cases.ok) return bad(cases.issues);
    for (const c of cases.value.cases.filter((x) => x.rank === 0 || x.rank > 3)) {
      findings.push({ kind: 'case-out-of-top-3', file: c.file, about: c.id, message: `confirmed cause ${c.expected} ranks ${c.rank || 'nowhere'}; the leaders are ${c.ranked.slice(0, 3).join(', ')}` });
    }
    report = { clean: findings.length === 0, findings, cases: cases.value };
  }
  const err = report.findings.map((f) => `${f.file}: ${f.about ? `${f.about}: ` : ''}${f.message}`).join('\n');
  const text = asJson ? json(report) : report.clean ? 'Rule folder clean: every check passed and every recorded case ranks in its top 3.' : '';
  return { code: report.clean ? 0 : 1, ...(text ? { out: text } : {}), ...(err ? { err } : {}) };
}

export async function adoptDraft(draftPath: string, rulesDir: string, casesDir: string, base: RuleBase, force: boolean): Promise<Outcome> {
  const d = readValidated(draftPath, draftFile);
  if (!d.ok) return bad(d.issues);
  const draft: DraftFile = d.value;
  const target = join(rulesDir, basename(draftPath));
  const merged = withDraft(base, draft, target);
  const cross = crossCheck(merged);
  if (cross.length) return bad(cross);
  const files = caseFiles(casesDir);
  const before = await checkCases(files, base);
  const after = await checkCases(files, merged);
  if (!before.ok) return bad(before.issues);
  if (!after.ok) return bad(after.issues);
  const dropped = rankChanges(before.value, after.value).filter((c) => c.droppedOut);
  const broke = dropped.map((c) => `  ${c.id} (${c.expected}): rank ${c.before} → ${c.after || 'absent'}`);
  if (dropped.length && !force) return { code: 1, err: [`Not adopted: ${dropped.length} recorded case(s) would leave the top 3:`, ...broke, 'Review the draft, or adopt with --force.'].join('\n') };
  // Catalogue changes are written completely before anything is published, and the draft is
  // removed only once every file is in place: a failure leaves the folder and the draft as they were.
  const { causes, checks, ...rules } = draft;
  const staged: Staged[] = [];
  let ruleWritten: string | undefined;
  try {
    // checks.json first: a cause names its checks, so new checks may stand before the causes that use them.
    if (checks?.length) staged.push(stageFile(join(rulesDir, 'checks.json'), stableJson({ checks: [...base.checks, ...checks] }, checksFile)));
    if (causes?.length) staged.push(stageFile(join(rulesDir, 'causes.json'), stableJson({ causes: [...base.causes, ...causes] }, causesFile)));
    ruleWritten = writeNewFile(rulesDir, basename(draftPath, '.json'), '.json', stableJson(rules, ruleFile)).file;
    while (staged.length) {
      staged[0]!.publish();
      staged.shift();
    }
  } catch (e) {
    staged.forEach((s) => s.abort());
    if (ruleWritten) removeQuietly(ruleWritten);
    return bad([{ code: 'unwritable', file: rulesDir, path: '', message: `could not adopt the draft: ${writeProblem(e)}; the rule folder and the draft are as they were` }]);
  }
  try {
    unlinkSync(draftPath);
  } catch (e) {
    return { code: 0, out: `Adopted ${basename(draftPath)} into ${rulesDir}, but the draft could not be removed (${writeProblem(e)}): remove it by hand.` };
  }
  const lines = [`Adopted ${basename(draftPath)} into ${rulesDir}.`];
  if (dropped.length) lines.push(`Adopted with --force; these recorded cases left their top 3:`, ...broke);
  return { code: 0, out: lines.join('\n') };
}


function removeQuietly(file: string): void {
  try {
    unlinkSync(file);
  } catch {
    // already gone
  }
}
