/**
 * Poisson weights for uniformization, after B. L. Fox and P. W. Glynn, "Computing Poisson
 * probabilities", Communications of the ACM 31(4), 440–445, 1988.
 *
 * Method. As in Fox and Glynn, the weights are computed without ever forming e^{−qt}: start with
 * weight 1 at the mode m = ⌊qt⌋ (the largest Poisson probability) and recurse outwards with the
 * exact ratios p(k−1)/p(k) = k/qt and p(k+1)/p(k) = qt/(k+1). Every weight lies in (0, 1], so
 * nothing overflows, and the recursion stops long before anything underflows (ε ≥ 1e-200 below).
 * The caller divides by `totalWeight`.
 *
 * Truncation points. Instead of the paper's a-priori corollaries we use an a-posteriori geometric
 * bound, which is rigorous for every qt and needs no special case for small qt:
 *   left tail  (L ≤ m):  Σ_{k<L} p(k) ≤ p(L−1) / (1 − (L−1)/qt)     (ratios k/qt ≤ (L−1)/qt < 1)
 *   right tail (R ≥ m):  Σ_{k>R} p(k) ≤ p(R+1) / (1 − qt/(R+2))     (ratios qt/(k+1) ≤ qt/(R+2) < 1)
 * Both are expressed in the scale of the weights; dividing by the window sum W bounds the tail
 * mass δ (since δ = tails/(W + tails) ≤ tails/W). L moves down until its bound is ≤ (ε/2)·(sum so
 * far), then R moves up likewise, so `tailBound` ≤ ε·(1 + 2·roundingBound).
 *
 * Guarantee. For x_k ∈ [0, 1], |Σ_{L..R} (w_k/W) x_k − Σ_{k≥0} p(k) x_k| ≤ δ ≤ tailBound (both
 * the window's excess δ and the neglected part lie in [0, δ]). `roundingBound` bounds the relative
 * error of each computed w_k/W: the weight at distance j from the mode carries ≤ 2j roundings and
 * W carries ≤ (R−L) more, so (2·max j + R − L + 2)·u, with a 1 % margin for second-order terms.
 *
 * Refuses (RangeError): qt < 0, qt not finite, qt > MAX_QT; ε outside [1e-200, 1).
 * The window has O(√qt · √log(1/ε)) weights; the cost of uniformization is R ≈ qt + O(√qt) mat-vecs.
 */
import { UNIT_ROUNDOFF } from '../shared/numeric.js';

/** Largest qt accepted: above it uniformization needs more than ~1e7 mat-vecs per piece. */
export const MAX_QT = 1e7;

export interface PoissonWindow {
  /** Smallest k kept. */
  readonly left: number;
  /** Largest k kept. */
  readonly right: number;
  /** weights[k − left] = c · Poisson(k; qt), for one unknown c > 0 (weight 1 at the mode). */
  readonly weights: Float64Array;
  /** Σ weights, summed in ascending k. */
  readonly totalWeight: number;
  /** Rigorous upper bound on the neglected Poisson mass Σ_{k<left} + Σ_{k>right}; ≤ ε(1 + 2·roundingBound). */
  readonly tailBound: number;
  /** Bound on the relative rounding error of weights[i] / totalWeight. */
  readonly roundingBound: number;
}

export function foxGlynn(qt: number, epsilon: number): PoissonWindow {
  if (!Number.isFinite(qt) || qt < 0) throw new RangeError(`Poisson parameter qt must be finite and ≥ 0, got ${qt}`);
  if (qt > MAX_QT) throw new RangeError(`Poisson parameter qt = ${qt} exceeds the limit ${MAX_QT}`);
  if (!(epsilon >= 1e-200 && epsilon < 1)) throw new RangeError(`epsilon must lie in [1e-200, 1), got ${epsilon}`);

  // --- special case: nothing happens -----------------------------------------------------------
  if (qt === 0) return { left: 0, right: 0, weights: Float64Array.of(1), totalWeight: 1, tailBound: 0, roundingBound: 0 };

  const half = epsilon / 2;
  const m = Math.floor(qt);
  const below: number[] = []; // weights at m−1, m−2, … (in that order)
  let sum = 1;
  let w = 1;
  let k = m;
  let tailLeft = 0;
  while (k > 0) {
    const prev = (w * k) / qt; // weight at k − 1
    const bound = prev / (1 - (k - 1) / qt);
    if (bound <= half * sum) {
      tailLeft = bound;
      break;
    }
    below.push(prev);
    sum += prev;
    w = prev;
    k--;
  }
  const left = k;

  const above: number[] = []; // weights at m+1, m+2, …
  w = 1;
  k = m;
  let tailRight: number;
  for (;;) {
    const next = (w * qt) / (k + 1); // weight at k + 1
    const bound = next / (1 - qt / (k + 2));
    if (bound <= half * sum) {
      tailRight = bound;
      break;
    }
    above.push(next);
    sum += next;
    w = next;
    k++;
  }
  const right = k;

  const n = right - left + 1;
  const weights = new Float64Array(n);
  for (let i = 0; i < below.length; i++) weights[below.length - 1 - i] = below[i]!;
  weights[below.length] = 1;
  for (let i = 0; i < above.length; i++) weights[below.length + 1 + i] = above[i]!;
  let totalWeight = 0;
  for (let i = 0; i < n; i++) totalWeight += weights[i]!;

  const maxDistance = Math.max(m - left, right - m);
  const roundingBound = 1.01 * (2 * maxDistance + n + 1) * UNIT_ROUNDOFF;
  // The tail bounds were computed with the same recursions: allow the same relative error.
  const tailBound = ((tailLeft + tailRight) / totalWeight) * (1 + 2 * roundingBound);
  return { left, right, weights, totalWeight, tailBound, roundingBound };
}
