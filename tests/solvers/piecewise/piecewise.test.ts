import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { horner } from '../../../solvers/piecewise/poly.js';
import { envelope, evaluate, integrate, linearCombination, pieceCount, single, type Piecewise } from '../../../solvers/piecewise/piecewise.js';

const EPS = 0.05;
const STRIDE = 5;
const poly = (c: number[]) => single(Float64Array.from(c), 0, c.length - 1, STRIDE, 0, EPS);
const arbPoly = (deg: number) => fc.array(fc.double({ min: -50, max: 50, noNaN: true }), { minLength: deg + 1, maxLength: deg + 1 });

describe('piecewise polynomials', () => {
  it('envelope of two crossing lines switches once at the crossing', () => {
    // 1 − 40τ and 0.2 + 0τ cross at τ = 0.02.
    const env = envelope([poly([1, -40]), poly([0.2, 0])], 1, 1);
    expect(pieceCount(env)).toBe(2);
    expect(env.breaks[1]).toBeCloseTo(0.02, 15);
    expect([...env.choice!]).toEqual([0, 1]);
    const low = envelope([poly([1, -40]), poly([0.2, 0])], -1, 1);
    expect([...low.choice!]).toEqual([1, 0]);
  });

  it('ties (identical inputs) give no breakpoint and the lower index', () => {
    const env = envelope([poly([0.3, 2, -7]), poly([0.3, 2, -7])], 1, 2);
    expect(pieceCount(env)).toBe(1);
    expect(env.choice![0]).toBe(0);
  });

  it('a tangency (double root of the difference) is not a switch', () => {
    // p = (τ − 0.025)², q = 0: p ≥ q everywhere, touching at 0.025.
    const env = envelope([poly([0.025 * 0.025, -0.05, 1]), poly([0])], 1, 2);
    expect(pieceCount(env)).toBe(1);
    expect(env.choice![0]).toBe(0);
  });

  it('integrate: continuous, F(0) = x0, and F′ = p on every piece', () => {
    const env = envelope([poly([1, -40, 100]), poly([0.2, 3, -10])], 1, 2);
    const F = integrate(env, 0.7, 2);
    expect(evaluate(F, 0, 3)).toBe(0.7);
    for (let i = 1; i < F.breaks.length - 1; i++) {
      const b = F.breaks[i]!;
      const left = horner(F.coef, (i - 1) * STRIDE, 3, b);
      const right = horner(F.coef, i * STRIDE, 3, b);
      expect(Math.abs(left - right)).toBeLessThan(1e-15);
    }
    const h = 1e-6;
    for (const t of [0.003, 0.011, 0.037, 0.049]) {
      const d = (evaluate(F, t + h, 3) - evaluate(F, t - h, 3)) / (2 * h);
      expect(Math.abs(d - evaluate(env, t, 2))).toBeLessThan(1e-6);
    }
  });

  it('property: the max is ≥ every input at sampled points and equals one of them; the min likewise', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 3 }).chain((deg) => fc.tuple(fc.constant(deg), fc.array(arbPoly(deg), { minLength: 1, maxLength: 4 }))), fc.boolean(), ([deg, cs], isMax) => {
        const fs = cs.map(poly);
        const sense = isMax ? 1 : -1;
        const env = envelope(fs, sense, deg);
        for (let q = 0; q <= 200; q++) {
          const t = (q / 200) * EPS;
          const e = evaluate(env, t, deg);
          const vals = fs.map((f) => evaluate(f, t, deg));
          const scale = 1 + Math.max(...vals.map(Math.abs));
          for (const v of vals) expect(sense * (e - v)).toBeGreaterThanOrEqual(-1e-12 * scale);
          expect(Math.min(...vals.map((v) => Math.abs(v - e)))).toBeLessThanOrEqual(1e-12 * scale);
        }
      }),
      { numRuns: 300, seed: 99 },
    );
  });

  it('property: envelopes and sums of piecewise inputs (merged breakpoints) evaluate to the pointwise values', () => {
    fc.assert(
      fc.property(fc.array(arbPoly(2), { minLength: 4, maxLength: 4 }), fc.double({ min: -3, max: 3, noNaN: true }), (cs, wgt) => {
        const [a, b, c, d] = cs.map(poly) as [Piecewise, Piecewise, Piecewise, Piecewise];
        const e1 = envelope([a, b], 1, 2);
        const e2 = envelope([c, d], -1, 2);
        const sum = linearCombination([{ w: 1, f: e1 }, { w: wgt, f: e2 }], 2, STRIDE);
        const top = envelope([e1, e2], 1, 2);
        for (let q = 0; q <= 100; q++) {
          const t = (q / 100) * EPS;
          const v1 = Math.max(evaluate(a, t, 2), evaluate(b, t, 2));
          const v2 = Math.min(evaluate(c, t, 2), evaluate(d, t, 2));
          expect(Math.abs(evaluate(sum, t, 2) - (v1 + wgt * v2))).toBeLessThan(1e-11 * (1 + Math.abs(v1) + Math.abs(wgt * v2)));
          expect(Math.abs(evaluate(top, t, 2) - Math.max(v1, v2))).toBeLessThan(1e-11 * (1 + Math.abs(v1) + Math.abs(v2)));
        }
      }),
      { numRuns: 200, seed: 5 },
    );
  });
});
