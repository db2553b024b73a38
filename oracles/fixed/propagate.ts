/**
 * The value of a fixed (piecewise constant) scheduler in fixed point: with time left running from 0
 * to T, each piece of constant decisions d_i advances the vector by exp(Q_{d_i}·L_i) (taylorSteps.ts, or
 * squaring.ts for small stiff pieces),
 * starting from the terminal vector [s ∈ G], which is exact. Each piece's exact evolution is a
 * stochastic matrix, so the bounds of the pieces add.
 */
import { parseExact, type DecModel } from '../common/decModel.js';
import type { LeftPiece } from '../expm/propagate.js';
import { commonExponent, intGenerator, type IntGenerator } from './generator.js';
import { rationalOf } from './numbers.js';
import { planSquaring, squaringCost, squaringPiece } from './squaring.js';
import { planSteps, stepPiece } from './taylorSteps.js';

export interface FixedValues {
  /** Values X / 2^P. */
  readonly X: bigint[];
  readonly P: number;
  /** Rigorous bound on max_s |X_s/2^P − v_s|. */
  readonly bound: number;
  readonly steps: number;
  readonly squarings: number;
  readonly maxTerms: number;
}

/**
 * Taylor steps (work linear in 2·maxExit·L, sparse) or scaling and squaring (work s·n³, dense):
 * whichever is estimated cheaper at a reference precision of 200 bits.
 */
export function pieceMethod(n: number, nnz: number, maxExit: number, length: number): 'steps' | 'squaring' {
  const st = planSteps(maxExit, length, 200);
  const steps = st.N * st.K * (nnz + 2 * n);
  return squaringCost(n, nnz, planSquaring(maxExit, length, 200)) < steps ? 'squaring' : 'steps';
}

/**
 * log2 of the growth of rounding errors of a piece (in units of 2^−P): Taylor steps N·(K+1)·e^θ,
 * scaling and squaring 2^s·n·(K+2). The caller adds these guard bits.
 */
export function pieceGuardBits(n: number, maxExit: number, length: number, P: number): number {
  const st = planSteps(maxExit, length, P);
  const sq = planSquaring(maxExit, length, P);
  const steps = Math.log2(st.N * (st.K + 1) + 1) + st.theta * Math.LOG2E;
  return Math.max(steps, sq.s + Math.log2(n * (sq.K + 2)));
}

export function propagateFixed(dm: DecModel, pieces: readonly LeftPiece[], P: number): FixedValues {
  const E = commonExponent(dm);
  const one = 1n << BigInt(P);
  const X = dm.terminal.map((v) => (v.isZero() ? 0n : one));
  const cache = new Map<string, IntGenerator>();
  let bound = 0;
  let steps = 0;
  let squarings = 0;
  let maxTerms = 0;
  for (const piece of pieces) {
    const len = rationalOf(parseExact(dm.D, piece.length));
    if (len.m === 0n) continue;
    const key = piece.choice.join(',');
    let g = cache.get(key);
    if (!g) cache.set(key, (g = intGenerator(dm, piece.choice, E)));
    const lengthNum = Number(piece.length);
    if (pieceMethod(g.n, g.nnz, g.maxExit, lengthNum) === 'squaring') {
      const plan = planSquaring(g.maxExit, lengthNum, P);
      bound += squaringPiece(g, X, P, len, lengthNum, bound);
      squarings += plan.s;
      maxTerms = Math.max(maxTerms, plan.K);
      continue;
    }
    const r = stepPiece(g, X, P, len, lengthNum, bound);
    bound += r.bound;
    steps += r.steps;
    maxTerms = Math.max(maxTerms, planSteps(g.maxExit, lengthNum, P).K);
  }
  return { X, P, bound, steps, squarings, maxTerms };
}

/** Estimated BigInt multiply-adds of propagateFixed (for refusing before starting). */
export function propagateFixedCost(
  n: number, nnz: number, maxExit: number, lengths: readonly number[], P: number,
): number {
  let ops = 0;
  for (const len of lengths) {
    const plan = planSteps(maxExit, len, P);
    const steps = plan.N * plan.K * (nnz + 2 * n);
    ops += Math.min(steps, squaringCost(n, nnz, planSquaring(maxExit, len, P)));
  }
  // BigInt cost grows with the number of 64-bit words; calibrated at ~192 bits.
  return ops * Math.max(1, P / 192);
}
