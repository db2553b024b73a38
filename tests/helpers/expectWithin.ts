/**
 * expectWithin(actual, reference, bound): the test form of the harness's one comparator
 * (harness/compare): |actual_s − reference_s| ≤ bound (+ the comparator's slack) in every state, with
 * a message naming the worst state, both values, the difference and what was allowed.
 */
import { expect } from 'vitest';
import { compareAnswers } from '../../harness/compare/index.js';

export function expectWithin(
  actual: ArrayLike<number> | number,
  reference: ArrayLike<number> | number,
  bound: number,
  what = 'value',
): void {
  const a = typeof actual === 'number' ? [actual] : actual;
  const r = typeof reference === 'number' ? [reference] : reference;
  expect(a.length, `${what}: ${a.length} values against ${r.length} references`).toBe(r.length);
  const c = compareAnswers({ label: 'actual', values: a, bound }, { label: 'reference', values: r, bound: 0 });
  const s = c.worstState;
  expect(c.agree, `${what}[${s}]: ${a[s]} vs reference ${r[s]}, |difference| ${c.difference} > allowed ${c.allowed}`).toBe(true);
}
