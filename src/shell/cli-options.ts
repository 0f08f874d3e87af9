/** The command line's options, shared by the launcher (to pick the build) and the shell. */
import { parseArgs } from 'node:util';

export const CLI_OPTIONS = {
  help: { type: 'boolean', short: 'h' },
  version: { type: 'boolean', short: 'V' },
  json: { type: 'boolean' },
  rules: { type: 'string' },
  adaptive: { type: 'boolean' },
  machine: { type: 'string' },
  session: { type: 'string' },
  cases: { type: 'string' },
  'from-case': { type: 'string' },
  force: { type: 'boolean' },
  report: { type: 'string' },
  'no-chart': { type: 'boolean' },
  role: { type: 'string' },
  close: { type: 'string' },
} as const;

/** Throws a TypeError naming the bad option, as node's parseArgs does. */
export function parseCommandLine(argv: string[]) {
  return parseArgs({ args: argv, allowPositionals: true, options: CLI_OPTIONS });
}

/** Whether these arguments open the dialogue (no command, or resume); bad arguments do not. */
export function opensDialogue(argv: string[]): boolean {
  try {
    const { values, positionals } = parseCommandLine(argv);
    return !values.help && !values.version && (positionals[0] === undefined || positionals[0] === 'resume');
  } catch {
    return false;
  }
}
