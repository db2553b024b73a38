/**
 * The fuzz run as a library: the share of each family, and the planted variant loose-tie (a tie
 * tolerance the bound does not pay for) caught by fuzz alone, at a fixed seed, sized by runs.
 */
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { fuzzArbitrary, runFuzz } from '../../../harness/fuzz/index.js';
// Planted variants are loaded only on request (harness/check/planted.ts); this test asks for one.
import '../../../harness/selftest/variants.js';

describe('fuzz families', () => {
  test('one model in four is adversarial (weights 8 : 3 : 4 : 1), at seed 3 over 1600 draws', () => {
    const fams = fc.sample(fuzzArbitrary(8), { seed: 3, numRuns: 1600 }).map((x) => x.family);
    const share = (f: string): number => fams.filter((x) => x === f).length / fams.length;
    // Binomial(1600, 1/4) has standard deviation about 0.011: ±0.04 is more than three of them.
    expect(Math.abs(share('adversarial') - 4 / 16)).toBeLessThan(0.04);
    expect(Math.abs(share('switching') - 3 / 16)).toBeLessThan(0.04);
    expect(Math.abs(share('random') - 8 / 16)).toBeLessThan(0.04);
    // Binomial(1600, 1/16): standard deviation about 0.006; ±0.02 is more than three of them.
    expect(Math.abs(share('dip') - 1 / 16)).toBeLessThan(0.02);
  });
});

describe('fuzz catches variant:loose-tie', () => {
  // The settings of the fuzz stage of selftest (harness/selftest/index.ts). Passes once the solver
  // honours KstepOptions.looseTie (a no-op before the k-step tie fix).
  test('seed 1, 100 runs, up to 6 states: a disagreement with kstep:4, shrunk to an adversarial near-tie', async () => {
    const s = await runFuzz({ runs: 100, seed: 1, maxStates: 6, precision: 1e-5, methods: ['variant:loose-tie'] });
    expect(s.failure).toBeDefined();
    const f = s.failure!;
    expect(f.failed.some((c) => c.name === 'agree variant:loose-tie ~ kstep:4')).toBe(true);
    expect(f.model.name).toMatch(/^adversarial-tie[0-3]$/);
    expect(s.drawn.random + s.drawn.switching + s.drawn.adversarial + s.drawn.dip).toBe(s.runs);
    expect(s.drawn.adversarial).toBeGreaterThan(0);
  }, 600_000);
});
