import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { arbSwitchingModelObject } from '../../../corpus/generators/random.js';
import { solveOptimal } from '../../../oracles/optimal/index.js';

describe('arbSwitchingModelObject', () => {
  it('draws valid models whose optimal scheduler (by the optimal-control oracle) switches in most samples', () => {
    const samples = fc.sample(arbSwitchingModelObject({ maxGadgets: 2 }), { numRuns: 12, seed: 4 });
    let switching = 0;
    for (const obj of samples) {
      const out = solveOptimal(buildModel(obj), { digits: 12 });
      expect(out.kind).toBe('solved');
      if (out.kind === 'solved' && (out.stats.switches ?? 0) > 0) switching++;
    }
    expect(switching).toBeGreaterThanOrEqual(6);
  });
});
