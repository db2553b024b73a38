/**
 * Optimal decisions at the start of a segment, by comparing derivatives lexicographically.
 *
 * With time left t0 and values x = v(t0), suppose decisions d are kept on [t0, t0 + ε). Then
 * v^{(k)}(t0) = Q_d^k x, and the advantage of action a over d(s) in state s,
 *   A(τ) = (q_a − q_{d(s)}) · v(t0 + τ) = Σ_k τ^k/k! · (q_a − q_{d(s)}) · Q_d^k x,
 * must be ≤ 0 for small τ > 0 (sign-adjusted: ≥ 0 for the min player), i.e. its Taylor
 * coefficients must be lexicographically ≤ 0. This is the lexicographic rule of B. L. Miller,
 * "Finite state continuous time Markov decision processes with a finite planning horizon", SIAM J.
 * Control 6(2), 1968, extended to games by M. N. Rabe and S. Schewe, "Finite optimal control for
 * time-bounded reachability in CTMDPs and continuous-time Markov games", Acta Informatica 48, 2011
 * (both from memory). Order k needs z_k = Q_d^k x, and (Q_d z_{k−1})_s =
 * q_{d(s)} · z_{k−1} is the same for every action still tied at orders < k — so refining the
 * candidate sets order by order IS the fixed point over all states: no iteration is needed.
 *
 * Ties within `tol` (normalised by ν, so every z_k has sup norm ≤ 1) count as ties. After n + 1
 * orders the remaining candidates are equivalent along this trajectory (Krylov space of dimension
 * ≤ n); the previous decision is kept when it is among them (a tie that is no switch), else the first.
 */
import type { Dec, DecModel } from '../common/decModel.js';
import { rowTimes } from '../common/decModel.js';

export interface Decision {
  readonly choice: Int32Array;
  /** Highest derivative order that was needed to break a tie (0: first derivatives sufficed). */
  readonly order: number;
}

export function decide(dm: DecModel, x: readonly Dec[], prev: Int32Array, nu: number, tol: Dec): Decision {
  const { n, D } = dm;
  const choice = new Int32Array(n);
  const cand: (number[] | undefined)[] = new Array(n);
  for (let s = 0; s < n; s++) {
    const k = dm.actions[s]!.length;
    choice[s] = k === 0 ? -1 : prev[s]! >= 0 && prev[s]! < k ? prev[s]! : 0;
    if (dm.sign[s] !== 0) cand[s] = Array.from({ length: k }, (_, i) => i);
  }
  // Special case: nothing to decide.
  if (!cand.some((c) => c !== undefined)) return { choice, order: 0 };
  const invNu = new D(1).div(nu > 0 ? nu : 1);
  let z: Dec[] = [...x];
  let order = 0;
  for (let k = 0; k <= n + 1; k++) {
    let open = false;
    for (let s = 0; s < n; s++) {
      const c = cand[s];
      if (!c || c.length < 2) continue;
      const acts = dm.actions[s]!;
      const sg = dm.sign[s]!;
      const vals = c.map((a) => (sg > 0 ? rowTimes(acts[a]!, s, z) : rowTimes(acts[a]!, s, z).neg()));
      let best = vals[0]!;
      for (const v of vals) if (v.gt(best)) best = v;
      const floor = best.minus(tol);
      const keep = c.filter((_, i) => vals[i]!.gte(floor));
      if (keep.length < c.length) order = k;
      cand[s] = keep;
      choice[s] = keep.includes(prev[s]!) ? prev[s]! : keep[0]!;
      if (keep.length > 1) open = true;
    }
    if (!open) break;
    const next: Dec[] = new Array(n);
    for (let s = 0; s < n; s++) {
      const a = choice[s]!;
      next[s] = a < 0 ? new D(0) : rowTimes(dm.actions[s]![a]!, s, z).times(invNu);
    }
    z = next;
  }
  return { choice, order };
}
