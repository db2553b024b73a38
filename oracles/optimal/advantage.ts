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
 * Arithmetic: the coefficients are fixed-point integers c_k = C_k/2^Q and the points dyadic S/2^Q
 * (midpoints are exact while w > 2^−Q); P and P' are evaluated by Horner's rule in BigInt, each step
 * truncated by less than one unit 2^−Q, so |P̃(σ) − P(σ)| ≤ (K+1)·2^−Q for σ ∈ [0, 1]; the slack
 * 6(K+1)·2^−Q also covers a truncation of each coefficient. The crossing test P̃ > tol is exact in
 * integers; the sup bound is evaluated in doubles from the integers with a relative margin of 1e-12.
 */
import type { Dec, DecCtor } from '../common/decModel.js';
import { dyadicOf } from '../fixed/numbers.js';

export interface ExceedFixed {
  /** First σ = at/2^Q with P(σ) > tol, to within wMin, or undefined. */
  readonly at?: bigint;
  /** Σ over uncertified cells of sup⁺·width (in the units of P times σ). */
  readonly unresolved: number;
  readonly nodes: number;
  /** When found: wMin·(tol + L·wMin), L = Σ k|c_k| ≥ sup|P'| — the loss of switching up to wMin late. */
  readonly switchLoss: number;
}

export interface Exceed extends Omit<ExceedFixed, 'at'> {
  readonly at?: Dec;
}

const NODE_BUDGET = 20_000;

/** floor(x·2^Q·(1 − 1e-12)) for a double x: a safe integer threshold just below x·2^Q. */
export function floorFixed(x: number, Q: number): bigint {
  if (x === 0) return 0n;
  if (x < 0) return -floorFixed(-x, Q) - 1n;
  const { m, k } = dyadicOf(x * (1 - 1e-12));
  return Q >= k ? m << BigInt(Q - k) : m >> BigInt(k - Q);
}

/** The search on integer coefficients C_k (c_k = C_k/2^Q). */
export function firstExceedFixed(C: readonly bigint[], Q: number, tol: number, wMin: number): ExceedFixed {
  const K = C.length - 1;
  const q = BigInt(Q);
  const unit = 2 ** -Q;
  const ca = C.map((x) => Math.abs(Number(x)) * unit);
  const tolInt = floorFixed(tol, Q);
  const evalBoth = (x: bigint): [bigint, bigint] => {
    let p = C[K]!;
    let dp = 0n;
    for (let k = K - 1; k >= 0; k--) {
      dp = ((dp * x) >> q) + p;
      p = ((p * x) >> q) + C[k]!;
    }
    return [p, dp];
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
  const slack = 6 * (K + 1) * unit;
  let nodes = 0;
  let unresolved = 0;
  const one = 1n << q;

  // Certification stops at width wCert = √wMin: an uncertified cell there costs at most sup⁺·wCert,
  // where sup⁺ is itself O(tol + |P'|·wCert + M₂·wCert²) — negligible, and the depth stays
  // O(log(1/wCert)) even for crossings of tiny slope. A crossing found in a cell of width wCert is
  // then located to wMin by plain bisection on the sign of P − tol.
  const wCert = Math.sqrt(wMin);
  const bisect = (lo: bigint, hi: bigint, w: number): bigint => {
    while (w > wMin && hi - lo > 1n) {
      const mid = (lo + hi) >> 1n;
      if (evalBoth(mid)[0] > tolInt) hi = mid;
      else lo = mid;
      w /= 2;
    }
    return hi;
  };
  const search = (lo: bigint, hi: bigint, w: number, pHi: bigint): bigint | undefined => {
    nodes++;
    const mid = (lo + hi) >> 1n;
    const [pmI, dpmI] = evalBoth(mid);
    const pm = Number(pmI) * unit;
    const spread = Math.abs(Number(dpmI) * unit) * w / 2 + m2(Number(hi) * unit) * w * w / 8;
    const sup = pm + spread + 1e-12 * (Math.abs(pm) + spread) + slack;
    if (sup <= tol) return undefined;
    if (w <= wCert || nodes > NODE_BUDGET || hi - lo <= 1n) {
      unresolved += Math.max(sup, 0) * w;
      return pHi > tolInt ? bisect(lo, hi, w) : undefined;
    }
    return search(lo, mid, w / 2, pmI) ?? search(mid, hi, w / 2, pHi);
  };
  const [p1] = evalBoth(one);
  const at = search(0n, one, 1, p1);
  let L = 0;
  for (let k = 1; k <= K; k++) L += k * ca[k]!;
  const switchLoss = wMin * (tol + L * wMin);
  return at === undefined ? { unresolved, nodes, switchLoss: 0 } : { at, unresolved, nodes, switchLoss };
}

/** The same search on decimal coefficients (read into fixed point, Q = 3.33·precision + 16 bits, to nearest). */
export function firstExceed(D: DecCtor, c: readonly Dec[], tol: number, wMin: number): Exceed {
  const Q = Math.ceil(D.precision * Math.log2(10)) + 16;
  // Exact conversion: a constructor wide enough for the digits of c_k times 2^Q.
  const DX = D.clone({ precision: 2 * D.precision + Q });
  const two = new DX(2).pow(Q);
  const C = c.map((x) => BigInt(new DX(x).times(two).round().toFixed(0)));
  const r = firstExceedFixed(C, Q, tol, wMin);
  const { at, ...rest } = r;
  return at === undefined ? rest : { ...rest, at: new D(at.toString()).div(two) };
}
