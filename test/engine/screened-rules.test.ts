/**
 * The screen that leaves rules out of a run (src/engine/run-rules.ts) leaves out only rules the
 * engine would have failed: on every recorded case, and on each case after each of its worked
 * checks, the rules that fire with the screen are those that fire without it, with the same
 * condition trees (the explanations are built from them).
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { RuleResult } from 'json-rules-engine';
import { jobFacts } from '../../src/engine/facts.js';
import { buildEngine, runToFixpoint, type ScreenedRules } from '../../src/engine/run-rules.js';
import { analyseTests } from '../../src/engine/series-analyses.js';
import type { CaseFile } from '../../src/knowledge/case-schema.js';
import { loadCase } from '../../src/knowledge/load-case.js';
import { computeExpectations } from '../../src/model/expected.js';
import { builtInRules, CASES_DIR } from '../support/rules.js';

const base = builtInRules();
const engine = buildEngine(base);

const fired = (results: RuleResult[]) => results.map((r) => ({ name: String(r.name), tree: r.toJSON(false).conditions })).sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));

/** The job with a prefix of its worked checks' readings and observations laid over its own. */
function jobs(c: CaseFile): CaseFile[] {
  const out: CaseFile[] = [{ ...c, checks: [] }];
  let job = { ...c, checks: [] };
  for (const w of c.checks ?? []) {
    job = { ...job, readings: { ...job.readings, ...w.readings }, observations: { ...job.observations, ...w.observations } };
    out.push(job);
  }
  return out;
}

async function sameWithAndWithout(rules: ScreenedRules, facts: Record<string, unknown>): Promise<number> {
  const screened = fired((await rules.run(facts)).results);
  expect(screened).toEqual(fired((await rules.runAll(facts)).results));
  return screened.length;
}

/** A job changed as another job on the same machine might be: readings moved, some observations and symptoms not there. */
function variant(c: CaseFile, random: () => number): CaseFile {
  const readings = Object.fromEntries(Object.entries(c.readings ?? {}).map(([k, v]) => [k, typeof v === 'number' ? v * (0.6 + 0.8 * random()) : v]));
  const observations = Object.fromEntries(Object.entries(c.observations ?? {}).filter(() => random() > 0.3));
  const symptoms = (c.symptoms ?? []).filter(() => random() > 0.3);
  return { ...c, readings, observations, symptoms, checks: [] };
}

/** A small seeded generator (mulberry32), so a failure can be run again. */
function seeded(seed: number): () => number {
  let a = seed;
  return () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const sortedNames = (results: RuleResult[]) => results.map((r) => String(r.name)).sort();

describe('the screened rule runs', () => {
  const files = readdirSync(CASES_DIR).filter((f) => f.endsWith('.json'));

  it('fire what the whole rule base fires, on every recorded case and after each worked check', async () => {
    let runs = 0;
    let firing = 0;
    for (const file of files) {
      const c = loadCase(join(CASES_DIR, file));
      if (!c.ok) throw new Error(file);
      for (const job of jobs(c.value)) {
        const expectation = computeExpectations({ machine: job.machine, readings: job.readings ?? {} });
        const start = jobFacts(job, expectation, analyseTests(job));
        const settled = (await runToFixpoint(engine, base, start)).facts;
        firing += await sameWithAndWithout(engine.derive, start);
        firing += await sameWithAndWithout(engine.judge, settled);
        runs += 2;
      }
    }
    // Enough runs, and enough rules firing in them, that the comparison means something.
    expect(runs).toBeGreaterThanOrEqual(2 * files.length);
    expect(firing).toBeGreaterThan(20 * files.length);
  });

  it('decide, without the engine where a screen judges a whole condition, what the engine fires: on every recorded case, after each worked check, and on 5 variants of each', async () => {
    const random = seeded(43);
    let decided = 0;
    for (const file of files) {
      const c = loadCase(join(CASES_DIR, file));
      if (!c.ok) throw new Error(file);
      for (const job of [...jobs(c.value), ...Array.from({ length: 5 }, () => variant(c.value, random))]) {
        const start = jobFacts(job, computeExpectations({ machine: job.machine, readings: job.readings ?? {} }), analyseTests(job));
        const settled = (await runToFixpoint(engine, base, start)).facts;
        for (const [rules, facts] of [[engine.derive, start], [engine.judge, settled]] as const) {
          const names = (await rules.decide(facts)).sort();
          expect(names, file).toEqual(sortedNames((await rules.runAll(facts)).results));
          decided += names.length;
        }
      }
    }
    expect(decided).toBeGreaterThan(40 * files.length);
  });

  it('settle, rerunning only the rules that read a fact just derived, where rerunning every rule settles', async () => {
    let derivations = 0;
    for (const file of files) {
      const c = loadCase(join(CASES_DIR, file));
      if (!c.ok) throw new Error(file);
      for (const job of jobs(c.value)) {
        const start = jobFacts(job, computeExpectations({ machine: job.machine, readings: job.readings ?? {} }), analyseTests(job));
        // The plain fixpoint: every derive rule, unscreened, until no fact is added.
        let facts: Record<string, unknown> = { ...start };
        let derivedHere: RuleResult[] = [];
        for (;;) {
          derivedHere = (await engine.derive.runAll(facts)).results;
          const added = derivedHere.map((r) => base.rules.find((x) => x.rule.name === r.name)!.rule).flatMap((r) => (r.kind === 'derive' && facts[r.derive] !== true ? [r.derive] : []));
          if (added.length === 0) break;
          facts = { ...facts, ...Object.fromEntries(added.map((f) => [f, true])) };
        }
        const settled = await runToFixpoint(engine, base, start);
        expect(settled.facts, `${file}`).toEqual(facts);
        const derivedThere = settled.fired.filter((f) => f.rule.kind === 'derive').map((f) => ({ name: f.rule.name, tree: f.tree }));
        expect(derivedThere, `${file}`).toEqual(fired(derivedHere));
        derivations += derivedThere.length;
      }
    }
    // Enough derivations that the comparison means something.
    expect(derivations).toBeGreaterThan(2 * files.length);
  });
});
