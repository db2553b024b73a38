/**
 * Scaling and squaring in fixed point (oracles/fixed/squaring.ts), the path for small stiff pieces:
 *  - against the Taylor steps on the same pieces (two methods, both with rigorous bounds): they must
 *    agree within the sum of their bounds;
 *  - a two-state chain with λT = 2·10^7 against its closed form P(X_t = 1 | X_0 = 0) =
 *    a/(a+b)·(1 − e^{−(a+b)t}) (S. M. Ross, Introduction to Probability Models, two-state chain;
 *    from memory), evaluated with decimal.js 10.6.0 at 60 digits.
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { decimalAt, decModel } from '../../../oracles/common/decModel.js';
import { solveExpm } from '../../../oracles/expm/index.js';
import { commonExponent, intGenerator } from '../../../oracles/fixed/generator.js';
import { fixedDiff, rationalOf } from '../../../oracles/fixed/numbers.js';
import { squaringPiece } from '../../../oracles/fixed/squaring.js';
import { stepPiece } from '../../../oracles/fixed/taylorSteps.js';
import { randomStructure } from '../../../bench/oracleStructures.js';

const D = Decimal.clone({ precision: 60 });

describe('fixed-point scaling and squaring', () => {
  it('agrees with the Taylor steps within both bounds (random 12- and 25-state generators)', () => {
    for (const [n, T, seed] of [[12, '3.7', 1], [25, '0.9', 2], [25, '11', 3]] as const) {
      const m = buildModel(randomStructure(n, 1, 3, T, seed));
      const dm = decModel(m, decimalAt(20));
      const g = intGenerator(dm, Int32Array.from(m.states, (st) => (st.actions.length > 0 ? 0 : -1)), commonExponent(dm));
      const len = rationalOf(new dm.D(T));
      const P = 180;
      const start = Array.from({ length: n }, (_, i) => (BigInt(i * 7919 % 101) << BigInt(P)) / 100n);
      const a = [...start];
      const b = [...start];
      const boundSq = squaringPiece(g, a, P, len, Number(T), 0);
      const boundSt = stepPiece(g, b, P, len, Number(T), 0).bound;
      let diff = 0;
      for (let i = 0; i < n; i++) diff = Math.max(diff, fixedDiff(a[i]!, P, b[i]!, P));
      expect(diff).toBeLessThanOrEqual(boundSq + boundSt);
      expect(boundSq).toBeLessThan(1e-40);
    }
  });

  it('two-state chain, a = 3e6, b = 7e6, T = 2 (λT = 2·10^7): 30 digits, closed form', () => {
    const m = buildModel({
      time_bound: '2', goal: ['up'], goal_mode: 'at',
      states: { down: { actions: { go: { up: '3e6' } } }, up: { actions: { go: { down: '7e6' } } } },
    });
    const out = solveExpm(m, { digits: 30 });
    if (out.kind !== 'solved') throw new Error(out.reason);
    expect(out.stats.squarings).toBeGreaterThan(20);
    const a = new D('3e6');
    const s = a.plus('7e6');
    const p01 = a.div(s).times(new D(1).minus(s.neg().times(2).exp()));
    expect(new D(out.valuesDecimal![0]!).minus(p01).abs().toNumber()).toBeLessThanOrEqual(1e-30);
  });
});
