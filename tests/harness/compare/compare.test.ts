import { describe, expect, it } from 'vitest';
import { compareAnswers, COMPARE_SLACK } from '../../../harness/compare/index.js';

describe('compareAnswers: |a − b| > bound_a + bound_b + 1e-15 flags a disagreement', () => {
  it('accepts a difference equal to the sum of the bounds and flags one just above it', () => {
    const a = { label: 'a', values: [0.5, 0.25], bound: 1e-6 };
    const onEdge = compareAnswers(a, { label: 'b', values: [0.5, 0.25 + 2e-6], bound: 1e-6 });
    expect(onEdge.agree).toBe(true);
    expect(onEdge.worstState).toBe(1);
    const over = compareAnswers(a, { label: 'b', values: [0.5, 0.25 + 2.1e-6], bound: 1e-6 });
    expect(over.agree).toBe(false);
    expect(over.ratio).toBeGreaterThan(1);
    expect(over.allowed).toBe(2e-6 + COMPARE_SLACK);
  });
  it('treats a NaN as a disagreement of infinite ratio', () => {
    const c = compareAnswers({ label: 'a', values: [0.1, NaN], bound: 1 }, { label: 'b', values: [0.1, 0.2], bound: 1 });
    expect(c.agree).toBe(false);
    expect(c.ratio).toBe(Infinity);
    expect(c.worstState).toBe(1);
  });
  it('is symmetric', () => {
    const a = { label: 'a', values: [0.3, 0.9], bound: 1e-9 };
    const b = { label: 'b', values: [0.3000001, 0.9], bound: 1e-8 };
    expect(compareAnswers(a, b).ratio).toBe(compareAnswers(b, a).ratio);
  });
});
