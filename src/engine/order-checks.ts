/**
 * Orders the checks still to do.
 *
 * Safety first: when a runaway warning applies, the machine is not run again to look, so isolated
 * checks come first; after an earth-fault or overcurrent trip the insulation and winding tests
 * that clear the fault head them, and nothing is energised before them. Otherwise the observe and
 * live-test checks come before the isolated ones, so the machine is isolated once; and once it
 * stands isolated, the isolated checks still worth doing come before anything that re-energises it.
 *
 * Within a group, checks go in falling order of their value per minute (see loop.ts): the
 * least-cost testing order of search theory (Mitten, 1960; Kadane and Simon, 1977; from memory).
 */
import type { Check } from '../knowledge/rulebase-schema.js';
import { compareIds } from './compare-ids.js';

export interface CauseChecks {
  id: string;
  checks: string[];
}

export interface OrderedCheck {
  check: Check;
  causes: string[];
}

/** normal: look and test live, then isolate once; isolate-first: isolated checks first; clear-fault-first: and the fault-clearing tests at their head. */
export type CheckOrder = 'normal' | 'isolate-first' | 'clear-fault-first';

export function orderChecks(causes: CauseChecks[], checks: Check[], value: (check: Check) => number, opts: { order: CheckOrder; isolatedNow?: boolean }): OrderedCheck[] {
  const byId = new Map(checks.map((c) => [c.id, c]));
  const causesOf = new Map<string, string[]>();
  for (const cause of causes) {
    for (const id of cause.checks) causesOf.set(id, [...(causesOf.get(id) ?? []), cause.id]);
  }
  // Looking without running the machine (a drive's keypad, a nameplate) energises nothing: after a
  // warning it may come whenever it is worth most.
  const looksOnly = (c: Check) => c.state === 'observe' && !c.running;
  const group = (c: Check): number => {
    if (opts.order === 'clear-fault-first') return c.state === 'isolated' ? (c.clearsFaultBeforeEnergising ? 0 : 1) : looksOnly(c) ? 1 : 2;
    if (opts.order === 'isolate-first') return c.state === 'isolated' || looksOnly(c) ? 0 : 1;
    if (opts.isolatedNow) return c.state === 'isolated' ? 0 : 1;
    return c.state === 'isolated' ? 1 : 0;
  };
  const values = new Map([...causesOf.keys()].filter((id) => byId.has(id)).map((id) => [id, value(byId.get(id)!)]));
  return [...values.keys()]
    .map((id) => ({ check: byId.get(id)!, causes: causesOf.get(id)! }))
    .sort((a, b) => group(a.check) - group(b.check) || values.get(b.check.id)! - values.get(a.check.id)! || compareIds(a.check.id, b.check.id));
}
