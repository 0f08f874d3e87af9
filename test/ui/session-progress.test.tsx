/**
 * Answers at a check's prompts (the isolation record among them) and at the outcome's are saved
 * as they are typed: a dialogue stopped between two of them resumes at the next one, with nothing lost.
 */
import { describe, expect, it } from 'vitest';
import { renderDialogue } from '../support/dialogue.js';

/** An invented job: a shunt-wound winder running fast with its field rheostat burnt. */
async function openJob(d: ReturnType<typeof renderDialogue>) {
  for (const line of ['', 'running', '1', 'shunt', 'fixed', 'shaft fan', '220 V', '24 A', '1500 rpm', '4,5 kW', '220 V', '0.8 A', 'F', 'WO-9001', 'winder 2', 'A. Fitter', '3', 'done']) await d.type(line);
}

function resumeFrom(first: ReturnType<typeof renderDialogue>) {
  const last = first.sessions.at(-1)!;
  first.unmount();
  return renderDialogue({ initialAnswers: last.answers, initialWork: last.work, initialProgress: last.progress });
}

describe('a session stopped at a prompt after the result', () => {
  it('keeps the isolation points and locks typed before the stop, and asks for the rest', async () => {
    const first = renderDialogue();
    await openJob(first);
    const screen = first.screen();
    const checks = screen.slice(screen.lastIndexOf('Checks, in order:')).split('\n').filter((l) => /^ ?\d+\. /.test(l));
    const isolated = checks.findIndex((l) => /\[isolated/.test(l)) + 1;
    expect(isolated).toBeGreaterThan(0);
    await first.type(`start ${isolated}`);
    await first.type('Isolator Q3');
    await first.type('L-12');
    expect(first.sessions.at(-1)!.progress.pendingWork?.got).toEqual({ 'isolation-points': 'Isolator Q3', locks: 'L-12' });

    const again = resumeFrom(first);
    await again.type('causes'); // any line: waits for the result to come back
    expect(again.lastFrame()).toContain('Who proved it dead');
    await again.type('R. Lead');
    await again.type('tester T-7');
    const work = again.sessions.at(-1)!.work;
    expect(work.at(-1)!.isolation).toEqual({ points: 'Isolator Q3', locks: 'L-12', provedDeadBy: 'R. Lead', tester: 'tester T-7' });
    again.unmount();
  });

  it('keeps the outcome answered so far and goes on from the next recording question', async () => {
    const first = renderDialogue();
    await openJob(first);
    await first.type('record');
    await first.type('another');
    await first.type('field-weak');
    expect(first.sessions.at(-1)!.progress.outcome?.map((a) => a.questionId)).toEqual(['confirmed', 'catalogue-cause']);

    const again = resumeFrom(first);
    await again.type('causes');
    expect(again.lastFrame()).toContain('What was done to put it right?');
    await again.type('Replaced the field rheostat');
    await again.type('');
    await again.type('A.P.');
    const { outcomeOf } = await import('../../src/dialogue/outcome.js');
    expect(outcomeOf(again.recorded[0]!.outcome, '2026-12-01')).toMatchObject({ cause: 'field-weak', fix: 'Replaced the field rheostat', recordedBy: 'A.P.' });
    again.unmount();
  });
});
