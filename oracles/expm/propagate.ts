/**
 * The dense path, kept as an independent check of the fixed-point Taylor steps (../fixed/) on small
 * models (tests compare the two; the oracle itself uses the fixed-point path).
 * The value of a fixed (piecewise constant) scheduler: with time left running from 0 to T, each
 * piece of constant decisions multiplies the vector by its own exact exponential,
 *   v(t_{i+1}) = exp(Q_{d_i} (t_{i+1} − t_i)) v(t_i),   v(0) = terminal vector,
 * as in C. Moler and C. Van Loan, SIAM Review 45(1), 2003 (scaling and squaring per piece, see
 * taylor.ts). The exact evolution over each piece is a stochastic matrix, hence non-expansive in
 * the sup norm, so the errors of the pieces add: ‖ṽ − v‖ ≤ Σ_i (δ_i + (n+1)u(1+δ_i))·‖ṽ_i‖.
 */
import { parseExact, type Dec, type DecModel } from '../common/decModel.js';
import { applyDense, expOfGenerator } from './taylor.js';

/** A piece of constant decisions, in order of time left; `length` is an exact decimal text. */
export interface LeftPiece {
  readonly length: string;
  /** Local action index per state, or −1. */
  readonly choice: Int32Array;
}

export interface Propagated {
  readonly values: Dec[];
  readonly bound: number;
  readonly squarings: number;
  readonly terms: number;
}

export function propagate(dm: DecModel, pieces: readonly LeftPiece[]): Propagated {
  const zero = new dm.D(0);
  let x: Dec[] = [...dm.terminal];
  let bound = 0;
  let squarings = 0;
  let terms = 0;
  for (const piece of pieces) {
    const len = parseExact(dm.D, piece.length);
    if (len.isZero()) continue;
    const e = expOfGenerator(dm, piece.choice, len);
    const { y, added } = applyDense(e, x, dm.n, dm.u, zero);
    x = y;
    // The piece length was read exactly; its rounding inside expOfGenerator is in e.bound.
    bound += added;
    squarings += e.squarings;
    terms = Math.max(terms, e.terms);
  }
  return { values: x, bound, squarings, terms };
}
