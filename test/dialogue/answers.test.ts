import { describe, expect, it } from 'vitest';
import { parseAnswer } from '../../src/dialogue/answers.js';
import { machineQuestions } from '../../src/dialogue/questions.js';

const q = (id: string) => machineQuestions().find((x) => x.id === id)!;
const reason = (id: string, text: string) => {
  const r = parseAnswer(q(id), text);
  return r.ok ? `accepted as ${r.shown}` : r.reason;
};

describe('choices as typed', () => {
  it('take a number, a word, a unique prefix or a unique word of the label', () => {
    expect(reason('connection', '2')).toBe('accepted as shunt');
    expect(reason('connection', 'shunt')).toBe('accepted as shunt');
    expect(reason('cooling', 'blower')).toBe('accepted as separate blower');
    expect(reason('drive', 'contr')).toBe('accepted as controlled converter (drive)');
  });

  it('suggest what a slip of the keyboard meant', () => {
    expect(reason('connection', 'shnt')).toContain('(did you mean "shunt"?)');
    expect(reason('connection', 'seires')).toContain('(did you mean "series"?)');
  });

  it('name the choices an ambiguous word fits', () => {
    expect(reason('cooling', 'fan')).toContain('(did you mean "shaft fan" or "no fan"?)');
  });

  it('say only what was wrong when nothing is close', () => {
    expect(reason('connection', 'zzz')).toBe('"zzz" is not one of the choices: give its number (1–7) or its word');
  });
});
