import { describe, expect, it } from 'vitest';
import { promptsFor, workAnswerProblem, type WorkRules } from '../../src/dialogue/work.js';

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
