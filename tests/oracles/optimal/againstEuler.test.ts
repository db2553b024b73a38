/**
 * The optimal-control oracle against explicit Euler run fine (an independent method: Euler shares no
 * code with the oracle), on random models whose optimal decisions switch in time.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import { arbSwitchingModelObject } from '../../../corpus/generators/random.js';
import { solveOptimal } from '../../../oracles/optimal/index.js';
import { solveEuler } from '../../../solvers/euler/index.js';

describe('optimal oracle against fine Euler', () => {
  it('agrees within the sum of the bounds on switching CTMDPs and CTMGs (λT ≤ 6, Euler at 1e-6)', () => {
    const models = fc
      .sample(arbSwitchingModelObject({ maxGadgets: 2 }), { numRuns: 60, seed: 9 })
      .map((o) => buildModel(o))
      .filter((m) => {
        const c = compile(m);
        return c.lambda * c.timeBound <= 6;
      })
      .slice(0, 8);
    expect(models.length).toBeGreaterThanOrEqual(4);
    let switching = 0;
    for (const model of models) {
      const o = solveOptimal(model, { digits: 15 });
      const e = solveEuler(compile(model), { precision: 1e-6 });
      if (o.kind !== 'solved' || e.kind !== 'solved') throw new Error(`not solved: ${JSON.stringify([o.kind, e.kind])}`);
      if ((o.stats.switches ?? 0) > 0) switching++;
      for (let s = 0; s < model.states.length; s++) expect(Math.abs(o.values[s]! - e.values[s]!)).toBeLessThanOrEqual(o.errorBound + e.errorBound + 1e-15);
    }
    expect(switching).toBeGreaterThan(0);
  });
});
