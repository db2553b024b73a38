import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import { localBound } from '../../../solvers/kstep/bound.js';
import { solveKstep } from '../../../solvers/kstep/index.js';

const solved = (o: ReturnType<typeof solveKstep>) => {
  if (o.kind !== 'solved') throw new Error(`refused: ${o.reason}`);
  return o;
};

// The symmetric two-state chain, rate λ each way, goal `b` in mode `at`: from `a`,
// v(t) = ½(1 − e^{−2λt}) (textbook two-state formula p(t) = a/(a+b)(1 − e^{−(a+b)t}) with a = b = λ).
const lambda = 2;
const sym = (T: number) =>
  compile(buildModel({ time_bound: T, goal: ['b'], goal_mode: 'at', states: { a: { actions: { x: { b: lambda } } }, b: { actions: { y: { a: lambda } } } } }));
const exact = (t: number) => 0.5 * (1 - Math.exp(-2 * lambda * t));

describe('kstep error bound', () => {
  it('one interval: the error is below (2λε)^{k+1}/(2(k+1)!) and close to it (the constant is nearly attained)', () => {
    for (const k of [1, 2, 3, 4, 5, 6]) {
      const eps = 0.01;
      const o = solved(solveKstep(sym(eps), { precision: 1, k, intervals: 1 }));
      const err = Math.abs(o.values[0]! - exact(eps));
      const L = localBound(lambda, eps, k);
      expect(err).toBeLessThanOrEqual(o.errorBound);
      expect(err).toBeLessThanOrEqual(L);
      if (k <= 4) expect(err / L).toBeGreaterThan(0.9); // beyond k = 4 the error nears rounding (1e-16)
    }
  });

  it('the Poisson-tail form (λε)^{k+1}/(k+1)! is NOT a bound for these polynomial Picard iterates', () => {
    for (const k of [1, 2, 3]) {
      const eps = 0.01;
      const o = solved(solveKstep(sym(eps), { precision: 1, k, intervals: 1 }));
      const err = Math.abs(o.values[0]! - exact(eps));
      let poisson = 1;
      for (let i = 1; i <= k + 1; i++) poisson *= (lambda * eps) / i;
      expect(err).toBeGreaterThan(poisson);
    }
  });

  it('the reported bound holds with many intervals on the near-worst-case chain, k = 1..6', () => {
    for (const k of [1, 2, 3, 4, 5, 6]) {
      const T = 1.5;
      for (const n of [1, 2, 5, 20, 100]) {
        const o = solved(solveKstep(sym(T), { precision: 1e6, k, intervals: n }));
        expect(Math.abs(o.values[0]! - exact(T))).toBeLessThanOrEqual(o.errorBound);
        expect(Math.abs(o.values[1]! - (1 - exact(T)))).toBeLessThanOrEqual(o.errorBound);
      }
    }
  });

  it('order of convergence: the error with n intervals falls like n^{-k} (log-log slope within 0.15 of −k)', () => {
    // Tolerance: the error is C·n^{-k}(1 + O(1/n)); on these ranges (λT = 2) the O(1/n) term moves
    // the fitted slope by under 0.1 (measured: 0.99, 2.04, 3.04, 4.09), and the smallest error,
    // 3e-10 at k = 4, n = 128, stays far above rounding (1e-15).
    const T = 1;
    const ns: Record<number, number[]> = { 1: [64, 128, 256, 512], 2: [32, 64, 128, 256], 3: [32, 64, 128, 256], 4: [16, 32, 64, 128] };
    for (const k of [1, 2, 3, 4]) {
      const pts = ns[k]!.map((n) => {
        const o = solved(solveKstep(sym(T), { precision: 1e6, k, intervals: n }));
        return [Math.log(n), Math.log(Math.abs(o.values[0]! - exact(T)))] as const;
      });
      const mx = pts.reduce((a, p) => a + p[0], 0) / pts.length;
      const my = pts.reduce((a, p) => a + p[1], 0) / pts.length;
      const slope = pts.reduce((a, p) => a + (p[0] - mx) * (p[1] - my), 0) / pts.reduce((a, p) => a + (p[0] - mx) ** 2, 0);
      expect(Math.abs(slope + k)).toBeLessThan(0.15);
    }
  });

  it('intervals demanded for precision π grow like π^{-1/k}', () => {
    const m = sym(10);
    for (const k of [2, 3, 4]) {
      // Precisions where rounding takes under 1 % of the budget (at 1e-8, k = 2 and λT = 20 it takes a
      // quarter, which shrinks the truncation budget and bends the curve).
      const pis = [1e-3, 1e-5, 1e-7];
      // The a-priori lengths (adaptive: false): the adaptive ones follow the solution, not this law.
      const Ns = pis.map((p) => solved(solveKstep(m, { precision: p, k, adaptive: false })).stats.intervals!);
      for (let i = 1; i < pis.length; i++) {
        const ratio = Math.log(Ns[i]! / Ns[i - 1]!) / Math.log(pis[i - 1]! / pis[i]!);
        expect(Math.abs(ratio - 1 / k)).toBeLessThan(0.02);
      }
    }
  });
});
