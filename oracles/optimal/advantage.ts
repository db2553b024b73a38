/**
 * The first point in (0, 1] where a polynomial advantage P(σ) = Σ_k c_k σ^k exceeds `tol`.
 *
 * P is the (normalised, sign-adjusted) Taylor polynomial of an advantage over one grid cell. The
 * search is a depth-first bisection that discards a subinterval [lo, hi] (width w, midpoint m)
 * when the second-order Taylor bound (common practice, no source)
 *   sup_{[lo,hi]} P ≤ P(m) + |P'(m)|·w/2 + M₂·w²/8,   M₂ = Σ_{k≥2} k(k−1)|c_k| hi^{k−2} ≥ sup |P''|,
 * shows that P stays ≤ tol there. A crossing is located to width `wMin` (the working precision).
 * Unlike sampling, this cannot miss a positive excursion between grid points: every
 * subinterval is either certified ≤ tol or searched. Near a tangency (a double root that does not
 * cross), the bound still shrinks like w², so only O(1) cells per level survive; cells that reach
 * width √wMin uncertified, or that exceed the node budget, are returned as `unresolved` with the bound
 * ∫ max(P, 0) ≤ Σ sup⁺·w, which the caller adds to its error bound (a missed excursion of height η
 * over a width w changes a value by at most η·w, since the exact evolution is non-expansive).
 *
 * P and P' are evaluated in decimal arithmetic (Horner); the tests use doubles of those values.
 */
import type { Dec, DecCtor } from '../common/decModel.js';

export interface Exceed {
  /** First σ with P(σ) > tol, to within wMin, or undefined. */
  readonly at?: Dec;
  /** Σ over uncertified cells of sup⁺·width (in the units of P times σ). */
  readonly unresolved: number;
  readonly nodes: number;
  /** When found: wMin·(tol + L·wMin), L = Σ k|c_k| ≥ sup|P'| — the loss of switching up to wMin late. */
  readonly switchLoss: number;
}

const NODE_BUDGET = 20_000;

export function firstExceed(D: DecCtor, c: readonly Dec[], tol: number, wMin: number): Exceed {
  const K = c.length - 1;
  const ca = c.map((x) => Math.abs(x.toNumber()));
  const evalBoth = (x: Dec): [number, number] => {
    let p = c[K]!;
    let dp = new D(0);
    for (let k = K - 1; k >= 0; k--) {
      dp = dp.times(x).plus(p);
      p = p.times(x).plus(c[k]!);
    }
    return [p.toNumber(), dp.toNumber()];
  };
  const m2 = (hi: number): number => {
    let s = 0;
    let pw = 1;
    for (let k = 2; k <= K; k++) {
      s += k * (k - 1) * ca[k]! * pw;
      pw *= hi;
    }
    return s * (1 + 1e-10);
  };
  // Rounding of the Horner evaluation at D's precision (first order: 4(K+1)·u·Σ|c_k|); the double
  // conversions of P(m), P'(m) are covered by a relative margin of 1e-12 on the bound itself.
  let scale = 0;
  for (const a of ca) scale += a;
  const slack = 4 * (K + 1) * 5 * 10 ** -D.precision * scale;
  let nodes = 0;
  let unresolved = 0;
  const half = new D('0.5');

  // Certification stops at width wCert = √wMin: an uncertified cell there costs at most sup⁺·wCert,
  // where sup⁺ is itself O(tol + |P'|·wCert + M₂·wCert²) — negligible, and the depth stays
  // O(log(1/wCert)) even for crossings of tiny slope. A crossing found in a cell of width wCert is
  // then located to wMin by plain bisection on the sign of P − tol.
  const wCert = Math.sqrt(wMin);
  const bisect = (lo: Dec, hi: Dec, w: number): Dec => {
    while (w > wMin) {
      const mid = lo.plus(hi).times(half);
      if (evalBoth(mid)[0] > tol) hi = mid;
      else lo = mid;
      w /= 2;
    }
    return hi;
  };
  const search = (lo: Dec, hi: Dec, w: number, pHi: number): Dec | undefined => {
    nodes++;
    const mid = lo.plus(hi).times(half);
    const [pm, dpm] = evalBoth(mid);
    const spread = Math.abs(dpm) * w / 2 + m2(hi.toNumber()) * w * w / 8;
    const sup = pm + spread + 1e-12 * (Math.abs(pm) + spread) + slack;
    if (sup <= tol) return undefined;
    if (w <= wCert || nodes > NODE_BUDGET) {
      unresolved += Math.max(sup, 0) * w;
      return pHi > tol ? bisect(lo, hi, w) : undefined;
    }
    return search(lo, mid, w / 2, pm) ?? search(mid, hi, w / 2, pHi);
  };
  const one = new D(1);
  const [p1] = evalBoth(one);
  const at = search(new D(0), one, 1, p1);
  let L = 0;
  for (let k = 1; k <= K; k++) L += k * ca[k]!;
  const switchLoss = wMin * (tol + L * wMin);
  return at === undefined ? { unresolved, nodes, switchLoss: 0 } : { at, unresolved, nodes, switchLoss };
}
