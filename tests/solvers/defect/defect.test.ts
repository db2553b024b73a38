/**
 * `defect` against independent references: the dense matrix exponential (tests/solvers/kstep/reference.ts,
 * a double-precision expm), the optimal-control oracle (decimal arithmetic, no code shared with solvers/),
 * and the adversarial models of tests/solvers/adversarial (near-ties at orders 0–3, frozen goals with huge
 * rates, whole models scaled by 10^±150). Its one-sided bounds must bracket the reference too.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import type { Outcome } from '../../../corpus/format/result.js';
import { arbModelObject } from '../../../corpus/generators/random.js';
import { solveOracle } from '../../../oracles/index.js';
import { solveDefect } from '../../../solvers/defect/index.js';
import { solverContract } from '../../helpers/solverContract.js';
import { nearTie, type NearTie } from '../adversarial/models.js';
import { expmValues } from '../kstep/reference.js';

function expectBracket(o: Outcome, ref: ArrayLike<number>, refBound: number, label: string): void {
  if (o.kind !== 'solved') throw new Error(`${label}: refused: ${o.reason}`);
  for (let s = 0; s < ref.length; s++) {
    expect(Math.abs(o.values[s]! - ref[s]!), label).toBeLessThanOrEqual(o.errorBound + refBound);
    expect(o.valuesLower![s]!, label).toBeLessThanOrEqual(ref[s]! + refBound);
    expect(o.valuesUpper![s]!, label).toBeGreaterThanOrEqual(ref[s]! - refBound);
  }
}

describe('defect under the shared solver contract', () => {
  solverContract({
    name: 'defect on CTMCs against the dense matrix exponential',
    solve: (m, p) => solveDefect(m, { precision: p }),
    reference: (m) => ({ values: expmValues(m), bound: 1e-12 }),
    models: { kind: 'ctmc', maxStates: 5, maxTime: 3 },
    runs: 40,
  });
});

describe('defect against the optimal-control oracle', () => {
  it('random CTMDPs and CTMGs at precision 1e-9: within the bound, and bracketed by the one-sided bounds', () => {
    let compared = 0;
    fc.assert(
      fc.property(arbModelObject({ kind: 'any', maxStates: 5, maxTime: 2, decades: 2 }), (obj) => {
        const model = buildModel(obj);
        const ref = solveOracle(model, { digits: 20 });
        if (ref.kind !== 'solved') return;
        expectBracket(solveDefect(compile(model), { precision: 1e-9 }), ref.values, ref.errorBound, obj.name ?? 'random');
        compared++;
      }),
      { numRuns: 30, seed: 99 },
    );
    expect(compared).toBeGreaterThan(15);
  });

  it('near-ties at orders 0–3, both players and goal modes, frozen goals with huge rates, scaled by 10^±150', () => {
    let i = 0;
    for (const order of [0, 1, 2, 3]) {
      for (const gap of [1e-3, 1e-7, 1e-13]) {
        const c: NearTie = {
          order, gap, owner: i % 2 ? 'min' : 'max', goalMode: i % 3 === 2 ? 'at' : 'within', goalRate: i % 4 < 2 ? 1e9 : 0,
          fastRate: 0, scale: [0, 150, -150][i % 3]!,
        };
        i++;
        const ref = solveOracle(buildModel(nearTie({ ...c, scale: 0, goalRate: 0 })), { digits: 25 });
        if (ref.kind !== 'solved') throw new Error(ref.reason);
        expectBracket(solveDefect(compile(buildModel(nearTie(c))), { precision: 1e-9 }), ref.values, ref.errorBound, JSON.stringify(c));
      }
    }
  });

  it('refuses honestly: a precision it cannot reach within its work cap', () => {
    const model = buildModel(nearTie({ order: 1, gap: 1e-3, owner: 'max', goalMode: 'within', goalRate: 0, fastRate: 0, scale: 0 }));
    const o = solveDefect(compile(model), { precision: 1e-9, maxWork: 100 });
    expect(o.kind).toBe('refused');
  });
});
