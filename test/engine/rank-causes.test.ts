/**
 * `cases check` scores with rankCauses, which stops where the ranking and the confirmation are
 * known. On every recorded case, and after each of its worked checks, it must rank exactly what a
 * full diagnosis ranks and confirm what it confirms.
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { diagnose, rankCauses } from '../../src/engine/diagnose.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { loadCase } from '../../src/knowledge/load-case.js';
import { builtInRules, CASES_DIR } from '../support/rules.js';

const base = builtInRules();
const engine = buildEngine(base);

describe('rankCauses', () => {
  it('ranks and confirms as diagnose does, on every recorded case and after each worked check', async () => {
    let compared = 0;
    let confirmations = 0;
    for (const file of readdirSync(CASES_DIR).filter((f) => f.endsWith('.json'))) {
      const c = loadCase(join(CASES_DIR, file));
      if (!c.ok) throw new Error(file);
      const checks = c.value.checks ?? [];
      for (let k = 0; k <= checks.length; k++) {
        const job = { ...c.value, checks: checks.slice(0, k) };
        const [full, ranking] = await Promise.all([diagnose(job, base, engine), rankCauses(job, base, engine)]);
        expect(ranking.causes, `${file} after ${k} checks`).toEqual(full.causes.map((x) => ({ id: x.id, score: x.score })));
        expect(ranking.confirmed, `${file} after ${k} checks`).toBe(full.confirmed);
        compared++;
        if (full.confirmed) confirmations++;
      }
    }
    // Enough jobs, and some confirmed, that the comparison means something.
    expect(compared).toBeGreaterThan(100);
    expect(confirmations).toBeGreaterThan(5);
  });
});
