/**
 * kstep against the project's high-precision oracles (decimal arithmetic, no shared numeric code):
 * at precisions down to 1e-11, where the rounding allowance is a visible part of the bound.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import { arbModelObject } from '../../../corpus/generators/random.js';
import { solveOracle } from '../../../oracles/index.js';
import { solveKstep } from '../../../solvers/kstep/index.js';

describe('kstep against the oracles', () => {
  it('random CTMCs, k = 3..5, precision 1e-11: |kstep − oracle| ≤ bound + oracle bound', () => {
    let compared = 0;
    fc.assert(
      fc.property(arbModelObject({ kind: 'ctmc', maxStates: 5, maxTime: 2, decades: 2 }), fc.integer({ min: 3, max: 5 }), (obj, k) => {
        const model = buildModel(obj);
        const m = compile(model);
        const o = solveKstep(m, { precision: 1e-11, k });
        const ref = solveOracle(model, { digits: 20 });
        if (o.kind !== 'solved' || ref.kind !== 'solved') return;
        compared++;
        for (let s = 0; s < m.nStates; s++) expect(Math.abs(o.values[s]! - ref.values[s]!)).toBeLessThanOrEqual(o.errorBound + ref.errorBound);
      }),
      { numRuns: 25, seed: 2026 },
    );
    expect(compared).toBeGreaterThan(15);
  });

  it('random CTMDPs and CTMGs, k = 2..4, precision 1e-8, against the optimal-control oracle', () => {
    let compared = 0;
    fc.assert(
      fc.property(arbModelObject({ kind: 'any', maxStates: 4, maxTime: 1.5, decades: 2 }), fc.integer({ min: 2, max: 4 }), (obj, k) => {
        const model = buildModel(obj);
        const m = compile(model);
        const o = solveKstep(m, { precision: 1e-8, k });
        const ref = solveOracle(model, { digits: 14 });
        if (o.kind !== 'solved' || ref.kind !== 'solved') return;
        compared++;
        for (let s = 0; s < m.nStates; s++) expect(Math.abs(o.values[s]! - ref.values[s]!)).toBeLessThanOrEqual(o.errorBound + ref.errorBound);
      }),
      { numRuns: 20, seed: 77 },
    );
    expect(compared).toBeGreaterThan(5);
  });
});
