import { describe, expect, it } from 'vitest';
import { COMMANDS, readCommandLine } from '../../src/shell/cli-options.js';
import { commandHelp, usage } from '../../src/shell/help.js';

const USAGE = usage(100);

describe('readCommandLine', () => {
  it('reads a command with its file and options', () => {
    expect(readCommandLine(['diagnose', 'job.json', '--json', '--rules', 'r'])).toMatchObject({ kind: 'run', command: 'diagnose', args: ['job.json'], opts: { json: true, rules: 'r' } });
    expect(readCommandLine(['cases', 'check'])).toMatchObject({ kind: 'run', command: 'cases check', args: [] });
    expect(readCommandLine([])).toMatchObject({ kind: 'run', command: '', args: [] });
  });

  it('takes - as a file and as the report path', () => {
    expect(readCommandLine(['diagnose', '-', '--report', '-'])).toMatchObject({ kind: 'run', args: ['-'], opts: { report: '-' } });
  });

  it('refuses an option of another command, and says which ones it takes', () => {
    expect(readCommandLine(['expect', 'j.json', '--force'])).toEqual({ kind: 'usage-error', command: 'expect', message: 'expect does not take --force (it takes --json, --rules, --no-chart)' });
    expect(readCommandLine(['--force'])).toMatchObject({ kind: 'usage-error', message: 'the dialogue does not take --force (it takes --rules, --cases, --machine, --session, --role, --report)' });
  });

  it('refuses extra file arguments', () => {
    expect(readCommandLine(['diagnose', 'a.json', 'b.json', 'c.json'])).toMatchObject({ kind: 'usage-error', message: 'diagnose takes one FILE; "b.json", "c.json" are extra' });
  });

  it('answers help and version before anything else', () => {
    expect(readCommandLine(['diagnose', 'a.json', 'b.json', '--help'])).toMatchObject({ kind: 'help', commands: [{ name: 'diagnose' }] });
    expect(readCommandLine(['-v'])).toEqual({ kind: 'version' });
    expect(readCommandLine(['help'])).toMatchObject({ kind: 'help', commands: COMMANDS });
    expect(readCommandLine(['help', 'rules'])).toMatchObject({ kind: 'help', commands: [{ name: 'rules draft' }, { name: 'rules check' }, { name: 'rules adopt' }] });
  });
});

describe('help text', () => {
  it('lists every command and every option in the whole usage', () => {
    for (const c of COMMANDS.filter((x) => x.name && x.name !== 'help')) expect(USAGE).toContain(`dctriage ${c.name}`);
    for (const o of new Set(COMMANDS.flatMap((c) => c.options))) expect(USAGE).toContain(`--${o}`);
  });

  it("a command's help lists its options and no other", () => {
    const expect_ = COMMANDS.find((c) => c.name === 'expect')!;
    const text = commandHelp(expect_);
    expect(text).toContain('--no-chart');
    expect(text).not.toContain('--adaptive');
  });
});
