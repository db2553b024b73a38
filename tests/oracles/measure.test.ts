/**
 * Measurements of the oracles (digits confirmed and seconds), printed, not asserted on time.
 * Skipped unless ORACLE_MEASURE=1:  ORACLE_MEASURE=1 npx vitest run tests/oracles/measure.test.ts
 * The models are seeded pseudo-random structures invented here (a linear congruential generator).
 */
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../corpus/format/build.js';
import { solveExpm } from '../../oracles/expm/index.js';
import { solveOptimal } from '../../oracles/optimal/index.js';
import { randomStructure } from './structures.js';

const run = process.env.ORACLE_MEASURE ? describe : describe.skip;

run('oracle measurements', () => {
  for (const [n, T] of [[20, '2'], [40, '2'], [60, '2'], [80, '2']] as const) {
    it(`expm, CTMC with ${n} states, 30 digits`, () => {
      const out = solveExpm(buildModel(randomStructure(n, 1, 3, T, n)), { digits: 30 });
      console.log(`expm n=${n}:`, out.kind === 'solved' ? `${out.stats.digitsConfirmed} digits, ${out.stats.seconds!.toFixed(1)} s, ${out.stats.squarings} squarings` : out.reason);
      expect(out.kind).toBe('solved');
    });
  }
  for (const [n, game] of [[10, false], [20, false], [30, false], [30, true]] as const) {
    it(`optimal, ${game ? 'CTMG' : 'CTMDP'} with ${n} states, 25 digits`, () => {
      const out = solveOptimal(buildModel(randomStructure(n, 2, 2, '1.5', 100 + n, game)), { digits: 25 });
      console.log(`optimal n=${n} ${game ? 'CTMG' : 'CTMDP'}:`, out.kind === 'solved'
        ? `${out.stats.digitsConfirmed} digits, ${out.stats.seconds!.toFixed(1)} s (certificate ${out.stats.secondsCertificate!.toFixed(1)} s), ${out.stats.switches} switches, ${out.stats.cells} cells`
        : out.reason);
      expect(out.kind).toBe('solved');
    });
  }
});
