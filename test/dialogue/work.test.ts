import { describe, expect, it } from 'vitest';
import { promptsFor, workAnswerProblem, type WorkEntry, type WorkRules } from '../../src/dialogue/work.js';
import { jobFromAnswers, parseDraft } from '../../src/dialogue/job.js';

const apprentice: WorkRules = { role: 'apprentice', apprenticesMayTestLive: true };
const [authorisedBy, authorisation] = promptsFor('started', true);
const signedOff = promptsFor('done', true).find((p) => p.id === 'signed-off-by')!;

describe("an apprentice's supervision", () => {
  it('refuses the apprentice as their own supervisor, however the name is written', () => {
    expect(workAnswerProblem(authorisedBy!, 'T. Apprentice', { worker: 'T. Apprentice', rules: apprentice })).toMatch(/someone other than you/);
    expect(workAnswerProblem(authorisedBy!, 't apprentice', { worker: 'T. Apprentice', rules: apprentice })).toMatch(/someone other than you/);
    expect(workAnswerProblem(signedOff, 'T.Apprentice', { worker: 'T. Apprentice', rules: apprentice })).toMatch(/someone other than you/);
    expect(workAnswerProblem(authorisedBy!, 'R. Lead', { worker: 'T. Apprentice', rules: apprentice })).toBeUndefined();
  });

  it('refuses remote authorisation of a live or isolated check unless the site allows it', () => {
    expect(workAnswerProblem(authorisation!, 'remote', { worker: 'T. Apprentice', rules: apprentice })).toMatch(/supervisor must be present/);
    expect(workAnswerProblem(authorisation!, 'remote', { worker: 'T. Apprentice', rules: { ...apprentice, remoteAuthorisationAllowed: true } })).toBeUndefined();
    expect(workAnswerProblem(authorisation!, 'present', { worker: 'T. Apprentice', rules: apprentice })).toBeUndefined();
  });
});

describe('checks worked in the dialogue become the case file\'s record', () => {
  it('folds a check started and done into one entry, with its result, readings in their units, finding and supervision', () => {
    const work: WorkEntry[] = [
      { check: 'live-armature-voltage-current', kind: 'started', at: '2026-12-02T09:00:00Z', by: 'T. Apprentice', authorisedBy: 'R. Lead', authorisation: 'present' },
      { check: 'live-armature-voltage-current', kind: 'done', at: '2026-12-02T09:12:00Z', by: 'T. Apprentice', signedOffBy: 'R. Lead', result: 'abnormal', readings: { armatureVoltage: '330 V', armatureCurrent: '1200mA' }, finding: 'low at the terminals' },
    ];
    const draft = jobFromAnswers([], { connection: 'shunt', nameplate: { armatureVoltage: '400 V' } }, work);
    const parsed = parseDraft(draft);
    if (!parsed.ok) throw new Error(parsed.reason);
    expect(parsed.job.checks).toEqual([
      { id: 'live-armature-voltage-current', result: 'abnormal', readings: { armatureVoltage: 330, armatureCurrent: 1.2 }, finding: 'low at the terminals', by: 'T. Apprentice', at: '2026-12-02T09:12:00Z', startedAt: '2026-12-02T09:00:00Z', authorisedBy: 'R. Lead', authorisation: 'present', signedOffBy: 'R. Lead' },
    ]);
  });

  it('asks what a check takes by name and unit, a result first, and whether an abnormal one found the fault', () => {
    const check = { takes: { readings: ['fieldCurrent'], observations: ['field-coils-equal'] } };
    const prompts = promptsFor('done', false, false, { check, confirmable: [{ value: 'field-weak', label: 'Field weak' }], got: { result: 'abnormal' } });
    expect(prompts.map((p) => p.id)).toEqual(['result', 'reading:fieldCurrent', 'observation:field-coils-equal', 'finding', 'confirms']);
    expect(prompts[1]!.prompt).toBe('Shunt or separate field current? (in A; Enter to skip)');
    expect(workAnswerProblem(prompts[1]!, '12 V')).toMatch(/current/);
    expect(workAnswerProblem(prompts[1]!, '0.6 A')).toBeUndefined();
    expect(promptsFor('done', false, false, { check, got: { result: 'normal' } }).map((p) => p.id)).not.toContain('confirms');
  });
});
