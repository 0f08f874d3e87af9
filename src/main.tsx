/**
 * The shell: arguments, files, output and exit codes. Everything it calls is pure or returns
 * coded issues; only this file prints or exits.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import { dirname, isAbsolute, join, relative, resolve } from 'node:path';
import { computeExpectations } from './model/expected.js';
import { caseFromJson, modelInput } from './knowledge/load-case.js';
import { loadRuleBase, type RuleBase } from './knowledge/load-rules.js';
import { readRuleSeal, type RuleSeal } from './knowledge/rule-seal.js';
import { exitCodeOf, failed, formatIssues, ok, type Issue, type Result } from './knowledge/result.js';
import { MAX_FILE_BYTES, parseJsonText, readJson, readValidated, validate } from './knowledge/read-json.js';
import { caseSchema, machineSchema } from './knowledge/case-schema.js';
import { safetyFile } from './knowledge/rulebase-schema.js';
import { diagnose } from './engine/diagnose.js';
import { buildEngine, RuleCycleError } from './engine/run-rules.js';
import { analyseTests } from './engine/series-analyses.js';
import { checkCases, type CaseRunner } from './engine/check-cases.js';
import { buildFlow, type Flow } from './dialogue/flow.js';
import { replayCase } from './dialogue/replay.js';
import { jobFromAnswers, parseDraft } from './dialogue/job.js';
import { oneLine } from './units/quote.js';
import { visible } from './knowledge/visible-text.js';
import { outcomeOf } from './dialogue/outcome.js';
import { ROLES, type Role } from './dialogue/work.js';
import { latestDiagnosis, type DialogueState } from './dialogue/reducer.js';
import { defaultSessionFile, keepAside, openSession, restoreSession, writeSession, type Restored, type Session } from './shell/session.js';
import { WriteFailed, writeNewFile, writeProblem } from './shell/safe-write.js';
import { fileCase } from './shell/file-case.js';
import { ReportRefused, writeReport, type ReportTarget } from './shell/write-report.js';
import { chartText } from './shell/chart-text.js';
import { readSettings, resolveKnowledge } from './shell/settings.js';
import { formatExpectation } from './shell/format-expect.js';
import { formatDiagnosis } from './shell/format-diagnosis.js';
import { formatSeries } from './report/series-text.js';
import { historyOf, readRecordedJobs } from './shell/history.js';
import { formatHistory } from './report/history-text.js';
import { assetHistory, earlierJobsNote, type RecordedJob } from './engine/asset-history.js';
import { caseCheckPrinter } from './shell/stream-case-check.js';
import { caseCheckWorkerJob, checkCasesInParallel, runCaseCheckWorker } from './shell/parallel-case-check.js';
import { terminalFacts } from './launch/off-thread.js';
import { watchStdout } from './launch/watch-stdout.js';
import { helpFor } from './shell/help.js';
import { addCase, adoptDraft, checkRules, draftRule, reviewJob, type Outcome } from './shell/lead-commands.js';
import { readCommandLine } from './shell/cli-options.js';
import { JSON_FORMATS } from './shell/json-formats.js';
import { wantsColor } from './shell/color.js';
import { wrapText } from './shell/wrap.js';
import { localDate } from './report/clock-time.js';
import { jobReport, type ProducedBy } from './report/job-report.js';
import type { Prepared } from './ui/run-dialogue.js';

/** Loads the dialogue's screens (Ink, React): given by the launcher, so this module never imports them. */
export type ScreensLoader = () => Promise<typeof import('./ui/run-dialogue.js')>;

/** What the launcher knows of where it runs from: this module may sit in either build's folder. */
export interface Install {
  /** The built-in rule and case folders. */
  rules: string;
  cases: string;
  /** The build's seal of the built-in rules (see rule-seal.ts); missing when running from source. */
  ruleSeal: string;
  loadScreens: ScreensLoader;
}

/** --machine takes a machine object, or a whole case file whose machine is used; the raw machine is kept as typed. */
function readMachineFile(file: string): Result<unknown> {
  const raw = readJson(file);
  if (!raw.ok) return raw;
  const v = raw.value;
  if (v !== null && typeof v === 'object' && 'format' in v) {
    const c = validate(file, v, caseSchema);
    return c.ok ? ok((v as Record<string, unknown>).machine) : c;
  }
  const m = validate(file, v, machineSchema);
  return m.ok ? ok(v) : m;
}
/** Set by runCli; one process runs one command line. */
let install: Install;
/** The seal, read on first use: null until then, undefined when there is none. */
let ruleSeal: RuleSeal | undefined | null = null;

/** A rule folder, with the files the build proved valid taken as read (see rule-seal.ts). */
function loadRules(dir: string) {
  if (ruleSeal === null) ruleSeal = readRuleSeal(install.ruleSeal);
  return loadRuleBase(dir, { seal: ruleSeal });
}

declare const DCTRIAGE_VERSION: string;

/** A command line that cannot run; `command` names the one it was for, for the help hint. */
class UsageError extends Error {
  constructor(message: string, readonly command?: string) {
    super(message);
  }
}

/** One line per issue, each starting with the program's name as other tools' messages do. */
function fail(issues: Issue[]): number {
  process.stderr.write(withProgramName(formatIssues(issues)) + '\n');
  return exitCodeOf(issues);
}

const withProgramName = (lines: string) => lines.split('\n').map((l) => `dctriage: ${l}`).join('\n');

/** The version the build stamped in; "dev" when running from source. */
const programVersion = () => (typeof DCTRIAGE_VERSION === 'string' ? DCTRIAGE_VERSION : 'dev');

function out(text: string): void {
  process.stdout.write(text.endsWith('\n') ? text : text + '\n');
}

/** Text for people: long lines wrapped to the terminal with a hanging indent. */
const outText = (text: string) => out(wrapText(text, terminalWidth()));

async function main(argv: string[]): Promise<number> {
  const line = readCommandLine(argv);
  if (line.kind === 'usage-error') throw new UsageError(line.message, line.command);
  if (line.kind === 'help') return out(helpFor(line.commands, terminalWidth())), 0;
  if (line.kind === 'version') return out(programVersion()), 0;
  const { command, args, opts } = line;
  switch (command) {
    case 'expect': {
      const loaded = await loadJob(args[0]!, opts);
      if (!loaded.ok) return fail(loaded.issues);
      const { job } = loaded.value;
      const e = computeExpectations(modelInput(job));
      if (opts.json) out(JSON.stringify({ format: JSON_FORMATS.expectation, quantities: e.quantities, missing: e.missing, assumptions: e.assumptions, findings: e.findings, analyses: analyseTests(job) }, null, 2));
      else {
        const chart = opts['no-chart'] ? undefined : chartText(modelInput(job), terminalWidth(), useColor());
        outText(formatExpectation(e, terminalWidth()) + (chart ? `\n\n${chart}` : ''));
        const series = formatSeries(job.tests, analyseTests(job), Math.max(20, terminalWidth() - 10));
        if (series) out(`\n${series}`);
      }
      return 0;
    }
    case 'diagnose': {
      if (opts.report === '-' && opts.json) throw new UsageError('--report - and --json both write to standard output: give --report a file', 'diagnose');
      const loaded = await loadJob(args[0]!, opts);
      if (!loaded.ok) return fail(loaded.issues);
      const { base, job, raw } = loaded.value;
      const engine = buildEngine(base);
      const replay = opts.adaptive ? await replayCase(raw, buildFlow(base), engine) : undefined;
      const d = replay?.diagnosis ?? (await diagnose(job, base, engine));
      const report = { job, raw: raw as Record<string, unknown>, diagnosis: d, safety: base.safety, generatedAt: new Date().toISOString(), timeZone: localTimeZone(), producedBy: producedBy(loaded.value.rulesDir), history: historyForReport(job.job?.asset, opts, base) };
      if (opts.report === '-') return out(jobReport(report)), 0;
      if (opts.json) {
        out(JSON.stringify({
          format: JSON_FORMATS.diagnosis,
          ...(replay ? { questionsAsked: replay.questionsAsked } : {}),
          status: d.status,
          confirmed: d.confirmed,
          next: d.next,
          warnings: d.warnings,
          causes: d.causes.map(({ id, title, score, evidence }) => ({ id, title, score, evidence: evidence.map(({ rule, says }) => ({ rule, says })) })),
          checks: d.checks.map(({ id, title, state, causes, minutes, result }) => ({ id, title, state, causes, minutes, ...(result ? { result } : {}) })),
          withheld: d.withheld.map(({ id, title, because, instead }) => ({ id, title, because, instead })),
          tellApart: d.tellApart.map((s) => ({ reading: s.reading, causes: s.between.map((x) => x.causes) })),
          isolation: d.isolation,
          quantities: d.expectation.quantities,
          analyses: d.analyses,
        }, null, 2));
      } else {
        if (replay) outText(`Asked ${replay.questionsAsked.length} questions (${replay.questionsAsked.join(', ') || 'none'}); stopped: ${replay.stoppedBecause}.\n`);
        outText(formatDiagnosis(d, { width: terminalWidth(), color: useColor(), chart: opts['no-chart'] ? undefined : chartText(modelInput(job), terminalWidth(), useColor()) }));
        const series = formatSeries(job.tests, d.analyses, Math.max(20, terminalWidth() - 10));
        if (series) out(`\nTest series\n\n${series}`);
      }
      if (opts.report !== undefined) {
        try {
          const where = await writeReport(opts.report, report, process.cwd(), { force: opts.force, inputs: [args[0]] });
          process.stderr.write(`Job report written to ${where}\n`);
        } catch (e) {
          return fail([reportIssue(opts.report, e)]);
        }
      }
      return 0;
    }
    case 'cases add': {
      const k = knowledge(opts, false);
      if (!k.ok) return fail(k.issues);
      const base = loadRules(k.value.rules);
      if (!base.ok) return fail(base.issues);
      const job = await readJobJson(args[0]!);
      if (!job.ok) return fail(job.issues);
      return print(addCase(job.value.file, job.value.json, k.value.cases, base.value, today()));
    }
    case 'cases check':
      return casesCheck(args[0], opts);
    case 'rules check':
    case 'rules draft':
    case 'rules adopt': {
      const k = knowledge(opts, command === 'rules check');
      if (!k.ok) return fail(k.issues);
      if (command === 'rules check') return print(await checkRules(k.value.rules, k.value.cases, !!opts.json, shownPath), !opts.json);
      const base = loadRules(k.value.rules);
      if (!base.ok) return fail(base.issues);
      if (command === 'rules draft') return print(await draftRule(opts['from-case']!, k.value.rules, k.value.cases, base.value, !!opts.json), !opts.json);
      return print(await adoptDraft(args[0]!, k.value.rules, k.value.cases, base.value, !!opts.force));
    }
    case 'review': {
      if (args[0] === '-') throw new UsageError('review takes a saved job file, not standard input: --close writes to it', 'review');
      const k = knowledge(opts, true);
      if (!k.ok) return fail(k.issues);
      const base = loadRules(k.value.rules);
      if (!base.ok) return fail(base.issues);
      return print(await reviewJob(args[0]!, base.value, opts.close, new Date().toISOString(), localTimeZone(), producedBy(k.value.rules)), false);
    }
    case 'history': {
            const k = knowledge(opts, true);
      if (!k.ok) return fail(k.issues);
      const base = loadRules(k.value.rules);
      if (!base.ok) return fail(base.issues);
      const h = historyOf(args[0]!, k.value.cases, new Map(base.value.causes.map((c) => [c.id, c.title])));
      if (!h.ok) return fail(h.issues);
      if (h.value.jobs.length === 0) return print({ code: 1, err: `no recorded jobs for asset "${args[0]}" in ${k.value.cases}` });
      out(opts.json ? JSON.stringify({ format: JSON_FORMATS.history, ...h.value }, null, 2) : formatHistory(h.value));
      return 0;
    }
    case '':
    case 'resume':
      if (opts.report === '-') throw new UsageError('the dialogue draws on standard output: give --report a file');
      return dialogue(command === 'resume', opts);
    default:
      throw new UsageError(`unknown command "${command}"`);
  }
}

async function casesCheck(dirArg: string | undefined, opts: { rules?: string | undefined; cases?: string | undefined; json?: boolean | undefined; adaptive?: boolean | undefined }): Promise<number> {
  const k = knowledge(opts, true);
  if (!k.ok) return fail(k.issues);
  const dir = dirArg ?? k.value.cases;
  const base = loadRules(k.value.rules);
  if (!base.ok) return fail(base.issues);
  let files: string[];
  try {
    files = readdirSync(dir).filter((f) => f.endsWith('.json')).sort().map((f) => join(dir, f));
  } catch {
    return fail([{ code: 'unreadable', file: dir, path: '', message: 'cases folder cannot be read' }]);
  }
  let runner: CaseRunner | undefined;
  if (opts.adaptive) {
    const flow = buildFlow(base.value);
    const engine = buildEngine(base.value);
    runner = async (_c, raw) => {
      const r = await replayCase(raw, flow, engine);
      return { ranked: r.diagnosis.causes.map((x) => x.id), questionsAsked: r.questionsAsked };
    };
  }
  // Results as they come, a count on a terminal, and (without --adaptive) every core at work.
  const printer = caseCheckPrinter(opts.json ? 'json' : 'text', (text) => process.stdout.write(text), terminalFacts().stderrIsTTY ? (text) => process.stderr.write(text) : undefined, { format: JSON_FORMATS.caseCheck, width: terminalWidth(), shownPath });
  const report = runner ? await checkCases(files, base.value, runner, printer.stream) : await checkCasesInParallel(files, base.value, k.value.rules, printer.stream);
  const someOut = printer.end(report);
  if (!report.ok) return fail(report.issues);
  return someOut ? 1 : 0;
}

/** A job file (or - for standard input) with the rule base in use: a recorded cause must be one of its catalogue. */
async function loadJob(file: string, opts: { rules?: string | undefined; cases?: string | undefined }) {
  const k = knowledge(opts, true);
  if (!k.ok) return k;
  const base = loadRules(k.value.rules);
  if (!base.ok) return base;
  const read = await readJobJson(file);
  if (!read.ok) return read;
  const loaded = caseFromJson(read.value.file, read.value.json, causeIdsOf(base.value));
  if (!loaded.ok) return loaded;
  return ok({ base: base.value, job: loaded.value.job, raw: loaded.value.raw, rulesDir: k.value.rules });
}

/** What messages call standard input when a job is read from it. */
const STDIN_NAME = '(standard input)';

/** The JSON of a job file, or of standard input for "-", with the name messages give it. */
async function readJobJson(file: string): Promise<Result<{ file: string; json: unknown }>> {
  if (file !== '-') {
    const r = readJson(file);
    return r.ok ? ok({ file, json: r.value }) : r;
  }
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of process.stdin) {
    chunks.push(chunk as Buffer);
    size += (chunk as Buffer).length;
    if (size > MAX_FILE_BYTES) return failed({ code: 'too-large', file: STDIN_NAME, path: '', message: `more than ${MAX_FILE_BYTES} bytes; a job is limited to 1 MiB` });
  }
  const json = parseJsonText(STDIN_NAME, Buffer.concat(chunks).toString('utf8'));
  return json.ok ? ok({ file: STDIN_NAME, json: json.value }) : json;
}

/**
 * A path for output: relative to the working folder when it is under it, relative to the
 * install's folder for the built-in rules and cases (output never shows where the tool is
 * installed), else as given.
 */
function shownPath(file: string): string {
  const under = (root: string) => {
    const r = relative(root, resolve(file));
    return r && !r.startsWith('..') && !isAbsolute(r) ? r : undefined;
  };
  return under(process.cwd()) ?? under(dirname(resolve(install.rules))) ?? file;
}

/** Which tool and which rules produced a result: for the report's footer. */
function producedBy(rulesDir: string): ProducedBy {
  const builtIn = resolve(rulesDir) === resolve(install.rules);
  return { version: programVersion(), rules: builtIn ? 'built-in rules' : shownPath(rulesDir), ...(builtIn ? {} : gitRevision(rulesDir)) };
}

/** The commit a rule folder is at, when it sits in a git repository (with git installed). */
function gitRevision(dir: string): { revision?: string } {
  const r = spawnSync('git', ['-C', dir, 'log', '-1', '--format=%h %cs'], { encoding: 'utf8', timeout: 3000, stdio: ['ignore', 'pipe', 'ignore'] });
  const rev = r.status === 0 ? r.stdout.trim() : '';
  if (!rev) return {};
  const dirty = spawnSync('git', ['-C', dir, 'status', '--porcelain', '--', '.'], { encoding: 'utf8', timeout: 3000, stdio: ['ignore', 'pipe', 'ignore'] });
  return { revision: dirty.status === 0 && dirty.stdout.trim() ? `${rev}, with uncommitted changes` : rev };
}

/** Where the rules and cases are; reading commands fall back to the built-in folders. */
function knowledge(opts: { rules?: string | undefined; cases?: string | undefined }, reading: boolean) {
  return resolveKnowledge(opts, process.env, process.cwd(), reading ? { rules: install.rules, cases: install.cases } : undefined);
}

/** A lead command's outcome; `asText` wraps its output to the terminal (a report stays as written). */
function print(o: Outcome, asText = true): number {
  if (o.out) (asText ? outText : out)(o.out);
  if (o.err) process.stderr.write(o.err.endsWith('\n') ? o.err : o.err + '\n');
  return o.code;
}

/** The interactive dialogue; Ink is loaded only here. */
async function dialogue(
  resume: boolean,
  opts: { rules?: string | undefined; cases?: string | undefined; machine?: string | undefined; session?: string | undefined; report?: string | undefined; role?: string | undefined; force?: boolean | undefined },
): Promise<number> {
  if (!process.stdin.isTTY || !process.stdout.isTTY) {
    process.stderr.write('dctriage: the dialogue needs a terminal. For a job in a file, run: dctriage diagnose FILE\n');
    return 2;
  }
  const sessionFile = opts.session ?? defaultSessionFile();
  // Before the first question: the session can be written, and no other dialogue holds it.
  const opened = openSession(sessionFile, resume);
  if (!opened.ok) return fail(opened.issues);
  const { lock, existing } = opened.value;
  process.once('exit', () => lock.release());
  try {
    return await runSession(sessionFile, opened.value.saved, existing, opened.value.notes, opts);
  } finally {
    lock.release();
  }
}

async function runSession(sessionFile: string, resumed: Session | undefined, existing: Session | undefined, notes: string[], opts: Parameters<typeof dialogue>[1]): Promise<number> {
  let saved = resumed;
  let rulesDir = opts.rules ?? saved?.rules ?? install.rules;
  let machineFile: unknown = saved?.machineFile;
  if (!saved && opts.machine) {
    const m = readMachineFile(opts.machine);
    if (!m.ok) return fail(m.issues);
    machineFile = m.value;
  }
  const settings = readSettings(process.env);
  if (!settings.ok) return fail(settings.issues);
  const role = opts.role ?? settings.value.role ?? 'fitter';
  if (!(ROLES as readonly string[]).includes(role)) throw new UsageError(`--role takes ${ROLES.join(', ')}, not "${role}"`);
  // The notice is all the first frame needs; the rest of the rule base loads behind it.
  const safety = readValidated(join(rulesDir, 'safety.json'), safetyFile);
  if (!safety.ok) return fail(safety.issues);
  for (const n of notes) process.stderr.write(oneLine(n, 800) + '\n');
  const color = useColor();
  const reportsWritten = new Set<string>();
  const prepare = (choice?: 'resume' | 'new'): Prepared => {
    let note: string | undefined;
    if (existing && choice === 'resume') {
      saved = existing;
      rulesDir = opts.rules ?? existing.rules;
      machineFile = existing.machineFile;
    } else if (existing && choice === 'new') {
      try {
        note = `The earlier session is kept as ${keepAside(sessionFile, 'kept')}; a new job starts.`;
      } catch (e) {
        return { ok: false, message: `${sessionFile}: the earlier session could not be kept aside (${writeProblem(e)}), so it was left as it was; move it away, or start with --session FILE` };
      }
    }
    const base = loadRules(rulesDir);
    if (!base.ok) return { ok: false, message: formatIssues(base.issues) };
    const flow = buildFlow(base.value);
    let restored: Restored = { answers: [], progress: {} };
    if (saved) {
      const r = restoreSession(sessionFile, saved, flow);
      if (!r.ok) return { ok: false, message: `${formatIssues(r.issues)}\n${sessionFile}: ${keptAsideSaying(sessionFile)}` };
      restored = r.value;
    }
    return {
      ok: true,
      ...(note ? { note } : {}),
      props: {
        ctx: { flow, machineFile, work: { role: role as Role, apprenticesMayTestLive: settings.value.apprenticesMayTestLive ?? true, remoteAuthorisationAllowed: settings.value.remoteAuthorisationAllowed ?? false }, earlierJobs: earlierJobsFor(opts, base.value) },
        engine: buildEngine(base.value),
        safetyNotice: base.value.safety.notice,
        initialAnswers: restored.answers,
        initialWork: saved?.work ?? [],
        initialProgress: restored.progress,
        color,
        chart: (job) => chartText({ machine: job.machine, readings: job.readings }, process.stdout.columns ?? 80, color),
        onAnswers: (answers, work, progress) => {
          try {
            writeSession(sessionFile, { rules: rulesDir, machineFile, answers, work, progress });
            return undefined;
          } catch (e) {
            return `The session could not be saved (${writeProblem(e)}): the last answers are not kept if this stops. Type save once the result is shown.`;
          }
        },
        onSave: (answers, outcome, work) => saveJob({ ...jobFromAnswers(answers, machineFile, work), ...(outcome.length ? { outcome: outcomeOf(outcome, today()) } : {}) }),
        onReport: (state) => reportFromDialogue(state, flow, machineFile, opts.report, role as Role, rulesDir, { force: opts.force, inputs: [sessionFile, opts.machine], ours: reportsWritten }),
        onRecord: (answers, outcome, work) => recordJob({ ...jobFromAnswers(answers, machineFile, work), outcome: outcomeOf(outcome, today()) }, base.value, opts),
      },
    };
  };
  const ask = existing ? `A job is kept in the session ${sessionFile} (${existing.answers.length} answers, saved ${existing.savedAt}). Type resume to go on with it, or new to start a new job (the earlier one is kept aside).` : undefined;
  const { runDialogue } = await install.loadScreens();
  const ended = await runDialogue({ notice: visible(safety.value.notice), color, prepare, ...(ask ? { ask } : {}) });
  if (ended.message) process.stderr.write(withProgramName(ended.message) + '\n');
  if (ended.code !== 0 && ended.code !== 2) process.stderr.write(resumeHint(sessionFile, opts.session !== undefined) + '\n');
  return ended.code;
}

/** Said when the dialogue is interrupted: where the session is, and the command that picks it up. */
function resumeHint(sessionFile: string, named: boolean): string {
  if (!existsSync(sessionFile)) return 'dctriage: stopped before any answer; nothing to resume.';
  const resume = named ? `dctriage resume --session ${JSON.stringify(sessionFile)}` : 'dctriage resume';
  return `dctriage: stopped. The session is kept in ${sessionFile}; to carry on where you were, run: ${resume}`;
}

/** A session whose values are wrong is moved aside; the words say where. */
function keptAsideSaying(file: string): string {
  try {
    return `this session cannot be resumed, so it was kept as ${keepAside(file, 'unreadable')} and nothing in it is lost; run dctriage to start a new job`;
  } catch (e) {
    return `this session cannot be resumed, and could not be kept aside (${writeProblem(e)}): move it away by hand`;
  }
}

/** Writes the job beside the fitter as a dc-case/1 file that never replaces another. */
function saveJob(draft: unknown): string {
  const stem = `dctriage-job-${today()}`;
  try {
    const w = writeNewFile(process.cwd(), stem, '.json', JSON.stringify(draft, null, 2) + '\n');
    return `Saved the job as ${w.file}`;
  } catch (e) {
    return `Could not save the job in ${process.cwd()}: ${writeProblem(e)}. The session is still kept; try from a folder you can write to.`;
  }
}

/** Today where the fitter is: files are named and outcomes dated by it. */
const today = () => localDate();
/** This machine's time zone (TZ, else the system's), for the times in a report. */
const localTimeZone = () => Intl.DateTimeFormat().resolvedOptions().timeZone;
/** The terminal's width; COLUMNS when the output is not a terminal (piped, or in a test). */
const terminalWidth = () => terminalFacts().stdoutColumns || Number(process.env.COLUMNS) || 80;
/** Colour as Node's hasColors() decides (NO_COLOR, FORCE_COLOR, TERM=dumb); the chart itself is drawn either way. */
const useColor = () => wantsColor(process.stdout);

/** The job report from the dialogue as it stands: the last result shown and the work done since. */
async function reportFromDialogue(state: DialogueState, flow: Flow, machineFile: unknown, path: string | undefined, role: Role, rulesDir: string, target: ReportTarget): Promise<string> {
  const draft = jobFromAnswers(state.answers, machineFile, state.work);
  const parsed = parseDraft(draft);
  const result = latestDiagnosis(state);
  if (!parsed.ok || !result) return 'No report yet: the result is not on screen.';
  try {
    const where = await writeReport(path, { job: parsed.job, raw: draft as Record<string, unknown>, diagnosis: result, safety: flow.base.safety, work: state.work, role, generatedAt: new Date().toISOString(), timeZone: localTimeZone(), producedBy: producedBy(rulesDir) }, process.cwd(), target);
    return `Job report written to ${where}`;
  } catch (e) {
    const i = reportIssue(path ?? process.cwd(), e);
    return `Could not write the report: ${i.file}: ${i.message}. The session is kept.`;
  }
}

/** Files the job with its outcome into the cases folder; the words say where, or why not (the session is kept). */
function recordJob(draft: Record<string, unknown>, base: RuleBase, opts: { rules?: string | undefined; cases?: string | undefined }): string {
  const k = knowledge(opts, false);
  if (!k.ok) return `Not recorded: ${formatIssues(k.issues)}. Type save to keep the job in this folder instead.`;
  const parsed = caseSchema.safeParse(draft);
  if (!parsed.success) return `Not recorded: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`;
  const cause = parsed.data.outcome?.cause;
  if (cause && !base.causes.some((c) => c.id === cause)) return `Not recorded: "${cause}" is not a cause of the catalogue in use`;
  const filed = fileCase(draft, parsed.data, k.value.cases, today());
  return filed.ok ? `Recorded the job as ${filed.value.file}` : `Not recorded: ${formatIssues(filed.issues)}. The session is kept; type save to keep the job here instead.`;
}


/** The asset's recorded jobs for a report; none when it has no name or the folder cannot be read. */
function historyForReport(asset: string | undefined, opts: { rules?: string | undefined; cases?: string | undefined }, base: RuleBase) {
  const k = knowledge(opts, true);
  if (!asset || !k.ok) return undefined;
  const h = historyOf(asset, k.value.cases, new Map(base.causes.map((c) => [c.id, c.title])));
  return h.ok ? h.value : undefined;
}

/** Why the report was not written: refused (bad input, exit 2) or the write failed (exit 74). */
function reportIssue(file: string, e: unknown): Issue {
  if (e instanceof ReportRefused) return { code: 'invalid', file: e.file, path: '', message: `not writing the report there: it ${e.reason}` };
  return { code: 'unwritable', file: e instanceof WriteFailed ? e.file : file, path: '', message: `could not write the report: ${writeProblem(e)}` };
}

function causeIdsOf(base: RuleBase): Set<string> {
  return new Set(base.causes.map((c) => c.id));
}

/** The dialogue's line on an asset's earlier jobs, from the cases folder in use, read when first asked; nothing if it cannot be read. */
function earlierJobsFor(opts: { rules?: string | undefined; cases?: string | undefined }, base: RuleBase): (asset: string) => string | undefined {
  let jobs: RecordedJob[] | undefined;
  const titles = new Map(base.causes.map((c) => [c.id, c.title]));
  return (asset) => {
    if (!jobs) {
      const k = knowledge(opts, true);
      const read = k.ok ? readRecordedJobs(k.value.cases) : k;
      jobs = read.ok ? read.value : [];
    }
    return earlierJobsNote(assetHistory(asset, jobs, titles), today());
  };
}

/**
 * Runs one command line and sets the exit code. The launcher (bin.ts) calls this from either
 * build; it loads nothing of the screens unless the dialogue opens.
 */
export async function runCli(argv: string[], from: Install): Promise<void> {
  install = from;
  // A worker thread of cases check (see parallel-case-check.ts) serves batches, nothing else.
  const worker = caseCheckWorkerJob();
  if (worker) return runCaseCheckWorker(worker, loadRules);
  watchStdout();
  try {
    process.exitCode = await main(argv);
  } catch (e) {
    if (e instanceof RuleCycleError) {
      process.stderr.write(`dctriage: ${e.message}\n`);
      process.exitCode = 2;
    } else if (e instanceof UsageError) {
      process.stderr.write(`dctriage: ${e.message}\nRun "dctriage help${e.command ? ` ${e.command}` : ''}" for usage.\n`);
      process.exitCode = 2;
    } else {
      process.stderr.write(`dctriage: internal error: ${(e as Error).message}\nPlease report this with the file you gave.\n`);
      process.exitCode = 70;
    }
  }
}
