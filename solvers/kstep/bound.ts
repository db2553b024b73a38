/**
 * Error bound of the k-step interval scheme, and the choice of the interval length ε from it.
 *
 * Setting. λ > 0 is at least every exit rate of a state that evolves. With P_a = I + (R_a − diag E_a)/λ
 * (a stochastic matrix, the uniformized matrix of action a; Jensen 1953, Gross & Miller 1984),
 *   B(y)_s = opt_a [Σ_{s'} R(s,a,s') y_{s'} − E(s,a) y_s] = λ (M(y) − y)_s,  M(y)_s = opt_a (P_a y)_s.
 * M is monotone and commutes with adding a constant, so ‖M(y) − M(z)‖∞ ≤ ‖y − z‖∞ (Crandall & Tartar,
 * "Some relations between nonexpansive and order preserving mappings", Proc. AMS 1980). Hence
 *   (i)   ‖B(y) − B(z)‖ ≤ 2λ‖y − z‖   (directly: |B(y)_s − B(z)_s| ≤ max_a 2E(s,a)·‖y − z‖);
 *   (ii)  ‖B(y)‖ ≤ λ for y ∈ [0,1]^S  (|(M(y) − y)_s| ≤ max_a Σ_{s'≠s} P_a(s,s')|y_{s'} − y_s| ≤ 1);
 *   (iii) the exact flow Φ_τ of dv/dτ = B(v) maps [0,1]^S to itself and is sup-norm non-expansive:
 *         for y, z solutions, D⁺‖y − z‖ ≤ λ(‖M(y) − M(z)‖ − ‖y − z‖) ≤ 0 at a state attaining the norm.
 *
 * Per interval (length ε, start values x ∈ [0,1]^S, exact solution f with f(0) = x). The scheme's
 * levels are the Picard iterates f⁰ ≡ x, f^j(τ) = x + ∫₀^τ B(f^{j−1}(σ)) dσ (Picard–Lindelöf; the
 * k-step idea for CTMDPs is from memory: Fearnley, Rabe, Schewe & Zhang, "Efficient approximation of
 * optimal control for continuous-time Markov games", FSTTCS 2011 / Inf. & Comput. 2016). Let
 * e_j(τ) = ‖f^j(τ) − f(τ)‖. Then e_0(τ) = ‖∫₀^τ B(f)‖ ≤ λτ by (ii), and by (i)
 * e_j(τ) ≤ ∫₀^τ 2λ e_{j−1}(σ) dσ, so by induction
 *        e_k(τ) ≤ (2λτ)^{k+1} / (2·(k+1)!)                                            (L)
 * This constant is attained to leading order: the two-state chain with rate λ each way and x = (1, 0)
 * has f(τ) = ½(1 ± e^{−2λτ}), and its Picard iterates are the Taylor sums of e^{−2λτ}, with error
 * (2λτ)^{k+1}/(2·(k+1)!)·(1 + O(λτ)). So the Poisson-tail form (λτ)^{k+1}/(k+1)!, which holds for
 * Picard iterates written with the integrating factor e^{−λτ}, does NOT hold for these polynomial
 * iterates (it is too small by the factor 2^k); the tests show it failing.
 *
 * Global. With x̃_i the computed start of interval i and x_i the exact values there,
 * ‖x̃_{i+1} − x_{i+1}‖ ≤ ‖x̃_{i+1} − Φ(x̃_i)‖ + ‖Φ(x̃_i) − Φ(x_i)‖ ≤ L(ε_i) + ρ_i + ‖x̃_i − x_i‖ by (iii),
 * where ρ_i is the rounding of interval i; clamping x̃ to [0,1] moves it no further from x ∈ [0,1]^S.
 * Hence the error at T is at most Σ_i (L(ε_i) + ρ_i); since L(τ)/τ increases, for intervals of length
 * ε and a shorter last one, Σ L(ε_i) ≤ T·(2λ)^{k+1} ε^k / (2·(k+1)!), and ε is chosen to make this
 * ≤ 0.9·precision.
 *
 * Rounding (ρ_i), a first-order model with a factor-2 margin, u = 2^−53, γ_n = nu/(1 − nu) (Higham,
 * Accuracy and Stability of Numerical Algorithms, 2002, Lemma 3.1 and §3.1, §5.1). Let d be the
 * longest row plus one, and C ≥ max_s Σ_i |c_i(s)| ε^i over every level's computed coefficients:
 * for a single polynomial c_0 = x ∈ [0,1] and c_{i+1} = r_i/(i+1) with |r_i| ≤ 2λ·max|c_i|, so
 * |c_i| ≤ (2λ)^i/i! and the sum is ≤ e^{2λε}; for the pieces of piecewise results C is measured
 * during the solve, and the larger of the two is used. At each level the computed iterate differs from the exact image of the
 * previous computed one by at most
 *   δ = 2·[γ_d·2λε·C (dot products of each coefficient) + 2u·C (division, adding x)
 *          + γ_{2k}·2λε·C (the choice between actions from rounded values, integrated over ε)],
 * and these perturbations propagate through (i) with total weight Σ_m (2λε)^m/m! ≤ e^{2λε}; the final
 * Horner evaluation adds γ_{2k}·C. So ρ ≤ δ·e^{2λε} + γ_{2k}·C. Misplaced breakpoints (roots accurate
 * to a few ulps) cost second order in the misplacement and are covered by the factor 2.
 * Where it breaks down: when k·intervals·ρ is not small against the precision (asking for precision
 * near 1e-15 with many intervals), the solver refuses instead of reporting a bound it cannot keep.
 */
import { gamma, UNIT_ROUNDOFF } from '../piecewise/poly.js';

/** (2λτ)^{k+1} / (2·(k+1)!), the per-interval truncation bound (L). */
export function localBound(lambda: number, tau: number, k: number): number {
  let r = 0.5;
  const z = 2 * lambda * tau;
  for (let i = 1; i <= k + 1; i++) r *= z / i;
  return r;
}

/** Largest ε with T·(2λ)^{k+1}ε^k/(2·(k+1)!) ≤ budget, capped so that λε ≤ 1. */
export function chooseEpsilon(lambda: number, T: number, k: number, budget: number): number {
  let fact = 1;
  for (let i = 2; i <= k + 1; i++) fact *= i;
  const eps = Math.pow((2 * fact * budget) / (T * Math.pow(2 * lambda, k + 1)), 1 / k);
  return Math.min(eps, 1 / lambda, T);
}

/** ρ for one interval, as derived above. */
export function roundingBound(lambda: number, eps: number, k: number, rowLen: number, coefNorm: number): number {
  const z = 2 * lambda * eps;
  const delta = 2 * (gamma(rowLen + 1) * z * coefNorm + 2 * UNIT_ROUNDOFF * coefNorm + gamma(2 * k) * z * coefNorm);
  return delta * Math.exp(z) + gamma(2 * k) * coefNorm;
}
