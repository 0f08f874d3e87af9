import { describe, expect, it } from 'vitest';
import { parseAnswer } from '../../src/dialogue/answers.js';
import { buildFlow } from '../../src/dialogue/flow.js';
import { jobFromAnswers, parseDraft, type Answer } from '../../src/dialogue/job.js';
import { rankQuestions } from '../../src/dialogue/policy.js';
import { replayCase } from '../../src/dialogue/replay.js';
import { seriesFromText } from '../../src/dialogue/series-answer.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { builtInRules, diagnoseJob } from '../support/rules.js';

const flow = buildFlow(builtInRules());
const question = (id: string) => flow.all.get(id)!;
const shunt = { connection: 'shunt' as const, drive: 'fixed-supply' as const, nameplate: { armatureVoltage: 220, armatureCurrent: 48, speed: 1500, power: 9000, fieldVoltage: 220, fieldCurrent: 0.88 } };
const openLine = `${Array.from({ length: 24 }, (_, i) => (i === 6 ? 40 : 1.9)).join(' ')} mV lap`;

describe('a series typed in the dialogue', () => {
  it('reads the readings, the unit and the winding from one line', () => {
    expect(seriesFromText('barToBar', '1.9 1.9 41 1.9 1.9 mV wave 4-pole')).toEqual({ ok: true, count: 5, input: { method: 'voltage-drop', unit: 'mV', winding: 'wave', poles: 4, values: [1.9, 1.9, 41, 1.9, 1.9] }, says: expect.stringContaining('open between bars 3 and 4') });
    expect(seriesFromText('barToBar', '12 12 250 12 uohm')).toEqual(expect.objectContaining({ input: expect.objectContaining({ method: 'resistance', unit: 'uohm' }) }));
  });

  it('refuses a line it cannot read, saying what to give', () => {
    expect(parseAnswer(question('bar-to-bar-series'), '1.9 1.9 41')).toEqual({ ok: false, reason: 'give the unit of the readings after them, e.g. "1.9 1.9 41 1.9 mV"' });
    expect(parseAnswer(question('pole-drop-series'), '55 55 41 V')).toEqual({ ok: false, reason: 'say whether the test supply was ac or dc, e.g. "55 55 41 55 V ac"' });
    expect(parseAnswer(question('bar-to-bar-series'), '1.9 -1.9 1.9 mohm')).toEqual({ ok: false, reason: 'reading 2: "-1.9 mohm" is negative; a resistance here is a magnitude' });
  });

  it('puts the series into the job, where it changes the diagnosis', async () => {
    const parsed = parseAnswer(question('bar-to-bar-series'), openLine);
    expect(parsed.ok && parsed.shown).toContain('24 readings: open between bars 7 and 8');
    if (!parsed.ok) return;
    const answers: Answer[] = [{ questionId: 'bar-to-bar-series', target: question('bar-to-bar-series').target, value: parsed.value, shown: parsed.shown, at: '' }];
    const draft = parseDraft({ ...jobFromAnswers(answers, shunt) });
    expect(draft.ok && draft.job.tests?.barToBar?.values).toHaveLength(24);
    if (!draft.ok) return;
    const d = await diagnoseJob({ machine: shunt, symptoms: ['sparking'], tests: draft.job.tests });
    expect(d.causes[0]?.id).toBe('armature-coil-open');
  });

  it('is worth asking when the armature coil causes lead', async () => {
    const d = await diagnoseJob({ machine: shunt, symptoms: ['sparking'], observations: { 'present-state': 'isolated', 'sparking-where': 'one-spot-on-commutator', 'commutator-surface': 'burnt-bars-regular-spacing' } });
    const ranked = rankQuestions(flow.policy, d, () => true).map((c) => c.question.id);
    expect(ranked.indexOf('bar-to-bar-series')).toBeLessThan(5);
  });

  it('is answered from a case file\'s series when a case is replayed', async () => {
    const base = builtInRules();
    const raw = {
      format: 'dc-case/1' as const,
      machine: shunt,
      symptoms: ['sparking' as const],
      observations: { 'present-state': 'isolated' as const, 'sparking-where': 'one-spot-on-commutator' as const },
      tests: { barToBar: { method: 'voltage-drop' as const, unit: 'mV', winding: 'lap' as const, values: openLine.split(' ').slice(0, 24).map(Number) } },
    };
    const r = await replayCase(raw, buildFlow(base), buildEngine(base));
    expect(r.questionsAsked).toContain('bar-to-bar-series');
    expect(r.diagnosis.causes[0]?.id).toBe('armature-coil-open');
  });
});
