/**
 * A-posteriori truncation bound of one interval of the k-step scheme, from the last two levels.
 *
 * Setting and notation as in ./bound.ts: Φ(g)(τ) = x + ∫₀^τ B(g(σ)) dσ is the Picard map of the
 * interval, f its fixed point (the exact solution from x), ‖B(y) − B(z)‖ ≤ 2λ‖y − z‖ (sup norm over
 * states), and f̃^j the computed levels (polynomials, or piecewise polynomials, with the computed
 * coefficients), with sup_τ ‖f̃^k(τ) − Φ(f̃^{k−1})(τ)‖ ≤ δ, δ the rounding and tie terms of ./bound.ts.
 *
 * Claim. With D(σ) = ‖f̃^k(σ) − f̃^{k−1}(σ)‖ and e(τ) = ‖f̃^k(τ) − f(τ)‖,
 *     e(τ) ≤ e^{2λτ}·(δ + 2λ ∫₀^τ D(σ) dσ)                                                     (A)
 * Proof. f̃^k − f = (f̃^k − Φ(f̃^{k−1})) + (Φ(f̃^{k−1}) − Φ(f)), so
 *     e(τ) ≤ δ + 2λ∫₀^τ ‖f̃^{k−1} − f‖ ≤ δ + 2λ∫₀^τ D + 2λ∫₀^τ e = g(τ) + 2λ∫₀^τ e,
 * with g nondecreasing; Gronwall's inequality (integral form; e.g. Hairer, Nørsett & Wanner, "Solving
 * Ordinary Differential Equations I", 2nd ed. 1993, §I.10, Lemma 10.1 in its linear special case)
 * gives e(τ) ≤ g(τ)e^{2λτ}. No smallness of λε is needed (unlike the contraction form
 * q/(1 − q)·sup D with q = 2λε, which (A) improves by about the factor k + 1 when D(σ) ∝ σ^k).
 *
 * The rounding part e^{2λτ}δ is already inside ρ of ./bound.ts, so the interval's truncation term
 * may be taken as min(L(ε), A(ε)) with A(ε) = e^{2λε}·2λ∫₀^ε D: both (L) and (A) bound the same
 * error, each together with ρ. D is bounded from the computed coefficients:
 *   - a state whose levels k − 1 and k are single polynomials: f̃^k_s − f̃^{k−1}_s = Σ_{i=1}^k Δ_i τ^i
 *     exactly (c_0 = x is shared), Δ_i the difference of the two stored coefficients (on the fast
 *     path, where nothing changed, Δ_i = 0 for i < k and Δ_k = c_k); |·| ≤ Σ_i |Δ_i| τ^i;
 *   - a state with a piecewise level k or k − 1: on each piece of the merged breakpoints the two
 *     are polynomials in the interval's own τ, so |f̃^k_s − f̃^{k−1}_s| ≤ Σ_i |Δ_i|·hi^i on a piece
 *     [lo, hi] ⊂ [0, ε]; the largest over pieces is used as a constant on [0, ε].
 * D(σ) ≤ Σ_i P_i σ^i + Q with P_i the largest |Δ_i| over single-polynomial states and Q the largest
 * constant of the others, so ∫₀^ε D ≤ Σ_i P_i ε^{i+1}/(i+1) + Qε. The doubles that evaluate this
 * (differences, products, sums: each a relative error ≤ u) are covered by a relative margin of 1e-9.
 * Unlike (L), which is a worst case over all models, A follows the solution: where its k-th
 * derivative is small (a solution settling down), it is far below L and the next interval may be
 * longer (./index.ts chooses lengths from it).
 */
import type { Piecewise } from '../piecewise/piecewise.js';
import { mergeBreaks, pieceAt } from '../piecewise/piecewise.js';
import type { KstepWork } from './interval.js';
import { gamma, UNIT_ROUNDOFF } from '../piecewise/poly.js';

/** Notes |f̃^k_s − f̃^{k−1}_s| of a single-polynomial state: level k from R at offset o, level k−1 from C. */
export function noteSingle(w: KstepWork, s: number, o: number): void {
  const { R, C, k, dPoly } = w;
  for (let i = 1; i < k; i++) {
    const a = R[o + i - 1]! / i;
    const d = a - C[i]![s]!;
    const ad = d < 0 ? -d : d;
    if (ad > dPoly[i]!) dPoly[i] = ad;
  }
  const top = R[o + k - 1]! / k;
  const at = top < 0 ? -top : top;
  if (at > dPoly[k]!) dPoly[k] = at;
}

/**
 * Notes sup |f − g| of a state with a piecewise level (f: level k, g: level k − 1, both of degree
 * ≤ deg in the interval's own τ ≥ 0). On each piece [lo, hi] of the merged breakpoints, the
 * difference d (coefficients d̃_j = fl(f_j − g_j), each within u|d̃_j|(1 + 2u) of the exact one) is
 * re-expanded about the midpoint c by repeated synthetic division (Horner's rule; Higham 2002, §5.1:
 * each computed b_i is within γ_{2deg}·M_i of the exact one, M_i the same sums in absolute values,
 * with Σ_i M_i r^i = Σ_j |d̃_j|(c + r)^j = Σ_j |d̃_j| hi^j), so with r = (hi − lo)/2
 *     sup_{[lo,hi]} |d| ≤ Σ_i |b̃_i| r^i + (γ_{2deg+2} + 2u)·Σ_j |d̃_j| hi^j.
 * The first sum keeps the cancellation that a sum of absolute values in τ loses (two levels that
 * switch action at nearby times differ little, although their coefficients in τ differ much).
 */
export function supDifference(w: KstepWork, f: Piecewise, g: Piecewise, deg: number): number {
  const br = mergeBreaks([f.breaks, g.breaks]);
  const b = w.shiftBuf;
  const tail = gamma(2 * deg + 2) + 2 * UNIT_ROUNDOFF;
  let sup = 0;
  for (let p = 0; p + 1 < br.length; p++) {
    const lo = br[p]!;
    const hi = br[p + 1]!;
    const c = 0.5 * (lo + hi);
    const r = 0.5 * (hi - lo);
    const of = pieceAt(f, c) * f.stride;
    const og = pieceAt(g, c) * g.stride;
    let crude = 0;
    for (let i = deg; i >= 0; i--) {
      const d = f.coef[of + i]! - g.coef[og + i]!;
      b[i] = d;
      crude = crude * hi + (d < 0 ? -d : d);
    }
    for (let i = 0; i < deg; i++) for (let j = deg - 1; j >= i; j--) b[j] += c * b[j + 1]!;
    let acc = 0;
    for (let i = deg; i >= 0; i--) acc = acc * r + (b[i]! < 0 ? -b[i]! : b[i]!);
    const bound = acc + tail * crude;
    if (bound > sup) sup = bound;
  }
  return sup;
}

/** A(ε) = e^{2λε}·2λ·(Σ_i P_i ε^{i+1}/(i+1) + Qε), with the margin for its own rounding. */
export function aposterioriBound(w: KstepWork, lambda: number, eps: number): number {
  let integral = w.dConst * eps;
  let p = eps;
  for (let i = 1; i <= w.k; i++) {
    p *= eps;
    integral += (w.dPoly[i]! * p) / (i + 1);
  }
  return Math.exp(2 * lambda * eps) * 2 * lambda * integral * (1 + 1e-9);
}

/** Clears the majorant before an interval. */
export function resetDifference(w: KstepWork): void {
  w.dPoly.fill(0);
  w.dConst = 0;
}
