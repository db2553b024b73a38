/**
 * One segment of constant decisions d, from time left t0 until the first switch or T.
 *
 * On the segment v(t0 + τ) = exp(Q_d τ) v(t0). The segment is cut into G equal cells of length h
 * with ν_d·h ≤ 4 (ν_d = 2·max exit rate of the chosen actions = ‖Q_d‖∞); on a cell starting at
 * ṽ the Taylor terms u_k = (hQ_d)^k ṽ / k! give v(· + σh) = Σ_{k≤K} u_k σ^k, σ ∈ [0, 1], with
 *   ‖tail‖ ≤ Σ_{k>K} (ν_d h)^k/k! ≤ (ν_d h)^{K+1}/(K+1)! / (1 − ν_d h/(K+2))   (‖ṽ‖ ≤ 1),
 * and K is chosen so the tail is below the unit roundoff. Rounding (first order, a priori) per
 * cell ≤ 2((m+3)ν_d h + K + 1)·u·e^{ν_d h} for rows of ≤ m successors. The exact flow is
 * non-expansive (a stochastic matrix), so the errors of the cells add.
 *
 * The same terms give every advantage of a non-chosen action as a polynomial on the cell,
 * P(σ) = sign·(q_a − q_{d(s)})·Σ u_k σ^k / ν, searched by `firstExceed` for the first point where
 * it exceeds tol: that is the next switching time. The Bellman condition is re-checked directly on
 * the cell's start and midpoint values (stats.bellmanViolation, normalised by ν).
 */
import type { Dec, DecModel } from '../common/decModel.js';
import { rowTimes, sameRow } from '../common/decModel.js';
import { firstExceed } from './advantage.js';

export interface SegmentResult {
  readonly tEnd: Dec;
  readonly x: Dec[];
  readonly switched: boolean;
  readonly cells: number;
  /** Truncation + rounding bound of the values over this segment. */
  readonly bound: number;
  /** Bound on the value lost through uncertified cells and the located switching width. */
  readonly lost: number;
  /** Largest Bellman violation seen on the grid (normalised by ν, sign-adjusted, ≥ 0 is bad). */
  readonly violation: number;
}

export interface SegmentOptions {
  /** Normalisation of advantages: 2·max exit over all actions. */
  readonly nu: number;
  readonly tol: number;
  readonly wMin: number;
  readonly maxCells: number;
}

export class TooManyCells extends Error {}

export function runSegment(dm: DecModel, x0: readonly Dec[], d: Int32Array, t0: Dec, T: Dec, o: SegmentOptions): SegmentResult {
  const { D, n, u } = dm;
  const rows = dm.actions.map((acts, s) => (d[s]! >= 0 ? acts[d[s]!] : undefined));
  let nuD = 0;
  let m = 0;
  for (const r of rows) if (r) { nuD = Math.max(nuD, 2 * r.exitUpper); m = Math.max(m, r.target.length); }
  const pairs: { s: number; a: number }[] = [];
  for (let s = 0; s < n; s++) {
    if (dm.sign[s] === 0) continue;
    const acts = dm.actions[s]!;
    for (let a = 0; a < acts.length; a++) if (a !== d[s] && !sameRow(acts[a]!, acts[d[s]!]!)) pairs.push({ s, a });
  }
  const R = T.minus(t0);
  const Rn = R.toNumber();
  const invNu = new D(1).div(o.nu > 0 ? o.nu : 1);
  const adv = (p: { s: number; a: number }, v: readonly Dec[]): Dec => {
    const acts = dm.actions[p.s]!;
    const diff = rowTimes(acts[p.a]!, p.s, v).minus(rowTimes(acts[d[p.s]!]!, p.s, v)).times(invNu);
    return dm.sign[p.s]! > 0 ? diff : diff.neg();
  };
  let violation = 0;
  const check = (v: readonly Dec[]): void => {
    for (const p of pairs) violation = Math.max(violation, adv(p, v).toNumber());
  };
  // Special case: nothing moves under d, so every advantage stays constant (≤ tol by the decision).
  if (!(nuD * Rn > 0)) {
    check(x0);
    return { tEnd: T, x: [...x0], switched: false, cells: 0, bound: 0, lost: 0, violation };
  }
  const G = Math.max(32, Math.ceil((nuD * Rn) / 4));
  if (G > o.maxCells) throw new TooManyCells(`needs ${G} grid cells for ν·(T − t) = ${(nuD * Rn).toPrecision(3)}`);
  const h = R.div(G);
  const nh = (nuD * Rn) / G;
  // Least K whose tail (ν_d h)^{K+1}/(K+1)!/(1 − ν_d h/(K+2)) is below u/1000.
  let K = 1;
  let tail = (nh * nh) / 2;
  while ((K + 2 <= 2 * nh || tail / (1 - nh / (K + 2)) > u * 1e-3) && K < 2000) {
    K++;
    tail *= nh / (K + 1);
  }
  const cellBound = 2 * ((m + 3) * nh + K + 1) * u * Math.exp(nh) + (2 * tail) / (1 - nh / (K + 2));
  const zero = new D(0);
  const half = new D('0.5');
  let v: Dec[] = [...x0];
  let bound = 0;
  let lost = 0;
  for (let j = 0; j < G; j++) {
    const terms: Dec[][] = [v];
    for (let k = 1; k <= K; k++) {
      const prev = terms[k - 1]!;
      const hk = h.div(k);
      terms.push(rows.map((r, s) => (r ? rowTimes(r, s, prev).times(hk) : zero)));
    }
    const sumAt = (x: Dec): Dec[] => {
      const out: Dec[] = new Array(n);
      for (let s = 0; s < n; s++) {
        let acc = terms[K]![s]!;
        for (let k = K - 1; k >= 0; k--) acc = acc.times(x).plus(terms[k]![s]!);
        out[s] = acc;
      }
      return out;
    };
    let first: Dec | undefined;
    let switchLoss = 0;
    for (const p of pairs) {
      const c = terms.map((t) => adv(p, t));
      const r = firstExceed(D, c, o.tol, o.wMin);
      lost += r.unresolved * o.nu * h.toNumber();
      if (r.at && (!first || r.at.lt(first))) first = r.at;
      if (r.at) switchLoss += r.switchLoss;
    }
    bound += cellBound;
    // Bellman re-check at the cell start and at the midpoint of the part before any switch.
    check(v);
    check(sumAt(first && first.lt(half) ? first.times(half) : half));
    if (first) {
      // The switch is placed within wMin after a crossing (the loss of that is in switchLoss).
      lost += o.nu * h.toNumber() * switchLoss;
      return { tEnd: t0.plus(h.times(first.plus(j))), x: sumAt(first), switched: true, cells: j + 1, bound, lost, violation };
    }
    v = sumAt(new D(1));
  }
  return { tEnd: T, x: v, switched: false, cells: G, bound, lost, violation };
}

