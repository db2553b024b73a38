/**
 * One interval of the k-step scheme: the Picard levels f¹ … f^k of the Bellman equations on
 * τ ∈ [0, len], from the start values x (the method, its source and its bound: ./bound.ts).
 *
 * Fast path (the common case): a state whose successors all carry one polynomial at level j − 1, and
 * which has one action or one action that is best on the whole interval, gets one polynomial at
 * level j, written as plain coefficients into a typed array (stride k + 1, coefficients in τ). A
 * state whose level-(j−1) function has several pieces is tagged by NaN coefficients; any right-hand
 * side that touches it turns NaN, which sends that state to the slow path without a per-transition
 * test. Slow path: piecewise right-hand sides with merged breakpoints, their envelope over the
 * actions, and the integral (../piecewise/piecewise.ts). If a state needs more than `pieceCap`
 * pieces, the interval is given up (the caller halves it).
 *
 * Allocation: none per state in the fast path; the slow path allocates its piecewise objects.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import { absSum, horner } from '../piecewise/poly.js';
import { envelope, evaluate, integrate, linearCombination, pieceCount, single, type Piecewise } from '../piecewise/piecewise.js';
import { realRoots } from '../piecewise/roots.js';

export interface KstepWork {
  readonly m: CompiledModel;
  readonly k: number;
  readonly K1: number;
  /** 1 where the state evolves (has a moving action and is not an absorbed goal). */
  readonly active: Uint8Array;
  F: Float64Array;
  G: Float64Array;
  pwPrev: Map<number, Piecewise>;
  pwCur: Map<number, Piecewise>;
  readonly acc: Float64Array;
  readonly diff: Float64Array;
  /** Decision (global action index) at level k in the last interval, per state; −1 if none. */
  readonly dec: Int32Array;
  readonly pieceCap: number;
  maxPieces: number;
  coefNorm: number;
  slowStates: number;
}

export function makeWork(m: CompiledModel, k: number, active: Uint8Array, x: Float64Array, pieceCap: number): KstepWork {
  const K1 = k + 1;
  const S = m.nStates;
  let maxA = 1;
  for (let s = 0; s < S; s++) maxA = Math.max(maxA, m.actionStart[s + 1]! - m.actionStart[s]!);
  const F = new Float64Array(S * K1);
  const G = new Float64Array(S * K1);
  for (let s = 0; s < S; s++) if (!active[s]) F[s * K1] = G[s * K1] = x[s]!;
  return {
    m, k, K1, active, F, G, pwPrev: new Map(), pwCur: new Map(), acc: new Float64Array(maxA * K1),
    diff: new Float64Array(K1), dec: new Int32Array(S).fill(-1), pieceCap, maxPieces: 1, coefNorm: 1, slowStates: 0,
  };
}

/**
 * Index (0-based among the state's actions) of the action that is best on all of [0, len], or −1
 * when another one overtakes it inside (0, len). Best at 0 is lexicographic in (value, slope, …).
 */
function dominant(w: KstepWork, nA: number, j: number, len: number, sense: number): number {
  const { acc, K1, diff } = w;
  let best = 0;
  for (let b = 1; b < nA; b++) {
    for (let i = 0; i < j; i++) {
      const d = sense * (acc[b * K1 + i]! - acc[best * K1 + i]!);
      if (d > 0) {
        best = b;
        break;
      }
      if (d < 0) break;
    }
  }
  for (let b = 0; b < nA; b++) {
    if (b === best) continue;
    let rest = 0;
    let p = 1;
    for (let i = 0; i < j; i++) diff[i] = sense * (acc[b * K1 + i]! - acc[best * K1 + i]!);
    for (let i = 1; i < j; i++) {
      p *= len;
      rest += Math.abs(diff[i]!) * p;
    }
    if (diff[0]! + rest <= 0) continue;
    const roots = realRoots(diff, 0, j - 1, 0, len);
    for (const r of roots) if (r > 0 && r < len) return -1;
  }
  return best;
}

function fnOf(w: KstepWork, u: number, deg: number, len: number): Piecewise {
  const o = u * w.K1;
  const F = w.F;
  if (F[o] !== F[o]) return w.pwPrev.get(u)!;
  return single(F, o, deg, w.K1, 0, len);
}

/** The slow path for state s at level j; false when the piece cap is exceeded. */
function slowState(w: KstepWork, s: number, j: number, len: number, x: Float64Array): boolean {
  const { m, K1 } = w;
  w.slowStates++;
  const a0 = m.actionStart[s]!;
  const nA = m.actionStart[s + 1]! - a0;
  const rhs: Piecewise[] = [];
  const self = fnOf(w, s, j - 1, len);
  for (let a = a0; a < a0 + nA; a++) {
    const terms: { w: number; f: Piecewise }[] = [{ w: -m.exitRate[a]!, f: self }];
    for (let t = m.rowStart[a]!; t < m.rowStart[a + 1]!; t++) terms.push({ w: m.rate[t]!, f: fnOf(w, m.col[t]!, j - 1, len) });
    rhs.push(linearCombination(terms, j - 1, K1));
  }
  const sense = m.owner[s]! < 0 ? -1 : 1;
  const env = nA > 1 ? envelope(rhs, sense, j - 1) : rhs[0]!;
  const f = integrate(env, x[s]!, j - 1);
  const n = pieceCount(f);
  if (n > w.pieceCap) return false;
  if (n > w.maxPieces) w.maxPieces = n;
  for (let i = 0; i < n; i++) w.coefNorm = Math.max(w.coefNorm, absSum(f.coef, i * K1, j, len));
  if (j === w.k && nA > 1) {
    const lenOf = new Float64Array(nA);
    for (let i = 0; i < n; i++) lenOf[env.choice![i]!] += f.breaks[i + 1]! - f.breaks[i]!;
    let best = 0;
    for (let a = 1; a < nA; a++) if (lenOf[a]! > lenOf[best]!) best = a;
    w.dec[s] = a0 + best;
  }
  const o = s * K1;
  if (n === 1) {
    for (let i = 0; i <= j; i++) w.G[o + i] = f.coef[i]!;
  } else {
    w.pwCur.set(s, f);
    for (let i = 0; i <= j; i++) w.G[o + i] = NaN;
  }
  return true;
}

/** Runs the k levels on [0, len] from x and writes f^k(len), clamped to [0, 1], into out. */
export function runInterval(w: KstepWork, x: Float64Array, len: number, out: Float64Array): boolean {
  const { m, k, K1, active, acc } = w;
  const { actionStart, rowStart, col, rate, exitRate, owner } = m;
  const S = m.nStates;
  for (let s = 0; s < S; s++) {
    if (!active[s]) continue;
    const o = s * K1;
    w.F[o] = x[s]!;
  }
  w.pwPrev.clear();
  for (let j = 1; j <= k; j++) {
    const F = w.F;
    const G = w.G;
    w.pwCur = new Map();
    for (let s = 0; s < S; s++) {
      if (!active[s]) continue;
      const base = s * K1;
      const a0 = actionStart[s]!;
      const nA = actionStart[s + 1]! - a0;
      let nan = false;
      for (let q = 0; q < nA; q++) {
        const a = a0 + q;
        const o = q * K1;
        for (let i = 0; i < j; i++) acc[o + i] = 0;
        const e1 = rowStart[a + 1]!;
        for (let t = rowStart[a]!; t < e1; t++) {
          const r = rate[t]!;
          const cb = col[t]! * K1;
          for (let i = 0; i < j; i++) acc[o + i] += r * F[cb + i]!;
        }
        const e = exitRate[a]!;
        for (let i = 0; i < j; i++) acc[o + i] -= e * F[base + i]!;
        if (acc[o] !== acc[o]) nan = true;
      }
      let best = 0;
      if (!nan && nA > 1) best = dominant(w, nA, j, len, owner[s]! < 0 ? -1 : 1);
      if (nan || best < 0) {
        if (!slowState(w, s, j, len, x)) return false;
        continue;
      }
      const o = best * K1;
      const xs = x[s]!;
      G[base] = xs;
      let norm = Math.abs(xs);
      let p = 1;
      for (let i = 0; i < j; i++) {
        const c = acc[o + i]! / (i + 1);
        G[base + i + 1] = c;
        p *= len;
        norm += Math.abs(c) * p;
      }
      if (norm > w.coefNorm) w.coefNorm = norm;
      if (j === k && nA > 1) w.dec[s] = a0 + best;
    }
    w.F = G;
    w.G = F;
    w.pwPrev = w.pwCur;
  }
  const F = w.F;
  for (let s = 0; s < S; s++) {
    if (!active[s]) {
      out[s] = x[s]!;
      continue;
    }
    const o = s * K1;
    let v = F[o] !== F[o] ? evaluate(w.pwPrev.get(s)!, len, k) : horner(F, o, k, len);
    if (v < 0) v = 0;
    else if (v > 1) v = 1;
    out[s] = v;
  }
  return true;
}
