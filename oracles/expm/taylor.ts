/**
 * exp(Q·t) of a CTMC generator in decimal arithmetic, by scaling and squaring with a Taylor series.
 *
 * Method: C. Moler and C. Van Loan, "Nineteen dubious ways to compute the exponential of a matrix,
 * twenty-five years later", SIAM Review 45(1), 2003, section 3 (scaling and squaring):
 * exp(Qt) = exp(A)^(2^s) with A = Q·t/2^s, where s is the least integer with θ = ‖A‖∞ ≤ 1/2
 * (‖Q‖∞ = 2·max exit rate for a generator), and exp(A) is the Taylor polynomial of degree K.
 *
 * Rigorous truncation bound (derived here). For ‖A‖ ≤ θ ≤ 1/2:
 *   ‖Σ_{k>K} A^k/k!‖ ≤ Σ_{k>K} θ^k/k! ≤ θ^{K+1}/(K+1)! · Σ_{j≥0} (θ/(K+2))^j ≤ 2·θ^{K+1}/(K+1)!.
 * Squaring: the exact exp(A) is a stochastic matrix (it is the transition matrix over time t/2^s),
 * so ‖exp(A)^{2^j}‖∞ = 1. If ‖P̃ − P‖ ≤ δ with ‖P‖ = 1, then
 *   ‖P̃² − P²‖ ≤ ‖P̃ − P‖‖P̃‖ + ‖P‖‖P̃ − P‖ ≤ δ(1 + δ) + δ = δ(2 + δ),
 * i.e. 1 + δ_{j+1} = (1 + δ_j)², so after s squarings δ_s = (1 + δ_0)^{2^s} − 1 ≈ 2^s·δ_0: the
 * error grows with ‖Q‖t but not exponentially. Each computed squaring adds its own rounding,
 * γ·(1 + δ_j)² with γ = (n+1)u for dot products of length n (|P̃||P̃| has the row sums of P̃²'s
 * bound), so the recursion actually run is δ_{j+1} = δ_j(2 + δ_j) + γ(1 + δ_j)².
 *
 * Rounding in the Taylor phase (first order in the unit roundoff u, a priori): the input
 * perturbation of A (rates·h and exit rates rounded) is ‖ΔA‖ ≤ (m+4)·u·θ for rows of ≤ m
 * successors, whose effect is ≤ ‖ΔA‖·e^{θ+‖ΔA‖}; the K products T_k = T_{k−1}A/k and the K sums
 * add at most ((n+2) + K + 2)·u·e^θ. Both are doubled for safety.
 *
 * Breaks down: cost is s dense products of n³ decimal multiply-adds plus K sparse ones of n·nnz;
 * the caller refuses models where that exceeds its budget. Exact zeros are skipped (they stay
 * exact), so sparse and acyclic structure makes it cheaper.
 */
import type { Dec, DecAction, DecCtor, DecModel } from '../common/decModel.js';

export interface ExpOfGenerator {
  /** exp(Q t) as a dense row-major n×n matrix. */
  readonly P: Dec[];
  /** ‖P − exp(Qt)‖∞ ≤ bound (truncation and rounding). */
  readonly bound: number;
  readonly squarings: number;
  readonly terms: number;
}

/** Least K with 2θ^{K+1}/(K+1)! ≤ eps (θ ≤ 1/2). */
export function taylorDegree(theta: number, eps: number): number {
  let k = 0;
  let term = 2 * theta; // 2θ^{k+1}/(k+1)! at k = 0
  while (term > eps && k < 10_000) {
    k++;
    term *= theta / (k + 1);
  }
  return Math.max(k, 1);
}

/** The scaling exponent s: least s ≥ 0 with ν·t/2^s ≤ 1/2. */
export function scalingExponent(nuT: number): number {
  let s = 0;
  while (nuT / 2 ** s > 0.5) s++;
  return s;
}

/** Rows of the generator of the fixed choice (choice[s] = local action index or −1). */
export function chosenRows(dm: DecModel, choice: Int32Array): (DecAction | undefined)[] {
  return dm.actions.map((acts, s) => (choice[s]! >= 0 ? acts[choice[s]!] : undefined));
}

function identity(dm: DecModel): Dec[] {
  const n = dm.n;
  const zero = new dm.D(0);
  const one = new dm.D(1);
  const I: Dec[] = new Array(n * n).fill(zero);
  for (let i = 0; i < n; i++) I[i * n + i] = one;
  return I;
}

export function expOfGenerator(dm: DecModel, choice: Int32Array, t: Dec): ExpOfGenerator {
  const { D, n, u } = dm;
  const rows = chosenRows(dm, choice);
  let maxExit = 0;
  let m = 0;
  for (const r of rows) if (r) { maxExit = Math.max(maxExit, r.exitUpper); m = Math.max(m, r.target.length); }
  const nuT = 2 * maxExit * t.toNumber() * (1 + 1e-12);
  // Special cases: nothing moves, or no time passes.
  if (!(nuT > 0)) return { P: identity(dm), bound: 0, squarings: 0, terms: 0 };

  const s = scalingExponent(nuT);
  const theta = nuT / 2 ** s;
  const K = taylorDegree(theta, u);
  const h = t.div(new D(2).pow(s));
  // Sparse A = Q·h, row by row, diagonal included.
  const aCol: Int32Array[] = [];
  const aVal: Dec[][] = [];
  for (let i = 0; i < n; i++) {
    const r = rows[i];
    if (!r || r.target.length === 0) { aCol.push(new Int32Array(0)); aVal.push([]); continue; }
    aCol.push(Int32Array.from([i, ...r.target]));
    aVal.push([r.exit.times(h).neg(), ...r.rate.map((x) => x.times(h))]);
  }
  const R = taylorThenSquare(dm.D, n, aCol, aVal, K, s);
  const eTheta = Math.exp(theta);
  const trunc = 2 * theta ** (K + 1) / factorial(K + 1);
  const dA = (m + 4) * u * theta;
  const inputPert = 2 * dA * Math.exp(theta + dA);
  const taylorRound = 2 * (n + 2 + K + 2) * u * eTheta;
  let delta = trunc + inputPert + taylorRound;
  const gamma = (n + 1) * u * 1.01;
  for (let j = 0; j < s; j++) delta = delta * (2 + delta) + gamma * (1 + delta) ** 2;
  return { P: R, bound: delta * (1 + 1e-9), squarings: s, terms: K };
}

/**
 * The bare numerics, for any matrix given by sparse rows (aCol, aVal) of A = M/2^s:
 * (Σ_{k≤K} A^k/k!)^(2^s). Bounds are the caller's (the generator case is derived above).
 */
export function taylorThenSquare(D: DecCtor, n: number, aCol: readonly Int32Array[], aVal: readonly Dec[][], K: number, s: number): Dec[] {
  const zero = new D(0);
  const one = new D(1);
  const I: Dec[] = new Array(n * n).fill(zero);
  for (let i = 0; i < n; i++) I[i * n + i] = one;
  let T = I;
  const P = [...I];
  for (let k = 1; k <= K; k++) {
    const next: Dec[] = new Array(n * n).fill(zero);
    for (let i = 0; i < n; i++) {
      const base = i * n;
      for (let l = 0; l < n; l++) {
        const til = T[base + l]!;
        if (til.isZero()) continue;
        const cols = aCol[l]!;
        const vals = aVal[l]!;
        for (let q = 0; q < cols.length; q++) {
          const j = base + cols[q]!;
          next[j] = next[j]!.plus(til.times(vals[q]!));
        }
      }
    }
    for (let j = 0; j < n * n; j++) {
      if (next[j]!.isZero()) continue;
      next[j] = next[j]!.div(k);
      P[j] = P[j]!.plus(next[j]!);
    }
    T = next;
  }
  let R = P;
  for (let j = 0; j < s; j++) R = square(R, n, zero);
  return R;
}

function factorial(k: number): number {
  let f = 1;
  for (let i = 2; i <= k; i++) f *= i;
  return f;
}

/** P·P for a dense row-major matrix, skipping exact zeros. */
function square(P: Dec[], n: number, zero: Dec): Dec[] {
  const C: Dec[] = new Array(n * n).fill(zero);
  for (let i = 0; i < n; i++) {
    const base = i * n;
    for (let l = 0; l < n; l++) {
      const a = P[base + l]!;
      if (a.isZero()) continue;
      const lb = l * n;
      for (let j = 0; j < n; j++) {
        const b = P[lb + j]!;
        if (b.isZero()) continue;
        C[base + j] = C[base + j]!.plus(a.times(b));
      }
    }
  }
  return C;
}

/**
 * y = P x for the dense P; returns y and the added error: with ‖P − exp‖ ≤ δ and the exact
 * evolution non-expansive, ‖y − exp·x_true‖ ≤ ‖x − x_true‖ + δ‖x‖ + (n+1)u(1+δ)‖x‖.
 */
export function applyDense(e: ExpOfGenerator, x: readonly Dec[], n: number, u: number, zero: Dec): { y: Dec[]; added: number } {
  const y: Dec[] = new Array(n).fill(zero);
  let xNorm = 0;
  for (const v of x) xNorm = Math.max(xNorm, Math.abs(v.toNumber()));
  for (let i = 0; i < n; i++) {
    let acc = zero;
    for (let j = 0; j < n; j++) {
      const p = e.P[i * n + j]!;
      const xj = x[j]!;
      if (p.isZero() || xj.isZero()) continue;
      acc = acc.plus(p.times(xj));
    }
    y[i] = acc;
  }
  const added = (e.bound + (n + 1) * u * (1 + e.bound) * 1.01) * xNorm * (1 + 1e-9);
  return { y, added };
}
