/**
 * The fixed-point Taylor steps against the dense decimal scaling-and-squaring path (oracles/expm/
 * taylor.ts and propagate.ts: another method, Moler & Van Loan 2003, section 3) on seeded random
 * models of 5 … 30 states under random two- and three-piece schedulers: the two values must agree
 * within the sum of their bounds, and the two working precisions of the stepping must confirm them.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { decimalAt, decModel } from '../../../oracles/common/decModel.js';
import { valueOfPieces } from '../../../oracles/expm/index.js';
import { propagate, type LeftPiece } from '../../../oracles/expm/propagate.js';
import { randomStructure } from '../../../bench/oracleStructures.js';

describe('fixed-point Taylor steps against dense scaling and squaring (≤ 30 states)', () => {
  it('random CTMDP structures under random piecewise schedulers agree within both bounds', () => {
    const arb = fc.record({
      n: fc.integer({ min: 5, max: 30 }),
      seed: fc.nat(10_000),
      T: fc.constantFrom('0.3', '1.7', '4'),
      cuts: fc.array(fc.integer({ min: 1, max: 99 }), { minLength: 0, maxLength: 2 }),
      picks: fc.array(fc.nat(1), { minLength: 90, maxLength: 90 }),
    });
    fc.assert(
      fc.property(arb, ({ n, seed, T, cuts, picks }) => {
        const m = buildModel(randomStructure(n, 2, 2, T, seed));
        // Pieces in time left: lengths are exact decimal texts that add up to T.
        const fr = [...new Set(cuts)].sort((a, b) => a - b);
        const bounds = [0, ...fr, 100];
        const pieces: LeftPiece[] = [];
        for (let i = 0; i + 1 < bounds.length; i++) {
          const choice = Int32Array.from(m.states, (st, s) => (st.actions.length === 0 ? -1 : picks[(s + 31 * i) % 90]!));
          const len = decimalAt(40)(T).times(bounds[i + 1]! - bounds[i]!).div(100).toFixed();
          pieces.push({ length: len, choice });
        }
        const stepped = valueOfPieces(m, pieces, 30);
        if ('code' in stepped) throw new Error(stepped.reason);
        expect(stepped.diff).toBeLessThanOrEqual(0.5e-30);
        expect(stepped.bound).toBeLessThanOrEqual(0.5e-30);
        const dense = propagate(decModel(m, decimalAt(50)), pieces);
        for (let s = 0; s < n; s++) {
          const d = stepped.values[s]!.minus(dense.values[s]!.toString()).abs().toNumber();
          expect(d).toBeLessThanOrEqual(stepped.bound + dense.bound);
        }
      }),
      { numRuns: 12, seed: 2026 },
    );
  });
});
