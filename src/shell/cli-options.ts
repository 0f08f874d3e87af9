/**
 * The command line: each command with the options and file arguments it takes, read into what
 * to run. Shared by the launcher (to answer --help and --version, and to pick the build) and
 * the shell. Pure: a bad command line is a message, never an exit.
 */
import { parseArgs } from 'node:util';
import { nearWords } from '../dialogue/edit-distance.js';

export const CLI_OPTIONS = {
  help: { type: 'boolean', short: 'h' },
  version: { type: 'boolean', short: 'v' },
  json: { type: 'boolean' },
  rules: { type: 'string' },
  cases: { type: 'string' },
  adaptive: { type: 'boolean' },
  machine: { type: 'string' },
  session: { type: 'string' },
  'from-case': { type: 'string' },
  force: { type: 'boolean' },
  report: { type: 'string' },
  'no-chart': { type: 'boolean' },
  role: { type: 'string' },
  close: { type: 'string' },
} as const;

export type OptionName = keyof typeof CLI_OPTIONS;

/** What each option says in help, with the word for its value. */
export const OPTION_HELP: Record<Exclude<OptionName, 'help' | 'version'>, { value?: string; says: string }> = {
  rules: { value: 'DIR', says: 'use this rule folder instead of the built-in one' },
  cases: { value: 'DIR', says: 'the recorded cases to read or write' },
  json: { says: 'machine-readable output on stdout (see docs/json-output.md)' },
  adaptive: { says: 'ask the file only what the dialogue would ask' },
  machine: { value: 'FILE', says: 'take the machine from this file (a machine or a case file)' },
  session: { value: 'FILE', says: 'keep the session here' },
  role: { value: 'ROLE', says: 'fitter, apprentice (checks beyond looking need a supervisor) or lead' },
  report: { value: 'FILE', says: 'write the job report: Markdown, HTML for FILE.html, - for Markdown on stdout' },
  'no-chart': { says: 'leave out the speed–current chart' },
  'from-case': { value: 'FILE', says: 'the recorded case to draft the rule from' },
  force: { says: 'rules adopt: adopt even if a recorded case leaves its top 3; diagnose: replace an existing report file' },
  close: { value: 'NAME', says: 'mark the job closed by NAME (written back to FILE)' },
};

export interface CommandSpec {
  /** "expect", "cases check"; "" is the dialogue itself. */
  name: string;
  /** The file arguments as help shows them: "FILE", "[DIR]". */
  args: string;
  minArgs: number;
  maxArgs: number;
  options: readonly Exclude<OptionName, 'help' | 'version'>[];
  says: string;
}

export const COMMANDS: readonly CommandSpec[] = [
  { name: '', args: '', minArgs: 0, maxArgs: 0, options: ['rules', 'cases', 'machine', 'session', 'role', 'report'], says: 'the guided dialogue (needs a terminal)' },
  { name: 'resume', args: '', minArgs: 0, maxArgs: 0, options: ['rules', 'cases', 'session', 'role', 'report'], says: 'pick up an interrupted dialogue' },
  { name: 'expect', args: 'FILE', minArgs: 1, maxArgs: 1, options: ['json', 'rules', 'no-chart'], says: 'what a healthy machine would read, against the readings' },
  { name: 'diagnose', args: 'FILE', minArgs: 1, maxArgs: 1, options: ['json', 'rules', 'cases', 'adaptive', 'report', 'force', 'no-chart'], says: 'ranked causes, ordered checks and isolation steps' },
  { name: 'cases check', args: '[DIR]', minArgs: 0, maxArgs: 1, options: ['json', 'rules', 'cases', 'adaptive'], says: 'every recorded case: where its confirmed cause ranks' },
  { name: 'cases add', args: 'FILE', minArgs: 1, maxArgs: 1, options: ['rules', 'cases'], says: 'file a solved job as a recorded case' },
  { name: 'rules draft', args: '--from-case FILE', minArgs: 0, maxArgs: 0, options: ['from-case', 'json', 'rules', 'cases'], says: 'draft a rule from a recorded case' },
  { name: 'rules check', args: '', minArgs: 0, maxArgs: 0, options: ['json', 'rules', 'cases'], says: 'review the rule folder, then run every recorded case' },
  { name: 'rules adopt', args: 'DRAFT', minArgs: 1, maxArgs: 1, options: ['force', 'rules', 'cases'], says: 'move a reviewed draft into the rule folder' },
  { name: 'review', args: 'SAVED', minArgs: 1, maxArgs: 1, options: ['close', 'rules', 'cases'], says: "a lead's review of a saved job: its report on stdout" },
  { name: 'history', args: 'ASSET', minArgs: 1, maxArgs: 1, options: ['json', 'rules', 'cases'], says: "an asset's recorded jobs and its insulation trend" },
  { name: 'help', args: '[COMMAND]', minArgs: 0, maxArgs: 2, options: [], says: "a command's usage and options" },
];

/** What the file arguments mean, for "needs a …" messages. */
const ARG_WORDS: Record<string, string> = { FILE: 'a case file (- reads it from standard input)', SAVED: 'a saved job file (a file, since --close writes to it)', DRAFT: 'a draft file', '[DIR]': 'a cases folder', '[COMMAND]': 'a command' };

/** The commands a first word can start: "cases" → cases check, cases add. */
const GROUPS = [...new Set(COMMANDS.map((c) => c.name.split(' ')[0]!).filter(Boolean))];

export type CommandLine =
  | { kind: 'help'; commands: readonly CommandSpec[] }
  | { kind: 'version' }
  | { kind: 'run'; command: string; args: string[]; opts: Options }
  /** `command` is the one the line was for, when that much was clear. */
  | { kind: 'usage-error'; message: string; command?: string };

/** The parsed option values, typed from CLI_OPTIONS. */
export type Options = ReturnType<typeof parseAll>['values'];

function parseAll(argv: string[]) {
  return parseArgs({ args: argv, allowPositionals: true, options: CLI_OPTIONS });
}

const usageError = (message: string, command?: string): CommandLine => ({ kind: 'usage-error', message, ...(command ? { command } : {}) });
const didYouMean = (typed: string, words: readonly string[]) => {
  const near = nearWords(typed, words);
  return near.length ? ` (did you mean ${near.map((w) => `"${w}"`).join(' or ')}?)` : '';
};
const optionList = (spec: CommandSpec) => (spec.options.length ? spec.options.map((o) => `--${o}`).join(', ') : 'no options');

/** The commands named by these words: one command, or the group "cases"; undefined if none. */
function commandsNamed(words: readonly string[]): readonly CommandSpec[] | string {
  const [first, second] = words;
  if (first === undefined) return COMMANDS.filter((c) => c.name === '');
  if (!GROUPS.includes(first)) return `unknown command "${first}"${didYouMean(first, GROUPS)}`;
  const group = COMMANDS.filter((c) => c.name.split(' ')[0] === first);
  if (group.length === 1 || second === undefined) return group;
  const subs = group.map((c) => c.name.split(' ')[1]!);
  return subs.includes(second) ? group.filter((c) => c.name === `${first} ${second}`) : `${first} ${second} is not a command: ${first} takes ${subs.join(', ')}${didYouMean(second, subs)}`;
}

/**
 * Reads a command line. Every command takes only its own options and file arguments: anything
 * else is a usage error that says what it does take.
 * @example readCommandLine(['expect', 'job.json', '--report', 'x.md'])
 * // { kind: 'usage-error', message: 'expect does not take --report (it takes --json, --rules, --no-chart)' }
 */
export function readCommandLine(argv: string[]): CommandLine {
  let parsed;
  try {
    parsed = parseAll(argv);
  } catch (e) {
    return usageError(optionProblem(e as NodeJS.ErrnoException));
  }
  const { values, positionals } = parsed;
  if (values.version && !values.help) return { kind: 'version' };
  const first = positionals[0];
  if (first === 'help') {
    const named = commandsNamed(positionals.slice(1));
    if (typeof named === 'string') return usageError(named);
    return { kind: 'help', commands: positionals.length > 1 ? named : COMMANDS };
  }
  const named = commandsNamed(positionals);
  if (typeof named === 'string') return usageError(named);
  if (values.help) return { kind: 'help', commands: positionals.length ? named : COMMANDS };
  if (named.length > 1) return usageError(`${first} takes a subcommand: ${named.map((c) => `dctriage ${c.name} ${c.args}`.trim()).join(' | ')}`);
  const spec = named[0]!;
  const args = positionals.slice(spec.name ? spec.name.split(' ').length : 0);
  const label = spec.name || 'the dialogue';
  for (const key of Object.keys(values) as OptionName[]) {
    if (key === 'help' || key === 'version') continue;
    if (!(spec.options as readonly string[]).includes(key)) return usageError(`${label} does not take --${key} (it takes ${optionList(spec)})`, spec.name);
  }
  if (args.length > spec.maxArgs) {
    const extra = args.slice(spec.maxArgs).map((a) => `"${a}"`).join(', ');
    const which = args.length - spec.maxArgs > 1 ? 'are' : 'is';
    return usageError(spec.maxArgs === 0 ? `${label} takes no file arguments; ${extra} ${which} extra` : `${label} takes one ${spec.args.replace(/[[\]]/g, '')}; ${extra} ${which} extra`, spec.name);
  }
  if (args.length < spec.minArgs) return usageError(`${label} needs ${ARG_WORDS[spec.args] ?? spec.args}: dctriage ${spec.name} ${spec.args}`, spec.name);
  if (spec.name === 'rules draft' && values['from-case'] === undefined) return usageError('rules draft needs --from-case FILE', spec.name);
  return { kind: 'run', command: spec.name, args, opts: values };
}

/** Node's message for a bad option, in a line of our own. */
function optionProblem(e: NodeJS.ErrnoException): string {
  const unknown = e.code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION' ? /Unknown option '([^']*)'/.exec(e.message) : null;
  if (!unknown) return e.message;
  const typed = unknown[1]!;
  const near = typed.startsWith('--') ? nearWords(typed.slice(2), Object.keys(CLI_OPTIONS)).map((o) => `--${o}`) : [];
  return `unknown option ${typed}${near.length ? ` (did you mean ${near.join(' or ')}?)` : ''}`;
}
