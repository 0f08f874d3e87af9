import { spawn } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { caseSchema } from '../../src/knowledge/case-schema.js';
import { fileCase } from '../../src/shell/file-case.js';
import { CLI, runCli } from '../support/cli.js';
import { CASES_DIR, copyOfRules } from '../support/rules.js';

const demo = join(CASES_DIR, '2026-10-14-press-feed-field-weak.json');
const raw = () => JSON.parse(readFileSync(demo, 'utf8')) as Record<string, unknown>;
const emptyDir = () => mkdtempSync(join(tmpdir(), 'dctriage-cases-'));
const jsonFiles = (dir: string) => readdirSync(dir).filter((f) => f.endsWith('.json')).sort();

describe('dctriage cases add', () => {
  it('files a case under its date and id, with stable key order and 2-space indentation', () => {
    const dir = emptyDir();
    const r = runCli(['cases', 'add', demo, '--cases', dir, '--rules', copyOfRules()]);
    expect(r.code).toBe(0);
    expect(jsonFiles(dir)).toEqual(['2026-10-14-press-feed-field-weak.json']);
    const text = readFileSync(join(dir, '2026-10-14-press-feed-field-weak.json'), 'utf8');
    expect(Object.keys(JSON.parse(text))).toEqual(['format', 'id', 'job', 'machine', 'symptoms', 'observations', 'readings', 'checks', 'outcome']);
    expect(text).toMatch(/^\{\n {2}"format": "dc-case\/1",\n {2}"id"/);
  });

  it('suffixes both the file name and the id on a collision, and says so', () => {
    const dir = emptyDir();
    const rules = copyOfRules();
    runCli(['cases', 'add', demo, '--cases', dir, '--rules', rules]);
    const r = runCli(['cases', 'add', demo, '--cases', dir, '--rules', rules]);
    expect(r.code).toBe(0);
    expect(r.stdout.replace(/\s+/g, ' ')).toContain('filed as "press-feed-field-weak-2"');
    expect(jsonFiles(dir)).toEqual(['2026-10-14-press-feed-field-weak-2.json', '2026-10-14-press-feed-field-weak.json']);
    expect(JSON.parse(readFileSync(join(dir, '2026-10-14-press-feed-field-weak-2.json'), 'utf8')).id).toBe('press-feed-field-weak-2');
  });

  it('suffixes an id already used under another date', () => {
    const dir = emptyDir();
    const other = { ...raw(), outcome: { ...(raw().outcome as object), date: '2025-01-01' } };
    const first = fileCase(other, caseSchema.parse(other), dir, '2026-01-01');
    const second = fileCase(raw(), caseSchema.parse(raw()), dir, '2026-01-01');
    expect(first.ok && second.ok).toBe(true);
    if (second.ok) expect(second.value.id).toBe('press-feed-field-weak-2');
  });

  it('refuses an unsafe id with exit 2 and writes nothing', () => {
    const dir = emptyDir();
    const bad = join(emptyDir(), 'bad.json');
    writeFileSync(bad, JSON.stringify({ ...raw(), id: '../../etc/passwd' }));
    const r = runCli(['cases', 'add', bad, '--cases', dir, '--rules', copyOfRules()]);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('at id: "../../etc/passwd": expected a safe id');
    expect(readdirSync(dir)).toEqual([]);
  });

  it('leaves no file, whole or half, when the write fails between writing and linking', () => {
    const dir = emptyDir();
    const r = fileCase(raw(), caseSchema.parse(raw()), dir, '2026-01-01', {
      link: () => {
        throw Object.assign(new Error('power lost'), { code: 'EIO' });
      },
    });
    expect(r.ok).toBe(false);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('gives two processes recording the same id at once two distinct files', async () => {
    const dir = emptyDir();
    const rules = copyOfRules();
    const run = () =>
      new Promise<number | null>((resolve) => {
        const p = spawn(process.execPath, [CLI, 'cases', 'add', demo, '--cases', dir, '--rules', rules], { stdio: 'ignore' });
        p.on('exit', resolve);
      });
    const codes = await Promise.all([run(), run()]);
    expect(codes).toEqual([0, 0]);
    const files = jsonFiles(dir);
    expect(files).toHaveLength(2);
    const ids = files.map((f) => JSON.parse(readFileSync(join(dir, f), 'utf8')).id);
    expect(new Set(ids).size).toBe(2);
  });

  it('gives 20 processes filing one id under different dates 20 distinct ids', async () => {
    const dir = emptyDir();
    const rules = copyOfRules();
    const sources = emptyDir();
    const run = (k: number) =>
      new Promise<number | null>((resolve) => {
        const file = join(sources, `job-${k}.json`);
        writeFileSync(file, JSON.stringify({ ...raw(), outcome: { ...(raw().outcome as object), date: `2026-01-${String(k + 1).padStart(2, '0')}` } }));
        const p = spawn(process.execPath, [CLI, 'cases', 'add', file, '--cases', dir, '--rules', rules], { stdio: 'ignore' });
        p.on('exit', resolve);
      });
    const codes = await Promise.all(Array.from({ length: 20 }, (_, k) => run(k)));
    expect(codes).toEqual(Array(20).fill(0));
    const ids = jsonFiles(dir).map((f) => JSON.parse(readFileSync(join(dir, f), 'utf8')).id);
    expect(ids).toHaveLength(20);
    expect(new Set(ids).size).toBe(20);
    expect(readdirSync(dir).filter((f) => !f.endsWith('.json'))).toEqual([]);
  }, 60_000);

  it('says clearly when the cases folder cannot be written', () => {
    // /sys refuses new files even to root, unlike a chmod-ed folder.
    const r = runCli(['cases', 'add', demo, '--cases', '/sys', '--rules', copyOfRules()]);
    expect(r.code).toBe(74);
    expect(r.stderr).toMatch(/\/sys: could not write the case/);
  });
});

describe('dctriage rules check', () => {
  it('finds the built-in rule folder clean', () => {
    const r = runCli(['rules', 'check', '--rules', join(CASES_DIR, '..', 'rules'), '--cases', CASES_DIR]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
  });

  const broken = (change: (dir: string) => void) => {
    const dir = copyOfRules();
    change(dir);
    return runCli(['rules', 'check', '--rules', dir, '--cases', CASES_DIR, '--json']);
  };
  const addFile = (dir: string, rules: unknown[]) => writeFileSync(join(dir, 'broken.json'), JSON.stringify({ family: 'broken', rules }));
  const rule = (name: string, extra: object) => ({ name, kind: 'evidence', cause: 'overload', weight: 0.3, ...extra });

  it('finds a rule naming an unknown fact', () => {
    const r = broken((d) => addFile(d, [rule('odd', { conditions: { all: [{ fact: 'colour', operator: 'is', value: 'red' }] } })]));
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('unknown fact "colour"');
  });

  it('finds a duplicate rule name', () => {
    const r = broken((d) => addFile(d, [rule('overload-current', { conditions: { all: [{ fact: 'symptoms', operator: 'contains', value: 'sparking' }] } })]));
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('rule name "overload-current" is also used');
  });

  it('finds a rule that can never fire', () => {
    const r = broken((d) => addFile(d, [rule('never', { conditions: { all: [{ fact: 'load-level', operator: 'is', value: 'heavy' }, { fact: 'load-level', operator: 'is', value: 'light' }] } })]));
    expect(r.code).toBe(1);
    expect(JSON.parse(r.stdout).findings).toContainEqual(expect.objectContaining({ kind: 'never-fires', about: 'rules[0] (never)' }));
  });

  it('finds a cause no rule can reach', () => {
    const r = broken((d) => {
      const f = join(d, 'causes.json');
      const c = JSON.parse(readFileSync(f, 'utf8'));
      c.causes.push({ id: 'gremlins', title: 'Gremlins', description: 'unexplained', checks: ['iso-connections'] });
      writeFileSync(f, JSON.stringify(c));
    });
    expect(r.code).toBe(1);
    expect(JSON.parse(r.stdout).findings).toContainEqual(expect.objectContaining({ kind: 'unreachable-cause', about: 'gremlins' }));
  });

  it('finds a cause ruled out and supported on the same conditions', () => {
    const conditions = { all: [{ fact: 'load-level', operator: 'is', value: 'heavy' }] };
    const r = broken((d) => addFile(d, [rule('for', { conditions }), { name: 'against', kind: 'rule-out', cause: 'overload', conditions, says: 'x' }]));
    expect(JSON.parse(r.stdout).findings).toContainEqual(expect.objectContaining({ kind: 'ruled-out-and-supported' }));
  });

  it('finds a question no rule uses', () => {
    const r = broken((d) => {
      const f = join(d, 'questions.json');
      const q = JSON.parse(readFileSync(f, 'utf8'));
      q.questions.push({ id: 'lonely', prompt: 'Insulation tester voltage?', state: 'observe', answer: { kind: 'quantity', reading: 'insulationTestVoltage' } });
      writeFileSync(f, JSON.stringify(q));
    });
    expect(JSON.parse(r.stdout).findings).toContainEqual(expect.objectContaining({ kind: 'unused-question', about: expect.stringContaining('lonely') }));
  });

  it('finds a recorded case that fell out of its top 3', () => {
    const r = broken((d) => {
      const f = join(d, 'field.json');
      const fam = JSON.parse(readFileSync(f, 'utf8'));
      fam.rules = fam.rules.filter((x: { cause?: string }) => x.cause !== 'field-weak');
      writeFileSync(f, JSON.stringify(fam));
      const s = join(d, 'symptoms.json');
      const sym = JSON.parse(readFileSync(s, 'utf8'));
      sym.rules = sym.rules.filter((x: { cause?: string }) => x.cause !== 'field-weak');
      writeFileSync(s, JSON.stringify(sym));
      const t = join(d, 'fits.json');
      const fits = JSON.parse(readFileSync(t, 'utf8'));
      fits.rules = fits.rules.filter((x: { cause?: string }) => x.cause !== 'field-weak');
      writeFileSync(t, JSON.stringify(fits));
    });
    expect(r.code).toBe(1);
    expect(JSON.parse(r.stdout).findings).toContainEqual(expect.objectContaining({ kind: 'case-out-of-top-3', about: 'press-feed-field-weak' }));
  });

  it('stops with exit 2 on a file that is not JSON', () => {
    const dir = copyOfRules();
    writeFileSync(join(dir, 'broken.json'), '{ not json');
    const r = runCli(['rules', 'check', '--rules', dir, '--cases', CASES_DIR]);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('broken.json: not valid JSON');
  });
});

describe('dctriage rules draft and adopt', () => {
  it('writes a draft for review, reports rank changes, and adopts it into the folder', () => {
    const k = mkdtempSync(join(tmpdir(), 'dctriage-knowledge-'));
    cpSync(join(CASES_DIR, '..', 'rules'), join(k, 'rules'), { recursive: true });
    cpSync(CASES_DIR, join(k, 'cases'), { recursive: true });
    const env = { DCTRIAGE_KNOWLEDGE: k };
    const r = runCli(['rules', 'draft', '--from-case', join(k, 'cases', '2025-07-29-resaw-brush-lead-crimp.json'), '--json'], { env, cwd: k });
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(existsSync(j.file)).toBe(true);
    expect(j.draft.rules[0]).toMatchObject({ kind: 'evidence', cause: 'armature-circuit-high-resistance' });
    expect(j.rankChanges.length).toBe(jsonFiles(join(k, 'cases')).length);
    const adopted = runCli(['rules', 'adopt', j.file], { env, cwd: k });
    expect(adopted.code).toBe(0);
    expect(existsSync(j.file)).toBe(false);
    expect(runCli(['rules', 'check'], { env, cwd: k }).code).toBe(0);
  });
});

describe('dctriage review', () => {
  it('shows a saved job as its report, and --close marks it closed by a named lead', () => {
    const dir = emptyDir();
    const file = join(dir, 'job.json');
    writeFileSync(file, readFileSync(demo, 'utf8'));
    const look = runCli(['review', file, '--rules', join(CASES_DIR, '..', 'rules')]);
    expect(look.code).toBe(0);
    expect(look.stdout).toContain('# Job report: PF-3 feed roll');
    expect(JSON.parse(readFileSync(file, 'utf8')).job.closedBy).toBeUndefined();
    const close = runCli(['review', file, '--close', 'R. Lead', '--rules', join(CASES_DIR, '..', 'rules')]);
    expect(close.code).toBe(0);
    const job = JSON.parse(readFileSync(file, 'utf8')).job;
    expect(job.closedBy).toBe('R. Lead');
    expect(runCli(['review', file, '--rules', join(CASES_DIR, '..', 'rules')]).stdout).toContain('| Closed by | R. Lead at ');
  });
});

describe('placeholder text never reaches fitters', () => {
  const knowledge = () => {
    const k = mkdtempSync(join(tmpdir(), 'dctriage-knowledge-'));
    cpSync(join(CASES_DIR, '..', 'rules'), join(k, 'rules'), { recursive: true });
    cpSync(CASES_DIR, join(k, 'cases'), { recursive: true });
    return k;
  };

  it('rules adopt refuses a draft whose new cause and check still have the placeholders, even with --force', () => {
    const k = knowledge();
    const env = { DCTRIAGE_KNOWLEDGE: k };
    const job = raw();
    job.id = 'press-feed-rheostat-track';
    job.outcome = { newCause: { id: 'rheostat-track-worn', title: 'Rheostat track worn through' }, date: '2026-10-14' };
    const file = join(k, 'new-cause.json');
    writeFileSync(file, JSON.stringify(job));
    const drafted = runCli(['rules', 'draft', '--from-case', file, '--json'], { env, cwd: k });
    expect(drafted.code, drafted.stderr).toBe(0);
    const draftFile = JSON.parse(drafted.stdout).file as string;
    for (const force of [[], ['--force']]) {
      const r = runCli(['rules', 'adopt', draftFile, ...force], { env, cwd: k });
      expect(r.code).toBe(1);
      expect(r.stderr).toContain("still has the draft's placeholder text");
      expect(r.stderr).toContain('checks[0].how (confirm-rheostat-track-worn): "Describe how to confirm or clear this cause."');
      expect(r.stderr).toContain('checks[0].instrument');
      expect(r.stderr).toContain('causes[0].description');
    }
    expect(existsSync(draftFile)).toBe(true);
    // Written properly, it is adopted.
    const draft = JSON.parse(readFileSync(draftFile, 'utf8'));
    draft.causes[0].description = 'The rheostat contact track is worn through where it usually sits, adding resistance to the field.';
    draft.checks[0].how = 'With the machine isolated, measure the rheostat across its wiper and each end while turning it slowly; a jump marks the worn place.';
    draft.checks[0].instrument = 'multimeter on resistance';
    writeFileSync(draftFile, JSON.stringify(draft));
    const ok = runCli(['rules', 'adopt', draftFile], { env, cwd: k });
    expect(ok.code, ok.stderr).toBe(0);
  });

  it('rules check reports placeholder text in the rule folder', () => {
    const dir = copyOfRules();
    const f = join(dir, 'checks.json');
    const checks = JSON.parse(readFileSync(f, 'utf8'));
    checks.checks[0].how = 'Describe how to confirm or clear this cause.';
    writeFileSync(f, JSON.stringify(checks));
    const r = runCli(['rules', 'check', '--rules', dir, '--cases', CASES_DIR, '--json']);
    expect(r.code).toBe(1);
    expect(JSON.parse(r.stdout).findings).toContainEqual(expect.objectContaining({ kind: 'placeholder-text', about: `checks[0].how (${checks.checks[0].id})` }));
  });
});

describe('rules adopt shows every case whose rank changes', () => {
  it('lists each recorded case that moves, not only those that leave the top 3', () => {
    const k = mkdtempSync(join(tmpdir(), 'dctriage-knowledge-'));
    cpSync(join(CASES_DIR, '..', 'rules'), join(k, 'rules'), { recursive: true });
    cpSync(CASES_DIR, join(k, 'cases'), { recursive: true });
    const env = { DCTRIAGE_KNOWLEDGE: k };
    // A rule for one cause on a common symptom: it moves several cases, some only a place or two.
    mkdirSync(join(k, 'rules', 'drafts'), { recursive: true });
    const draft = join(k, 'rules', 'drafts', 'weak-overspeed.json');
    writeFileSync(draft, JSON.stringify({ family: 'drafts', description: 'test', rules: [{ name: 'weak-overspeed-series', kind: 'evidence', cause: 'field-shorted-turns', weight: 0.9, conditions: { all: [{ fact: 'symptoms', operator: 'contains', value: 'overspeed' }] }, says: 'runs fast' }] }));
    const ranks = () => new Map((JSON.parse(runCli(['cases', 'check', '--json'], { env, cwd: k }).stdout).cases as { id: string; rank: number }[]).map((c) => [c.id, c.rank]));
    const before = ranks();
    const r = runCli(['rules', 'adopt', draft, '--force'], { env, cwd: k });
    expect(r.code, r.stderr).toBe(0);
    const after = ranks();
    const moved = [...after].filter(([id, rank]) => before.get(id) !== rank).map(([id]) => id);
    expect(moved.length).toBeGreaterThan(0);
    const listed = [...r.stdout.matchAll(/^ {2}(?:OUT | {4})(\S+) \(/gm)].map((m) => m[1]);
    expect(listed.sort()).toEqual(moved.sort());
  });
});

describe('cases add warns, and still files', () => {
  it('about the same job already filed, and about a job with no cause', () => {
    const dir = emptyDir();
    const rules = copyOfRules();
    const first = runCli(['cases', 'add', demo, '--cases', dir, '--rules', rules]);
    expect(first.stderr).toBe('');
    const again = runCli(['cases', 'add', demo, '--cases', dir, '--rules', rules]);
    expect(again.code).toBe(0);
    expect(again.stderr).toContain(`dctriage: warning: the same job is already filed as ${join(dir, '2026-10-14-press-feed-field-weak.json')}`);
    const noCause = { ...raw(), id: 'no-cause-yet', outcome: { date: '2026-10-15', notes: 'left running' } };
    const file = join(emptyDir(), 'job.json');
    writeFileSync(file, JSON.stringify(noCause));
    const r = runCli(['cases', 'add', file, '--cases', dir, '--rules', rules]);
    expect(r.code).toBe(0);
    expect(r.stderr).toContain('warning: the job names no confirmed cause');
    expect(r.stderr).not.toContain('already filed');
    expect(jsonFiles(dir)).toHaveLength(3);
  });
});

describe('cases check says what it skipped', () => {
  it('counts the files without a cause and those with a new cause, and names them', () => {
    const dir = emptyDir();
    cpSync(demo, join(dir, 'a.json'));
    writeFileSync(join(dir, 'b.json'), JSON.stringify({ ...raw(), id: 'b', outcome: { date: '2026-10-15' } }));
    writeFileSync(join(dir, 'c.json'), JSON.stringify({ ...raw(), id: 'c', outcome: { newCause: { id: 'rheostat-track-worn', title: 'Rheostat track worn' } } }));
    const text = runCli(['cases', 'check', dir], { env: { COLUMNS: '300' } });
    expect(text.stdout).toContain('1 cases: 1 ranked first');
    expect(text.stdout).toContain('Skipped 2 files:');
    expect(text.stdout).toMatch(/1 with no confirmed cause recorded: \S*b\.json/);
    expect(text.stdout).toMatch(/1 with a new cause not yet adopted into the catalogue: \S*c\.json/);
    const j = JSON.parse(runCli(['cases', 'check', dir, '--json']).stdout);
    expect(j.skipped).toEqual([
      { file: expect.stringMatching(/b\.json$/), why: 'no-outcome' },
      { file: expect.stringMatching(/c\.json$/), why: 'new-cause' },
    ]);
  });
});
