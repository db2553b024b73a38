import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { horner } from '../../../solvers/piecewise/poly.js';
import { isolateRoots, realRoots } from '../../../solvers/piecewise/roots.js';

/** Coefficients (ascending) of lead·Π(τ − r_i). */
function fromRoots(roots: number[], lead = 1): Float64Array {
  let c = [lead];
  for (const r of roots) {
    const next = new Array<number>(c.length + 1).fill(0);
    for (let i = 0; i < c.length; i++) {
      next[i + 1] += c[i]!;
      next[i] -= r * c[i]!;
    }
    c = next;
  }
  return Float64Array.from(c);
}

const roots = (c: Float64Array, lo = 0, hi = 1) => realRoots(c, 0, c.length - 1, lo, hi);

describe('realRoots (known roots; the polynomials are products of linear factors, common practice, no source)', () => {
  it('linear and quadratic, including a cancellation-prone quadratic', () => {
    expect(roots(Float64Array.of(-0.25, 1))).toEqual([0.25]);
    const r = roots(fromRoots([0.2, 0.7]));
    expect(r[0]).toBeCloseTo(0.2, 14);
    expect(r[1]).toBeCloseTo(0.7, 14);
    // τ² − 1e8·τ + 1 has a root ≈ 1e-8: the naive formula loses it to cancellation.
    const small = roots(Float64Array.of(1, -1e8, 1));
    expect(small).toHaveLength(1);
    expect(Math.abs(small[0]! - 1e-8) / 1e-8).toBeLessThan(1e-12);
  });

  it('cubic with three real roots (trigonometric form) and with one real root (Cardano)', () => {
    const r3 = roots(fromRoots([0.1, 0.5, 0.9], -3));
    expect(r3).toHaveLength(3);
    [0.1, 0.5, 0.9].forEach((x, i) => expect(Math.abs(r3[i]! - x)).toBeLessThan(1e-14));
    // (τ − 0.3)(τ² + 1): one real root.
    const c = fromRoots([0.3]);
    const r1 = roots(Float64Array.of(-0.3 * 1, 1, -0.3, 1));
    void c;
    expect(r1).toHaveLength(1);
    expect(Math.abs(r1[0]! - 0.3)).toBeLessThan(1e-14);
  });

  it('double roots are tangencies: any sign change found near one is at the level of rounding', () => {
    // In double precision a double root may become two roots ~√u apart, or none (the rounded
    // polynomial's own roots); between them |p| is at the level of its evaluation error.
    for (const [c, r0] of [[fromRoots([0.4, 0.4]), 0.4], [fromRoots([0.4, 0.4, 0.8]), 0.4], [fromRoots([0.25, 0.25, 0.6, 0.9]), 0.25]] as const) {
      const near = roots(c).filter((x) => Math.abs(x - r0) < 1e-3);
      expect(near.length).toBeGreaterThanOrEqual(1);
      for (const x of near) expect(Math.abs(x - r0)).toBeLessThan(1e-7);
      for (let i = 0; i + 1 < near.length; i++) expect(Math.abs(horner(c, 0, c.length - 1, 0.5 * (near[i]! + near[i + 1]!)))).toBeLessThan(1e-15);
    }
    // The exact double root 0.4 of τ² − 0.8τ + 0.16 is found once.
    expect(roots(fromRoots([0.4, 0.4]))).toEqual([0.4]);
  });

  it('roots at the ends 0 and ε, and roots clustered near an end', () => {
    const eps = 0.03;
    const at0 = realRoots(fromRoots([0, 0.02]), 0, 2, 0, eps);
    expect(at0[0]).toBe(0);
    expect(Math.abs(at0[1]! - 0.02)).toBeLessThan(1e-16);
    const atEps = realRoots(fromRoots([eps, 0.01, 0.5]), 0, 3, 0, eps);
    expect(atEps.some((r) => Math.abs(r - eps) < 1e-15)).toBe(true);
    const want = [eps * (1 - 3e-4), eps * (1 - 2e-4), eps * (1 - 1e-4)];
    const cluster = realRoots(fromRoots(want), 0, 3, 0, eps);
    expect(cluster).toHaveLength(3);
    // Roots 3e-6 apart: their condition number is ~1/δ², so ~1e-10 is the expected accuracy.
    want.forEach((x, i) => expect(Math.abs(cluster[i]! - x)).toBeLessThan(1e-9));
    // A near-triple root 1e-9·ε apart is ill-conditioned: rounding moves it by ~u^{1/3}·ε ≈ 2e-7
    // (the perturbation theory of multiple roots, common practice, no source); it stays near ε.
    const tight = realRoots(fromRoots([eps * (1 - 1e-9), eps * (1 - 2e-9), eps * (1 - 3e-9)]), 0, 3, 0, eps);
    expect(tight.length).toBeGreaterThanOrEqual(1);
    for (const r of tight) expect(eps - r).toBeLessThan(1e-6);
  });

  it('identical polynomials give the zero difference: no root, no breakpoint', () => {
    expect(roots(new Float64Array(4))).toEqual([]);
    expect(isolateRoots(new Float64Array(6), 0, 5, 0, 1)).toEqual([]);
  });

  it('degree 4 and 5 by isolation (Sturm-free: derivative roots and bisection)', () => {
    const want = [0.05, 0.3, 0.55, 0.95];
    const r = roots(fromRoots(want, 2));
    expect(r).toHaveLength(4);
    want.forEach((x, i) => expect(Math.abs(r[i]! - x)).toBeLessThan(1e-13));
    const r5 = roots(fromRoots([0.1, 0.2, 0.3, 0.4, 2], -1));
    expect(r5).toHaveLength(4);
  });

  it('property: the roots of lead·Π(τ − r_i) with separated roots are found, by closed form and by isolation', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0.01, max: 0.99, noNaN: true }), { minLength: 1, maxLength: 5 }),
        fc.double({ min: 0.1, max: 100, noNaN: true }),
        fc.boolean(),
        (rs, lead, neg) => {
          const sorted = [...rs].sort((a, b) => a - b);
          for (let i = 1; i < sorted.length; i++) fc.pre(sorted[i]! - sorted[i - 1]! > 1e-3);
          const c = fromRoots(sorted, neg ? -lead : lead);
          for (const found of [roots(c), isolateRoots(c, 0, c.length - 1, 0, 1)]) {
            expect(found).toHaveLength(sorted.length);
            sorted.forEach((x, i) => expect(Math.abs(found[i]! - x)).toBeLessThan(1e-9));
          }
        },
      ),
      { numRuns: 300, seed: 7 },
    );
  });
});
