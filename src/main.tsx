/**
 * The shell: arguments, files, output and exit codes. Everything it calls is pure or returns
 * coded issues; only this file prints or exits.
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { computeExpectations } from './model/expected.js';
import { loadCaseFile, modelInput } from './knowledge/load-case.js';
import { loadRuleBase, type RuleBase } from './knowledge/load-rules.js';
import { readRuleSeal, type RuleSeal } from './knowledge/rule-seal.js';
import { exitCodeOf, formatIssues, ok, type Issue, type Result } from './knowledge/result.js';
import { readJson, readValidated, validate } from './knowledge/read-json.js';
import { caseSchema, machineSchema } from './knowledge/case-schema.js';
import { safetyFile } from './knowledge/rulebase-schema.js';
import { diagnose } from './engine/diagnose.js';
import { buildEngine, RuleCycleError } from './engine/run-rules.js';
import { checkCases, type CaseRunner } from './engine/check-cases.js';
import { buildFlow, type Flow } from './dialogue/flow.js';
import { replayCase } from './dialogue/replay.js';
import { jobFromAnswers, parseDraft } from './dialogue/job.js';
import { oneLine } from './units/quote.js';
import { visible } from './knowledge/visible-text.js';
import { outcomeOf } from './dialogue/outcome.js';
import { ROLES, type Role } from './dialogue/work.js';
import type { DialogueState } from './dialogue/reducer.js';
import { defaultSessionFile, keepAside, openSession, restoreSession, writeSession, type Restored, type Session } from './shell/session.js';
import { WriteFailed, writeNewFile, writeProblem } from './shell/safe-write.js';
import { fileCase } from './shell/file-case.js';
import { ReportRefused, writeReport, type ReportTarget } from './shell/write-report.js';
import { chartText } from './shell/chart-text.js';
import { readSettings, resolveKnowledge } from './shell/settings.js';
import { formatExpectation } from './shell/format-expect.js';
import { formatDiagnosis } from './shell/format-diagnosis.js';
import { caseCheckPrinter } from './shell/stream-case-check.js';
import { caseCheckWorkerJob, checkCasesInParallel, runCaseCheckWorker } from './shell/parallel-case-check.js';
import { USAGE } from './shell/help.js';
import { addCase, adoptDraft, checkRules, draftRule, reviewJob, type Outcome } from './shell/lead-commands.js';
import { parseCommandLine } from './shell/cli-options.js';
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

class UsageError extends Error {}

function fail(issues: Issue[]): number {
  process.stderr.write(formatIssues(issues) + '\n');
  return exitCodeOf(issues);
}

function out(text: string): void {
  process.stdout.write(text.endsWith('\n') ? text : text + '\n');
}

async function main(argv: string[]): Promise<number> {
  let parsed;
  try {
    parsed = parseCommandLine(argv);
  } catch (e) {
    throw new UsageError(optionProblem(e as NodeJS.ErrnoException));
  }
  const { values: opts, positionals } = parsed;
  if (opts.help) return out(USAGE), 0;
  if (opts.version) return out(typeof DCTRIAGE_VERSION === 'string' ? DCTRIAGE_VERSION : 'dev'), 0;
  const [command, ...rest] = positionals;
  switch (command) {
    case 'expect': {
      const loaded = loadJob(rest[0], 'expect', opts);
      if (!loaded.ok) return fail(loaded.issues);
      const { job } = loaded.value;
      const e = computeExpectations(modelInput(job));
      if (opts.json) out(JSON.stringify({ quantities: e.quantities, missing: e.missing, assumptions: e.assumptions, findings: e.findings }, null, 2));
      else {
        const chart = opts['no-chart'] ? undefined : chartText(modelInput(job), terminalWidth(), useColor());
        out(formatExpectation(e, terminalWidth()) + (chart ? `\n\n${chart}` : ''));
      }
      return 0;
    }
    case 'diagnose': {
      const loaded = loadJob(rest[0], 'diagnose', opts);
      if (!loaded.ok) return fail(loaded.issues);
      const { base, job, raw } = loaded.value;
      const engine = buildEngine(base);
      const replay = opts.adaptive ? await replayCase(raw, buildFlow(base), engine) : undefined;
      const d = replay?.diagnosis ?? (await diagnose(job, base, engine));
      if (opts.json) {
        out(JSON.stringify({
          ...(replay ? { questionsAsked: replay.questionsAsked } : {}),
          warnings: d.warnings,
          causes: d.causes.map(({ id, title, score, evidence }) => ({ id, title, score, evidence: evidence.map(({ rule, says }) => ({ rule, says })) })),
          checks: d.checks.map(({ id, title, state, causes, minutes }) => ({ id, title, state, causes, minutes })),
          isolation: d.isolation,
          quantities: d.expectation.quantities,
        }, null, 2));
      } else {
        if (replay) out(`Asked ${replay.questionsAsked.length} questions (${replay.questionsAsked.join(', ') || 'none'}); stopped: ${replay.stoppedBecause}.\n`);
        out(formatDiagnosis(d, { width: terminalWidth(), chart: opts['no-chart'] ? undefined : chartText(modelInput(job), terminalWidth(), useColor()) }));
      }
      if (opts.report !== undefined) {
        try {
          const where = await writeReport(opts.report, { job, raw: raw as Record<string, unknown>, diagnosis: d, safety: base.safety, generatedAt: new Date().toISOString(), timeZone: localTimeZone() }, process.cwd(), { force: opts.force, inputs: [rest[0]] });
          process.stderr.write(`Job report written to ${where}\n`);
        } catch (e) {
          return fail([reportIssue(opts.report, e)]);
        }
      }
      return 0;
    }
    case 'cases':
      if (rest[0] === 'add') {
        if (!rest[1]) throw new UsageError('cases add needs a case file: dctriage cases add FILE');
        const k = knowledge(opts, false);
        if (!k.ok) return fail(k.issues);
        const base = loadRules(k.value.rules);
        if (!base.ok) return fail(base.issues);
        return print(addCase(rest[1], k.value.cases, base.value, new Date().toISOString().slice(0, 10)));
      }
      if (rest[0] !== 'check') throw new UsageError('cases takes a subcommand: dctriage cases check [DIR] | dctriage cases add FILE');
      return casesCheck(rest[1], opts);
    case 'rules': {
      if (!['check', 'draft', 'adopt'].includes(rest[0] ?? '')) throw new UsageError('rules takes a subcommand: check, draft --from-case FILE, adopt DRAFT');
      const k = knowledge(opts, rest[0] === 'check');
      if (!k.ok) return fail(k.issues);
      if (rest[0] === 'check') return print(await checkRules(k.value.rules, k.value.cases, !!opts.json));
      const base = loadRules(k.value.rules);
      if (!base.ok) return fail(base.issues);
      if (rest[0] === 'draft') {
        if (!opts['from-case']) throw new UsageError('rules draft needs --from-case FILE');
        return print(await draftRule(opts['from-case'], k.value.rules, k.value.cases, base.value, !!opts.json));
      }
      if (rest[0] === 'adopt') {
        if (!rest[1]) throw new UsageError('rules adopt needs a draft file: dctriage rules adopt DRAFT');
        return print(await adoptDraft(rest[1], k.value.rules, k.value.cases, base.value, !!opts.force));
      }
      throw new UsageError(`rules ${rest[0]} is not a subcommand`);
    }
    case 'review': {
      if (!rest[0]) throw new UsageError('review needs a saved job: dctriage review FILE [--close NAME]');
      const k = knowledge(opts, true);
      if (!k.ok) return fail(k.issues);
      const base = loadRules(k.value.rules);
      if (!base.ok) return fail(base.issues);
      return print(await reviewJob(rest[0], base.value, opts.close, new Date().toISOString(), localTimeZone()));
    }
    case undefined:
    case 'resume':
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
  const printer = caseCheckPrinter(opts.json ? 'json' : 'text', (text) => process.stdout.write(text), process.stderr.isTTY ? (text) => process.stderr.write(text) : undefined);
  const report = runner ? await checkCases(files, base.value, runner, printer.stream) : await checkCasesInParallel(files, base.value, k.value.rules, printer.stream);
  const someOut = printer.end(report);
  if (!report.ok) return fail(report.issues);
  return someOut ? 1 : 0;
}

/** A job file with the rule base in use: a recorded cause must be one of its catalogue. */
function loadJob(file: string | undefined, command: string, opts: { rules?: string | undefined; cases?: string | undefined }) {
  if (!file) throw new UsageError(`${command} needs a case file: dctriage ${command} FILE`);
  const k = knowledge(opts, true);
  if (!k.ok) return k;
  const base = loadRules(k.value.rules);
  if (!base.ok) return base;
  const loaded = loadCaseFile(file, causeIdsOf(base.value));
  if (!loaded.ok) return loaded;
  return ok({ base: base.value, job: loaded.value.job, raw: loaded.value.raw });
}

/** Where the rules and cases are; reading commands fall back to the built-in folders. */
function knowledge(opts: { rules?: string | undefined; cases?: string | undefined }, reading: boolean) {
  return resolveKnowledge(opts, process.env, process.cwd(), reading ? { rules: install.rules, cases: install.cases } : undefined);
}

function print(o: Outcome): number {
  if (o.out) out(o.out);
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
  const color = !process.env.NO_COLOR;
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
        ctx: { flow, machineFile, work: { role: role as Role, apprenticesMayTestLive: settings.value.apprenticesMayTestLive ?? true } },
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
        onSave: (answers, outcome) => saveJob({ ...jobFromAnswers(answers, machineFile), ...(outcome.length ? { outcome: outcomeOf(outcome, today()) } : {}) }),
        onReport: (state) => reportFromDialogue(state, flow, machineFile, opts.report, role as Role, { force: opts.force, inputs: [sessionFile, opts.machine], ours: reportsWritten }),
        onRecord: (answers, outcome) => recordJob({ ...jobFromAnswers(answers, machineFile), outcome: outcomeOf(outcome, today()) }, base.value, opts),
      },
    };
  };
  const ask = existing ? `A job is kept in the session ${sessionFile} (${existing.answers.length} answers, saved ${existing.savedAt}). Type resume to go on with it, or new to start a new job (the earlier one is kept aside).` : undefined;
  const { runDialogue } = await install.loadScreens();
  const ended = await runDialogue({ notice: visible(safety.value.notice), color, prepare, ...(ask ? { ask } : {}) });
  if (ended.message) process.stderr.write(ended.message + '\n');
  return ended.code;
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
  const stem = `dctriage-job-${new Date().toISOString().slice(0, 10)}`;
  try {
    const w = writeNewFile(process.cwd(), stem, '.json', JSON.stringify(draft, null, 2) + '\n');
    return `Saved the job as ${w.file}`;
  } catch (e) {
    return `Could not save the job in ${process.cwd()}: ${writeProblem(e)}. The session is still kept; try from a folder you can write to.`;
  }
}

const today = () => new Date().toISOString().slice(0, 10);
/** This machine's time zone (TZ, else the system's), for the times in a report. */
const localTimeZone = () => Intl.DateTimeFormat().resolvedOptions().timeZone;
const terminalWidth = () => process.stdout.columns ?? 80;
/** Colour only on a terminal, and never with NO_COLOR; the chart itself is drawn either way. */
const useColor = () => !process.env.NO_COLOR && process.stdout.isTTY === true;

/** The job report from the dialogue as it stands: the last result shown and the work done since. */
async function reportFromDialogue(state: DialogueState, flow: Flow, machineFile: unknown, path: string | undefined, role: Role, target: ReportTarget): Promise<string> {
  const draft = jobFromAnswers(state.answers, machineFile);
  const parsed = parseDraft(draft);
  const result = [...state.log].reverse().find((e) => e.kind === 'result');
  if (!parsed.ok || !result || result.kind !== 'result') return 'No report yet: the result is not on screen.';
  try {
    const where = await writeReport(path, { job: parsed.job, raw: draft as Record<string, unknown>, diagnosis: result.diagnosis, safety: flow.base.safety, work: state.work, role, generatedAt: new Date().toISOString(), timeZone: localTimeZone() }, process.cwd(), target);
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


/** Why the report was not written: refused (bad input, exit 2) or the write failed (exit 74). */
function reportIssue(file: string, e: unknown): Issue {
  if (e instanceof ReportRefused) return { code: 'invalid', file: e.file, path: '', message: `not writing the report there: it ${e.reason}` };
  return { code: 'unwritable', file: e instanceof WriteFailed ? e.file : file, path: '', message: `could not write the report: ${writeProblem(e)}` };
}

function causeIdsOf(base: RuleBase): Set<string> {
  return new Set(base.causes.map((c) => c.id));
}

/** Node's message for a bad option, in a line of our own. */
function optionProblem(e: NodeJS.ErrnoException): string {
  const unknown = e.code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION' ? /Unknown option '([^']*)'/.exec(e.message) : null;
  return unknown ? `unknown option ${unknown[1]}` : e.message;
}

let watchingStdout = false;
/** Once per process: a reader that stops early (dctriage … | head) is not an error; another write failure is one line. */
function watchStdout(): void {
  if (watchingStdout) return;
  watchingStdout = true;
  process.stdout.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0);
    process.stderr.write(`dctriage: cannot write the output: ${e.message}\n`);
    process.exit(74);
  });
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
      process.stderr.write(`dctriage: ${e.message}\nRun "dctriage --help" for usage.\n`);
      process.exitCode = 2;
    } else {
      process.stderr.write(`dctriage: internal error: ${(e as Error).message}\nPlease report this with the file you gave.\n`);
      process.exitCode = 70;
    }
  }
}
