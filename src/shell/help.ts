/** Usage text and the safety notice: the whole tool's (--help), and each command's (help CMD, CMD --help). */
import { COMMANDS, OPTION_HELP, type CommandSpec } from './cli-options.js';

export const SAFETY_NOTICE = `Safety: dctriage advises; it does not make equipment safe. Before touching conductors,
isolate, lock off and prove dead (test the tester before and after). Live tests are for
qualified persons only. A turning shaft makes a DC machine a generator; drive DC links hold
charge after isolation. Local regulations, site procedures and licensed practice prevail.`;

const synopsis = (c: CommandSpec) => ['dctriage', c.name, c.args].filter(Boolean).join(' ');

const EXIT_CODES = `Exit codes: 0 done, 1 findings (cases check: a case outside its top 3), 2 bad input,
70 internal error, 74 output could not be written; the dialogue also ends with
130 on Ctrl-C, 143 on SIGTERM, 129 when its terminal closes (the session is kept).`;

const FILE_NOTE = 'FILE is a dc-case/1 JSON file (schema: schemas/dc-case-1.schema.json); - reads it from standard input.';

const KNOWLEDGE_NOTE = `Without --rules/--cases, writing commands use DCTRIAGE_KNOWLEDGE, the "knowledge"
folder of ~/.config/dctriage/settings.json, or rules/ and cases/ of a checkout.`;

function columns(rows: [string, string][]): string {
  const w = Math.max(...rows.map(([a]) => a.length));
  return rows.map(([a, b]) => `  ${a.padEnd(w)}  ${b}`).join('\n');
}

export const USAGE = `dctriage - find faults on DC machines, fast and safely

Usage:
${columns([...COMMANDS.filter((c) => c.name !== 'help').map((c): [string, string] => [synopsis(c), c.says]), ['dctriage help COMMAND', "a command's usage and options (or COMMAND --help)"], ['dctriage --help | --version', '']])}

Options (each command takes only its own; see dctriage help COMMAND):
${columns(Object.entries(OPTION_HELP).map(([name, o]): [string, string] => [`--${name}${o.value ? ` ${o.value}` : ''}`, o.says]))}
  -h, --help      this help
  -v, --version   the version

${KNOWLEDGE_NOTE}

${FILE_NOTE}
${EXIT_CODES}

${SAFETY_NOTICE}`;

/** One command's usage and options. */
export function commandHelp(c: CommandSpec): string {
  const options = columns([...c.options.map((name): [string, string] => [`--${name}${OPTION_HELP[name].value ? ` ${OPTION_HELP[name].value}` : ''}`, OPTION_HELP[name].says]), ['-h, --help', 'this help']]);
  const notes = [c.args === 'FILE' ? FILE_NOTE : '', c.options.includes('cases') ? KNOWLEDGE_NOTE : ''].filter(Boolean);
  return [`Usage: ${synopsis(c)}${c.options.length ? ' [options]' : ''}`, '', c.says.charAt(0).toUpperCase() + c.says.slice(1) + '.', '', 'Options:', options, ...(notes.length ? ['', ...notes] : [])].join('\n');
}

/** The help for these commands: the whole usage when all are asked for. */
export function helpFor(commands: readonly CommandSpec[]): string {
  return commands.length === COMMANDS.length ? USAGE : commands.map(commandHelp).join('\n\n');
}
