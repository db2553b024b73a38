import { describe, expect, it } from 'vitest';
import poissonPmf from '@stdlib/stats-base-dists-poisson-pmf';
import { Decimal } from 'decimal.js';
import { MAX_QT, foxGlynn } from '../../../solvers/uniformization/foxGlynn.js';

// Reference: @stdlib/stats-base-dists-poisson-pmf 0.2.3 (computes exp(k ln λ − λ − ln k!)).
// Its relative accuracy degrades with the size of the exponent's terms: against the 50-digit
// decimal.js recursion below it is off by up to ~2e-11 at λ = 1e4 (where our weights are within
// 7e-13), hence the tolerance 5e-15·λ for the library comparison.
const libraryRelError = (lambda: number): number => 5e-15 * Math.max(1, lambda);

function tailByLibrary(lambda: number, left: number, right: number): number {
  let t = 0;
  for (let k = 0; k < left; k++) t += poissonPmf(k, lambda);
  // Far beyond R the terms fall faster than geometrically; 40·√λ + 60 more terms cover them.
  const end = right + Math.ceil(40 * Math.sqrt(lambda)) + 60;
  for (let k = right + 1; k <= end; k++) t += poissonPmf(k, lambda);
  return t;
}

describe('foxGlynn against @stdlib/stats-base-dists-poisson-pmf 0.2.3', () => {
  for (const lambda of [1e-3, 0.02, 0.7, 1, 3.5, 17, 100, 999.5, 1e4]) {
    for (const eps of [1e-6, 1e-12]) {
      it(`λ = ${lambda}, ε = ${eps}: weights within the window and the neglected mass`, () => {
        const w = foxGlynn(lambda, eps);
        expect(w.left).toBeLessThanOrEqual(Math.floor(lambda));
        expect(w.right).toBeGreaterThanOrEqual(Math.floor(lambda));
        expect(w.weights.length).toBe(w.right - w.left + 1);
        let worst = 0;
        for (let k = w.left; k <= w.right; k++) {
          const p = poissonPmf(k, lambda);
          const rel = Math.abs(w.weights[k - w.left]! / w.totalWeight - p) / p;
          if (rel > worst) worst = rel;
        }
        // Normalising over the window inflates every weight by 1/(1 − δ), δ ≤ tailBound ≤ ε.
        expect(worst).toBeLessThanOrEqual(w.tailBound * 1.01 + w.roundingBound + libraryRelError(lambda));
        const tail = tailByLibrary(lambda, w.left, w.right);
        expect(tail).toBeLessThanOrEqual(w.tailBound * (1 + libraryRelError(lambda)));
        expect(w.tailBound).toBeLessThanOrEqual(eps * (1 + 2 * w.roundingBound));
        // Not wastefully loose: the geometric bounds overshoot the true tail by a modest factor only.
        expect(w.tailBound).toBeLessThanOrEqual(1e3 * tail + 1e-3 * eps);
      });
    }
  }
});

// A more precise reference: decimal.js 10.6.0 at 50 digits, p(0) = e^{−λ}, p(k) = p(k−1)·λ/k.
describe('foxGlynn against a 50-digit decimal.js recursion', () => {
  for (const lambda of [250.25, 1e4, 1e5]) {
    it(`λ = ${lambda}, ε = 1e-12: every weight within δ + rounding of the exact Poisson probability`, () => {
      const D = Decimal.clone({ precision: 50 });
      const w = foxGlynn(lambda, 1e-12);
      const lam = new D(lambda);
      let p = lam.neg().exp();
      let worst = 0;
      for (let k = 1; k <= w.right; k++) {
        p = p.times(lam).div(k);
        if (k < w.left) continue;
        const rel = new D(w.weights[k - w.left]! / w.totalWeight).minus(p).abs().div(p).toNumber();
        if (rel > worst) worst = rel;
      }
      expect(worst).toBeLessThanOrEqual(w.tailBound * 1.01 + w.roundingBound);
    });
  }
});

describe('foxGlynn stability over λT from 1e-6 to 1e7', () => {
  for (const qt of [1e-6, 1e-4, 0.5, 50, 5e3, 1e5, 1e6, MAX_QT]) {
    it(`qt = ${qt}: finite positive weights, no underflow, mode weight 1`, () => {
      const w = foxGlynn(qt, 1e-10);
      expect(Number.isFinite(w.totalWeight)).toBe(true);
      let min = Infinity;
      let max = 0;
      for (const x of w.weights) {
        min = Math.min(min, x);
        max = Math.max(max, x);
      }
      expect(max).toBe(1);
      expect(min).toBeGreaterThan(1e-200); // far from the subnormal range
      expect(w.tailBound).toBeLessThanOrEqual(1e-10 * (1 + 2 * w.roundingBound));
      // The window is O(√(qt log 1/ε)) wide around the mode (common practice, no source): ±12√qt + 40 is ample.
      expect(w.right - w.left).toBeLessThanOrEqual(24 * Math.sqrt(qt) + 80);
    });
  }
  it('qt = 0 is a single weight', () => {
    const w = foxGlynn(0, 1e-9);
    expect([w.left, w.right, w.totalWeight, w.tailBound]).toEqual([0, 0, 1, 0]);
  });
  it('refuses what it cannot do', () => {
    expect(() => foxGlynn(-1, 1e-6)).toThrow(RangeError);
    expect(() => foxGlynn(Number.NaN, 1e-6)).toThrow(RangeError);
    expect(() => foxGlynn(MAX_QT * 1.01, 1e-6)).toThrow(/exceeds/);
    expect(() => foxGlynn(1, 0)).toThrow(RangeError);
    expect(() => foxGlynn(1, 1)).toThrow(RangeError);
  });
});

// The Poisson fact (common practice, no source): the probability of more than k events in time ε at
// rate λ is at most (λε)^{k+1}/(k+1)! (Taylor remainder of e^{λε} times e^{−λε} ≤ 1).
describe('more than k events in a short interval', () => {
  const factorial = (n: number): number => (n <= 1 ? 1 : n * factorial(n - 1));
  for (const le of [1e-6, 1e-3, 0.05, 0.4]) {
    it(`λε = ${le}: the library tail and our right truncation obey (λε)^{k+1}/(k+1)!`, () => {
      for (let k = 0; k <= 6; k++) {
        let tail = 0;
        for (let j = k + 1; j < k + 40; j++) tail += poissonPmf(j, le);
        expect(tail).toBeLessThanOrEqual((le ** (k + 1) / factorial(k + 1)) * (1 + 1e-12));
      }
      // Our window should not need more terms than the Poisson fact asks for (one extra at most).
      const eps = 1e-12;
      let kFact = 0;
      while (le ** (kFact + 1) / factorial(kFact + 1) > eps / 2) kFact++;
      const w = foxGlynn(le, eps);
      expect(w.left).toBe(0);
      expect(w.right).toBeLessThanOrEqual(kFact + 1);
    });
  }
});
