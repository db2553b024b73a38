/**
 * Property tests on random small CTMCs (the lead's arbitrary, corpus/generators/random.ts; fast-check 4.11.0).
 * References are other solvers run at finer precision; agreement is required within the sum of the stated bounds.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import type { Outcome, Solved } from '../../../corpus/format/result.js';
import { arbModelObject } from '../../../corpus/generators/random.js';
import { solveEuler } from '../../../solvers/euler/index.js';
import { solveUniformization } from '../../../solvers/uniformization/index.js';
import { solverContract } from '../../helpers/solverContract.js';
import { scaleRates, withTimeBound } from './transform.js';

const solved = (o: Outcome): Solved => {
  if (o.kind !== 'solved') throw new Error(`refused: ${o.reason}`);
  return o;
};
const SEED = 20261201;
// Small λT (rates 0.1 … 10, T ≤ 0.4) so that Euler at 1e-4 takes well under a second per model.
const smallCtmc = { kind: 'ctmc' as const, maxStates: 4, decades: 2, maxTime: 0.4 };

describe('uniformization: the shared solver contract', () => {
  solverContract({
    name: 'uniformization at 1e-9 on CTMCs, against Euler at 1e-4',
    solve: (m, precision) => solveUniformization(m, { precision }),
    reference: (m) => {
      const e = solved(solveEuler(m, { precision: 1e-4 }));
      return { values: e.values, bound: e.errorBound };
    },
    models: smallCtmc,
    precision: 1e-9,
    runs: 25,
  });
});

describe('uniformization: metamorphic properties on random CTMCs', () => {
  const ctmc = arbModelObject({ kind: 'ctmc', maxStates: 5, decades: 3, maxTime: 3 });
  it('values in [0, 1]; within-values do not decrease in T', () => {
    fc.assert(
      fc.property(ctmc, fc.double({ min: 1.05, max: 3, noNaN: true }), (obj, f) => {
        const o = { ...obj, goal_mode: 'within' as const };
        const a = solved(solveUniformization(compile(buildModel(o)), { precision: 1e-10 }));
        const b = solved(solveUniformization(compile(buildModel(withTimeBound(o, Number(o.time_bound) * f))), { precision: 1e-10 }));
        for (let s = 0; s < a.values.length; s++) {
          expect(a.values[s]).toBeGreaterThanOrEqual(0);
          expect(a.values[s]).toBeLessThanOrEqual(1);
          expect(a.values[s]!).toBeLessThanOrEqual(b.values[s]! + a.errorBound + b.errorBound);
        }
      }),
      { numRuns: 60, seed: SEED },
    );
  });
  it('scaling every rate by c and T by 1/c leaves the values unchanged (within the bounds)', () => {
    fc.assert(
      fc.property(ctmc, fc.constantFrom(0.125, 0.5, 3, 16), (obj, c) => {
        const a = solved(solveUniformization(compile(buildModel(obj)), { precision: 1e-10 }));
        const b = solved(solveUniformization(compile(buildModel(scaleRates(obj, c))), { precision: 1e-10 }));
        for (let s = 0; s < a.values.length; s++) expect(Math.abs(a.values[s]! - b.values[s]!)).toBeLessThanOrEqual(a.errorBound + b.errorBound);
      }),
      { numRuns: 60, seed: SEED },
    );
  });
  it('a fixed scheduler on a CTMDP with one segment per state equals the CTMC of the chosen actions', () => {
    fc.assert(
      fc.property(arbModelObject({ kind: 'ctmdp', maxStates: 4, decades: 2, maxTime: 2 }), (obj) => {
        const m = compile(buildModel(obj));
        // The scheduler that picks the last action everywhere, and the CTMC that keeps only that action.
        const choices: Record<string, { from: number; action: string }[]> = {};
        const states: NonNullable<typeof obj.states> = {};
        for (const [name, st] of Object.entries(obj.states!)) {
          const names = Object.keys(st.actions ?? {});
          const last = names[names.length - 1];
          if (names.length >= 2) choices[name] = [{ from: 0, action: last! }];
          states[name] = last === undefined ? {} : { actions: { [last]: st.actions![last]! } };
        }
        const u = solved(solveUniformization(m, { precision: 1e-10, scheduler: { choices } }));
        const c = solved(solveUniformization(compile(buildModel({ ...obj, states })), { precision: 1e-10 }));
        for (let s = 0; s < u.values.length; s++) expect(Math.abs(u.values[s]! - c.values[s]!)).toBeLessThanOrEqual(u.errorBound + c.errorBound);
      }),
      { numRuns: 40, seed: SEED },
    );
  });
});
