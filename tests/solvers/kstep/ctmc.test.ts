import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import { arbModelObject } from '../../../corpus/generators/random.js';
import { solveKstep } from '../../../solvers/kstep/index.js';
import { expmValues } from './reference.js';

const solved = (o: ReturnType<typeof solveKstep>) => {
  if (o.kind !== 'solved') throw new Error(`refused: ${o.reason}`);
  return o;
};

describe('kstep on CTMCs', () => {
  // Two-state chain 0 ⇄ 1 with rates a, b, starting in 0, goal 1 in mode `at`:
  // p(t) = a/(a+b)·(1 − e^{−(a+b)t}) (textbook formula, e.g. Ross, Introduction to Probability Models, §6.4).
  const a = 1.5;
  const b = 0.5;
  const two = compile(buildModel({ time_bound: 2, goal: ['on'], goal_mode: 'at', states: {
    off: { actions: { up: { on: a } } }, on: { actions: { down: { off: b } } } } }));
  const p = (t: number) => (a / (a + b)) * (1 - Math.exp(-(a + b) * t));
  const q = (t: number) => (a + b * Math.exp(-(a + b) * t)) / (a + b); // from state `on`
  for (const k of [1, 2, 3, 4, 5, 6]) {
    for (const precision of [1e-4, 1e-7]) {
      if (k === 1 && precision < 1e-5) continue; // k = 1 needs ~10^8 intervals at 1e-7
      it(`two-state chain, closed form, k = ${k}, precision ${precision}`, () => {
        const o = solved(solveKstep(two, { precision, k }));
        expect(o.errorBound).toBeLessThanOrEqual(precision);
        expect(Math.abs(o.values[0]! - p(2))).toBeLessThanOrEqual(o.errorBound);
        expect(Math.abs(o.values[1]! - q(2))).toBeLessThanOrEqual(o.errorBound);
      });
    }
  }

  // Erlang(n, μ) CDF: P(X ≤ t) = 1 − Σ_{i<n} e^{−μt}(μt)^i/i! (textbook formula, e.g. Ross, §5.2.3).
  it('a chain of n = 5 phases of rate μ = 3 gives the Erlang CDF (within mode), k = 1..5', () => {
    const n = 5;
    const mu = 3;
    const T = 1.7;
    const states: Record<string, { actions?: Record<string, Record<string, number>> }> = {};
    for (let i = 0; i < n; i++) states[`p${i}`] = { actions: { go: { [i + 1 < n ? `p${i + 1}` : 'done']: mu } } };
    states.done = {};
    const m = compile(buildModel({ time_bound: T, goal: ['done'], states }));
    let tail = 0;
    let term = Math.exp(-mu * T);
    for (let i = 0; i < n; i++) {
      tail += term;
      term *= (mu * T) / (i + 1);
    }
    const erlang = 1 - tail;
    for (const k of [1, 2, 3, 4, 5]) {
      const o = solved(solveKstep(m, { precision: k === 1 ? 1e-4 : 1e-8, k }));
      expect(Math.abs(o.values[0]! - erlang)).toBeLessThanOrEqual(o.errorBound);
    }
  });

  it('random CTMCs: |kstep − expm| ≤ bound + 1e-12, at the requested precision and on coarse forced intervals', () => {
    fc.assert(
      fc.property(arbModelObject({ kind: 'ctmc', maxStates: 6, maxTime: 4 }), fc.integer({ min: 1, max: 6 }), fc.integer({ min: 1, max: 5 }), (obj, k, n) => {
        const m = compile(buildModel(obj));
        const ref = expmValues(m);
        const fine = solveKstep(m, { precision: k === 1 ? 1e-3 : 1e-6, k });
        const coarse = solveKstep(m, { precision: 1e6, k, intervals: n });
        for (const o of [fine, coarse]) {
          if (o.kind === 'refused') continue;
          for (let s = 0; s < m.nStates; s++) expect(Math.abs(o.values[s]! - ref[s]!)).toBeLessThanOrEqual(o.errorBound + 1e-12);
        }
        expect(fine.kind).toBe('solved');
      }),
      { numRuns: 150, seed: 424242 },
    );
  });
});
