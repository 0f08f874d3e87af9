/**
 * The bundle's deep copy (stubs/clone.cjs) against the `clone` package it stands in for: the same
 * copies, prototypes and shared objects, on what json-rules-engine copies (a rule's conditions)
 * and on the kinds of value it hands back to the package.
 */
import { createRequire } from 'node:module';
import { Rule } from 'json-rules-engine';
import { describe, expect, it } from 'vitest';

const require = createRequire(import.meta.url);
const stub = require('../../stubs/clone.cjs') as (x: unknown) => unknown;
const original = require('clone') as (x: unknown) => unknown;

class Shadowing {
  declare hidden: number;
  visible = 1;
}
Object.defineProperty(Shadowing.prototype, 'hidden', { get: () => 2, enumerable: false });

function sample(): unknown[] {
  const conditions = new Rule({
    name: 'r',
    conditions: { all: [{ fact: 'ratio', path: '$.speed', operator: 'greaterThan', value: 1.05 }, { any: [{ fact: 'symptoms', operator: 'contains', value: 'overspeed' }, { not: { condition: 'shared' } }] }] },
    event: { type: 'evidence' },
  }).conditions;
  const shared = { list: ['a', 'b'] };
  const cycle: Record<string, unknown> = { name: 'loop' };
  cycle.self = cycle;
  const withHidden = Object.defineProperty(new Shadowing(), 'hidden', { value: 5, enumerable: true });
  // An array with a hole, which a copy keeps a hole.
  const holed: number[] = [1];
  holed[2] = 3;
  // Holes at the end, which a copy leaves out, as the package does.
  const trailing = [1];
  trailing.length = 3;
  return [conditions, { twice: [shared, shared] }, cycle, withHidden, { toString: 'own' }, new Map([['k', { v: 1 }]]), new Date(0), holed, trailing, Object.create(null), 'text', 7, null];
}

describe('the deep copy json-rules-engine is bundled with', () => {
  it('copies each sample as the clone package does', () => {
    for (const value of sample()) {
      const ours = stub(value);
      const theirs = original(value);
      expect(ours).toStrictEqual(theirs);
      if (value !== null && typeof value === 'object') {
        expect(ours).not.toBe(value);
        expect(Object.getPrototypeOf(ours)).toBe(Object.getPrototypeOf(theirs));
      }
    }
  });

  it('keeps a shared object shared and a cycle a cycle', () => {
    const [, twice, cycle] = sample() as [unknown, { twice: unknown[] }, { self: unknown }];
    const copy = stub(twice) as { twice: unknown[] };
    expect(copy.twice[0]).toBe(copy.twice[1]);
    const loop = stub(cycle) as { self: unknown };
    expect(loop.self).toBe(loop);
  });

  it('leaves out what a prototype holds without a setter, as the package does', () => {
    const copy = stub(Object.assign(new Shadowing(), { visible: 3 })) as Shadowing;
    expect(Object.hasOwn(copy, 'visible')).toBe(true);
    expect(copy.hidden).toBe(2);
    expect(original(Object.assign(new Shadowing(), { visible: 3 }))).toStrictEqual(copy);
  });
});
