/** Usage text and the safety notice: the whole tool's (--help), and each command's (help CMD, CMD --help). */
import { COMMANDS, OPTION_HELP, type CommandSpec } from './cli-options.js';
import { wrapText } from './wrap.js';

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

/** A note reflowed to the width. */
const paragraph = (text: string, width: number) => wrapText(text.replace(/\n/g, ' '), width);

/** Two columns; a description too long for the width continues under itself. */
function columns(rows: [string, string][], width: number): string {
  const w = Math.max(...rows.map(([a]) => a.length));
  const room = width - w - 4;
  // Too narrow for two columns: each description goes under its name.
  if (room < 30) return rows.flatMap(([a, b]) => [`  ${a}`, ...(b ? [wrapText(`      ${b}`, width)] : [])]).join('\n');
  const lines = (text: string) => wrapText(text, room).split('\n');
  return rows
    .flatMap(([a, b]) => lines(b).map((part, k) => `  ${(k === 0 ? a : '').padEnd(w)}  ${part}`.trimEnd()))
    .join('\n');
}

/** The whole tool's usage, laid out for `width` columns. */
export const usage = (width = 80) => `${paragraph('dctriage - find faults on DC machines, fast and safely', width)}

Usage:
${columns([...COMMANDS.filter((c) => c.name !== 'help').map((c): [string, string] => [synopsis(c), c.says]), ['dctriage help COMMAND', "a command's usage and options (or COMMAND --help)"], ['dctriage --help | --version', '']], width)}

${wrapText('Options (each command takes only its own; see dctriage help COMMAND):', width)}
${columns(Object.entries(OPTION_HELP).map(([name, o]): [string, string] => [`--${name}${o.value ? ` ${o.value}` : ''}`, o.says]), width)}
  -h, --help      this help
  -v, --version   the version

${paragraph(KNOWLEDGE_NOTE, width)}

${paragraph(FILE_NOTE, width)}
${paragraph(EXIT_CODES, width)}

${paragraph(SAFETY_NOTICE, width)}`;

/** One command's usage and options. */
export function commandHelp(c: CommandSpec, width = 80): string {
  const options = columns([...c.options.map((name): [string, string] => [`--${name}${OPTION_HELP[name].value ? ` ${OPTION_HELP[name].value}` : ''}`, OPTION_HELP[name].says]), ['-h, --help', 'this help']], width);
  const notes = [c.args === 'FILE' ? FILE_NOTE : '', c.options.includes('cases') ? KNOWLEDGE_NOTE : ''].filter(Boolean);
  return [paragraph(`Usage: ${synopsis(c)}${c.options.length ? ' [options]' : ''}`, width), '', paragraph(c.says.charAt(0).toUpperCase() + c.says.slice(1) + '.', width), '', 'Options:', options, ...(notes.length ? ['', ...notes.map((n) => paragraph(n, width))] : [])].join('\n');
}

/** The help for these commands: the whole usage when all are asked for. */
export function helpFor(commands: readonly CommandSpec[], width = 80): string {
  return commands.length === COMMANDS.length ? usage(width) : commands.map((c) => commandHelp(c, width)).join('\n\n');
}
