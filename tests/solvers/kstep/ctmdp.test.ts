import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import { arbModelObject } from '../../../corpus/generators/random.js';
import { solveKstep } from '../../../solvers/kstep/index.js';
import { solverContract } from '../../helpers/solverContract.js';
import { expmValues, schedulerValues } from './reference.js';

const solved = (o: ReturnType<typeof solveKstep>) => {
  if (o.kind !== 'solved') throw new Error(`refused: ${o.reason}`);
  return o;
};

/*
 * A hand-solvable CTMDP (derived here; invented data). State s (max) chooses A: s → g at rate 1, or
 * B: s → m at rate 4, and m → g at rate 4; g is the goal (within). With t time left and w = 1 − v_s:
 * near t = 0, A is best (A's slope w vs B's 4(w − e^{−4t}), 1 > 0 at t = 0); they are equal when
 * 3e^{−t} = 4e^{−4t}, i.e. t* = ln(4/3)/3. After t*, w′ = −4w + 4e^{−4t}, so w = (C + 4t)e^{−4t} with
 * w(t*) = e^{−t*}, C = 4/3 − 4t*; and B − A = 12(t − t*)e^{−4t} > 0, so B stays best. Hence
 *   v_s(T) = 1 − (4/3 − 4t* + 4T)·e^{−4T}   for T > t*,
 * and the optimal scheduler plays B for elapsed time [0, T − t*) and A from T − t* on.
 */
const tStar = Math.log(4 / 3) / 3;
const handModel = (T: number) =>
  compile(buildModel({ time_bound: T, goal: ['g'], states: { s: { owner: 'max', actions: { A: { g: 1 }, B: { m: 4 } } }, m: { actions: { go: { g: 4 } } }, g: {} } }));
const handValue = (T: number) => 1 - (4 / 3 - 4 * tStar + 4 * T) * Math.exp(-4 * T);

describe('kstep on CTMDPs and CTMGs', () => {
  for (const k of [1, 2, 3, 4, 5]) {
    it(`hand-derived CTMDP with one switch: value within the bound, k = ${k}`, () => {
      const T = 0.8;
      const o = solved(solveKstep(handModel(T), { precision: k === 1 ? 1e-4 : 1e-7, k }));
      expect(Math.abs(o.values[0]! - handValue(T))).toBeLessThanOrEqual(o.errorBound);
      // The switch falls inside an interval; level 1 is constant per interval, so k = 1 has no pieces.
      if (k > 1) expect(o.stats.maxPieces).toBeGreaterThanOrEqual(2);
    });
  }

  it('hand-derived CTMDP: coarse forced intervals still respect the bound and converge like n^{-k}', () => {
    const T = 0.8;
    for (const k of [1, 2, 3, 4]) {
      const errs = [8, 16, 32, 64].map((n) => {
        const o = solved(solveKstep(handModel(T), { precision: 1e6, k, intervals: n }));
        const err = Math.abs(o.values[0]! - handValue(T));
        expect(err).toBeLessThanOrEqual(o.errorBound);
        return err;
      });
      // Slope between n = 16 and 64 (rounding floor 1e-14 excluded); tolerance as in bound.test.ts,
      // widened to 0.3 because the switch moves between pieces as n changes (an O(1/n) effect).
      if (errs[3]! > 1e-13) expect(Math.abs(Math.log(errs[1]! / errs[3]!) / Math.log(4) - k)).toBeLessThan(0.3);
    }
  });

  it('hand-derived CTMDP: the scheduler switches from B to A at elapsed T − t* (to far better than ε), and achieves the value within the bounds', () => {
    const T = 0.8;
    const o = solved(solveKstep(handModel(T), { precision: 1e-7, k: 3 }));
    const segs = o.scheduler!.choices.s!;
    expect(segs.map((g) => g.action)).toEqual(['B', 'A']);
    // The switch sits at the level-k envelope's breakpoint, not at an interval end.
    expect(Math.abs(segs[1]!.from - (T - tStar))).toBeLessThanOrEqual(o.stats.epsilon! / 100);
    const m = handModel(T);
    const { values, estimate } = schedulerValues(m, o.scheduler!, 1e-3);
    // Optimal ≥ any scheduler: the scheduler's value never exceeds kstep + bounds ...
    expect(values[0]!).toBeLessThanOrEqual(o.values[0]! + o.errorBound + estimate + 1e-12);
    // ... and this one attains it within the bounds.
    expect(values[0]!).toBeGreaterThanOrEqual(o.values[0]! - o.errorBound - estimate);
  });

  it('random CTMDPs and CTMGs: |kstep − fine kstep (1e-9)| ≤ both bounds; scheduler values never beat the optimum', () => {
    fc.assert(
      fc.property(arbModelObject({ kind: 'any', maxStates: 5, maxTime: 2, decades: 3 }), fc.integer({ min: 1, max: 4 }), fc.integer({ min: 1, max: 6 }), (obj, k, n) => {
        const m = compile(buildModel(obj));
        const ref = solved(solveKstep(m, { precision: 1e-9, k: 4 }));
        const runs = [solveKstep(m, { precision: k === 1 ? 1e-3 : 1e-6, k }), solveKstep(m, { precision: 1e6, k, intervals: n })];
        for (const o of runs) {
          if (o.kind === 'refused') continue;
          for (let s = 0; s < m.nStates; s++) expect(Math.abs(o.values[s]! - ref.values[s]!)).toBeLessThanOrEqual(o.errorBound + ref.errorBound);
        }
        expect(runs[0]!.kind).toBe('solved');
        // In a CTMDP owned by max only, the extracted scheduler is a fixed strategy: its value is ≤ the optimum.
        const owners = new Set([...m.owner].filter((x) => x !== 0));
        if (owners.size === 1 && owners.has(1) && m.nStates <= 4) {
          const { values, estimate } = schedulerValues(m, ref.scheduler!, 0.02 / Math.max(1, m.lambda));
          for (let s = 0; s < m.nStates; s++) expect(values[s]!).toBeLessThanOrEqual(ref.values[s]! + ref.errorBound + estimate + 1e-12);
        }
      }),
      { numRuns: 60, seed: 31337 },
    );
  });

  it('a game that is a CTMC in disguise (duplicated actions) equals the CTMC', () => {
    const ctmc = compile(buildModel({ time_bound: 1.3, goal: ['c'], states: { a: { actions: { x: { b: 2, c: 0.5 } } }, b: { actions: { y: { a: 1, c: 3 } } }, c: {} } }));
    const game = compile(buildModel({ time_bound: 1.3, goal: ['c'], states: {
      a: { owner: 'min', actions: { x: { b: 2, c: 0.5 }, x2: { b: 2, c: 0.5 } } }, b: { owner: 'max', actions: { y: { a: 1, c: 3 }, y2: { a: 1, c: 3 } } }, c: {} } }));
    const ref = expmValues(ctmc);
    const o = solved(solveKstep(game, { precision: 1e-8, k: 4 }));
    for (let s = 0; s < 3; s++) expect(Math.abs(o.values[s]! - ref[s]!)).toBeLessThanOrEqual(o.errorBound + 1e-12);
    expect(o.stats.maxPieces).toBe(1); // identical actions: ties, no breakpoints
  });
});

describe('kstep under the shared solver contract', () => {
  solverContract({
    name: 'kstep k = 3 on CTMCs against the dense matrix exponential',
    solve: (m, p) => solveKstep(m, { precision: p, k: 3 }),
    reference: (m) => ({ values: expmValues(m), bound: 1e-12 }),
    models: { kind: 'ctmc', maxStates: 5, maxTime: 3 },
    runs: 40,
  });
  solverContract({
    name: 'kstep k = 2 on games against kstep k = 4 at precision 1e-10',
    solve: (m, p) => solveKstep(m, { precision: p, k: 2 }),
    reference: (m) => {
      const o = solveKstep(m, { precision: 1e-10, k: 4 });
      return o.kind === 'solved' ? { values: o.values, bound: o.errorBound } : undefined;
    },
    models: { kind: 'ctmg', maxStates: 4, maxTime: 2, decades: 3 },
    runs: 30,
  });
});
