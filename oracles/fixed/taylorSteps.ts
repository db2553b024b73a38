/**
 * v(t + L) = exp(L·Q) v(t) for a generator Q, applied to a vector by N Taylor steps of length h = L/N,
 * in exact fixed-point arithmetic (numbers.ts) with sparse products only.
 *
 * Method: the Taylor series of the matrix exponential (C. Moler and C. Van Loan, "Nineteen dubious
 * ways to compute the exponential of a matrix, twenty-five years later", SIAM Review 45(1), 2003,
 * section 3) applied to a vector step by step: with A = hQ, one step is
 *   ṽ ← Σ_{k≤K} ũ_k,   ũ_0 = ṽ,   ũ_k = trunc(A ũ_{k−1} / k)
 * where A ũ_{k−1} / k = (m_L / (10^{e_L+E}·N·k))·(Q_int ũ_{k−1}) is an exact integer product followed
 * by one division by an exact rational (Q = Q_int/10^E, L = m_L/10^{e_L}): each entry of ũ_k has an
 * error below ε = 2^−P, and nothing else is rounded (the rates, the step and 1/k are exact).
 *
 * Rigorous bound of one step (derived here). θ ≥ ‖A‖∞ = 2h·max exit rate. With u_k = A^k ṽ/k! the
 * exact terms from the same ṽ, d_k = ũ_k − u_k satisfies d_k = A d_{k−1}/k + e_k, |e_k| < ε, so
 *   ‖d_k‖ ≤ D_k,   D_0 = 0,   D_k = θ·D_{k−1}/k + ε,
 * and the truncated tail is ‖Σ_{k>K} A^k ṽ/k!‖ ≤ ‖ṽ‖·θ^{K+1}/(K+1)! / (1 − θ/(K+2)) (K + 2 > θ; a
 * geometric majorant of the exponential series, common practice). The step's error against exp(A)ṽ is
 * δ ≤ Σ_{k≤K} D_k + tail. The exact exp(A) is a stochastic matrix (‖exp(A)‖∞ = 1), so the errors of
 * the steps add: ‖ṽ_N − exp(LQ)v‖ ≤ Σ δ_i, with ‖ṽ_i‖ ≤ 1 + Σ_{j<i} δ_j for v ∈ [0, 1]^n.
 * The doubles that evaluate the bound carry a relative margin of 1e-9 (a few dozen operations, each
 * with relative error 2^−53).
 *
 * Cost and where it breaks down: N·K sparse products of BigInt entries, N ≈ 2·maxExit·L/θ_step; the
 * intermediate terms reach e^θ, which costs θ·log2(e) guard bits. The caller refuses when the
 * estimated work exceeds its budget (large λT times the number of transitions).
 */
import { intMatVec, type IntGenerator } from './generator.js';
import { pow10, type DecRational } from './numbers.js';

/** θ per step: larger steps need fewer products per unit of time but more guard bits (e^θ growth). */
export const THETA_STEP = 6;

export interface StepPlan {
  readonly N: number;
  readonly theta: number;
  readonly K: number;
}

/** Geometric tail majorant θ^{K+1}/(K+1)!/(1 − θ/(K+2)). */
export function taylorTail(theta: number, K: number): number {
  let t = 1;
  for (let j = 1; j <= K + 1; j++) t *= theta / j;
  return t / (1 - theta / (K + 2));
}

/** Steps and terms for a piece of length `length` (double, rounded up inside) at P bits. */
export function planSteps(maxExit: number, length: number, P: number): StepPlan {
  const nuL = 2 * maxExit * length * (1 + 1e-12);
  if (!(nuL > 0)) return { N: 0, theta: 0, K: 0 };
  const N = Math.max(1, Math.ceil(nuL / THETA_STEP));
  const theta = (nuL / N) * (1 + 1e-12);
  const eps = 2 ** -P;
  let K = Math.max(1, Math.ceil(2 * theta));
  while (taylorTail(theta, K) > eps && K < 100_000) K++;
  return { N, theta, K };
}

/** The rounding part Σ_{k≤K} D_k of one step's bound. */
export function roundingPerStep(theta: number, K: number, P: number): number {
  const eps = 2 ** -P;
  let Dk = 0;
  let sum = 0;
  for (let k = 1; k <= K; k++) {
    Dk = (theta * Dk) / k + eps;
    sum += Dk;
  }
  return sum;
}

export interface Stepped {
  readonly bound: number;
  readonly steps: number;
}

/**
 * Advance X (values X/2^P, modified in place) over a piece of exact length `len` with generator g.
 * `prior` is the error bound of X on entry (for the ‖ṽ‖ factor of the tail).
 */
export function stepPiece(
  g: IntGenerator, X: bigint[], P: number, len: DecRational, lengthNum: number, prior: number,
): Stepped {
  const plan = planSteps(g.maxExit, lengthNum, P);
  // Special case: nothing moves under g, or the piece has length 0.
  if (plan.N === 0 || len.m === 0n) return { bound: 0, steps: 0 };
  const { N, theta, K } = plan;
  const n = g.n;
  const round = roundingPerStep(theta, K, P);
  const tail = taylorTail(theta, K);
  const baseDen = pow10(len.e + g.E) * BigInt(N);
  const dens = Array.from({ length: K + 1 }, (_, k) => baseDen * BigInt(Math.max(k, 1)));
  const num = len.m;
  let u: bigint[] = X.slice();
  let W: bigint[] = new Array(n).fill(0n);
  let bound = 0;
  const moving = g.moving;
  for (let step = 0; step < N; step++) {
    for (let i = 0; i < n; i++) u[i] = X[i]!;
    for (let k = 1; k <= K; k++) {
      intMatVec(g, u, W);
      const den = dens[k]!;
      for (let q = 0; q < moving.length; q++) {
        const i = moving[q]!;
        const t = (W[i]! * num) / den;
        W[i] = t;
        X[i] = X[i]! + t;
      }
      const swap = u;
      u = W;
      W = swap;
    }
    bound += (round + tail * (1 + prior + bound)) * (1 + 1e-9);
  }
  return { bound, steps: N };
}
