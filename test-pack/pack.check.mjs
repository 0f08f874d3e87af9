/**
 * npm run test:pack (CI): packs the package as it would be published, installs the tarball into
 * an empty prefix with no network, and runs the installed command from another folder. Checks
 * that the install brings no runtime dependency, ships no devtools chunk and runs no install
 * script, and that the commands work from there.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
const work = mkdtempSync(join(tmpdir(), 'dctriage-pack-'));
let failures = 0;
let passed = 0;
const check = (what, ok, detail = '') => {
  if (ok) passed++;
  else failures++;
  console.log(`${ok ? 'ok  ' : 'FAIL'} ${what}${ok || !detail ? '' : `: ${detail}`}`);
};
const npm = (args, cwd) => execFileSync('npm', args, { cwd, encoding: 'utf8', env: { ...process.env, npm_config_audit: 'false', npm_config_fund: 'false', npm_config_update_notifier: 'false' } });

// Pack (prepack builds), and see what the tarball holds.
const packed = JSON.parse(npm(['pack', '--json', '--pack-destination', work], root))[0];
const files = packed.files.map((f) => f.path);
check('the tarball holds the command, its rules, cases, schemas and the licence', ['dist/cli.mjs', 'dist/core.cjs', 'rules/causes.json', 'schemas/dc-case-1.schema.json', 'LICENSE', 'README.md', 'docs/json-output.md'].every((f) => files.includes(f)), files.join(' '));
// esbuild heads each bundled module with its path: Ink's devtools modules must not be among them.
const shipped = files.filter((f) => f.startsWith('dist/') && f.endsWith('js'));
check('no devtools chunk or code is shipped', !files.some((f) => /devtools/i.test(f)) && !shipped.some((f) => /ink\/build\/devtools|node_modules\/react-devtools-core/.test(readFileSync(join(root, f), 'utf8'))), files.filter((f) => /devtools/i.test(f)).join(' '));
check('no source, test or build script is shipped', !files.some((f) => /^(src|test|test-browser|test-pack|scripts|bench)\//.test(f) || f === 'build.mjs'));

const manifest = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8'));
check('the package can be published: not private, with repository, homepage and bugs', !manifest.private && !!manifest.repository && !!manifest.homepage && !!manifest.bugs);
check('installing runs no script of its own (no install, postinstall or prepare)', !['preinstall', 'install', 'postinstall', 'prepare'].some((s) => manifest.scripts?.[s]));
check('it declares no runtime dependency (the bundle needs none)', Object.keys(manifest.dependencies ?? {}).length === 0, JSON.stringify(manifest.dependencies));

// Install into an empty prefix, offline: with no dependencies there is nothing to fetch.
const prefix = join(work, 'prefix');
npm(['install', '--global', '--offline', '--prefix', prefix, join(work, packed.filename)], work);
const installed = join(prefix, 'lib', 'node_modules');
check('the install holds dctriage and nothing else', readdirSync(installed).join(' ') === 'dctriage', readdirSync(installed).join(' '));
check('the installed package has no node_modules of its own', !existsSync(join(installed, 'dctriage', 'node_modules')));

// Run it from another folder.
const elsewhere = mkdtempSync(join(tmpdir(), 'dctriage-elsewhere-'));
const bin = join(prefix, 'bin', 'dctriage');
const run = (args, input) => spawnSync(bin, args, { cwd: elsewhere, encoding: 'utf8', input: input ?? '', env: { ...process.env, NO_COLOR: '1' } });
check('--version', run(['--version']).stdout.trim() === manifest.version);
check('help diagnose', run(['help', 'diagnose']).stdout.startsWith('Usage: dctriage diagnose FILE'));
const job = readFileSync(join(root, 'cases', '2026-10-14-press-feed-field-weak.json'), 'utf8');
writeFileSync(join(elsewhere, 'job.json'), job);
const d = run(['diagnose', 'job.json', '--json']);
check('diagnose a job in the working folder', d.status === 0 && JSON.parse(d.stdout).causes[0].id === 'field-weak', d.stderr);
check('its JSON shows no path of the install', !d.stdout.includes(prefix));
const fromStdin = run(['expect', '-'], job);
check('expect - reads the job from standard input', fromStdin.status === 0 && fromStdin.stdout.includes('field current'), fromStdin.stderr);
const cases = run(['cases', 'check', '--json']);
check('cases check runs the installed cases', cases.status === 0 && JSON.parse(cases.stdout).total > 0 && !cases.stdout.includes(prefix), cases.stderr);
const report = run(['diagnose', 'job.json', '--report', 'job.html']);
check('writes an HTML report in the working folder', report.status === 0 && existsSync(join(elsewhere, 'job.html')), report.stderr);
const adopt = run(['rules', 'check']);
check('rules check on the built-in rules', adopt.status === 0, adopt.stderr);

console.log(`\n${passed} passed, ${failures} failed`);
process.exit(failures ? 1 : 0);
