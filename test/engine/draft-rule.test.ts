/**
 * What a drafted rule is worth: with the rules that speak for a case's cause taken away, the
 * case drops out of its top 3; the draft from that case alone must bring it back, and no other
 * recorded case may drop out because of it.
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { CaseFile } from '../../src/knowledge/case-schema.js';
import { loadCase } from '../../src/knowledge/load-case.js';
import { crossCheck, type RuleBase } from '../../src/knowledge/load-rules.js';
import { draftFile } from '../../src/knowledge/rulebase-schema.js';
import { diagnose } from '../../src/engine/diagnose.js';
import { casesDraftFiresOn, draftFromCase, withDraft } from '../../src/engine/draft-rule.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { builtInRules, CASES_DIR } from '../support/rules.js';

const base = builtInRules();
const names = readdirSync(CASES_DIR).filter((f) => f.endsWith('.json')).sort();
const cases: CaseFile[] = names.map((n) => {
  const c = loadCase(join(CASES_DIR, n));
  if (!c.ok) throw new Error(n);
  return c.value;
});

// The rules' own ranking, before any recorded check result (as cases check ranks): a draft is judged on what the rules say.
const rankIn = async (c: CaseFile, b: RuleBase, engine = buildEngine(b)) => (await diagnose({ ...c, checks: [] }, b, engine)).causes.findIndex((x) => x.id === c.outcome?.cause) + 1;
const inTop3 = (r: number) => r >= 1 && r <= 3;

describe('a rule drafted from a case', () => {
  const restored: string[] = [];
  const conditionCounts: number[] = [];

  names.forEach((name, k) => {
    it(`${name}: the draft alone brings its cause back into the top 3 and pushes no other case out`, async () => {
      const target = cases[k]!;
      const cause = target.outcome!.cause!;
      const stripped: RuleBase = { ...base, rules: base.rules.filter(({ rule }) => !(rule.kind === 'evidence' && rule.cause === cause && rule.weight > 0)) };
      expect(inTop3(await rankIn(target, stripped))).toBe(false);

      const draft = await draftFromCase(target, cases.filter((_, j) => j !== k), stripped);
      if ('error' in draft) throw new Error(draft.error);
      expect(draftFile.safeParse(draft.file).success).toBe(true);
      const withIt = withDraft(stripped, draft.file, 'drafts/x.json');
      expect(crossCheck(withIt)).toEqual([]);
      conditionCounts.push(draft.conditions);

      const after = await rankIn(target, withIt);
      expect(inTop3(after), `rank after the draft: ${after}`).toBe(true);
      restored.push(name);

      const fires = await casesDraftFiresOn(draft.file, cases, stripped);
      const engineBefore = buildEngine(stripped);
      const engineAfter = buildEngine(withIt);
      for (const [j, c] of cases.entries()) {
        if (j === k || !fires[j]) continue;
        const before = await rankIn(c, stripped, engineBefore);
        if (inTop3(before)) expect(inTop3(await rankIn(c, withIt, engineAfter)), `${names[j]} dropped out`).toBe(true);
      }
    });
  });

  it('reports how many drafts restored their case and how many conditions they have', () => {
    const sorted = [...conditionCounts].sort((a, b) => a - b);
    console.log(`drafts restoring their case to the top 3: ${restored.length} of ${names.length}; conditions per draft: median ${sorted[sorted.length >> 1]}, range ${sorted[0]}–${sorted.at(-1)}`);
    expect(restored.length).toBe(names.length);
  });
});
