import { describe, expect, it } from 'vitest';
import { wrapText } from '../../src/shell/wrap.js';
import { runCli } from '../support/cli.js';

const longest = (text: string) => Math.max(...text.split('\n').map((l) => [...l].length));

describe('wrapText', () => {
  it('wraps under the text a list marker starts', () => {
    expect(wrapText('  - brush contact drop taken as 2 V total', 24)).toBe('  - brush contact drop\n    taken as 2 V total');
    expect(wrapText('12. Measure winding resistances at a known current', 30)).toBe('12. Measure winding\n    resistances at a known\n    current');
    expect(wrapText('!! DANGER — the machine is running away', 24)).toBe('!! DANGER — the machine\n   is running away');
  });
  it('cuts a word longer than the line', () => {
    const t = wrapText('Wrote /a/very/long/path/that/cannot/fit/in/twenty/five/columns.json', 25);
    expect(longest(t)).toBeLessThanOrEqual(25);
    expect(t.replace(/\n/g, '').replace(/ /g, '')).toBe('Wrote/a/very/long/path/that/cannot/fit/in/twenty/five/columns.json');
  });
  it('leaves lines that fit, and table rows, as they are', () => {
    expect(wrapText('short line', 40)).toBe('short line');
    const row = 'speed                      2010 rpm  1586 rpm  127 %  !';
    expect(wrapText(row, 30)).toBe(row);
  });
});

describe('every text output fits COLUMNS', () => {
  const demo = 'cases/2026-10-14-press-feed-field-weak.json';
  it.each([50, 60, 80])('at %i columns, no line is wider', (columns) => {
    for (const args of [['diagnose', demo], ['diagnose', demo, '--adaptive'], ['expect', demo], ['cases', 'check'], ['--help'], ['help', 'rules'], ['diagnose', '--help']]) {
      const r = runCli(args, { env: { COLUMNS: String(columns) } });
      expect(longest(r.stdout), `${args.join(' ')}: ${r.stdout.split('\n').find((l) => [...l].length > columns)}`).toBeLessThanOrEqual(columns);
    }
  });
});
