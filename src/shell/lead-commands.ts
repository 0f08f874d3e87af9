/**
 * The workshop lead's commands: file a case, draft a rule from it, review a rule folder, adopt
 * a draft. Each returns what to print and the exit code; the CLI prints.
 */
import { readdirSync, unlinkSync } from 'node:fs';
import { basename, isAbsolute, join, relative } from 'node:path';
import { caseSchema, type CaseFile } from '../knowledge/case-schema.js';
import { stableJson } from '../knowledge/canonical.js';
import { caseFromJson, loadCase, loadCaseFile } from '../knowledge/load-case.js';
import { crossCheck, loadRuleBase, type RuleBase } from '../knowledge/load-rules.js';
import { readJson, readValidated } from '../knowledge/read-json.js';
import { exitCodeOf, formatIssues, type Issue } from '../knowledge/result.js';
import { causesFile, checksFile, draftFile, ruleFile } from '../knowledge/rulebase-schema.js';
import { checkCases, type CaseCheckReport } from '../engine/check-cases.js';
import { reviewRuleBase, type RuleFinding } from '../engine/check-rules.js';
import { draftFromCase, withDraft, type DraftFile } from '../engine/draft-rule.js';
import { fileCase } from './file-case.js';
import { placeholderTexts } from '../engine/draft-placeholders.js';
import { diagnose } from '../engine/diagnose.js';
import { buildEngine } from '../engine/run-rules.js';
import { jobReport, type ProducedBy } from '../report/job-report.js';
import { clockTime } from '../report/clock-time.js';
import { JSON_FORMATS } from './json-formats.js';
import { makeFolder, replaceFile, stageFile, writeNewFile, writeProblem, type Staged } from './safe-write.js';

export interface Outcome {
  code: number;
  out?: string;
  err?: string;
}

/** Issues as the shell prints them: one line each, starting with the program's name. */
const bad = (issues: Issue[]): Outcome => ({ code: exitCodeOf(issues), err: formatIssues(issues).split('\n').map((l) => `dctriage: ${l}`).join('\n') });
/** A path as the lead would type it: relative when it is under the working folder. */
const shown = (file: string) => {
  const r = relative(process.cwd(), file);
  return r && !r.startsWith('..') && !isAbsolute(r) ? r : file;
};
const json = (v: unknown) => JSON.stringify(v, null, 2);

export function caseFiles(dir: string): string[] {
  return readdirSync(dir).filter((f) => f.endsWith('.json')).sort().map((f) => join(dir, f));
}

/** `file` names where the job's JSON came from (a file, or standard input). */
export function addCase(file: string, json: unknown, casesDir: string, base: RuleBase, today: string): Outcome {
  const c = caseFromJson(file, json, new Set(base.causes.map((x) => x.id)));
  if (!c.ok) return bad(c.issues);
  // A valid case is filed whatever these say; they are for the lead to act on.
  const warnings: string[] = [];
  const twin = sameJobIn(casesDir, c.value.raw);
  if (twin) warnings.push(`dctriage: warning: the same job is already filed as ${shown(twin)}`);
  if (!c.value.job.outcome?.cause && !c.value.job.outcome?.newCause) warnings.push('dctriage: warning: the job names no confirmed cause (outcome.cause or outcome.newCause): cases check and rules draft will skip it');
  const filed = fileCase(c.value.raw, c.value.job, casesDir, today);
  if (!filed.ok) return bad(filed.issues);
  const note = filed.value.requestedId ? ` (id "${filed.value.requestedId}" was taken: filed as "${filed.value.id}")` : '';
  return { code: 0, out: `Filed ${shown(filed.value.file)}${note}`, ...(warnings.length ? { err: warnings.join('\n') } : {}) };
}

/** A case file in `dir` holding the same job (its id and "$schema" aside), if any. */
function sameJobIn(dir: string, raw: object): string | undefined {
  const content = (v: unknown) => {
    const { id: _id, $schema: _schema, ...rest } = v as Record<string, unknown>;
    return stableJson(rest, caseSchema);
  };
  const wanted = content(raw);
  let files: string[];
  try {
    files = caseFiles(dir);
  } catch {
    return undefined; // filing will say what is wrong with the folder
  }
  return files.find((f) => {
    const r = readJson(f);
    return r.ok && r.value !== null && typeof r.value === 'object' && content(r.value) === wanted;
  });
}

/** A lead's review of a saved job: its report on stdout, and with `closeBy` the job marked closed. */
export async function reviewJob(file: string, base: RuleBase, closeBy: string | undefined, now: string, timeZone?: string, producedBy?: ProducedBy): Promise<Outcome> {
  const c = loadCaseFile(file, new Set(base.causes.map((x) => x.id)));
  if (!c.ok) return bad(c.issues);
  const { job: parsed, raw } = c.value;
  const d = await diagnose(parsed, base, buildEngine(base));
  const text = jobReport({ job: parsed, raw, diagnosis: d, safety: base.safety, generatedAt: now, ...(timeZone ? { timeZone } : {}), ...(producedBy ? { producedBy } : {}) });
  if (closeBy === undefined) return { code: 0, out: text };
  if (closeBy.trim() === '') return bad([{ code: 'invalid', file, path: 'job.closedBy', message: 'name who closes the job: --close NAME' }]);
  try {
    replaceFile(file, stableJson({ ...raw, job: { ...raw.job, closedBy: closeBy, closedAt: now } }, caseSchema));
  } catch (e) {
    return bad([{ code: 'unwritable', file, path: '', message: `could not mark the job closed: ${writeProblem(e)}; the file is as it was` }]);
  }
  return { code: 0, out: `${text}\nClosed by ${closeBy} at ${clockTime(now, timeZone)}; written to ${file}.` };
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
  if (asJson) return { code: 0, out: json({ format: JSON_FORMATS.ruleDraft, file: written, draft: draft.file, conditions: draft.conditions, rankChanges: changes, flagged: dropped.map((c) => c.id) }) };
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

/** `shownPath` turns a file into what output shows (never the install's absolute path). */
export async function checkRules(rulesDir: string, casesDir: string, asJson: boolean, shownPath: (file: string) => string = (f) => f): Promise<Outcome> {
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
  report = { ...report, findings: report.findings.map((f) => ({ ...f, file: shownPath(f.file) })), ...(report.cases ? { cases: { ...report.cases, cases: report.cases.cases.map((c) => ({ ...c, file: shownPath(c.file) })), skipped: report.cases.skipped.map((x) => ({ ...x, file: shownPath(x.file) })) } } : {}) };
  const err = report.findings.map((f) => `${f.file}: ${f.about ? `${f.about}: ` : ''}${f.message}`).join('\n');
  const text = asJson ? json({ format: JSON_FORMATS.ruleCheck, ...report }) : report.clean ? 'Rule folder clean: every check passed and every recorded case ranks in its top 3.' : '';
  return { code: report.clean ? 0 : 1, ...(text ? { out: text } : {}), ...(err ? { err } : {}) };
}

export async function adoptDraft(draftPath: string, rulesDir: string, casesDir: string, base: RuleBase, force: boolean): Promise<Outcome> {
  const d = readValidated(draftPath, draftFile);
  if (!d.ok) return bad(d.issues);
  const draft: DraftFile = d.value;
  const unwritten = placeholderTexts(draft.causes ?? [], draft.checks ?? []);
  if (unwritten.length) {
    return {
      code: 1,
      err: [`Not adopted: ${draftPath} still has the draft's placeholder text, which would reach fitters:`, ...unwritten.map((p) => `  ${p.path} (${p.about}): ${JSON.stringify(p.text)}`), 'Write the real words in the draft, then adopt it.'].join('\n'),
    };
  }
  const target = join(rulesDir, basename(draftPath));
  const merged = withDraft(base, draft, target);
  const cross = crossCheck(merged);
  if (cross.length) return bad(cross);
  const files = caseFiles(casesDir);
  const before = await checkCases(files, base);
  const after = await checkCases(files, merged);
  if (!before.ok) return bad(before.issues);
  if (!after.ok) return bad(after.issues);
  const moved = rankChanges(before.value, after.value).filter((c) => c.before !== c.after);
  const dropped = moved.filter((c) => c.droppedOut);
  const broke = dropped.map((c) => `  ${c.id} (${c.expected}): rank ${c.before} → ${c.after || 'absent'}`);
  // Every case whose confirmed cause moves, up or down, not only those that leave the top 3.
  const changeLines = moved.length
    ? ['Rank changes (confirmed cause, before → after):', ...moved.map((c) => `  ${c.droppedOut ? 'OUT ' : '    '}${c.id} (${c.expected}): ${c.before || 'absent'} → ${c.after || 'absent'}`)]
    : ['No recorded case changes rank.'];
  if (dropped.length && !force) return { code: 1, err: [`Not adopted: ${dropped.length} recorded case(s) would leave the top 3:`, ...broke, ...changeLines, 'Review the draft, or adopt with --force.'].join('\n') };
  // Catalogue changes are written completely before anything is published, and the draft is
  // removed only once every file is in place: a failure leaves the folder and the draft as they were.
  const { causes, checks, ...rules } = draft;
  const staged: Staged[] = [];
  let ruleWritten: string | undefined;
  try {
    // checks.json first: a cause names its checks, so new checks may stand before the causes that use them.
    if (checks?.length) staged.push(stageFile(join(rulesDir, 'checks.json'), stableJson({ checks: [...base.checks, ...checks], ...(base.retiredChecks ? { retired: base.retiredChecks } : {}) }, checksFile)));
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
  const lines = [`Adopted ${basename(draftPath)} into ${rulesDir}.`, ...changeLines];
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
