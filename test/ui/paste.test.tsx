/**
 * Long and multi-line input: a paragraph pasted at a free-text prompt is one answer with every
 * line in it; a line longer than its limit is refused, naming the limit, and nothing is cut.
 */
import { describe, expect, it } from 'vitest';
import { renderDialogue } from '../support/dialogue.js';

async function toFinding(d: ReturnType<typeof renderDialogue>) {
  for (const line of ['', 'running', '1', 'shunt', 'fixed', 'shaft fan', '220 V', '24 A', '1500 rpm', '4,5 kW', '220 V', '0.8 A', 'F', 'WO-9001', 'winder 2', 'A. Fitter', '3', 'done']) await d.type(line);
  await d.type('start 1');
  for (let k = 0; k < 6 && /\? .*(Isolation points|Lock and tag|proved it dead|voltage tester)/.test(d.lastFrame() ?? ''); k++) await d.type('x');
  await d.type('done 1');
  await d.type('normal');
  for (let k = 0; k < 8 && !/What did you find/.test(d.lastFrame() ?? ''); k++) await d.type('');
  expect(d.lastFrame()).toContain('What did you find (in your words)?');
}

describe('pasted and long input', () => {
  it('keeps every line of a paragraph pasted as a finding, in one answer', async () => {
    const d = renderDialogue();
    await toFinding(d);
    await d.type('Brush 3 worn to the wear mark\nspring pressure low on two holders\r\nholder 4 loose');
    expect(d.sessions.at(-1)!.work.at(-1)).toMatchObject({ kind: 'done', finding: 'Brush 3 worn to the wear mark spring pressure low on two holders holder 4 loose' });
    d.unmount();
  });

  it('refuses a finding over 2000 characters, naming the limit, and takes one of 1500 whole', async () => {
    const d = renderDialogue();
    await toFinding(d);
    await d.type('w'.repeat(2500));
    expect(d.lastFrame()).toContain('that is 2500 characters, and text here is limited to 2000: nothing was taken');
    expect(d.lastFrame()).toContain('What did you find (in your words)?');
    await d.type('v'.repeat(1500));
    expect(d.sessions.at(-1)!.work.at(-1)!.finding).toBe('v'.repeat(1500));
    d.unmount();
  });

  it('refuses an answer over 200 characters at a choice, naming the limit', async () => {
    const d = renderDialogue();
    await d.type('');
    await d.type(`running${' '.repeat(10)}${'x'.repeat(250)}`);
    expect(d.lastFrame()).toContain('that is 258 characters, and an answer here is limited to 200: nothing was taken');
    expect(d.saved.at(-1) ?? []).toEqual([]);
    d.unmount();
  });
});
