import { describe, expect, it } from 'vitest';
import { compareAnswers, compareAtMost, compareRange, compareWithReference, COMPARE_SLACK } from '../../../harness/compare/index.js';
import { formatRatio } from '../../../harness/numbers.js';
import { expectWithin } from '../../helpers/expectWithin.js';

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

describe('the one-sided forms, the range and references use the same rule', () => {
  it('compareAtMost: a may exceed b by the bounds, not more; a below b is fine by any amount', () => {
    const b = { label: 'b', values: [0.5], bound: 1e-6 };
    expect(compareAtMost({ label: 'a', values: [0.5 + 2e-6], bound: 1e-6 }, b).agree).toBe(true);
    expect(compareAtMost({ label: 'a', values: [0.5 + 2.1e-6], bound: 1e-6 }, b).agree).toBe(false);
    const below = compareAtMost({ label: 'a', values: [0.1], bound: 0 }, b);
    expect(below.agree).toBe(true);
    expect(below.ratio).toBe(0);
  });
  it('compareRange: values in [0, 1] up to the bound; a NaN is outside', () => {
    expect(compareRange({ label: 'a', values: [-1e-7, 1 + 1e-7], bound: 1e-7 }).agree).toBe(true);
    const low = compareRange({ label: 'a', values: [0.5, -2e-7], bound: 1e-7 });
    expect(low.agree).toBe(false);
    expect(low.worstState).toBe(1);
    expect(compareRange({ label: 'a', values: [NaN], bound: 1 }).agree).toBe(false);
  });
  it('compareWithReference: only the referenced states count, the tolerance is the reference bound', () => {
    const a = { label: 'a', values: [0.9, 0.25, 0.125], bound: 1e-9 };
    const ok = compareWithReference(a, { label: 'expect', states: [1], values: [0.25 + 1e-6], tolerance: 1e-6 });
    expect(ok.agree).toBe(true);
    const bad = compareWithReference(a, { label: 'expect', states: [0, 2], values: [0.9, 0.126], tolerance: 1e-6 });
    expect(bad.agree).toBe(false);
    expect(bad.worstState).toBe(2);
  });
  it('refuses to compare answers of different lengths', () => {
    expect(() => compareAnswers({ label: 'a', values: [1], bound: 0 }, { label: 'b', values: [1, 2], bound: 0 })).toThrow(/1 states.*2 states/);
  });
});

describe('formatRatio: three significant digits, never rounded across 1', () => {
  it.each([
    [0.9995, '0.999'],
    [0.99949, '0.999'],
    [1.0004, '1.0004'],
    [1, '1.00'],
    [0.5, '0.500'],
    [0.0123456, '0.0123'],
    [5.82e-4, '5.82e-4'],
    [12.345, '12.3'],
    [0, '0'],
    [Infinity, 'inf'],
  ])('%s → %s', (r, shown) => expect(formatRatio(r)).toBe(shown));
  it('a ratio just below 1 never reads as 1 or more, one just above never as 1 or less', () => {
    for (let e = 1; e <= 15; e++) {
      expect(Number(formatRatio(1 - 10 ** -e))).toBeLessThan(1);
      expect(Number(formatRatio(1 + 10 ** -e))).toBeGreaterThan(1);
    }
  });
});

describe('expectWithin (the test helper over the comparator)', () => {
  it('accepts a difference within the bound and rejects one beyond it, naming the state', () => {
    expectWithin([0.5, 0.25], [0.5, 0.25 + 1e-7], 1e-7);
    expect(() => expectWithin([0.5, 0.25], [0.5, 0.25 + 2e-7], 1e-7, 'v')).toThrow(/v\[1\]: 0\.25 vs reference/);
  });
});
