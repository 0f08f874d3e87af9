import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { combine } from '../../src/engine/certainty.js';
import { checksShow, diagnose } from '../../src/engine/diagnose.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { simulateLoop } from '../../src/engine/simulate-loop.js';
import { checkCases, sameCause } from '../../src/engine/check-cases.js';
import { sensitivity } from '../../src/engine/loop.js';
import { caseSchema, type CaseFile, type WorkedCheck } from '../../src/knowledge/case-schema.js';
import { stableJson } from '../../src/knowledge/canonical.js';
import { loadCase } from '../../src/knowledge/load-case.js';
import { builtInRules, CASES_DIR } from '../support/rules.js';
import { assertSafe } from '../support/safety.js';

const base = builtInRules();
const engine = buildEngine(base);
const check = (id: string) => base.checks.find((c) => c.id === id)!;
const shows = checksShow(base);

/** An invented job: a separately excited winder on a converter, stopping on overcurrent while winding up. */
const winder: CaseFile = caseSchema.parse({
  format: 'dc-case/1',
  machine: { connection: 'separately-excited', drive: 'controlled-converter', feedback: 'tacho', nameplate: { armatureVoltage: '440 V', armatureCurrent: '68 A', speed: '1500 rpm', power: '26 kW', fieldVoltage: '310 V', fieldCurrent: '2.2 A', insulationClass: 'F' } },
  symptoms: ['speed-low', 'low-torque'],
  observations: { 'present-state': 'stopped', 'load-coupled': 'yes', 'load-kind': 'general' },
});
const withChecks = (job: CaseFile, checks: WorkedCheck[]): CaseFile => ({ ...job, checks });
const scoreOf = (d: Awaited<ReturnType<typeof diagnose>>, id: string) => d.causes.find((c) => c.id === id)?.score ?? 0;

describe('a check result updates the ranking', () => {
  it('a normal result weighs against each cause the check shows by its sensitivity (certainty factors, MYCIN)', async () => {
    const before = await diagnose(winder, base, engine);
    const target = before.checks[0]!;
    const cause = target.causes.find((c) => scoreOf(before, c) > 0)!;
    const after = await diagnose(withChecks(winder, [{ id: target.id, result: 'normal' }]), base, engine);
    const s = sensitivity(check(target.id), cause);
    // The rule evidence combined, then −s: with s = 0.8 a cause at 0.5 drops to (0.5 − 0.8)/(1 − 0.5) = −0.6.
    const expected = combine(scoreOf(before, cause), -s);
    if (expected > 0) expect(scoreOf(after, cause)).toBeCloseTo(expected, 2);
    else expect(after.causes.map((c) => c.id)).not.toContain(cause);
  });

  it('an abnormal result is shared among the causes the check shows by their belief, and weighs a little against the rest', async () => {
    const before = await diagnose(winder, base, engine);
    const target = before.checks.find((c) => c.causes.length === 1) ?? before.checks[0]!;
    const after = await diagnose(withChecks(winder, [{ id: target.id, result: 'abnormal' }]), base, engine);
    for (const c of target.causes) expect(scoreOf(after, c)).toBeGreaterThan(scoreOf(before, c));
    const elsewhere = before.causes.find((c) => !(shows.get(target.id) ?? []).includes(c.id))!;
    expect(scoreOf(after, elsewhere.id)).toBeLessThan(elsewhere.score);
    // A check that shows one cause alone gives it its whole sensitivity: 0.5 ⊕ 0.9 = 0.95.
    if (target.causes.length === 1) expect(scoreOf(after, target.causes[0]!)).toBeCloseTo(combine(scoreOf(before, target.causes[0]!), sensitivity(check(target.id), target.causes[0]!)), 2);
  });

  it('lets the readings a check took into the model: a low field current measured by the check raises a weak field', async () => {
    const before = await diagnose(winder, base, engine);
    const after = await diagnose(withChecks(winder, [{ id: 'live-field-current', result: 'abnormal', readings: { fieldCurrent: 1.3, fieldVoltage: 310 } }]), base, engine);
    expect(after.expectation.quantities.fieldCurrent?.ratio).toBeCloseTo(1.3 / 2.2, 3);
    expect(scoreOf(after, 'field-weak')).toBeGreaterThan(scoreOf(before, 'field-weak'));
    expect(after.causes[0]!.evidence.some((e) => /field current 1\.3 A/.test(e.says))).toBe(true);
  });
});

describe('confirmation', () => {
  it('confirms a cause when an abnormal result leaves it clearly ahead of the others its check shows', async () => {
    const d = await diagnose(withChecks(winder, [{ id: 'live-field-current', result: 'abnormal', readings: { fieldCurrent: 1.3, fieldVoltage: 310 } }]), base, engine);
    expect(d.status).toBe('confirmed');
    expect(d.confirmed).toBe('field-weak');
    expect(d.next).toBeNull();
    expect(d.found?.returnToService.length).toBeGreaterThan(0);
  });

  it('does not confirm on an abnormal result shared by causes it cannot tell apart', async () => {
    const job: CaseFile = caseSchema.parse({ format: 'dc-case/1', machine: { connection: 'shunt', drive: 'fixed-supply' }, symptoms: ['reversed-rotation'], observations: { 'recent-work': 'rewired', 'load-kind': 'general' } });
    const d = await diagnose(withChecks(job, [{ id: 'iso-connections', result: 'abnormal' }]), base, engine);
    expect(d.status).toBe('open');
    expect(d.confirmed).toBeNull();
    // The next check is one that tells the armature from the field.
    expect(['iso-armature-polarity', 'iso-field-polarity']).toContain(d.next);
  });

  it("takes the fitter's word that a check found the fault", async () => {
    const d = await diagnose(withChecks(winder, [{ id: 'obs-drive-settings', result: 'abnormal', confirms: 'current-limit-low', finding: 'current limit at 40 %' }]), base, engine);
    expect(d.confirmed).toBe('current-limit-low');
  });

  it('says so when every useful check is done and nothing is confirmed', async () => {
    let d = await diagnose(winder, base, engine);
    const worked: WorkedCheck[] = [];
    for (let k = 0; k < 40 && d.next; k++) {
      worked.push({ id: d.next, result: 'normal' });
      d = await diagnose(withChecks(winder, worked), base, engine);
    }
    expect(d.status).toBe('exhausted');
    expect(d.confirmed).toBeNull();
    expect(new Set(worked.map((w) => w.id)).size).toBe(worked.length); // no check proposed twice
  });
});

describe('the loop keeps the safety rules after every result', () => {
  const recorded = readdirSync(CASES_DIR).filter((f) => f.endsWith('.json')).sort();
  it('on every recorded case worked by a simulated fitter: no unsafe check, stored energy first, no check twice, no false confirmation', async () => {
    for (const name of recorded) {
      const c = loadCase(join(CASES_DIR, name));
      if (!c.ok || !c.value.outcome?.cause) continue;
      const truth = c.value.outcome.cause;
      // A cause that refines the recorded one, or the one it refines, is the same fault.
      const same = sameCause(base);
      const run = await simulateLoop(c.value, truth, base, engine, same);
      expect(run.confirmed === null || run.correct, `${name}: confirmed ${run.confirmed}, not ${truth}`).toBe(true);
      expect(new Set(run.checks).size, name).toBe(run.checks.length);
      const worked: WorkedCheck[] = [];
      for (const id of run.checks) {
        worked.push({ id, result: (shows.get(id) ?? []).some((x) => same(x, truth)) ? 'abnormal' : 'normal' });
        const job = withChecks({ ...c.value, checks: [] }, [...worked]);
        const d = await diagnose(job, base, engine);
        assertSafe(d, job, `${name} after ${worked.length} checks`);
        expect(d.checks.slice(0, worked.length).map((x) => x.id)).toEqual(worked.map((w) => w.id));
      }
    }
  });
});

describe('one job, one record', () => {
  it('keeps the checks worked through a round trip of the case file', () => {
    const file = join(CASES_DIR, '2025-07-29-resaw-brush-lead-crimp.json');
    const raw = JSON.parse(readFileSync(file, 'utf8'));
    const again = JSON.parse(stableJson(raw, caseSchema));
    expect(caseSchema.parse(again).checks).toEqual(caseSchema.parse(raw).checks);
    expect(again.checks.map((c: { id: string; result: string }) => `${c.id}:${c.result}`)).toEqual(['live-armature-voltage-current:abnormal', 'iso-cable-connections:normal', 'iso-winding-resistance:abnormal']);
  });

  it('refuses a check entry with a result that is not one of the three, naming the field', () => {
    const r = caseSchema.safeParse({ format: 'dc-case/1', machine: { connection: 'shunt' }, checks: [{ id: 'iso-brush-gear', result: 'bad' }] });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0]!.path).toEqual(['checks', 0, 'result']);
  });

  it('replays the recorded checks of every case that has them, each confirming its recorded cause', async () => {
    const files = readdirSync(CASES_DIR).filter((f) => f.endsWith('.json')).map((f) => join(CASES_DIR, f));
    const report = await checkCases(files, base);
    if (!report.ok) throw new Error('cases do not load');
    const replayed = report.value.cases.filter((c) => c.loop);
    expect(replayed.length).toBeGreaterThanOrEqual(10);
    for (const c of replayed) expect(c.loop, c.id).toMatchObject({ correct: true });
  });
});
