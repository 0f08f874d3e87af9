import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readSession, sessionAnswers, writeSession } from '../../src/shell/session.js';
import { buildFlow } from '../../src/dialogue/flow.js';
import type { Answer } from '../../src/dialogue/job.js';
import type { WorkEntry } from '../../src/dialogue/work.js';
import { builtInRules } from '../support/rules.js';

describe('the session file', () => {
  it('keeps the answers and the checks worked, with their authorisations, across a restart', () => {
    const file = join(mkdtempSync(join(tmpdir(), 'dctriage-session-')), 'session.json');
    const answers: Answer[] = [{ questionId: 'present-state', target: { section: 'observations', name: 'present-state' }, value: { kind: 'one', value: 'running' }, shown: 'running', at: 't1' }];
    const work: WorkEntry[] = [{ check: 'iso-connections', kind: 'started', at: 't2', by: 'A. Fitter', authorisedBy: 'R. Lead', authorisation: 'remote', isolation: { points: 'Q4', locks: 'L-1', provedDeadBy: 'R. Lead' } }];
    writeSession(file, { rules: 'rules', answers, work });
    const back = readSession(file);
    expect(back.ok).toBe(true);
    if (!back.ok) return;
    expect(back.value.work).toEqual(work);
    const restored = sessionAnswers(file, back.value, buildFlow(builtInRules()));
    expect(restored.ok && restored.value).toEqual(answers);
  });
});
