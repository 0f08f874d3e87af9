/** Whatever is typed, the answer parser and the dialogue reducer never throw and never lose an answer. */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseAnswer } from '../../src/dialogue/answers.js';
import { buildFlow } from '../../src/dialogue/flow.js';
import { initialState, reduce, type DialogueState } from '../../src/dialogue/reducer.js';
import { parseQuantity } from '../../src/units/quantity.js';
import { builtInRules } from '../support/rules.js';

const flow = buildFlow(builtInRules());
const questions = [...flow.all.values()];
const typed = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.string({ unit: 'binary', maxLength: 60 }),
  fc.stringMatching(/^[0-9., ]{0,8}(V|A|mA|kW|rpm|r\/min|ohm|Ω|MΩ|°C|C|hp|x)?$/),
  fc.constantFrom('back', 'why', 'causes', 'safety', 'done', 'help', 'save', 'record', 'start 1', 'done 3', '', ' ', '\u001b[2J', 'line one\nline two', 'x'.repeat(5000)),
);

describe('typed answers (property tests)', () => {
  it('yield a value or a reason for every question, never an exception', () => {
    fc.assert(
      fc.property(fc.constantFrom(...questions), typed, (q, text) => {
        const r = parseAnswer(q, text);
        expect(typeof r.ok).toBe('boolean');
        if (!r.ok) expect(r.reason.length).toBeGreaterThan(0);
      }),
      { numRuns: 2000 },
    );
  });

  it('give the unit adapter a number or a coded error, whatever the text', () => {
    fc.assert(
      fc.property(typed, fc.constantFrom('voltage', 'current', 'speed', 'temperature', 'insulation', 'resistance', 'power') as fc.Arbitrary<Parameters<typeof parseQuantity>[1]>, (text, dim) => {
        const r = parseQuantity(text, dim);
        if (r.ok) expect(Number.isFinite(r.value)).toBe(true);
        else expect(typeof r.error.code).toBe('string');
      }),
      { numRuns: 2000 },
    );
  });

  it('keep every earlier answer in the dialogue reducer unless "back" takes the last one', () => {
    fc.assert(
      fc.property(fc.array(typed, { minLength: 1, maxLength: 25 }), (inputs) => {
        let s: DialogueState = initialState();
        for (const text of inputs) {
          const before = s.answers;
          s = reduce(s, { type: 'input', text, at: '2026-12-01T00:00:00Z' }, { flow });
          const back = text.trim().toLowerCase() === 'back';
          const kept = back ? before.slice(0, -1) : before;
          expect(s.answers.slice(0, kept.length)).toEqual(kept);
          expect(s.answers.length).toBeGreaterThanOrEqual(kept.length);
        }
      }),
      { numRuns: 300 },
    );
  });
});
