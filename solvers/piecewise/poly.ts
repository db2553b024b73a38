/**
 * Dense polynomials p(τ) = Σ_{i=0}^{deg} c_i τ^i stored as coefficient slices of a Float64Array,
 * in the global variable τ of an interval (never re-expanded around a piece's left end, so that a
 * piecewise polynomial's pieces share one coordinate and no shift adds rounding).
 *
 * Evaluation is Horner's rule; its error is at most γ_{2·deg}·Σ|c_i||τ|^i with γ_n = n·u/(1 − n·u)
 * and u = 2^−53 (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed. 2002, §5.1).
 */

/** Unit roundoff of IEEE double precision. */
export const UNIT_ROUNDOFF = 2 ** -53;

/** γ_n = n·u/(1 − n·u) (Higham 2002, Lemma 3.1). */
export function gamma(n: number): number {
  const nu = n * UNIT_ROUNDOFF;
  return nu / (1 - nu);
}

/** p(τ) by Horner's rule, coefficients c[off] … c[off+deg]. */
export function horner(c: ArrayLike<number>, off: number, deg: number, tau: number): number {
  let r = c[off + deg]!;
  for (let i = deg - 1; i >= 0; i--) r = r * tau + c[off + i]!;
  return r;
}

/** Σ |c_i|·|τ|^i, the magnitude that scales Horner's rounding error at τ. */
export function absSum(c: ArrayLike<number>, off: number, deg: number, tau: number): number {
  const t = Math.abs(tau);
  let r = Math.abs(c[off + deg]!);
  for (let i = deg - 1; i >= 0; i--) r = r * t + Math.abs(c[off + i]!);
  return r;
}

/** Degree after dropping exactly-zero leading coefficients (−1 for the zero polynomial). */
export function trueDegree(c: ArrayLike<number>, off: number, deg: number): number {
  let d = deg;
  while (d >= 0 && c[off + d] === 0) d--;
  return d;
}

/** Coefficients of p′ (degree deg − 1) as a new array. */
export function derivative(c: ArrayLike<number>, off: number, deg: number): Float64Array {
  const out = new Float64Array(Math.max(deg, 1));
  for (let i = 1; i <= deg; i++) out[i - 1] = i * c[off + i]!;
  return out;
}
