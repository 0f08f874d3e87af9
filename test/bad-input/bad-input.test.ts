/**
 * Bad-input corpus: every malformed case file must be refused by the built CLI with exit 2,
 * nothing on stdout, and one line on stderr naming the file and, where one field is wrong, that
 * field's path. No stack trace, no raw control characters, nothing written anywhere.
 *
 * Needs the built CLI: `npm run build` first (npm test does it through pretest).
 */
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const CLI = join(ROOT, 'dist', 'cli.mjs');
const CORPUS = fileURLToPath(new URL('./corpus/', import.meta.url));

interface Expected {
  /** Field path the message must name, or "" when the file as a whole is wrong. */
  path: string;
  /** Something else the message must say (the unknown key, the size limit, …). */
  says?: RegExp;
  /** Lines of the message, when one line cannot say it (the first 20 issues and a count); 1 when absent. */
  lines?: number;
}

/** Each corpus file and what the refusal must point at. */
const TABLE: Record<string, Expected> = {
  // not JSON at all
  'not-json.json': { path: '', says: /JSON/ },
  'truncated-json.json': { path: '', says: /JSON/ },
  'empty-file.json': { path: '', says: /JSON/ },
  'whitespace-only.json': { path: '', says: /JSON/ },
  'trailing-comma.json': { path: '', says: /JSON/ },
  'json-with-comments.json': { path: '', says: /JSON/ },
  'single-quoted-json.json': { path: '', says: /JSON/ },
  'yaml-not-json.json': { path: '', says: /JSON/ },
  // wrong top-level type
  'top-level-array.json': { path: '', says: /object/ },
  'top-level-number.json': { path: '', says: /object/ },
  'top-level-string.json': { path: '', says: /object/ },
  'top-level-null.json': { path: '', says: /object/ },
  // format and machine
  'missing-format.json': { path: 'format' },
  'wrong-format.json': { path: 'format', says: /dc-case\/1/ },
  'format-as-number.json': { path: 'format' },
  'missing-machine.json': { path: 'machine' },
  'machine-is-number.json': { path: 'machine' },
  'machine-is-null.json': { path: 'machine' },
  'missing-machine-connection.json': { path: 'machine.connection' },
  'unknown-connection.json': { path: 'machine.connection', says: /triple-wound/ },
  'connection-wrong-case.json': { path: 'machine.connection' },
  'unknown-drive.json': { path: 'machine.drive' },
  'tacho-constant-zero.json': { path: 'machine.tachoVoltsPer1000Rpm' },
  'tacho-constant-as-string.json': { path: 'machine.tachoVoltsPer1000Rpm' },
  // wrong container types
  'symptoms-is-string.json': { path: 'symptoms', says: /array/ },
  'readings-is-array.json': { path: 'readings', says: /object/ },
  'nameplate-is-string.json': { path: 'machine.nameplate', says: /object/ },
  'observations-is-number.json': { path: 'observations', says: /object/ },
  'isolation-points-is-string.json': { path: 'job.isolation.points', says: /array/ },
  // unknown fields at several depths: the message names the object and the key
  'unknown-field-top.json': { path: '', says: /"colour"/ },
  'unknown-field-machine.json': { path: 'machine', says: /"ratedTorque"/ },
  'unknown-field-nameplate.json': { path: 'machine.nameplate', says: /"torque"/ },
  'unknown-field-readings-typo.json': { path: 'readings', says: /"armatureVoltge"/ },
  'unknown-field-job-isolation.json': { path: 'job.isolation', says: /"padlock"/ },
  'unknown-field-readings-after.json': { path: 'outcome.readingsAfter', says: /"rpm"/ },
  'unknown-observation-name.json': { path: 'observations', says: /"smell"/ },
  // vocabulary
  'unknown-symptom.json': { path: 'symptoms[0]', says: /smoking/ },
  'unknown-second-symptom.json': { path: 'symptoms[1]', says: /smells-hot/ },
  'unknown-observation-answer.json': { path: 'observations.present-state', says: /on-fire/ },
  'observation-answer-boolean.json': { path: 'observations.load-coupled' },
  'observation-null.json': { path: 'observations.present-state' },
  'unknown-cause.json': { path: 'outcome.cause', says: /gremlins/ },
  'cause-not-safe-id.json': { path: 'outcome.cause' },
  'new-cause-id-path-traversal.json': { path: 'outcome.newCause.id' },
  'insulation-tested-winding-unknown.json': { path: 'readings.insulationTestedWinding', says: /rotor/ },
  'insulation-class-Z.json': { path: 'machine.nameplate.insulationClass', says: /"Z"/ },
  // quantities
  'voltage-in-amperes.json': { path: 'readings.armatureVoltage', says: /5 A/ },
  'speed-in-volts.json': { path: 'readings.speed', says: /220 V/ },
  'brush-drop-in-ohms.json': { path: 'machine.brushDrop' },
  'readings-after-wrong-dimension.json': { path: 'outcome.readingsAfter.speed' },
  'current-as-sum.json': { path: 'readings.armatureCurrent' },
  'current-as-function.json': { path: 'readings.armatureCurrent' },
  'unit-written-twice.json': { path: 'readings.armatureCurrent' },
  'two-numbers-one-unit.json': { path: 'readings.armatureCurrent' },
  'negative-resistance.json': { path: 'machine.resistances.armature', says: /negative/ },
  'negative-current.json': { path: 'readings.fieldCurrent', says: /negative/ },
  'negative-current-bare-number.json': { path: 'readings.armatureCurrent', says: /negative/ },
  'armature-voltage-10-MV.json': { path: 'machine.nameplate.armatureVoltage', says: /range/ },
  'speed-1e6-rpm.json': { path: 'readings.speed', says: /range/ },
  'speed-bare-number-absurd.json': { path: 'readings.speed', says: /range/ },
  'ambient-below-absolute-zero.json': { path: 'readings.ambientTemperature', says: /range/ },
  'empty-string-quantity.json': { path: 'readings.armatureCurrent', says: /empty/ },
  'blank-string-quantity.json': { path: 'readings.armatureVoltage', says: /empty/ },
  'unit-without-number.json': { path: 'readings.armatureVoltage', says: /volts/ },
  'nan-quantity.json': { path: 'readings.armatureVoltage' },
  'nan-bare.json': { path: 'readings.speed' },
  'infinity-quantity.json': { path: 'readings.armatureCurrent' },
  'quantity-as-object.json': { path: 'readings.armatureVoltage' },
  'quantity-as-array.json': { path: 'readings.armatureVoltage' },
  'quantity-as-boolean.json': { path: 'readings.speed' },
  'reading-null.json': { path: 'readings.speed' },
  'quantity-very-long.json': { path: 'readings.armatureVoltage' },
  'quantity-with-newline.json': { path: 'readings.armatureVoltage' },
  'quantity-with-terminal-escape.json': { path: 'readings.armatureVoltage' },
  // ids, dates, long strings
  'id-path-traversal.json': { path: 'id' },
  'id-empty.json': { path: 'id' },
  'id-with-space.json': { path: 'id' },
  'id-200-characters.json': { path: 'id' },
  'id-is-number.json': { path: 'id' },
  'symptom-very-long.json': { path: 'symptoms[0]' },
  'outcome-date-not-iso.json': { path: 'outcome.date' },
  'outcome-date-month-13.json': { path: 'outcome.date' },
  // magnetization
  'magnetization-one-pair.json': { path: 'machine.magnetization' },
  'magnetization-unknown-word.json': { path: 'machine.magnetization' },
  'magnetization-negative-flux.json': { path: 'machine.magnetization[1][1]' },
  'magnetization-pairs-as-strings.json': { path: 'machine.magnetization' },
  'magnetization-triple.json': { path: 'machine.magnetization' },
  // a rated value the model divides by
  'nameplate-voltage-zero.json': { path: 'machine.nameplate.armatureVoltage', says: /rated value of 0/ },
  'nameplate-field-current-zero-bare.json': { path: 'machine.nameplate.fieldCurrent', says: /rated value of 0/ },
  'nameplate-speed-zero.json': { path: 'machine.nameplate.speed', says: /rated value of 0/ },
  // a key twice: JSON.parse would keep the last silently
  'duplicate-key-readings.json': { path: 'readings', says: /"speed" appears twice/ },
  'duplicate-key-top.json': { path: '', says: /"id" appears twice/ },
  // the same key, once spelt with an escape: JSON.parse reads both as "speed"
  'duplicate-key-escaped.json': { path: 'readings', says: /"speed" appears twice/ },
  'connection-with-escape-sequence.json': { path: 'machine.connection' },
};

/** A valid case: the control, and the body of the generated oversized files. */
const VALID_CASE = {
  format: 'dc-case/1',
  id: 'bad-input-control',
  machine: {
    connection: 'shunt',
    drive: 'fixed-supply',
    nameplate: { armatureVoltage: '220 V', armatureCurrent: '24 A', speed: '1500 rpm', fieldVoltage: '220 V', fieldCurrent: '0.80 A', insulationClass: 'F' },
    resistances: { armature: '0.55 ohm', shuntField: '200 ohm', at: '20 degC' },
  },
  symptoms: ['overspeed'],
  observations: { 'present-state': 'running', 'load-coupled': 'yes' },
  readings: { armatureVoltage: '221 V', armatureCurrent: '9.5 A', fieldCurrent: '0.54 A', speed: '2010 rpm' },
  outcome: { cause: 'field-weak', date: '2026-10-14' },
};

const MiB = 1024 * 1024;
const GEN = mkdtempSync(join(tmpdir(), 'dctriage-bad-input-gen-'));

/** Inputs made by the test into a temp folder: binary, oversized, not a file at all. */
const GENERATED: Record<string, Expected & { make: (file: string) => void }> = {
  'binary-garbage.json': {
    path: '',
    make: (file) => {
      // A picture saved under the wrong name: PNG signature, then pseudo-random bytes.
      const bytes = Buffer.alloc(4096);
      let x = 12345;
      for (let i = 0; i < bytes.length; i++) {
        x = (Math.imul(x, 1103515245) + 12345) >>> 0;
        bytes[i] = x >>> 24;
      }
      Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d]).copy(bytes);
      writeFileSync(file, bytes);
    },
  },
  'terminal-escapes.json': {
    path: '',
    make: (file) => writeFileSync(file, Buffer.from('\x1b[2J\x1b]0;title\x07\x1b[31m not a case\n', 'latin1')),
  },
  // A valid case padded to 50 MB: if it were read rather than refused, it would pass.
  'fifty-megabytes.json': {
    path: '',
    says: /1 MiB|1048576/,
    make: (file) => writeFileSync(file, JSON.stringify({ ...VALID_CASE, job: { workOrder: 'W'.repeat(50 * MiB) } })),
  },
  // A valid case padded with trailing whitespace to one byte over the limit.
  'one-byte-over-1-MiB.json': {
    path: '',
    says: /1 MiB|1048576/,
    make: (file) => {
      const body = JSON.stringify(VALID_CASE);
      writeFileSync(file, body + ' '.repeat(MiB + 1 - Buffer.byteLength(body)));
    },
  },
  'a-folder.json': { path: '', make: (file) => mkdirSync(file) },
  // stat says 0 bytes; reading it would never end. Only an aligned read works on it.
  'link-to-proc-pagemap.json': { path: '', says: /1 MiB|1048576/, make: (file) => symlinkSync('/proc/self/pagemap', file) },
  'link-to-dev-zero.json': { path: '', says: /not a regular file/, make: (file) => symlinkSync('/dev/zero', file) },
  // 2,000 objects inside each other: refused before anything recurses into them.
  'nested-2000-deep.json': { path: '', says: /nested more than 64 levels deep/, make: (file) => writeFileSync(file, `{"format":"dc-case/1","machine":${'{"x":'.repeat(2000)}1${'}'.repeat(2000)}}`) },
  // 100,000 issues in one file: the first 20 and a count of the rest.
  'hundred-thousand-issues.json': {
    path: 'symptoms[0]',
    says: /and 99980 more issues in this file/,
    lines: 21,
    make: (file) => writeFileSync(file, JSON.stringify({ ...VALID_CASE, symptoms: Array(100_000).fill('smoking') })),
  },
  'no-such-file.json': { path: '', make: () => {} },
};

const COMMANDS = [
  { name: 'expect', args: (file: string) => ['expect', file] },
  { name: 'diagnose --json', args: (file: string) => ['diagnose', file, '--json'] },
] as const;

interface Run {
  code: number | null;
  stdout: string;
  stderr: string;
  /** What was left in the (fresh, empty) working folder afterwards. */
  leftInCwd: string[];
}

function run(args: string[]): Run {
  const cwd = mkdtempSync(join(tmpdir(), 'dctriage-bad-input-cwd-'));
  try {
    const r = spawnSync(process.execPath, [CLI, ...args], {
      cwd,
      input: '',
      encoding: 'utf8',
      env: { ...process.env, NO_COLOR: '1' },
      timeout: 60_000,
    });
    return { code: r.status, stdout: r.stdout, stderr: r.stderr, leftInCwd: readdirSync(cwd) };
  } finally {
    rmSync(cwd, { recursive: true, force: true });
  }
}

const escapeRe = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
/** The path as a whole token: "readings" must not be satisfied by "readings.speed". */
const namesPath = (text: string, path: string) => new RegExp(`(?<![\\w.\\[\\]-])${escapeRe(path)}(?![\\w.\\[-])`).test(text);

const STACK_LINE = /^\s+at .*:\d+:\d+\)?$/m;
const NODE_ERROR = /^\s*(?:[A-Z]\w*)?Error(?: \[\w+\])?:/m;
// C0 controls but tab and newline, DEL, and the C1 CSI: a terminal would act on them.
// oxlint-disable-next-line no-control-regex -- matching control characters is the point
const CONTROL = /[\x00-\x08\x0b-\x1f\x7f\x9b]/;
/** A message a fitter can read: longer than this (beyond the file name) is a dump. */
const MAX_MESSAGE = 600;

/** Every property the refusal must have; returns the ones it lacks (empty = answered well). */
function problems(r: Run, file: string, want: Expected): string[] {
  const p: string[] = [];
  if (r.code !== 2) p.push(`exit code ${r.code}, expected 2`);
  if (r.stdout !== '') p.push(`stdout not empty (${r.stdout.length} chars)`);
  if (r.stderr.trim() === '') p.push('stderr empty');
  const lines = r.stderr.replace(/\n$/, '').split('\n');
  if (lines.length !== (want.lines ?? 1)) p.push(`stderr has ${lines.length} lines, expected ${want.lines ?? 1}`);
  if (!r.stderr.includes(file)) p.push('message does not name the file');
  if (want.path && !namesPath(r.stderr, want.path)) p.push(`message does not name the field ${want.path}`);
  if (want.says && !want.says.test(r.stderr)) p.push(`message does not say ${want.says}`);
  if (STACK_LINE.test(r.stderr)) p.push('stack trace on stderr');
  if (NODE_ERROR.test(r.stderr) || r.stderr.includes('node:internal')) p.push('Node error output on stderr');
  if (CONTROL.test(r.stderr)) p.push('raw control characters on stderr');
  if (r.stderr.replaceAll(file, '').length > MAX_MESSAGE * (want.lines ?? 1)) p.push(`message is ${r.stderr.length} chars long`);
  if (r.leftInCwd.length > 0) p.push(`wrote into the working folder: ${r.leftInCwd.join(', ')}`);
  return p;
}

const snapshot = (dir: string) =>
  readdirSync(dir)
    .sort()
    .map((f) => {
      const st = statSync(join(dir, f));
      return `${f} ${st.size} ${st.mtimeMs} ${createHash('sha256').update(readFileSync(join(dir, f))).digest('hex')}`;
    });

const corpusFiles = readdirSync(CORPUS).sort();
const CORPUS_BEFORE = snapshot(CORPUS);

interface Input extends Expected {
  label: string;
  file: string;
}
const inputs: Input[] = [
  ...corpusFiles.map((f) => ({ label: `corpus/${f}`, file: join(CORPUS, f), path: TABLE[f]?.path ?? '', ...(TABLE[f]?.says ? { says: TABLE[f].says } : {}) })),
  ...Object.entries(GENERATED).map(([f, g]) => ({ label: `generated/${f}`, file: join(GEN, f), path: g.path, ...(g.says ? { says: g.says } : {}), ...(g.lines ? { lines: g.lines } : {}) })),
];

/** Results by input and command, so the summary need not run everything twice. */
const results = new Map<string, string[]>();
function check(input: Input, command: (typeof COMMANDS)[number]): { r: Run; p: string[] } {
  const r = run(command.args(input.file));
  const p = problems(r, input.file, input);
  results.set(`${input.label} ${command.name}`, p);
  return { r, p };
}

beforeAll(() => {
  if (!existsSync(CLI)) throw new Error(`no built CLI at ${CLI}: run npm run build first`);
  for (const [f, g] of Object.entries(GENERATED)) g.make(join(GEN, f));
});

afterAll(() => {
  rmSync(GEN, { recursive: true, force: true });
});

describe('the corpus and its table agree', () => {
  test('every corpus file has an expected field path, and every entry has its file', () => {
    expect(corpusFiles.filter((f) => !(f in TABLE))).toEqual([]);
    expect(Object.keys(TABLE).filter((f) => !corpusFiles.includes(f))).toEqual([]);
  });

  test('the control case, valid, is accepted by both commands (so refusals below come from the faults)', () => {
    const file = join(GEN, 'control.json');
    writeFileSync(file, JSON.stringify(VALID_CASE, null, 2));
    for (const c of COMMANDS) {
      const r = run(c.args(file));
      expect(r.stderr, c.name).toBe('');
      expect(r.code, c.name).toBe(0);
      expect(r.stdout.length, c.name).toBeGreaterThan(0);
    }
    rmSync(file);
  });

  test('the checks themselves catch a bad answer', () => {
    const file = '/x/case.json';
    const good: Run = { code: 2, stdout: '', stderr: `${file}: at readings.speed: "220 V" is not a speed\n`, leftInCwd: [] };
    expect(problems(good, file, { path: 'readings.speed' })).toEqual([]);
    expect(problems({ ...good, code: 70 }, file, { path: 'readings.speed' })).toHaveLength(1);
    expect(problems(good, file, { path: 'readings' })).toHaveLength(1);
    expect(problems(good, file, { path: 'readings.spee' })).toHaveLength(1);
    expect(problems({ ...good, stderr: `${file}: oops\n    at main (file:///x/cli.mjs:10:5)\n` }, file, { path: '' }).length).toBeGreaterThan(0);
    expect(problems({ ...good, stderr: `TypeError: x is undefined\n` }, file, { path: '' }).length).toBeGreaterThan(0);
    expect(problems({ ...good, stderr: `${file}: "\x1b[2J"\n` }, file, { path: '' })).toHaveLength(1);
  });
});

describe.each(inputs)('$label', (input) => {
  test.each(COMMANDS)('$name: exit 2, one message naming the file and field, nothing else', (command) => {
    const { r, p } = check(input, command);
    expect(p, `stderr was: ${JSON.stringify(r.stderr.slice(0, 400))}`).toEqual([]);
  }, 90_000);
});

describe('the corpus as a whole', () => {
  test('was left unchanged, and counts at least 40 inputs', () => {
    expect(snapshot(CORPUS)).toEqual(CORPUS_BEFORE);
    expect(corpusFiles.length).toBeGreaterThanOrEqual(40);
  });

  test('summary', () => {
    for (const input of inputs) for (const c of COMMANDS) if (!results.has(`${input.label} ${c.name}`)) check(input, c);
    const answered = inputs.filter((i) => COMMANDS.every((c) => results.get(`${i.label} ${c.name}`)?.length === 0));
    console.log(`bad-input corpus: ${inputs.length} inputs, ${answered.length} answered with exit 2 and a message`);
    for (const i of inputs) {
      for (const c of COMMANDS) {
        const p = results.get(`${i.label} ${c.name}`) ?? [];
        if (p.length) console.log(`  ${i.label} (${c.name}): ${p.join('; ')}`);
      }
    }
    expect(corpusFiles.length).toBeGreaterThanOrEqual(40);
  }, 600_000);
});
