/**
 * Orders the checks that confirm or clear the ranked causes.
 *
 * Safety first: when a runaway warning applies, the machine is not run again to look, so isolated
 * checks come first; after an earth-fault or overcurrent trip the insulation and winding tests
 * that clear the fault head them, and nothing is energised before them.
 * Otherwise the observe and live-test checks come before the isolated ones, so the machine is
 * isolated once.
 *
 * Within a group, checks go in falling order of the chance they find the fault per minute they
 * take (p/c): the order that finds a single fault soonest on average when each check confirms or
 * clears its causes: the classic least-cost testing order of search theory (Mitten, 1960;
 * Kadane and Simon, 1977; references from memory).
 */
import type { Check } from '../knowledge/rulebase-schema.js';
import { compareIds } from './compare-ids.js';

export interface RankedCause {
  id: string;
  /** Share of the summed positive scores: a rough probability among the ranked causes. */
  share: number;
  checks: string[];
}

export interface OrderedCheck {
  check: Check;
  causes: string[];
}

/** normal: look and test live, then isolate once; isolate-first: isolated checks first; clear-fault-first: and the fault-clearing tests at their head. */
export type CheckOrder = 'normal' | 'isolate-first' | 'clear-fault-first';

export function orderChecks(ranked: RankedCause[], checks: Check[], order: CheckOrder): OrderedCheck[] {
  const byId = new Map(checks.map((c) => [c.id, c]));
  const causesOf = new Map<string, string[]>();
  for (const cause of ranked) {
    for (const id of cause.checks) causesOf.set(id, [...(causesOf.get(id) ?? []), cause.id]);
  }
  const share = new Map(ranked.map((c) => [c.id, c.share]));
  const worth = (id: string) => {
    const p = Math.min(1, (causesOf.get(id) ?? []).reduce((s, c) => s + (share.get(c) ?? 0), 0));
    return p / byId.get(id)!.minutes;
  };
  const group = (c: Check): number => {
    if (order === 'clear-fault-first') return c.state === 'isolated' ? (c.clearsFaultBeforeEnergising ? 0 : 1) : 2;
    if (order === 'isolate-first') return c.state === 'isolated' ? 0 : 1;
    return c.state === 'isolated' ? 1 : 0;
  };
  return [...causesOf.keys()]
    .filter((id) => byId.has(id))
    .map((id) => ({ check: byId.get(id)!, causes: causesOf.get(id)! }))
    .sort((a, b) => group(a.check) - group(b.check) || worth(b.check.id) - worth(a.check.id) || compareIds(a.check.id, b.check.id));
}
