/**
 * Two actions of one state s that tie at time left 0 up to a given order and differ at the next one
 * by a given relative gap: the construction behind the adversarial fuzz family (adversarial.ts).
 *
 * Setting. The successors u_0 … u_{n−1} of s form a CTMC that never returns to s (each has at most one
 * action). With v the value and t the time left, their derivatives at t = 0 are d_0 = [u ∈ G] and
 * d_{i+1} = Q d_i, Q the generator of the successors (rows of goal states zero in mode `within`,
 * where they are frozen at 1). If action a sends rates R_a(u) from s, the Bellman right-hand side is
 * rhs_a(t) = Σ_u R_a(u) (v_u(t) − v_s(t)), and its i-th derivative at 0 is
 *     r_i(a) = Σ_u R_a(u) c_i(u),   c_i(u) = d_i(u) − v_s^{(i)}(0),
 * where v_s^{(0)}(0) = 0 (s is not a goal) and v_s^{(i)}(0) = r_{i−1}(optimal action). When the two
 * actions agree at orders 0 … j−1, v_s^{(i)}(0) for i ≤ j is the same whichever of them is optimal,
 * so the c_i (i ≤ j) are known from the first action alone.
 *
 * Construction. Given the first action's rates R_1 > 0, order j and gap δ, the second action is
 * R_2 = R_1 + D with D supported on u_0 … u_j and
 *     D · c_i = 0 (i < j),     D · c_j = σ δ |r_j(1)|   (σ = ±1),
 * a (j+1)×(j+1) linear system, solved in 60-digit decimal arithmetic by Gaussian elimination with
 * partial pivoting. Then r_i(2) = r_i(1) for i < j (up to the 60-digit rounding and the digits the
 * rates are written with) and r_j(2) = r_j(1)(1 + σδ) when r_j(1) ≠ 0 (the gap is relative to
 * Σ_u R_1(u)|c_j(u)| when r_j(1) = 0). With u_0 the goal, c_0 = (1, 0, …), so order 0 changes only
 * the rate to the goal: R_2(goal) = R_1(goal)(1 ± δ), the plain near-tie of two rates.
 * Away from t = 0 the two right-hand sides differ by O(δ) at every order: a near-tie throughout.
 */
import { Dec } from './decimalText.js';

export interface SuccessorChain {
  /** Per successor: its goal flag, whether it is frozen (a goal in mode `within`), and its rates. */
  readonly goal: readonly boolean[];
  readonly frozen: readonly boolean[];
  readonly rows: readonly (readonly { to: number; rate: Dec }[])[];
}

/** d_i(u) = v_u^{(i)}(0) for i = 0 … order. */
export function successorDerivatives(chain: SuccessorChain, order: number): Dec[][] {
  const n = chain.goal.length;
  const d: Dec[][] = [chain.goal.map((g) => new Dec(g ? 1 : 0))];
  for (let i = 1; i <= order; i++) {
    const prev = d[i - 1]!;
    d.push(
      Array.from({ length: n }, (_, u) => {
        if (chain.frozen[u]) return new Dec(0);
        let acc = new Dec(0);
        for (const { to, rate } of chain.rows[u]!) if (to !== u) acc = acc.plus(rate.times(prev[to]!.minus(prev[u]!)));
        return acc;
      }),
    );
  }
  return d;
}

/** r_i(a) for i = 0 … order, with v_s^{(i)}(0) taken from the action `ref` (ties below the order). */
export function rhsCoefficients(
  chain: SuccessorChain,
  order: number,
  rates: readonly Dec[],
  ref: readonly Dec[] = rates,
): Dec[] {
  const d = successorDerivatives(chain, order);
  const out: Dec[] = [];
  let vs = new Dec(0);
  for (let i = 0; i <= order; i++) {
    let r = new Dec(0);
    let rRef = new Dec(0);
    for (let u = 0; u < rates.length; u++) {
      const c = d[i]![u]!.minus(vs);
      r = r.plus(rates[u]!.times(c));
      rRef = rRef.plus(ref[u]!.times(c));
    }
    out.push(r);
    vs = rRef;
  }
  return out;
}

/** Solves A x = b (square, in place); undefined when a pivot vanishes relative to the row's size. */
function solve(A: Dec[][], b: Dec[]): Dec[] | undefined {
  const n = b.length;
  for (let col = 0; col < n; col++) {
    let p = col;
    for (let r = col + 1; r < n; r++) if (A[r]![col]!.abs().gt(A[p]![col]!.abs())) p = r;
    const size = A[p]!.reduce((m, x) => Dec.max(m, x.abs()), new Dec(0));
    if (A[p]![col]!.abs().lte(size.times('1e-40'))) return undefined;
    [A[col], A[p]] = [A[p]!, A[col]!];
    [b[col], b[p]] = [b[p]!, b[col]!];
    for (let r = col + 1; r < n; r++) {
      const f = A[r]![col]!.div(A[col]![col]!);
      for (let c = col; c < n; c++) A[r]![c] = A[r]![c]!.minus(f.times(A[col]![c]!));
      b[r] = b[r]!.minus(f.times(b[col]!));
    }
  }
  const x = new Array<Dec>(n);
  for (let r = n - 1; r >= 0; r--) {
    let acc = b[r]!;
    for (let c = r + 1; c < n; c++) acc = acc.minus(A[r]![c]!.times(x[c]!));
    x[r] = acc.div(A[r]![r]!);
  }
  return x;
}

/**
 * The second action's rates (rounded to `digits` significant digits), or undefined when the system
 * is singular or a rate would not stay positive. Needs order < rates.length and rates[0] the goal.
 */
export function nearTieRates(
  chain: SuccessorChain,
  rates: readonly Dec[],
  order: number,
  gap: Dec,
  sign: 1 | -1,
  digits = 30,
): Dec[] | undefined {
  if (order >= rates.length) return undefined;
  const d = successorDerivatives(chain, order);
  const c: Dec[][] = [];
  let vs = new Dec(0);
  for (let i = 0; i <= order; i++) {
    c.push(rates.map((_, u) => d[i]![u]!.minus(vs)));
    vs = rates.reduce((acc, r, u) => acc.plus(r.times(c[i]![u]!)), new Dec(0));
  }
  const rj = vs; // r_order(first action)
  const size = rates.reduce((acc, r, u) => acc.plus(r.times(c[order]![u]!.abs())), new Dec(0));
  const scale = rj.isZero() ? size : rj.abs();
  if (scale.isZero()) return undefined;
  const A = c.map((row) => row.slice(0, order + 1));
  const b = c.map((_, i) => (i < order ? new Dec(0) : scale.times(gap).times(sign)));
  const D = solve(A, b);
  if (!D) return undefined;
  const out = rates.map((r, u) => (u <= order ? r.plus(D[u]!) : r).toSignificantDigits(digits));
  return out.every((r) => r.gt(0)) ? out : undefined;
}
