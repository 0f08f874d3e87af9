/** The recorded cases are the regression suite: each confirmed cause must rank in its top 3. */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadCase } from '../src/knowledge/load-case.js';
import { diagnose } from '../src/engine/diagnose.js';
import { buildEngine } from '../src/engine/run-rules.js';
import { builtInRules, CASES_DIR } from './support/rules.js';

const base = builtInRules();
const engine = buildEngine(base);
const causeIds = new Set(base.causes.map((c) => c.id));
const files = readdirSync(CASES_DIR).filter((f) => f.endsWith('.json')).sort();

describe('recorded cases', () => {
  it('exist', () => expect(files.length).toBeGreaterThan(0));

  for (const name of files) {
    it(`${name} ranks its confirmed cause in the top 3`, async () => {
      const c = loadCase(join(CASES_DIR, name), causeIds);
      if (!c.ok) throw new Error(JSON.stringify(c.issues));
      const expected = c.value.outcome?.cause;
      if (expected === undefined) return;
      const d = await diagnose(c.value, base, engine);
      expect(d.causes.slice(0, 3).map((x) => x.id)).toContain(expected);
    });
  }
});
