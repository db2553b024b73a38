/**
 * The Bernstein enclosure of a polynomial's range and of the integral of its positive part, against
 * dense evaluation in decimal arithmetic (decimal.js 10.6.0), and the textbook example x² = B_{2,2}
 * (R. T. Farouki, "The Bernstein polynomial basis: a centennial retrospective", CAGD 2012: the
 * Bernstein coefficients of x^n on [0, 1] are 0, …, 0, 1).
 */
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { bernsteinEnclosure, bernsteinWeights, polyRange } from '../../../solvers/defect/range.js';

const D = Decimal.clone({ precision: 40 });

describe('Bernstein enclosures', () => {
  it('x² on [0, 1]: coefficients 0, 0, 1 (Farouki 2012)', () => {
    const lo = new Float64Array(3);
    const hi = new Float64Array(3);
    bernsteinEnclosure(Float64Array.of(0, 0, 1), new Float64Array(3), 2, 1, bernsteinWeights(2), new Float64Array(3), lo, hi);
    [0, 0, 1].forEach((b, i) => {
      expect(lo[i]).toBeLessThanOrEqual(b);
      expect(hi[i]).toBeGreaterThanOrEqual(b);
      expect(hi[i]! - lo[i]!).toBeLessThan(1e-14);
    });
  });

  it('encloses the range and the integral of the positive part of random polynomials, uncertain coefficients included', () => {
    const arb = fc.record({
      n: fc.integer({ min: 1, max: 14 }),
      coef: fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength: 15, maxLength: 15 }),
      h: fc.double({ min: 1e-6, max: 2, noNaN: true }),
      err: fc.double({ min: 0, max: 1e-3, noNaN: true }),
    });
    fc.assert(
      fc.property(arb, ({ n, coef, h, err }) => {
        const e = Float64Array.from(coef.slice(0, n + 1));
        const de = new Float64Array(n + 1).fill(err);
        const r = { lo: 0, hi: 0 };
        polyRange(e, de, n, h, bernsteinWeights(n), r);
        const lo = new Float64Array(n + 1);
        const hi = new Float64Array(n + 1);
        bernsteinEnclosure(e, de, n, h, bernsteinWeights(n), new Float64Array(n + 1), lo, hi);
        const intBound = (h * hi.reduce((acc, b) => acc + Math.max(b, 0), 0)) / (n + 1);
        // Sampled in decimal, every coefficient moved by ±err in the direction that makes p largest/smallest.
        const N = 64;
        let integral = new D(0);
        for (let q = 0; q <= N; q++) {
          const tau = new D(h).times(q).div(N);
          let p = new D(0);
          let slackUp = new D(0);
          for (let j = n; j >= 0; j--) p = p.times(tau).plus(e[j]!);
          for (let j = n; j >= 0; j--) slackUp = slackUp.times(tau).plus(err);
          expect(p.plus(slackUp).toNumber()).toBeLessThanOrEqual(r.hi);
          expect(p.minus(slackUp).toNumber()).toBeGreaterThanOrEqual(r.lo);
          const pos = Decimal.max(p, 0);
          integral = integral.plus(q === 0 || q === N ? pos.div(2) : pos);
        }
        // The trapezoid sum exceeds the integral by at most h³·max|p″|/(12N²) (the trapezoid rule's
        // error term, common practice, no source); max|p″| ≤ Σ j(j−1)|e_j| h^{j−2}.
        let curv = 0;
        for (let j = 2; j <= n; j++) curv += j * (j - 1) * Math.abs(e[j]!) * h ** (j - 2);
        const trap = integral.times(h).div(N).toNumber();
        expect(trap).toBeLessThanOrEqual(intBound + (1.01 * h ** 3 * curv) / (12 * N * N) + 1e-300);
      }),
      { numRuns: 150, seed: 7 },
    );
  });
});
