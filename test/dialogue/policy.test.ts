import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readJson } from '../../src/knowledge/read-json.js';
import type { CaseInput } from '../../src/knowledge/case-schema.js';
import { buildFlow } from '../../src/dialogue/flow.js';
import { rankQuestions, chooseQuestion, MIN_GAIN_BITS } from '../../src/dialogue/policy.js';
import { replayCase } from '../../src/dialogue/replay.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { sameCause } from '../../src/engine/check-cases.js';
import { builtInRules, CASES_DIR, diagnoseJob } from '../support/rules.js';

const base = builtInRules();
const flow = buildFlow(base);
const engine = buildEngine(base);
const same = sameCause(base);
const files = readdirSync(CASES_DIR).filter((f) => f.endsWith('.json')).sort();

describe('adaptive replay of the recorded cases', () => {
  for (const name of files) {
    it(`${name}: the policy's questions bring the confirmed cause into the top 3`, async () => {
      const raw = readJson(join(CASES_DIR, name));
      if (!raw.ok) throw new Error(JSON.stringify(raw.issues));
      const c = raw.value as CaseInput;
      const r = await replayCase(c, flow, engine);
      // A cause that refines the recorded one, or the one it refines, counts as the same fault (as in cases check).
      expect(r.diagnosis.causes.slice(0, 3).some((x) => same(x.id, c.outcome!.cause!)), `top 3: ${r.diagnosis.causes.slice(0, 3).map((x) => x.id).join(', ')}`).toBe(true);
      expect(new Set(r.questionsAsked).size).toBe(r.questionsAsked.length);
    });
  }
});

describe('the question policy', () => {
  it('never picks an isolated question while one answerable as the machine stands separates the leaders as well', async () => {
    const d = await diagnoseJob({ machine: { connection: 'shunt', nameplate: { armatureVoltage: 220, armatureCurrent: 30, speed: 1450 } }, symptoms: ['sparking'] });
    const ranked = rankQuestions(flow.policy, d, () => true).filter((c) => c.gain >= MIN_GAIN_BITS);
    const pick = chooseQuestion(flow.policy, d, () => true)!;
    const bestNear = ranked.find((c) => c.question.state !== 'isolated')!;
    if (pick.question.state === 'isolated') expect(pick.gain).toBeGreaterThan(bestNear.gain);
    else expect(pick.question.id).toBe(bestNear.question.id);
    expect(pick.question.state).not.toBe('isolated');
  });

  it('asks about sparking when sparking is the complaint', async () => {
    const d = await diagnoseJob({ machine: { connection: 'shunt' }, symptoms: ['sparking'] });
    // Without a nameplate no reading can be set against a healthy machine: only observations are open.
    const top = rankQuestions(flow.policy, d, (q) => q.target.section !== 'readings').slice(0, 3).map((c) => c.question.id);
    expect(top.some((id) => id.startsWith('sparking') || id === 'commutator-surface')).toBe(true);
  });
});
