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
 * Rounding (ρ_i). Standard model of binary64 arithmetic, u = 2^−53, γ_n = nu/(1 − nu) (Higham,
 * Accuracy and Stability of Numerical Algorithms, 2002, §2.2, Lemma 3.1, eq. (3.5) for dot products,
 * §5.1 for Horner). Let d be the longest row, and C ≥ Σ_i max_s|c_i(s)| ε^i over every level's computed
 * coefficients: for a single polynomial c_0 = x ∈ [0,1] and c_{i+1} = r_i/(i+1) with |r_i| ≤
 * 2λ·max|c_i| (up to the factor (1 + γ_{2d+3}) per order that rounding allows), so the sum is
 * ≤ e^{2λε}(1 + γ_{2d+3})^k; for the pieces of piecewise results C is measured during the solve, and the
 * larger is used. At each level j and state s, the computed iterate differs from the exact Picard image
 * of the previous computed level (x + ∫ opt_a rhs_a with rhs_a built from the computed coefficients) by:
 *   - the computed r̃_{a,i} of the chosen action: a dot product of d + 1 terms plus the mismatch between
 *     the computed exit rate and its row's sum, ≤ γ_{2d+2}·2E_a·max|c_i| (coefError in ./interval.ts);
 *     integrated over [0, ε] and summed over i: ≤ γ_{2d+2}·2λε·C;
 *   - the choice, made from computed coefficients: where the chosen polynomial is verified ≥ every
 *     other one (no crossing), the true right-hand sides may still differ by both actions' coefficient
 *     errors: ≤ 2γ_{2d+2}·2λε·C; where a tie decision leaves another action better, the measured loss
 *     `tieLoss` (./interval.ts, dominant);
 *   - c_{i+1} = fl(r_i/(i+1)): ≤ u·C;
 *   - on the slow path, the integral is made continuous by evaluating the previous piece at each
 *     breakpoint (Horner, degree ≤ k: ≤ γ_{2k+2}·C each) and these offsets add over the pieces:
 *     ≤ pieces·γ_{2k+2}·C; sums of piecewise functions (linear combinations) are dot products as above.
 * So δ = 3γ_{2d+2}·2λε·C + u·C + pieces·γ_{2k+2}·C + tieLoss. These perturbations propagate through
 * (i): E_j ≤ δ + ∫ 2λ E_{j−1}, so E_k ≤ δ·Σ_m (2λε)^m/m! ≤ δ·e^{2λε}. The final Horner evaluation at
 * ε and the addition of x add γ_{2k+2}·C. Hence
 *     ρ = 2·[δ·e^{2λε} + γ_{2k+2}·C],
 * where the factor 2 covers the products of (1 + γ) factors that the first-order sum above leaves out
 * (their excess is O(u²), far below a factor 2) and a breakpoint of the slow path misplaced by the root
 * isolation (../piecewise/roots.ts, a few ulps of ε): the wrong polynomial is then used on a span of a
 * few ulps where the two differ by at most their slope times that span, a second-order loss. That
 * last term is an estimate, not a proof: it assumes that the root isolation places every crossing to
 * within a few ulps. The inputs add a term of their own (see inputBound): rates are decimals rounded
 * to doubles (relative error ≤ u) and the time bound too, so the right-hand side moves by ≤ 2uλ and
 * time by ≤ uT; the flow is non-expansive and |dv/dt| ≤ λ, so values move by ≤ 3uλT.
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

/** ρ for one interval, as derived above (tieLoss: the interval's measured tie loss, 0 if none). */
export function roundingBound(lambda: number, eps: number, k: number, rowLen: number, coefNorm: number, pieces = 1, tieLoss = 0): number {
  const z = 2 * lambda * eps;
  const g = gamma(2 * rowLen);
  const delta = 3 * g * z * coefNorm + UNIT_ROUNDOFF * coefNorm + pieces * gamma(2 * k + 2) * coefNorm + tieLoss;
  return 2 * (delta * Math.exp(z) + gamma(2 * k + 2) * coefNorm);
}

/** The a-priori C for single polynomials: e^{2λε}(1 + γ_{2d+3})^k. */
export function singleCoefNorm(lambda: number, eps: number, k: number, rowLen: number): number {
  return Math.exp(2 * lambda * eps) * Math.pow(1 + gamma(2 * rowLen + 1), k);
}

/** Rounded inputs: rates and the time bound, each within relative u of their decimals: 3uλT. */
export function inputBound(lambdaT: number): number {
  return 3 * UNIT_ROUNDOFF * lambdaT * (1 + 1e-12);
}

/**
 * Largest ε with T·(2λ)^{k+1}ε^k/(2·(k+1)!) ≤ budget, capped so that λε ≤ 1, computed in units of 1/λ
 * (only λT and λε enter, so nothing overflows or underflows for any finite λ and T).
 */
export function chooseEpsilon(lambda: number, T: number, k: number, budget: number): number {
  let fact = 1;
  for (let i = 2; i <= k + 1; i++) fact *= i;
  const lt = lambda * T;
  // (λε)^k = 2·(k+1)!·budget / (λT·2^{k+1})
  const le = Math.pow((2 * fact * budget) / lt / 2 ** (k + 1), 1 / k);
  return Math.min(le / lambda, 1 / lambda, T);
}
