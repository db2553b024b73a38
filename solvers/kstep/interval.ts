/**
 * One interval of the k-step scheme: the Picard levels f¹ … f^k of the Bellman equations on
 * τ ∈ [0, len], from the start values x (the method, its source and its bound: ./bound.ts).
 *
 * Incremental levels. Write f^j_s = Σ_{i≤j} c_i(s) τ^i and rhs_a = Σ_i r_{a,i} τ^i for the
 * right-hand side of action a on level j − 1. If no successor of s (nor s) changed its coefficients
 * 0 … j−2 between levels j − 2 and j − 1 ("clean"), then r_{a,0 … j−2} are unchanged too (the same
 * floating-point operations on the same numbers), so level j only computes r_{a,j−1} from the one
 * array c_{j−1}: one mat-vec-sized pass per level, which is the common case. A state is "dirty"
 * at a level when its lower coefficients changed (its decision changed, or it was recomputed from
 * a dirty successor), and "piecewise" when f^j_s has several pieces (../piecewise/). A state with a
 * dirty successor recomputes all its coefficients; one with a piecewise successor, or whose best
 * action is overtaken inside (0, len), takes the slow path: piecewise right-hand sides with merged
 * breakpoints, their envelope over actions, and the integral. If a state needs more than `pieceCap`
 * pieces the interval is given up (the caller halves it). Level k is only evaluated at len.
 *
 * Allocation: none per state in the fast paths; the slow path allocates its piecewise objects.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import { absSum, gamma } from '../piecewise/poly.js';
import { envelope, evaluate, integrate, linearCombination, pieceCount, single, type Piecewise } from '../piecewise/piecewise.js';
import { realRoots } from '../piecewise/roots.js';
import { noteSingle, resetDifference, supDifference } from './aposteriori.js';
import { lastLevelShortcut } from './shortcut.js';

/**
 * The level-k functions of an interval: c_i(s) at coef[i·S + s] for a state with one polynomial on
 * [0, len] (f = x + Σ_i r_i τ^{i+1}/(i+1)), and the piecewise function of a state in `pieces`.
 */
export interface LevelK {
  readonly coef: Float64Array;
  readonly pieces: Map<number, Piecewise>;
}

export interface KstepWork {
  readonly m: CompiledModel;
  readonly k: number;
  readonly active: Uint8Array;
  /** C[i][s] = c_i(s) of the current level, i = 1 … k−1 (c_0 = x). */
  readonly C: Float64Array[];
  /** r_{a,i} at a·k + i. */
  readonly R: Float64Array;
  /** 0 clean, 1 dirty, 2 piecewise: for the previous level (dPrev) and the current one (dCur). */
  dPrev: Uint8Array;
  dCur: Uint8Array;
  nDirtyPrev: number;
  /** Pending new coefficients of dirty single-piece states, applied after the level's pass. */
  readonly pendS: Int32Array;
  readonly pendC: Float64Array;
  pwPrev: Map<number, Piecewise>;
  pwCur: Map<number, Piecewise>;
  /** Best action (index within the state) on the current level, for states with choices. */
  readonly act: Int32Array;
  readonly diff: Float64Array;
  /** Decision (global action index) at level k in the last interval, per state; −1 if none. */
  readonly dec: Int32Array;
  /**
   * States whose level-k decision changes inside the last interval: the piece starts τ (time left
   * from the interval's start) and the decision on each piece. Cleared by the caller per interval.
   */
  readonly pieceDec: Map<number, { tau: number[]; action: number[] }>;
  readonly pieceCap: number;
  /**
   * Planted-bug hook for `selftest` only (variant:loose-tie): when > 0, coefficient differences below
   * looseTie · (|r_b| + |r_best| + λ·max|c_i|) are called ties and nothing in the bound pays for it.
   */
  readonly looseTie: number;
  /** λ · max_s |c_i(s)| for the current level (i = 0: the start values): the scale of rounding in r_{a,i}. */
  readonly coefScale: Float64Array;
  /** max_s |c_i(s)| for the current level (i = 0: the start values). */
  readonly coefMax: Float64Array;
  /** γ_{2d+2} for the longest row d of the model (see coefError). */
  readonly gammaCoef: number;
  /** Largest ∫ over the interval of what a tie decision can lose, over states and levels (see dominant). */
  tieLoss: number;
  maxPieces: number;
  /**
   * When set (a caller that certifies the dense solution), runInterval stores each state's level-k
   * function on [0, len] here: nothing else reads it, and nothing is stored when it is unset.
   */
  levelK?: LevelK;
  /** Largest Σ_i |c_i| len^i over the pieces of piecewise results (single polynomials obey the
   *  a-priori bound e^{2λ·len}, see ./bound.ts). */
  coefNorm: number;
  slowStates: number;
  /** State-levels recomputed in full because a successor (or the state) changed. */
  dirtyStates: number;
  /**
   * A-posteriori majorant of the last two levels' difference (./aposteriori.ts): for every state s
   * whose level k is a single polynomial, |f^k_s(τ) − f^{k−1}_s(τ)| ≤ Σ_i dPoly[i]·τ^i on [0, len];
   * for the others, ≤ dConst. Reset by runInterval.
   */
  readonly dPoly: Float64Array;
  dConst: number;
  /** Scratch for the Taylor shift of ./aposteriori.ts. */
  readonly shiftBuf: Float64Array;
  /** Predecessors of each state (CSR over states: s' → every s with an action reaching s'). */
  readonly predStart: Int32Array;
  readonly pred: Int32Array;
  /** Largest dirtiness (0, 1, 2) among the successors of each state on the previous level. */
  readonly need: Uint8Array;
  /** Per action, how many of its coefficients r_{a,0 …} are current (see runInterval's two-action skip). */
  readonly valid: Uint8Array;
  /** Largest exit rate of an action of an active state. */
  readonly lam: number;
  /** Majorant Σ_i levelDiff[i]·τ^i + levelDiffConst of |f^{k−1}_s − f^{k−2}_s| over all states (./shortcut.ts). */
  readonly levelDiff: Float64Array;
  levelDiffConst: number;
  /** Level-k proxies of level k − 1 (./shortcut.ts): current when proxyStamp[s] = stamp. */
  readonly proxyP: Float64Array;
  readonly proxyEta: Float64Array;
  readonly proxyI: Float64Array;
  readonly proxyErr: Float64Array;
  readonly proxyStamp: Int32Array;
  stamp: number;
  readonly proxyQ: Float64Array;
  readonly proxySlack: Float64Array;
  scratchRound: number;
  /** States of the last interval whose level k took the shortcut, and the largest rounding bound of their values. */
  shortcutStates: number;
  shortcutRound: number;
  /** Over the whole solve: state-levels that took the shortcut; dominated actions not computed. */
  shortcuts: number;
  skippedRows: number;
}

function activeLambda(m: CompiledModel, active: Uint8Array): number {
  let l = 0;
  for (let s = 0; s < m.nStates; s++) if (active[s]) for (let a = m.actionStart[s]!; a < m.actionStart[s + 1]!; a++) l = Math.max(l, m.exitRate[a]!);
  return l;
}

function maxActions(m: CompiledModel): number {
  let n = 1;
  for (let s = 0; s < m.nStates; s++) n = Math.max(n, m.actionStart[s + 1]! - m.actionStart[s]!);
  return n;
}

/** Predecessor lists over states, built once per model. */
function predecessors(m: CompiledModel): { predStart: Int32Array; pred: Int32Array } {
  const S = m.nStates;
  const predStart = new Int32Array(S + 1);
  for (let t = 0; t < m.nTransitions; t++) predStart[m.col[t]! + 1]++;
  for (let s = 0; s < S; s++) predStart[s + 1] += predStart[s]!;
  const fill = predStart.slice(0, S);
  const pred = new Int32Array(m.nTransitions);
  for (let s = 0; s < S; s++)
    for (let a = m.actionStart[s]!; a < m.actionStart[s + 1]!; a++)
      for (let t = m.rowStart[a]!; t < m.rowStart[a + 1]!; t++) pred[fill[m.col[t]!]!++] = s;
  return { predStart, pred };
}

/** Longest row (successors) of any action plus one: the length d + 1 of a coefficient's dot product. */
function rowLen(m: CompiledModel): number {
  let d = 0;
  for (let a = 0; a < m.nActions; a++) d = Math.max(d, m.rowStart[a + 1]! - m.rowStart[a]!);
  return d + 1;
}

export function makeWork(m: CompiledModel, k: number, active: Uint8Array, _x: Float64Array, pieceCap: number, looseTie = 0): KstepWork {
  const S = m.nStates;
  return {
    m, k, active, C: Array.from({ length: k }, () => new Float64Array(S)), R: new Float64Array(m.nActions * k),
    dPrev: new Uint8Array(S), dCur: new Uint8Array(S), nDirtyPrev: 0, pendS: new Int32Array(S), pendC: new Float64Array(S * k),
    pwPrev: new Map(), pwCur: new Map(), act: new Int32Array(S), diff: new Float64Array(k + 1), dec: new Int32Array(S).fill(-1), pieceDec: new Map(),
    pieceCap, looseTie, coefScale: new Float64Array(k), coefMax: new Float64Array(k), gammaCoef: gamma(2 * rowLen(m)), tieLoss: 0, maxPieces: 1, coefNorm: 1, slowStates: 0, dirtyStates: 0,
    dPoly: new Float64Array(k + 1), dConst: 0, shiftBuf: new Float64Array(k + 1), ...predecessors(m), need: new Uint8Array(S),
    valid: new Uint8Array(m.nActions), lam: activeLambda(m, active), levelDiff: new Float64Array(k + 1), levelDiffConst: 0, proxyP: new Float64Array(S * k), proxyEta: new Float64Array(S), proxyI: new Float64Array(S),
    proxyErr: new Float64Array(S), proxyStamp: new Int32Array(S), stamp: 0,
    proxyQ: new Float64Array(maxActions(m) * k), proxySlack: new Float64Array(maxActions(m)), scratchRound: 0,
    shortcutStates: 0, shortcutRound: 0, shortcuts: 0, skippedRows: 0,
  };
}

/**
 * Rounding bound of the computed coefficient r̃_{a,i} = fl(Σ_t R_t c_i(s'_t) − E_a c_i(s)), a dot
 * product of d + 1 terms (Higham 2002, Lemma 3.1 and eq. (3.5): |error| ≤ γ_{d+1} Σ|terms|), plus the
 * mismatch between the computed exit rate and the sum of the row's rates (≤ γ_d E_a |c_i(s)|): in all
 * ≤ γ_{2d+2}·(Σ_t R_t |c_i(s'_t)| + E_a |c_i(s)|). Only the state's own quantities enter.
 */
function coefError(w: KstepWork, a: number, s: number, i: number, x: Float64Array): number {
  const { rowStart, col, rate, exitRate } = w.m;
  const c = i === 0 ? x : w.C[i]!;
  let acc = exitRate[a]! * Math.abs(c[s]!);
  for (let t = rowStart[a]!; t < rowStart[a + 1]!; t++) acc += rate[t]! * Math.abs(c[col[t]!]!);
  return w.gammaCoef * acc * (1 + w.gammaCoef);
}

/** Is the computed difference d of coefficient i between actions b and best within rounding? */
function isTie(w: KstepWork, d: number, b: number, best: number, s: number, i: number, rb: number, rbest: number, x: Float64Array): boolean {
  if (w.looseTie > 0) return Math.abs(d) <= w.looseTie * (Math.abs(rb) + Math.abs(rbest) + w.coefScale[i]!);
  const m = w.m;
  // Cheap test first: coefError ≤ γ·2E_a·max_s|c_i(s)|; only a near-tie pays for the exact sums.
  const cheap = w.gammaCoef * 2 * (m.exitRate[b]! + m.exitRate[best]!) * w.coefMax[i]! * (1 + 1e-12);
  if (Math.abs(d) > cheap) return false;
  return Math.abs(d) <= coefError(w, b, s, i, x) + coefError(w, best, s, i, x);
}

/**
 * Index (within the state) of the action that is best on all of [0, len], or −1 when another one
 * overtakes it inside (0, len). Best at 0 is lexicographic in (value, slope, …), where a difference
 * within the rounding bound of the two coefficients (isTie) is decided by the next order; a tie at
 * every order keeps the lower index. What such a choice can lose is paid for: for every other action
 * b whose computed difference to the chosen one is positive somewhere in [0, len] (no interior
 * crossing, else the caller takes the slow path), a bound on its largest value times len goes into
 * w.tieLoss, which ./bound.ts adds to the interval's bound. Below the rounding bound this is a rounding
 * loss; a tie rule whose tolerance is not paid for is the planted bug `looseTie`.
 */
function dominant(w: KstepWork, s: number, a0: number, nA: number, j: number, len: number, sense: number, x: Float64Array): number {
  const { R, k, diff } = w;
  let best = 0;
  for (let b = 1; b < nA; b++) {
    for (let i = 0; i < j; i++) {
      const rb = R[(a0 + b) * k + i]!;
      const rbest = R[(a0 + best) * k + i]!;
      const d = sense * (rb - rbest);
      if (d === 0 || isTie(w, d, a0 + b, a0 + best, s, i, rb, rbest, x)) continue;
      if (d > 0) best = b;
      break;
    }
  }
  for (let b = 0; b < nA; b++) {
    if (b === best) continue;
    let rest = 0;
    let p = 1;
    for (let i = 0; i < j; i++) diff[i] = sense * (R[(a0 + b) * k + i]! - R[(a0 + best) * k + i]!);
    for (let i = 1; i < j; i++) {
      p *= len;
      rest += Math.abs(diff[i]!) * p;
    }
    if (diff[0]! + rest <= 0 || shiftedMax(w.shiftBuf, diff, j - 1, len, rest + Math.abs(diff[0]!)) <= 0) continue;
    for (const r of realRoots(diff, 0, j - 1, 0, len)) if (r > 0 && r < len) return -1;
    // No crossing inside: the sign is constant on (0, len). Charge what b may be better by.
    if (w.looseTie > 0) continue;
    let mid = diff[j - 1]!;
    for (let i = j - 2; i >= 0; i--) mid = mid * (0.5 * len) + diff[i]!;
    // Positive inside: at most d_0 + Σ|d_i| len^i. Positive only at 0: a crossing closer to 0 than
    // the root isolation resolves, after which b is worse; d_0 (a tie, so at rounding level) bounds it.
    const loss = mid > 0 ? diff[0]! + rest : diff[0]! > 0 ? diff[0]! : 0;
    if (loss > 0) w.tieLoss = Math.max(w.tieLoss, loss * len * (1 + 1e-12));
  }
  return best;
}

/**
 * An upper bound of the polynomial d (degree deg, in τ) on [0, len], rigorous for the computed
 * coefficients: re-expanded about c = len/2 by repeated synthetic division into b (Horner's rule,
 * each b_i within γ_{2deg}·M_i of the exact one, Σ_i M_i (len/2)^i = Σ_j |d_j| len^j = crude; Higham
 * 2002, §5.1), max ≤ b_0 + Σ_{i≥1} |b_i| (len/2)^i + γ_{2deg+2}·crude. Sharper than d_0 + Σ|d_i| len^i
 * where d falls (it keeps the cancellation), so that fewer near-switch states call the root finder.
 */
function shiftedMax(b: Float64Array, d: Float64Array, deg: number, len: number, crude: number): number {
  for (let i = 0; i <= deg; i++) b[i] = d[i]!;
  const c = 0.5 * len;
  for (let i = 0; i < deg; i++) for (let q = deg - 1; q >= i; q--) b[q] += c * b[q + 1]!;
  let acc = 0;
  for (let i = deg; i >= 1; i--) acc = (acc + (b[i]! < 0 ? -b[i]! : b[i]!)) * c;
  return b[0]! + acc + gamma(2 * deg + 2) * crude * (1 + 1e-12);
}

/** Slow path for s at level j: returns f^j_s(len), or NaN when the piece cap is exceeded. */
function slowState(w: KstepWork, s: number, j: number, len: number, x: Float64Array, nPend: { n: number }): number {
  const { m, k } = w;
  const PS = k + 1;
  w.slowStates++;
  const a0 = m.actionStart[s]!;
  const nA = m.actionStart[s + 1]! - a0;
  const rhs: Piecewise[] = [];
  for (let a = a0; a < a0 + nA; a++) {
    // Single-piece successors are summed into one polynomial; only piecewise ones bring breakpoints.
    const base = new Float64Array(PS);
    const terms: { w: number; f: Piecewise }[] = [];
    const add = (u: number, r: number): void => {
      if (w.dPrev[u] === 2) {
        terms.push({ w: r, f: w.pwPrev.get(u)! });
        return;
      }
      base[0] += r * x[u]!;
      for (let i = 1; i < j; i++) base[i] += r * w.C[i]![u]!;
    };
    for (let t = m.rowStart[a]!; t < m.rowStart[a + 1]!; t++) add(m.col[t]!, m.rate[t]!);
    add(s, -m.exitRate[a]!);
    const poly = single(base, 0, j - 1, PS, 0, len);
    rhs.push(terms.length === 0 ? poly : linearCombination([{ w: 1, f: poly }, ...terms], j - 1, PS));
  }
  const env = nA > 1 ? envelope(rhs, m.owner[s]! < 0 ? -1 : 1, j - 1) : rhs[0]!;
  const f = integrate(env, x[s]!, j - 1);
  const n = pieceCount(f);
  if (n > w.pieceCap) return NaN;
  if (n > w.maxPieces) w.maxPieces = n;
  for (let i = 0; i < n; i++) w.coefNorm = Math.max(w.coefNorm, absSum(f.coef, i * PS, j, len));
  w.act[s] = -1;
  if (j === k || j === k - 1) {
    const prev = w.dPrev[s] === 2 ? w.pwPrev.get(s)! : previousSingle(w, s, x[s]!, len, j - 1);
    const sup = supDifference(w, f, prev, j);
    if (j === k) {
      if (sup > w.dConst) w.dConst = sup;
    } else if (sup > w.levelDiffConst) w.levelDiffConst = sup;
  }
  if (j === k) {
    if (w.levelK) w.levelK.pieces.set(s, f);
    if (nA > 1) {
      const lenOf = new Float64Array(nA);
      for (let i = 0; i < n; i++) lenOf[env.choice![i]!] += f.breaks[i + 1]! - f.breaks[i]!;
      let best = 0;
      for (let a = 1; a < nA; a++) if (lenOf[a]! > lenOf[best]!) best = a;
      w.dec[s] = a0 + best;
      let changes = false;
      for (let i = 1; i < n; i++) if (env.choice![i] !== env.choice![i - 1]) changes = true;
      if (changes) {
        const tau: number[] = [];
        const action: number[] = [];
        for (let i = 0; i < n; i++) {
          if (i > 0 && env.choice![i] === env.choice![i - 1]) continue;
          tau.push(f.breaks[i]!);
          action.push(a0 + env.choice![i]!);
        }
        w.pieceDec.set(s, { tau, action });
      }
    }
    return evaluate(f, len, j);
  }
  if (n === 1) {
    const p = nPend.n++;
    w.pendS[p] = s;
    for (let i = 1; i <= j; i++) w.pendC[p * k + i - 1] = f.coef[i]!;
    w.dCur[s] = 1;
  } else {
    w.pwCur.set(s, f);
    w.dCur[s] = 2;
  }
  return 0;
}

/** The previous level (degree deg) of a single-polynomial state as a one-piece function (c_0 = x_s, c_i from C). */
function previousSingle(w: KstepWork, s: number, xs: number, len: number, deg: number): Piecewise {
  const c = new Float64Array(w.k + 1);
  c[0] = xs;
  for (let i = 1; i <= deg; i++) c[i] = w.C[i]![s]!;
  return single(c, 0, w.k, w.k + 1, 0, len);
}

/** r_{a,i} for i = lo … j−1 from the coefficient arrays (i = 0 reads x). */
function accumulate(w: KstepWork, a: number, s: number, lo: number, j: number, x: Float64Array): void {
  const { rowStart, col, rate, exitRate } = w.m;
  const t0 = rowStart[a]!;
  const t1 = rowStart[a + 1]!;
  const e = exitRate[a]!;
  for (let i = lo; i < j; i++) {
    const c = i === 0 ? x : w.C[i]!;
    let acc = 0;
    for (let t = t0; t < t1; t++) acc += rate[t]! * c[col[t]!]!;
    w.R[a * w.k + i] = acc - e * c[s]!;
  }
}

/** max_s |c[s]|. */
function absMax(c: Float64Array): number {
  let mx = 0;
  for (let s = 0; s < c.length; s++) {
    const v = c[s]! < 0 ? -c[s]! : c[s]!;
    if (v > mx) mx = v;
  }
  return mx;
}

/**
 * Runs the k levels on [0, len] from x and writes f^k(len), clamped to [0, 1], into out.
 * Per level, a clean state costs its rows' dot products for the one new coefficient and the
 * dominance test; which states are dirty is pushed from the changed states to their predecessors
 * (work proportional to the changes, not to the transitions).
 */
export function runInterval(w: KstepWork, x: Float64Array, len: number, out: Float64Array): boolean {
  const { m, k, active, R, C, need, predStart, pred, gammaCoef, coefMax, valid } = w;
  const { actionStart, owner, rowStart, col, rate, exitRate } = m;
  const S = m.nStates;
  w.dPrev.fill(0);
  need.fill(0);
  w.nDirtyPrev = 0;
  w.levelK?.pieces.clear();
  w.pwPrev.clear();
  resetDifference(w);
  w.levelDiff.fill(0);
  w.levelDiffConst = 0;
  w.stamp++;
  w.shortcutStates = 0;
  w.shortcutRound = 0;
  const nPend = { n: 0 };
  // coefMax[i] ≥ max_s |c_i(s)| of every level of this interval so far (an upper bound is all that
  // isTie's cheap test needs).
  w.coefMax.fill(0);
  w.coefMax[0] = absMax(x);
  w.coefScale[0] = m.lambda * w.coefMax[0]!;
  for (let j = 1; j <= k; j++) {
    const last = j === k;
    const dPrev = w.dPrev;
    const dCur = w.dCur;
    const check = w.nDirtyPrev > 0;
    const cj = j === 1 ? x : C[j - 1]!;
    const cOut = last ? null : C[j]!;
    const top = j - 1;
    dCur.fill(0);
    w.pwCur = new Map();
    nPend.n = 0;
    for (let s = 0; s < S; s++) {
      if (!active[s]) {
        if (last) out[s] = x[s]!;
        if (last && w.levelK) for (let i = 0; i <= k; i++) w.levelK.coef[i * S + s] = i === 0 ? x[s]! : 0;
        continue;
      }
      const a0 = actionStart[s]!;
      const a1 = actionStart[s + 1]!;
      const nA = a1 - a0;
      let dirty = 0;
      if (check) {
        dirty = dPrev[s]!;
        if (need[s]! > dirty) dirty = need[s]!;
      }
      let skipped = false;
      if (dirty === 0 && nA === 2 && j >= 2 && w.looseTie === 0 && w.act[s]! >= 0) {
        // Two actions, clean: the new coefficient of the action that was best, then a range bound
        // on the other's difference polynomial, with each coefficient not computed bounded by
        // |r_{b,i}| ≤ (Σ_t R_t + E_b)·max_s|c_i(s)| = 2E_b·coefMax[i] (times 1 + 2γ for rounding):
        //   d(τ) ≤ d_0 + Σ_{i≥1} |d_i| τ^i,  |d_i| ≤ 2E_b·coefMax[i] + |r_{best,i}| where r_{b,i} is unknown.
        // When that is ≤ 0 on [0, len] the other action is dominated throughout: it is not computed.
        const B = a0 + w.act[s]!;
        const O = B === a0 ? a0 + 1 : a0;
        if (valid[B]! < top) accumulate(w, B, s, valid[B]!, top, x);
        let acc = 0;
        for (let t = rowStart[B]!, t1 = rowStart[B + 1]!; t < t1; t++) acc += rate[t]! * cj[col[t]!]!;
        R[B * k + top] = acc - exitRate[B]! * cj[s]!;
        valid[B] = j;
        const sense = owner[s]! < 0 ? -1 : 1;
        const d0 = sense * (R[O * k]! - R[B * k]!);
        if (d0 < 0) {
          const vO = valid[O]!;
          const eO = 2 * exitRate[O]! * (1 + 2 * gammaCoef);
          let pos = 0;
          let p = 1;
          for (let i = 1; i < j; i++) {
            p *= len;
            const rb = R[B * k + i]!;
            const d = i < vO ? R[O * k + i]! - rb : eO * coefMax[i]! + (rb < 0 ? -rb : rb);
            pos += (d < 0 ? -d : d) * p;
          }
          skipped = pos * (1 + 1e-12) <= -d0 * (1 - 1e-12);
        }
        if (!skipped) {
          accumulate(w, O, s, valid[O]!, j, x);
          valid[O] = j;
        }
      } else if (dirty === 0) {
        // The new coefficient r_{a,j−1} = Σ R(s,a,s')·c_{j−1}(s') − E(s,a)·c_{j−1}(s) of every action.
        const cs = cj[s]!;
        for (let a = a0; a < a1; a++) {
          if (valid[a]! < top) accumulate(w, a, s, valid[a]!, top, x);
          let acc = 0;
          for (let t = rowStart[a]!, t1 = rowStart[a + 1]!; t < t1; t++) acc += rate[t]! * cj[col[t]!]!;
          R[a * k + top] = acc - exitRate[a]! * cs;
          valid[a] = j;
        }
      } else if (dirty === 1) {
        w.dirtyStates++;
        for (let a = a0; a < a1; a++) {
          accumulate(w, a, s, 0, j, x);
          valid[a] = j;
        }
      }
      let best = 0;
      if (skipped) {
        w.skippedRows++;
        best = w.act[s]!;
      } else if (dirty < 2 && nA === 2 && w.looseTie === 0) {
        // Two actions, the common case, without a call: the first order whose difference is beyond
        // isTie's cheap test decides, and when the other action's difference polynomial is ≤ 0 on
        // [0, len] by the crude range bound, nothing is charged. Anything else (a possible tie or
        // crossing) goes to dominant, which decides exactly as it would have from the start.
        const sense = owner[s]! < 0 ? -1 : 1;
        const oa = a0 * k;
        const ob = oa + k;
        const tolE = gammaCoef * 2 * (exitRate[a0]! + exitRate[a0 + 1]!) * (1 + 1e-12);
        let pick = 0;
        for (let i = 0; i < j; i++) {
          const d = sense * (R[ob + i]! - R[oa + i]!);
          if (d === 0) continue;
          const tol = tolE * coefMax[i]!;
          pick = d > tol ? 1 : d < -tol ? 0 : -1;
          break;
        }
        if (pick >= 0) {
          const ob2 = pick === 0 ? ob : oa;
          const ox = pick === 0 ? oa : ob;
          let rest = 0;
          let p = 1;
          for (let i = 1; i < j; i++) {
            p *= len;
            const d = R[ob2 + i]! - R[ox + i]!;
            rest += (d < 0 ? -d : d) * p;
          }
          if (sense * (R[ob2]! - R[ox]!) + rest > 0) pick = -1;
        }
        best = pick >= 0 ? pick : dominant(w, s, a0, nA, j, len, sense, x);
      } else if (dirty < 2 && nA > 1) best = dominant(w, s, a0, nA, j, len, owner[s]! < 0 ? -1 : 1, x);
      // The shortcut gives a state's value at the interval's end only, no level-k function: not when
      // the dense solution is asked for (a certificate needs every state's function).
      if (dirty === 2 && last && k >= 2 && !w.levelK) {
        const v = lastLevelShortcut(w, s, x, len);
        if (v === v) {
          out[s] = v < 0 ? 0 : v > 1 ? 1 : v;
          w.shortcutStates++;
          if (w.scratchRound > w.shortcutRound) w.shortcutRound = w.scratchRound;
          continue;
        }
      }
      if (dirty === 2 || best < 0) {
        const v = slowState(w, s, j, len, x, nPend);
        if (v !== v) return false;
        if (last) out[s] = v < 0 ? 0 : v > 1 ? 1 : v;
        continue;
      }
      const o = (a0 + best) * k;
      if (nA > 1 && j > 1 && best !== w.act[s]) dirty = 1;
      if (nA > 1) w.act[s] = best;
      if (last) {
        // f^k(len) = x + Σ_i r_i len^{i+1}/(i+1), by Horner in len.
        let v = R[o + j - 1]! / j;
        for (let i = j - 2; i >= 0; i--) v = v * len + R[o + i]! / (i + 1);
        v = x[s]! + v * len;
        out[s] = v < 0 ? 0 : v > 1 ? 1 : v;
        if (nA > 1) w.dec[s] = a0 + best;
        if (w.levelK) for (let i = 0; i <= k; i++) w.levelK.coef[i * S + s] = i === 0 ? x[s]! : R[o + i - 1]! / i;
        noteSingle(w, s, o);
      } else if (dirty) {
        if (j === k - 1) {
          // Level k − 1 changed below its top coefficient: note |c^{k−1}_i − c^{k−2}_i| (./shortcut.ts).
          for (let i = 1; i < j; i++) {
            const d = R[o + i - 1]! / i - C[i]![s]!;
            const ad = d < 0 ? -d : d;
            if (ad > w.levelDiff[i]!) w.levelDiff[i] = ad;
          }
        }
        const pi = nPend.n++;
        w.pendS[pi] = s;
        for (let i = 0; i < j; i++) w.pendC[pi * k + i] = R[o + i]! / (i + 1);
        dCur[s] = 1;
      } else {
        cOut![s] = R[o + j - 1]! / j;
      }
    }
    if (last) {
      if (w.shortcutStates > 0) {
        // D^k_s ≤ 2λ∫₀^σ (Σ_i P_i ρ^i + Q) for the states that took the shortcut (./shortcut.ts).
        const z = 2 * w.lam * (1 + 1e-12);
        const dPoly = w.dPoly;
        for (let i = 1; i < k; i++) dPoly[i + 1] = Math.max(dPoly[i + 1]!, (z * w.levelDiff[i]!) / (i + 1));
        dPoly[1] = Math.max(dPoly[1]!, z * w.levelDiffConst);
        w.shortcuts += w.shortcutStates;
      }
      break;
    }
    for (let p = 0; p < nPend.n; p++) {
      const s = w.pendS[p]!;
      for (let i = 1; i <= j; i++) {
        const v = w.pendC[p * k + i - 1]!;
        C[i]![s] = v;
        const av = v < 0 ? -v : v;
        if (av > w.coefMax[i]!) w.coefMax[i] = av;
      }
    }
    const mj = absMax(C[j]!);
    if (mj > w.coefMax[j]!) w.coefMax[j] = mj;
    // The top coefficient is new at this level: |c^j_j − 0| ≤ max_s |c_j(s)| (stale entries only add).
    if (j === k - 1 && mj > w.levelDiff[j]!) w.levelDiff[j] = mj;
    for (let i = 1; i <= j; i++) w.coefScale[i] = m.lambda * w.coefMax[i]!;
    // Dirtiness for the next level: each changed state marks its predecessors.
    let nd = 0;
    need.fill(0);
    for (let s = 0; s < S; s++) {
      const d = dCur[s]!;
      if (d === 0) continue;
      nd++;
      for (let q = predStart[s]!, q1 = predStart[s + 1]!; q < q1; q++) if (need[pred[q]!]! < d) need[pred[q]!] = d;
    }
    w.nDirtyPrev = nd;
    w.dPrev = dCur;
    w.dCur = dPrev;
    w.pwPrev = w.pwCur;
  }
  return true;
}

