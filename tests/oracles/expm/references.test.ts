/**
 * The exact exponential against outside references: mathjs 15.2.0's `expm` (Padé with scaling and
 * squaring) on random small generators, and the worked example of C. Moler and C. Van Loan,
 * "Nineteen dubious ways to compute the exponential of a matrix, twenty-five years later", SIAM
 * Review 45(1), 2003.
 */
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { expm, matrix } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { decimalAt, decModel } from '../../../oracles/common/decModel.js';
import { expOfGenerator, scalingExponent, taylorDegree, taylorThenSquare } from '../../../oracles/expm/taylor.js';

describe('expm against mathjs 15.2.0 expm', () => {
  it('random generators of 2–6 states, rates 1e-2 … 1e2, entries agree to 1e-12 (mathjs 15.2.0)', () => {
    const arb = fc.integer({ min: 2, max: 6 }).chain((n) =>
      fc.record({
        n: fc.constant(n),
        rates: fc.array(fc.array(fc.oneof(fc.constant(0), fc.double({ min: -2, max: 2, noNaN: true })), { minLength: n, maxLength: n }), { minLength: n, maxLength: n }),
        t: fc.double({ min: 0.01, max: 3, noNaN: true }),
      }));
    fc.assert(
      fc.property(arb, ({ n, rates, t }) => {
        const states: Record<string, { actions: Record<string, Record<string, string>> }> = {};
        const Q: number[][] = Array.from({ length: n }, () => new Array(n).fill(0));
        for (let i = 0; i < n; i++) {
          const succ: Record<string, string> = {};
          for (let j = 0; j < n; j++) {
            const e = rates[i]![j]!;
            if (i === j || e === 0) continue;
            const r = Number((10 ** e).toPrecision(4));
            succ[`s${j}`] = String(r);
            Q[i]![j] = r;
            Q[i]![i]! -= r;
          }
          states[`s${i}`] = { actions: { go: succ } };
        }
        const tb = Number(t.toPrecision(4));
        const dm = decModel(buildModel({ time_bound: String(tb), goal: [], goal_mode: 'at', states }), decimalAt(40));
        const mine = expOfGenerator(dm, new Int32Array(n), new dm.D(String(tb)));
        const ref = expm(matrix(Q.map((row) => row.map((q) => q * tb)))).toArray() as number[][];
        for (let i = 0; i < n; i++) {
          for (let j = 0; j < n; j++) expect(Math.abs(mine.P[i * n + j]!.toNumber() - ref[i]![j]!)).toBeLessThanOrEqual(1e-12);
        }
        expect(mine.bound).toBeLessThan(1e-30);
      }),
      { numRuns: 40, seed: 4242 },
    );
  });
});

describe('Moler & Van Loan 2003 worked example A = [[-49, 24], [-64, 31]]', () => {
  // Eigenvalues −1 and −17 with eigenvectors (1, 2) and (3, 4) (derived here), so
  //   e^A = [[−2e^{−1} + 3e^{−17}, 1.5e^{−1} − 1.5e^{−17}], [−4e^{−1} + 4e^{−17}, 3e^{−1} − 2e^{−17}]].
  // The paper's rounded values [[-0.735759, 0.551819], [-1.471518, 1.103638]] are from memory.
  const D = decimalAt(50);
  const rows = [[-49, 24], [-64, 31]];
  const norm = 95; // ‖A‖∞
  const s = scalingExponent(norm);
  const K = taylorDegree(norm / 2 ** s, 1e-45);
  const scale = new D(2).pow(s);
  const aCol = [Int32Array.from([0, 1]), Int32Array.from([0, 1])];
  const aVal = rows.map((r) => r.map((x) => new D(x).div(scale)));
  const P = taylorThenSquare(D, 2, aCol, aVal, K, s);

  it('matches the closed form from the eigen-decomposition to 25 digits', () => {
    const e1 = new D(-1).exp();
    const e17 = new D(-17).exp();
    const closed = [
      e1.times(-2).plus(e17.times(3)), e1.times('1.5').minus(e17.times('1.5')),
      e1.times(-4).plus(e17.times(4)), e1.times(3).minus(e17.times(2)),
    ];
    // This matrix is not a generator: ‖e^{A/2^j}‖ is not 1 and the cancellation in the series is
    // heavy (Moler & Van Loan's point), so 25 of the 50 working digits are asked, not 40.
    for (let i = 0; i < 4; i++) expect(P[i]!.minus(closed[i]!).abs().toNumber()).toBeLessThan(1e-25);
  });

  it("matches the paper's six-digit values (from memory)", () => {
    const paper = [-0.735759, 0.551819, -1.471518, 1.103638];
    for (let i = 0; i < 4; i++) expect(Math.abs(P[i]!.toNumber() - paper[i]!)).toBeLessThan(1e-6);
  });
});

describe('expm bound honoured against a more precise run', () => {
  it('a stiff 3-state generator (rates 1e-4 … 1e4): |P(40 digits) − P(80 digits)| ≤ bound', () => {
    const m = buildModel({
      time_bound: '2', goal: [], goal_mode: 'at',
      states: { a: { actions: { go: { b: '10000', c: '0.0001' } } }, b: { actions: { go: { a: '9000', c: '3' } } }, c: { actions: { go: { a: '0.5' } } } },
    });
    const lo = decModel(m, decimalAt(40));
    const hi = decModel(m, decimalAt(80));
    const pLo = expOfGenerator(lo, new Int32Array(3), new lo.D(2));
    const pHi = expOfGenerator(hi, new Int32Array(3), new hi.D(2));
    let rowErr = 0;
    for (let i = 0; i < 3; i++) {
      let r = new Decimal(0);
      for (let j = 0; j < 3; j++) r = r.plus(new Decimal(pLo.P[i * 3 + j]!.toString()).minus(pHi.P[i * 3 + j]!.toString()).abs());
      rowErr = Math.max(rowErr, r.toNumber());
    }
    expect(pLo.squarings).toBeGreaterThan(10);
    expect(rowErr).toBeLessThanOrEqual(pLo.bound + pHi.bound);
    expect(pLo.bound).toBeLessThan(1e-30);
  });
});
