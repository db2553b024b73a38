/**
 * exp(L·Q) applied to a vector by scaling and squaring in exact fixed-point arithmetic: for small,
 * stiff pieces (large 2·maxExit·L, few states), where Taylor steps would need work linear in λL.
 *
 * Method: C. Moler and C. Van Loan, "Nineteen dubious ways to compute the exponential of a matrix,
 * twenty-five years later", SIAM Review 45(1), 2003, section 3: exp(LQ) = exp(A)^(2^s), A = LQ/2^s,
 * s the least integer with θ = 2·maxExit·L/2^s ≤ 1/2 (θ ≥ ‖A‖∞), exp(A) by its Taylor polynomial.
 *
 * Rigorous bound (derived here; norms are ‖·‖∞ of matrices, i.e. the ℓ1 norm of each row).
 * Taylor phase, row by row: r_0 = e_i, r_k = trunc(r_{k−1}A/k) (an exact integer product by the
 * exact rational A/k, then one truncation below ε = 2^−P per entry, n entries at most), so the row
 * error obeys ‖d_k‖₁ ≤ θ‖d_{k−1}‖₁/k + nε (‖rA‖₁ ≤ ‖r‖₁‖A‖∞), and with the tail
 *   δ_0 = Σ_{k≤K} D_k (D_k = θD_{k−1}/k + nε) + θ^{K+1}/(K+1)!/(1 − θ/(K+2)).
 * Squaring: each exact power exp(A)^(2^j) is a stochastic matrix (norm 1); if ‖P̃ − P‖ ≤ δ then
 * ‖P̃² − P²‖ ≤ δ(1 + δ) + δ, and the computed square truncates each entry once (row error < nε), so
 *   δ_{j+1} = δ_j(2 + δ_j) + nε.
 * Applying P̃ to x (entries truncated once): error ≤ δ_s‖x‖ + ε, with ‖x‖ ≤ 1 + prior.
 * The errors grow like 2^s·n·ε: the caller adds s + log2(n) guard bits.
 * Breaks down: s·n³ BigInt multiply-adds; used only where that is cheaper than Taylor steps.
 */
import type { IntGenerator } from './generator.js';
import { pow10, type DecRational } from './numbers.js';
import { taylorTail } from './taylorSteps.js';

export interface SquaringPlan {
  readonly s: number;
  readonly theta: number;
  readonly K: number;
}

export function planSquaring(maxExit: number, length: number, P: number): SquaringPlan {
  const nuL = 2 * maxExit * length * (1 + 1e-12);
  let s = 0;
  while (nuL / 2 ** s > 0.5) s++;
  const theta = (nuL / 2 ** s) * (1 + 1e-12);
  let K = 1;
  while (taylorTail(theta, K) > 2 ** -P && K < 10_000) K++;
  return { s, theta, K };
}

/** Estimated BigInt multiply-adds of squaringPiece. */
export function squaringCost(n: number, nnz: number, plan: SquaringPlan): number {
  return plan.s * n ** 3 + plan.K * n * (nnz + n) + n * n;
}

/** Advance X (values X/2^P, in place) over a piece of exact length `len`; returns the piece's bound. */
export function squaringPiece(
  g: IntGenerator, X: bigint[], P: number, len: DecRational, lengthNum: number, prior: number,
): number {
  const { n, rowStart, col, rate, diag } = g;
  const { s, theta, K } = planSquaring(g.maxExit, lengthNum, P);
  const eps = 2 ** -P;
  const one = 1n << BigInt(P);
  // A/k = m_L·Q_int / (10^{e_L+E}·2^s·k).
  const baseDen = pow10(len.e + g.E) << BigInt(s);
  const M: bigint[] = new Array(n * n).fill(0n);
  const r: bigint[] = new Array(n).fill(0n);
  const out: bigint[] = new Array(n).fill(0n);
  for (let i = 0; i < n; i++) {
    r.fill(0n);
    r[i] = one;
    M[i * n + i] = one;
    for (let k = 1; k <= K; k++) {
      out.fill(0n);
      let any = false;
      for (let l = 0; l < n; l++) {
        const rl = r[l]!;
        if (rl === 0n || diag[l] === 0n) continue;
        any = true;
        out[l] = out[l]! - rl * diag[l]!;
        for (let q = rowStart[l]!; q < rowStart[l + 1]!; q++) out[col[q]!] = out[col[q]!]! + rl * rate[q]!;
      }
      if (!any) break;
      const den = baseDen * BigInt(k);
      for (let j = 0; j < n; j++) {
        const v = out[j]!;
        r[j] = v === 0n ? 0n : (v * len.m) / den;
        if (r[j] !== 0n) M[i * n + j] = M[i * n + j]! + r[j]!;
      }
    }
  }
  let D = 0;
  let sum = 0;
  for (let k = 1; k <= K; k++) {
    D = (theta * D) / k + n * eps;
    sum += D;
  }
  let delta = (sum + taylorTail(theta, K)) * (1 + 1e-9);
  let cur = M;
  const q = BigInt(P);
  for (let j = 0; j < s; j++) {
    const C: bigint[] = new Array(n * n).fill(0n);
    for (let i = 0; i < n; i++) {
      for (let l = 0; l < n; l++) {
        const a = cur[i * n + l]!;
        if (a === 0n) continue;
        for (let c = 0; c < n; c++) {
          const b = cur[l * n + c]!;
          if (b !== 0n) C[i * n + c] = C[i * n + c]! + a * b;
        }
      }
    }
    for (let t = 0; t < n * n; t++) C[t] = C[t]! >> q;
    cur = C;
    delta = (delta * (2 + delta) + n * eps) * (1 + 1e-9);
  }
  const y: bigint[] = new Array(n).fill(0n);
  for (let i = 0; i < n; i++) {
    let acc = 0n;
    for (let j = 0; j < n; j++) if (cur[i * n + j] !== 0n && X[j] !== 0n) acc += cur[i * n + j]! * X[j]!;
    y[i] = acc >> q;
  }
  for (let i = 0; i < n; i++) X[i] = y[i]!;
  return (delta * (1 + prior) + eps) * (1 + 1e-9);
}
