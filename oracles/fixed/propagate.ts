/**
 * The value of a fixed (piecewise constant) scheduler in fixed point: with time left running from 0
 * to T, each piece of constant decisions d_i advances the vector by exp(Q_{d_i}·L_i) (taylorSteps.ts),
 * starting from the terminal vector [s ∈ G], which is exact. Each piece's exact evolution is a
 * stochastic matrix, so the bounds of the pieces add.
 */
import { parseExact, type DecModel } from '../common/decModel.js';
import type { LeftPiece } from '../expm/propagate.js';
import { commonExponent, intGenerator, type IntGenerator } from './generator.js';
import { rationalOf } from './numbers.js';
import { planSteps, stepPiece } from './taylorSteps.js';

export interface FixedValues {
  /** Values X / 2^P. */
  readonly X: bigint[];
  readonly P: number;
  /** Rigorous bound on max_s |X_s/2^P − v_s|. */
  readonly bound: number;
  readonly steps: number;
  readonly maxTerms: number;
}

export function propagateFixed(dm: DecModel, pieces: readonly LeftPiece[], P: number): FixedValues {
  const E = commonExponent(dm);
  const one = 1n << BigInt(P);
  const X = dm.terminal.map((v) => (v.isZero() ? 0n : one));
  const cache = new Map<string, IntGenerator>();
  let bound = 0;
  let steps = 0;
  let maxTerms = 0;
  for (const piece of pieces) {
    const len = rationalOf(parseExact(dm.D, piece.length));
    if (len.m === 0n) continue;
    const key = piece.choice.join(',');
    let g = cache.get(key);
    if (!g) cache.set(key, (g = intGenerator(dm, piece.choice, E)));
    const lengthNum = Number(piece.length);
    const r = stepPiece(g, X, P, len, lengthNum, bound);
    bound += r.bound;
    steps += r.steps;
    maxTerms = Math.max(maxTerms, planSteps(g.maxExit, lengthNum, P).K);
  }
  return { X, P, bound, steps, maxTerms };
}

/** Estimated BigInt multiply-adds of propagateFixed (for refusing before starting). */
export function propagateFixedCost(
  n: number, nnz: number, maxExit: number, lengths: readonly number[], P: number,
): number {
  let ops = 0;
  for (const len of lengths) {
    const plan = planSteps(maxExit, len, P);
    ops += plan.N * plan.K * (nnz + 2 * n);
  }
  // BigInt cost grows with the number of 64-bit words; calibrated at ~192 bits.
  return ops * Math.max(1, P / 192);
}
