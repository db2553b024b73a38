/**
 * A rigorous enclosure of the range of a polynomial p(τ) = Σ_{j≤n} e_j τ^j over [0, h], whose
 * coefficients are known up to |Δe_j| ≤ de_j, in floating point.
 *
 * Method: the Bernstein form. With a_j = e_j h^j, p(h·x) = Σ_i b_i B_{n,i}(x) on x ∈ [0, 1], where
 * b_i = Σ_{j≤i} [C(i,j)/C(n,j)] a_j, and since the Bernstein basis polynomials are non-negative and
 * sum to 1, min_i b_i ≤ p ≤ max_i b_i on [0, h] (R. T. Farouki, "The Bernstein polynomial basis: a
 * centennial retrospective", Computer Aided Geometric Design 29, 2012, §2 and the convex hull property;
 * the conversion formula is standard, from memory).
 *
 * Rounding (standard model, u = 2^−53, γ_n = nu/(1 − nu); Higham, "Accuracy and Stability of Numerical
 * Algorithms", 2002, Lemma 3.1): h^j carries relative error ≤ γ_j and a_j one more u; each weight
 * w_ij = C(i,j)/C(n,j) ∈ [0, 1] carries ≤ γ_{n+2} (products and one division of exact integers), and
 * the sum over j ≤ n terms adds γ_n of Σ|w a|. So every computed b̃_i satisfies
 *     |b̃_i − b_i| ≤ γ_{3n+4}·Σ_j |a_j| + Σ_j de_j·h^j·(1 + γ_{2n+3}),
 * where b_i are the exact Bernstein coefficients of the exact polynomial. The enclosure is widened by
 * that amount. Special cases first: n = 0 (a constant) and h = 0.
 */
import { gamma, UNIT_ROUNDOFF } from '../piecewise/poly.js';

/** Weights C(i,j)/C(n,j) for 0 ≤ j ≤ i ≤ n, row-major at i·(n+1) + j. */
export function bernsteinWeights(n: number): Float64Array {
  const w = new Float64Array((n + 1) * (n + 1));
  const binom = (a: number, b: number): number => {
    let r = 1;
    for (let q = 1; q <= b; q++) r = (r * (a - b + q)) / q;
    return r;
  };
  for (let i = 0; i <= n; i++) for (let j = 0; j <= i; j++) w[i * (n + 1) + j] = binom(i, j) / binom(n, j);
  return w;
}

/**
 * Encloses the Bernstein coefficients of p on [0, h]: lo[i] ≤ b_i ≤ hi[i] for the exact b_i of the
 * exact polynomial. Then lo_min ≤ p ≤ hi_max on [0, h], and since ∫₀^h B_{n,i}(τ/h) dτ = h/(n + 1),
 * ∫₀^h max(p, 0) ≤ h·Σ_i max(hi[i], 0)/(n + 1). `a` is scratch of length ≥ n + 1; `w` from
 * bernsteinWeights(n).
 */
export function bernsteinEnclosure(e: Float64Array, de: Float64Array, n: number, h: number, w: Float64Array, a: Float64Array, lo: Float64Array, hi: Float64Array): void {
  let pw = 1;
  let absA = 0;
  let err = 0;
  for (let j = 0; j <= n; j++) {
    a[j] = e[j]! * pw;
    absA += Math.abs(a[j]!);
    err += de[j]! * pw;
    pw *= h;
  }
  // The last term covers the rounding of the slack itself and of b ∓ slack.
  const slack0 = (gamma(3 * n + 4) * absA + err * (1 + gamma(2 * n + 3))) * (1 + 1e-12);
  for (let i = 0; i <= n; i++) {
    let b = 0;
    const row = i * (n + 1);
    for (let j = 0; j <= i; j++) b += w[row + j]! * a[j]!;
    const slack = slack0 + 2 * UNIT_ROUNDOFF * (Math.abs(b) + slack0);
    lo[i] = b - slack;
    hi[i] = b + slack;
  }
}

export interface Range {
  lo: number;
  hi: number;
}

/** Encloses {p(τ) : τ ∈ [0, h]} in [out.lo, out.hi] (see bernsteinEnclosure). */
export function polyRange(e: Float64Array, de: Float64Array, n: number, h: number, w: Float64Array, out: Range): void {
  const a = new Float64Array(n + 1);
  const lo = new Float64Array(n + 1);
  const hi = new Float64Array(n + 1);
  bernsteinEnclosure(e, de, n, h, w, a, lo, hi);
  out.lo = Math.min(...lo);
  out.hi = Math.max(...hi);
}
