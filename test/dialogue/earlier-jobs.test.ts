import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { buildFlow } from '../../src/dialogue/flow.js';
import { currentStep, initialState, reduce, type DialogueContext, type DialogueState } from '../../src/dialogue/reducer.js';
import { assetHistory, earlierJobsNote } from '../../src/engine/asset-history.js';
import { readRecordedJobs } from '../../src/shell/history.js';
import { builtInRules } from '../support/rules.js';

const DIR = fileURLToPath(new URL('../shell/history-jobs/', import.meta.url));
const ASSET = 'CT-4 cooling tower fan drive';

function recorded() {
  const jobs = readRecordedJobs(DIR);
  if (!jobs.ok) throw new Error(JSON.stringify(jobs.issues));
  return jobs.value;
}

describe('the dialogue names an asset\'s earlier jobs', () => {
  it('counts the jobs this year and says what was found last', () => {
    const h = assetHistory(ASSET, recorded(), new Map([['insulation-damp-or-dirty', 'Windings damp or contaminated']]));
    expect(earlierJobsNote(h, '2025-11-02')).toBe(
      'CT-4 cooling tower fan drive: second job this year, 4 earlier on record; last on 2025-06-20 (June): Windings damp or contaminated — Baked 8 h at 110 °C, varnished; insulation falling 54 MΩ a year, at its minimum about 2026-05-12 on that trend.',
    );
    expect(earlierJobsNote(assetHistory('New asset', recorded(), new Map()), '2025-11-02')).toBeUndefined();
  });

  it('adds the line to the transcript when the fitter names the asset', () => {
    const ctx: DialogueContext = { flow: buildFlow(builtInRules()), earlierJobs: (asset) => (asset === ASSET ? 'CT-4: third job this year' : undefined) };
    let s: DialogueState = reduce(initialState(), { type: 'begin' }, ctx);
    for (let i = 0; i < 40; i++) {
      const step = currentStep(s, ctx);
      if (step.kind !== 'ask') break;
      const q = step.question;
      const text = q.id === 'asset' ? ASSET : q.answer.kind === 'text' ? 'x' : '1';
      s = reduce(s, { type: 'input', text, at: '2026-12-01T00:00:00Z' }, ctx);
      if (q.id === 'asset') break;
    }
    expect(s.log.at(-1)).toEqual({ kind: 'note', text: 'CT-4: third job this year' });
    expect(s.log.at(-2)).toEqual(expect.objectContaining({ kind: 'answer' }));
  });
});
