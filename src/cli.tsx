/**
 * The shell: arguments, files, output and exit codes. Everything it calls is pure or returns
 * coded issues; only this file prints or exits.
 */
import { parseArgs } from 'node:util';
import { computeExpectations } from './model/expected.js';
import { loadCase, modelInput } from './knowledge/load-case.js';
import { formatIssues, type Issue } from './knowledge/result.js';
import { formatExpectation } from './shell/format-expect.js';
import { USAGE } from './shell/help.js';

declare const DCTRIAGE_VERSION: string;

class UsageError extends Error {}

function fail(issues: Issue[]): number {
  process.stderr.write(formatIssues(issues) + '\n');
  return 2;
}

function out(text: string): void {
  process.stdout.write(text.endsWith('\n') ? text : text + '\n');
}

async function main(argv: string[]): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      options: {
        help: { type: 'boolean', short: 'h' },
        version: { type: 'boolean', short: 'V' },
        json: { type: 'boolean' },
        rules: { type: 'string' },
      },
    });
  } catch (e) {
    throw new UsageError((e as Error).message);
  }
  const { values: opts, positionals } = parsed;
  if (opts.help) return out(USAGE), 0;
  if (opts.version) return out(typeof DCTRIAGE_VERSION === 'string' ? DCTRIAGE_VERSION : 'dev'), 0;
  const [command, ...rest] = positionals;
  switch (command) {
    case 'expect': {
      const file = rest[0];
      if (!file) throw new UsageError('expect needs a case file: dctriage expect FILE');
      const c = loadCase(file);
      if (!c.ok) return fail(c.issues);
      const e = computeExpectations(modelInput(c.value));
      out(opts.json ? JSON.stringify({ quantities: e.quantities, missing: e.missing, assumptions: e.assumptions, findings: e.findings }, null, 2) : formatExpectation(e));
      return 0;
    }
    case undefined:
      out(USAGE);
      return 0;
    default:
      throw new UsageError(`unknown command "${command}"`);
  }
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    if (e instanceof UsageError) {
      process.stderr.write(`dctriage: ${e.message}\nRun "dctriage --help" for usage.\n`);
      process.exitCode = 2;
    } else {
      process.stderr.write(`dctriage: internal error: ${(e as Error).message}\nPlease report this with the file you gave.\n`);
      process.exitCode = 70;
    }
  },
);
