import { describe, expect, it } from 'vitest';
import { idFromTitle } from '../../src/shell/id-from-title.js';
import { wantsColor } from '../../src/shell/color.js';
import { editDistance, nearWords } from '../../src/dialogue/edit-distance.js';
import { localDate } from '../../src/report/clock-time.js';

describe('idFromTitle', () => {
  it('keeps letters with accents as their base letters', () => {
    expect(idFromTitle('Förderband 3')).toBe('forderband-3');
    expect(idFromTitle('Pompe à eau n°2')).toBe('pompe-a-eau-n-2');
    expect(idFromTitle('Straße / Ølpumpe')).toBe('strasse-olpumpe');
    expect(idFromTitle('  --  ')).toBe('');
  });
  it('cuts long titles without a trailing dash', () => {
    expect(idFromTitle(`${'a'.repeat(59)} b`)).toBe('a'.repeat(59));
  });
});

describe('wantsColor', () => {
  const pipe = { isTTY: false };
  it('asks a terminal (which reads NO_COLOR, FORCE_COLOR, TERM)', () => {
    expect(wantsColor({ isTTY: true, hasColors: () => false }, {})).toBe(false);
    expect(wantsColor({ isTTY: true, hasColors: () => true }, {})).toBe(true);
  });
  it('colours a pipe only when FORCE_COLOR asks for it', () => {
    expect(wantsColor(pipe, {})).toBe(false);
    expect(wantsColor(pipe, { FORCE_COLOR: '1' })).toBe(true);
    expect(wantsColor(pipe, { FORCE_COLOR: '' })).toBe(true);
    expect(wantsColor(pipe, { FORCE_COLOR: '0' })).toBe(false);
    expect(wantsColor(pipe, { FORCE_COLOR: 'false' })).toBe(false);
  });
});

describe('editDistance', () => {
  it('counts a swap of two neighbouring letters as one edit', () => {
    expect(editDistance('jsno', 'json')).toBe(1);
    expect(editDistance('diagnsoe', 'diagnose')).toBe(1);
    expect(editDistance('kitten', 'sitting')).toBe(3); // the textbook Levenshtein example
  });
  it('suggests only words a slip away', () => {
    expect(nearWords('chekc', ['check', 'add'])).toEqual(['check']);
    expect(nearWords('frobnicate', ['check', 'add'])).toEqual([]);
  });
});

describe('localDate', () => {
  it('is the date where the person is, not the UTC date', () => {
    const evening = new Date('2026-12-01T03:30:00Z'); // 21:30 the day before in Chicago
    expect(localDate(evening, 'America/Chicago')).toBe('2026-11-30');
    expect(localDate(evening, 'Europe/Berlin')).toBe('2026-12-01');
    expect(localDate(evening, 'UTC')).toBe('2026-12-01');
  });
});
