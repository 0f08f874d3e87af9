/** The command line as people use it: per-command options, help, version, standard input and output. */
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { CLI, ROOT, installCopy, runCli } from '../support/cli.js';
import { copyOfRules } from '../support/rules.js';

const demo = 'cases/2026-10-14-press-feed-field-weak.json';
const demoText = () => readFileSync(join(ROOT, demo), 'utf8');
const emptyDir = () => mkdtempSync(join(tmpdir(), 'dctriage-cwd-'));

describe('each command takes only its own options and file arguments', () => {
  it('refuses an option the command does not take, naming what it takes, and writes nothing', () => {
    const cwd = emptyDir();
    const r = runCli(['expect', join(ROOT, demo), '--report', 'x.md'], { cwd });
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain('dctriage: expect does not take --report (it takes --json, --rules, --no-chart)');
    expect(r.stderr).toContain('Run "dctriage help expect" for usage.');
    expect(readdirSync(cwd)).toEqual([]);
  });

  it('refuses an extra file argument instead of ignoring it', () => {
    const r = runCli(['diagnose', demo, 'b.json']);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain('diagnose takes one FILE; "b.json" is extra');
  });

  it('refuses file arguments to a command that takes none', () => {
    const r = runCli(['rules', 'check', 'rules']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('rules check takes no file arguments; "rules" is extra');
  });

  it('says what is missing', () => {
    expect(runCli(['expect']).stderr).toContain('expect needs a case file');
    expect(runCli(['rules', 'draft']).stderr).toContain('rules draft needs --from-case FILE');
    expect(runCli(['rules']).stderr).toContain('rules takes a subcommand');
  });

  it('suggests the command or option meant', () => {
    const cmd = runCli(['diagnsoe', demo]);
    expect(cmd.code).toBe(2);
    expect(cmd.stderr).toContain('unknown command "diagnsoe" (did you mean "diagnose"?)');
    expect(runCli(['cases', 'chekc']).stderr).toContain('(did you mean "check"?)');
    expect(runCli(['expect', demo, '--jsno']).stderr).toContain('unknown option --jsno (did you mean --json?)');
    // Nothing close: no suggestion.
    expect(runCli(['frobnicate']).stderr).not.toContain('did you mean');
  });
});

describe('help and version', () => {
  it('help COMMAND and COMMAND --help show that command with its options', () => {
    const a = runCli(['help', 'diagnose']);
    const b = runCli(['diagnose', '--help']);
    expect(a.code).toBe(0);
    expect(a.stdout).toBe(b.stdout);
    expect(a.stdout).toMatch(/^Usage: dctriage diagnose FILE \[options\]/);
    for (const o of ['--json', '--rules DIR', '--adaptive', '--report FILE', '--no-chart']) expect(a.stdout).toContain(o);
    expect(a.stdout).not.toContain('--close');
    expect(runCli(['help', 'rules', 'adopt']).stdout).toMatch(/^Usage: dctriage rules adopt DRAFT \[options\][\s\S]*--force/);
  });

  it('help for a group shows each of its commands', () => {
    const r = runCli(['cases', '--help']);
    expect(r.stdout).toContain('Usage: dctriage cases check [DIR]');
    expect(r.stdout).toContain('Usage: dctriage cases add FILE');
  });

  it('help for an unknown command is a usage error', () => {
    const r = runCli(['help', 'diagnosis']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('(did you mean "diagnose"?)');
  });

  it('-v and --version print the version', async () => {
    const { default: pkg } = await import('../../package.json', { with: { type: 'json' } });
    expect(runCli(['-v']).stdout).toBe(`${pkg.version}\n`);
    expect(runCli(['--version']).stdout).toBe(`${pkg.version}\n`);
  });

  it('--help and --version load only the launcher, not the tool', () => {
    const dir = emptyDir();
    const log = join(dir, 'loaded.txt');
    writeFileSync(join(dir, 'hooks.mjs'), `import { appendFileSync } from 'node:fs';\nexport async function load(url, context, next) { appendFileSync(${JSON.stringify(log)}, url + '\\n'); return next(url, context); }\n`);
    writeFileSync(join(dir, 'register.mjs'), `import { register } from 'node:module';\nregister('./hooks.mjs', import.meta.url);\n`);
    const loaded = (args: string[], cli = CLI) => {
      rmSync(log, { force: true });
      const r = spawnSync(process.execPath, ['--import', join(dir, 'register.mjs'), cli, ...args], { cwd: ROOT, encoding: 'utf8' });
      expect(r.status, r.stderr).toBe(0);
      return readFileSync(log, 'utf8').trim().split('\n').filter((u) => u.startsWith('file:')).map((u) => new URL(u).pathname);
    };
    const holdsTheTool = (files: string[]) => files.some((f) => readFileSync(f, 'utf8').includes('function computeExpectations('));
    for (const args of [['--version'], ['--help'], ['help', 'expect'], ['expect', '--help']]) {
      const files = loaded(args);
      expect(holdsTheTool(files), args.join(' ')).toBe(false);
      expect(files.reduce((n, f) => n + statSync(f).size, 0), args.join(' ')).toBeLessThan(60_000);
    }
    // The control, so the check above can fail: without the CommonJS bundle, a command loads
    // the tool from the ES modules, and the hook sees it.
    const install = installCopy();
    rmSync(join(install, 'dist', 'core.cjs'));
    expect(holdsTheTool(loaded(['expect', demo], join(install, 'dist', 'cli.mjs')))).toBe(true);
  });
});

describe('standard input and output', () => {
  it('- reads the job from standard input', () => {
    const fromFile = runCli(['diagnose', demo, '--json']);
    const fromStdin = runCli(['diagnose', '-', '--json'], { input: demoText() });
    expect(fromStdin.code).toBe(0);
    expect(fromStdin.stdout).toBe(fromFile.stdout);
    expect(runCli(['expect', '-', '--json'], { input: demoText() }).stdout).toBe(runCli(['expect', demo, '--json']).stdout);
  });

  it('a bad job on standard input is refused naming standard input and the field', () => {
    const r = runCli(['expect', '-'], { input: JSON.stringify({ format: 'dc-case/1', machine: { connection: 'shunt' }, readings: { armatureVoltage: '5 A' } }) });
    expect(r.code).toBe(2);
    expect(r.stderr).toBe('dctriage: (standard input): at readings.armatureVoltage: "5 A" is not a voltage (expected a value in V)\n');
    expect(runCli(['expect', '-'], { input: '{' }).stderr).toMatch(/^dctriage: \(standard input\): not valid JSON/);
  });

  it('--report - writes the Markdown report to standard output and no file', () => {
    const cwd = emptyDir();
    const r = runCli(['diagnose', join(ROOT, demo), '--report', '-'], { cwd });
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^# Job report: PF-3 feed roll/);
    expect(r.stdout).not.toContain('Likely causes:\n1.');
    expect(r.stdout).not.toContain('.svg');
    expect(readdirSync(cwd)).toEqual([]);
  });

  it('refuses --report - with --json, both wanting standard output', () => {
    const r = runCli(['diagnose', demo, '--json', '--report', '-']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('both write to standard output');
  });
});

describe('messages and colour', () => {
  it('a message about a file starts with the program name', () => {
    const r = runCli(['expect', 'no-such.json']);
    expect(r.stderr).toBe('dctriage: no-such.json: no such file\n');
  });

  it('colours the chart only when asked: FORCE_COLOR on a pipe, never with FORCE_COLOR=0', () => {
    const esc = '\u001b[';
    const plain = runCli(['expect', demo], { env: { NO_COLOR: '', FORCE_COLOR: '0' } });
    expect(plain.stdout).not.toContain(esc);
    const forced = spawnSync(process.execPath, [CLI, 'expect', demo], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, NO_COLOR: undefined, FORCE_COLOR: '1' } });
    expect(forced.stdout).toContain(esc);
  });
});

describe('dates', () => {
  it('names a filed job by the local date, not the UTC one', () => {
    const cases = emptyDir();
    const job = JSON.parse(demoText());
    delete job.outcome.date;
    delete job.id;
    job.job.asset = 'Förderband 3';
    const file = join(emptyDir(), 'job.json');
    writeFileSync(file, JSON.stringify(job));
    // A fixed clock is not available to a child process; the zone far west of UTC makes the local
    // date differ from the UTC one for half of every day, and must never be ahead of it.
    const r = runCli(['cases', 'add', file, '--cases', cases, '--rules', join(ROOT, 'rules')], { env: { TZ: 'Pacific/Pago_Pago' } });
    expect(r.code, r.stderr).toBe(0);
    const local = new Intl.DateTimeFormat('en-CA', { timeZone: 'Pacific/Pago_Pago', year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date());
    const [name] = readdirSync(cases);
    // The id keeps the letters of the asset's name.
    expect([`${local}-forderband-3.json`]).toContain(name);
  });
});

describe('the report says what produced it', () => {
  it('names the version and the built-in rules, or a rule folder with its git revision', async () => {
    const { default: pkg } = await import('../../package.json', { with: { type: 'json' } });
    expect(runCli(['diagnose', demo, '--report', '-']).stdout).toContain(`Diagnosis by dctriage ${pkg.version} with its built-in rules.`);
    const rules = copyOfRules();
    const git = (...args: string[]) => spawnSync('git', ['-C', rules, ...args], { encoding: 'utf8', env: { ...process.env, GIT_AUTHOR_NAME: 't', GIT_AUTHOR_EMAIL: 't@example.invalid', GIT_COMMITTER_NAME: 't', GIT_COMMITTER_EMAIL: 't@example.invalid' } });
    git('init', '-q');
    git('add', '.');
    git('commit', '-qm', 'rules');
    const rev = git('log', '-1', '--format=%h %cs').stdout.trim();
    expect(rev).toMatch(/^[0-9a-f]{7,} \d{4}-\d{2}-\d{2}$/);
    expect(runCli(['diagnose', demo, '--rules', rules, '--report', '-']).stdout).toContain(`(revision ${rev}).`);
    mkdirSync(join(rules, 'drafts'));
    writeFileSync(join(rules, 'drafts', 'later.json'), '{}');
    expect(runCli(['diagnose', demo, '--rules', rules, '--report', '-']).stdout).toContain(`(revision ${rev}, with uncommitted changes).`);
  });
});
