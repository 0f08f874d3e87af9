import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { evidenceLines } from '../../src/report/evidence-lines.js';
import { describeTree } from '../../src/engine/explain.js';
import { loadCase } from '../../src/knowledge/load-case.js';
import { diagnose } from '../../src/engine/diagnose.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { OBSERVATIONS } from '../../src/knowledge/vocabulary.js';
import type { Expectation } from '../../src/model/expected.js';
import { builtInRules, CASES_DIR } from '../support/rules.js';

const none: Expectation = { quantities: {}, missing: [], assumptions: [], findings: [] };
/** Answer ids that are not words: "grows-with-load", "only-at-start". */
const ANSWER_IDS = Object.values(OBSERVATIONS).flatMap((o) => Object.keys(o.values).filter((k) => k.includes('-')));

describe('evidence in words', () => {
  it('says an observation by its answer words, not its id', () => {
    const tree = { all: [{ fact: 'sparking-with-load', operator: 'is', value: 'grows-with-load', factResult: 'grows-with-load', result: true }] };
    expect(describeTree(tree, none)).toBe('how sparking changes with load: grows with load');
  });

  it('says a yes-or-no trait of the machine as a sentence', () => {
    const has = { all: [{ fact: 'hasShuntField', operator: 'equal', value: true, factResult: true, result: true }] };
    const hasNot = { all: [{ fact: 'hasSeriesField', operator: 'equal', value: false, factResult: false, result: true }] };
    expect(describeTree(has, none)).toBe('the machine has a shunt field');
    expect(describeTree(hasNot, none)).toBe('the machine has no series field');
  });

  it('says each thing seen once per cause', () => {
    const lines = evidenceLines([
      { weight: 0.5, says: 'runs faster than it should' },
      { weight: 0.3, says: 'speed 2010 rpm is 127 %; runs faster than it should' },
      { weight: 0.2, says: 'runs faster than it should' },
      { weight: -0.2, says: 'the machine has a shunt field' },
    ]);
    expect(lines).toEqual([
      { supports: true, says: 'runs faster than it should' },
      { supports: true, says: 'speed 2010 rpm is 127 %' },
      { supports: false, says: 'the machine has a shunt field' },
    ]);
  });

  it('on every recorded case: no answer id, no true or false, no line or part twice', async () => {
    const base = builtInRules();
    const engine = buildEngine(base);
    const problems: string[] = [];
    for (const f of readdirSync(CASES_DIR).filter((x) => x.endsWith('.json'))) {
      const c = loadCase(join(CASES_DIR, f));
      if (!c.ok) throw new Error(f);
      const d = await diagnose(c.value, base, engine);
      for (const cause of d.causes) {
        const parts = evidenceLines(cause.evidence).flatMap((l) => l.says.split('; '));
        if (new Set(parts).size !== parts.length) problems.push(`${f} ${cause.id}: a part said twice`);
        for (const p of parts) {
          if (/: (true|false)\b/.test(p)) problems.push(`${f} ${cause.id}: "${p}"`);
          const id = ANSWER_IDS.find((a) => new RegExp(`(^|[\\s:])${a}($|[\\s;,.])`).test(p));
          if (id) problems.push(`${f} ${cause.id}: "${p}" says the id ${id}`);
        }
      }
    }
    expect(problems).toEqual([]);
  });
});
