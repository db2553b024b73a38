/**
 * Property tests of Euler on random small models (the lead's arbitrary, corpus/generators/random.ts;
 * fast-check 4.11.0). Rates 0.1 … 10 and short time bounds keep λT ≤ ~6, so that Euler at fine
 * precision ((λT)²/precision steps) stays fast. Agreement is required within the sum of the stated bounds.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile, type CompiledModel } from '../../../corpus/format/compile.js';
import type { Outcome, Solved } from '../../../corpus/format/result.js';
import { arbModelObject } from '../../../corpus/generators/random.js';
import { solveEuler } from '../../../solvers/euler/index.js';
import { solveUniformization } from '../../../solvers/uniformization/index.js';
import { solverContract } from '../../helpers/solverContract.js';
import { scaleRates, withTimeBound } from '../uniformization/transform.js';

const solved = (o: Outcome): Solved => {
  if (o.kind !== 'solved') throw new Error(`refused: ${o.reason}`);
  return o;
};
const SEED = 20261201;
const close = (a: Solved, b: Solved): void => {
  for (let s = 0; s < a.values.length; s++) expect(Math.abs(a.values[s]! - b.values[s]!)).toBeLessThanOrEqual(a.errorBound + b.errorBound);
};

describe('Euler: the shared solver contract', () => {
  solverContract({
    name: 'Euler at 1e-3 on CTMCs, against uniformization at 1e-13',
    solve: (m, precision) => solveEuler(m, { precision }),
    reference: (m: CompiledModel) => {
      const u = solved(solveUniformization(m, { precision: 1e-13 }));
      return { values: u.values, bound: u.errorBound };
    },
    models: { kind: 'ctmc', maxStates: 4, decades: 2, maxTime: 0.5 },
    precision: 1e-3,
    runs: 30,
  });
  for (const kind of ['ctmdp', 'ctmg'] as const) {
    solverContract({
      name: `Euler at 1e-2 on ${kind.toUpperCase()}s, against Euler at 1e-5`,
      solve: (m, precision) => solveEuler(m, { precision }),
      reference: (m: CompiledModel) => {
        const e = solved(solveEuler(m, { precision: 1e-5 }));
        return { values: e.values, bound: e.errorBound };
      },
      models: { kind, maxStates: 3, decades: 2, maxTime: 0.2 },
      precision: 1e-2,
      runs: 20,
    });
  }
});

describe('Euler: metamorphic properties', () => {
  const games = arbModelObject({ kind: 'any', maxStates: 4, decades: 2, maxTime: 0.5 });
  it('within-values do not decrease in T (CTMCs, CTMDPs, CTMGs)', () => {
    fc.assert(
      fc.property(games, fc.double({ min: 1.1, max: 2, noNaN: true }), (obj, f) => {
        const o = { ...obj, goal_mode: 'within' as const };
        const a = solved(solveEuler(compile(buildModel(o)), { precision: 1e-3 }));
        const b = solved(solveEuler(compile(buildModel(withTimeBound(o, Number(o.time_bound) * f))), { precision: 1e-3 }));
        for (let s = 0; s < a.values.length; s++) expect(a.values[s]!).toBeLessThanOrEqual(b.values[s]! + a.errorBound + b.errorBound);
      }),
      { numRuns: 40, seed: SEED },
    );
  });
  it('scaling every rate by c and T by 1/c leaves the values unchanged (within the bounds)', () => {
    fc.assert(
      fc.property(games, fc.constantFrom(0.25, 4), (obj, c) => {
        const a = solved(solveEuler(compile(buildModel(obj)), { precision: 1e-3 }));
        const b = solved(solveEuler(compile(buildModel(scaleRates(obj, c))), { precision: 1e-3 }));
        close(a, b);
      }),
      { numRuns: 40, seed: SEED },
    );
  });
  it('uniformization and Euler agree on random CTMCs within the sum of their bounds', () => {
    fc.assert(
      fc.property(arbModelObject({ kind: 'ctmc', maxStates: 5, decades: 2, maxTime: 0.5 }), (obj) => {
        const m = compile(buildModel(obj));
        close(solved(solveEuler(m, { precision: 1e-4 })), solved(solveUniformization(m, { precision: 1e-10 })));
      }),
      { numRuns: 40, seed: SEED },
    );
  });
  it("the scheduler Euler finds is no better than the optimum: its exact value (uniformization) respects Euler's", () => {
    fc.assert(
      fc.property(arbModelObject({ kind: 'ctmdp', maxStates: 4, decades: 2, maxTime: 0.5 }), (obj) => {
        const m = compile(buildModel(obj));
        const e = solved(solveEuler(m, { precision: 1e-3 }));
        if (!e.scheduler) return; // no choices, or too many switches
        const u = solved(solveUniformization(m, { precision: 1e-10, scheduler: e.scheduler }));
        const slack = e.errorBound + u.errorBound;
        for (let s = 0; s < m.nStates; s++) {
          // max: every scheduler's value ≤ optimum ≤ Euler + bound; min: every scheduler's value ≥ optimum ≥ Euler − bound.
          const owner = m.owner.find((o) => o !== 0) ?? 1;
          if (owner > 0) expect(u.values[s]!).toBeLessThanOrEqual(e.values[s]! + slack);
          else expect(u.values[s]!).toBeGreaterThanOrEqual(e.values[s]! - slack);
        }
      }),
      { numRuns: 40, seed: SEED },
    );
  });
});
