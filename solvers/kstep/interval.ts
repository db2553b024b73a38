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
  /** Stride of piecewise objects (k + 1: they reach degree k). */
  readonly PS: number;
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
  // Stored levels have degree ≤ k − 1 (level k is only evaluated at len): a power-of-two stride ≥ k
  // keeps one state's coefficients within one cache line; piecewise objects use stride k + 1.
  let K1 = 1;
  while (K1 < k) K1 *= 2;
  const S = m.nStates;
  let maxA = 1;
  for (let s = 0; s < S; s++) maxA = Math.max(maxA, m.actionStart[s + 1]! - m.actionStart[s]!);
  const F = new Float64Array(S * K1);
  const G = new Float64Array(S * K1);
  for (let s = 0; s < S; s++) if (!active[s]) F[s * K1] = G[s * K1] = x[s]!;
  return {
    m, k, K1, PS: k + 1, active, F, G, pwPrev: new Map(), pwCur: new Map(), acc: new Float64Array(maxA * K1),
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

function fnOf(w: KstepWork, u: number, deg: number, len: number, x: Float64Array): Piecewise {
  if (deg === 0) return single(x, u, 0, w.PS, 0, len);
  const o = u * w.K1;
  const F = w.F;
  if (F[o] !== F[o]) return w.pwPrev.get(u)!;
  return single(F, o, deg, w.PS, 0, len);
}

/**
 * The slow path for state s at level j: stores f^j_s (levels below k) and returns f^j_s(len); NaN
 * when the piece cap is exceeded.
 */
function slowState(w: KstepWork, s: number, j: number, len: number, x: Float64Array): number {
  const { m, K1, PS } = w;
  w.slowStates++;
  const a0 = m.actionStart[s]!;
  const nA = m.actionStart[s + 1]! - a0;
  const rhs: Piecewise[] = [];
  const self = fnOf(w, s, j - 1, len, x);
  for (let a = a0; a < a0 + nA; a++) {
    const terms: { w: number; f: Piecewise }[] = [{ w: -m.exitRate[a]!, f: self }];
    for (let t = m.rowStart[a]!; t < m.rowStart[a + 1]!; t++) terms.push({ w: m.rate[t]!, f: fnOf(w, m.col[t]!, j - 1, len, x) });
    rhs.push(linearCombination(terms, j - 1, PS));
  }
  const sense = m.owner[s]! < 0 ? -1 : 1;
  const env = nA > 1 ? envelope(rhs, sense, j - 1) : rhs[0]!;
  const f = integrate(env, x[s]!, j - 1);
  const n = pieceCount(f);
  if (n > w.pieceCap) return NaN;
  if (n > w.maxPieces) w.maxPieces = n;
  for (let i = 0; i < n; i++) w.coefNorm = Math.max(w.coefNorm, absSum(f.coef, i * PS, j, len));
  if (j === w.k && nA > 1) {
    const lenOf = new Float64Array(nA);
    for (let i = 0; i < n; i++) lenOf[env.choice![i]!] += f.breaks[i + 1]! - f.breaks[i]!;
    let best = 0;
    for (let a = 1; a < nA; a++) if (lenOf[a]! > lenOf[best]!) best = a;
    w.dec[s] = a0 + best;
  }
  if (j === w.k) return evaluate(f, len, j);
  const o = s * K1;
  if (n === 1) {
    for (let i = 0; i <= j; i++) w.G[o + i] = f.coef[i]!;
  } else {
    w.pwCur.set(s, f);
    for (let i = 0; i <= j; i++) w.G[o + i] = NaN;
  }
  return 0;
}

/**
 * acc[o … o+j−1] = coefficients of Σ_{s'} R(s,a,s')·f_{s'} − E(s,a)·f_s for the level-(j−1) polynomials
 * in F. Unrolled for j ≤ 4 with the sums in registers (the hot loop of the solver).
 */
function accumulate(m: CompiledModel, a: number, o: number, j: number, F: Float64Array, base: number, acc: Float64Array, stride: number): void {
  const { rowStart, col, rate } = m;
  const t0 = rowStart[a]!;
  const t1 = rowStart[a + 1]!;
  const e = m.exitRate[a]!;
  if (j === 1) {
    let c0 = 0;
    for (let t = t0; t < t1; t++) c0 += rate[t]! * F[col[t]! * stride]!;
    acc[o] = c0 - e * F[base]!;
  } else if (j === 2) {
    let c0 = 0;
    let c1 = 0;
    for (let t = t0; t < t1; t++) {
      const r = rate[t]!;
      const cb = col[t]! * stride;
      c0 += r * F[cb]!;
      c1 += r * F[cb + 1]!;
    }
    acc[o] = c0 - e * F[base]!;
    acc[o + 1] = c1 - e * F[base + 1]!;
  } else if (j === 3) {
    let c0 = 0;
    let c1 = 0;
    let c2 = 0;
    for (let t = t0; t < t1; t++) {
      const r = rate[t]!;
      const cb = col[t]! * stride;
      c0 += r * F[cb]!;
      c1 += r * F[cb + 1]!;
      c2 += r * F[cb + 2]!;
    }
    acc[o] = c0 - e * F[base]!;
    acc[o + 1] = c1 - e * F[base + 1]!;
    acc[o + 2] = c2 - e * F[base + 2]!;
  } else if (j === 4) {
    let c0 = 0;
    let c1 = 0;
    let c2 = 0;
    let c3 = 0;
    for (let t = t0; t < t1; t++) {
      const r = rate[t]!;
      const cb = col[t]! * stride;
      c0 += r * F[cb]!;
      c1 += r * F[cb + 1]!;
      c2 += r * F[cb + 2]!;
      c3 += r * F[cb + 3]!;
    }
    acc[o] = c0 - e * F[base]!;
    acc[o + 1] = c1 - e * F[base + 1]!;
    acc[o + 2] = c2 - e * F[base + 2]!;
    acc[o + 3] = c3 - e * F[base + 3]!;
  } else {
    for (let i = 0; i < j; i++) acc[o + i] = 0;
    for (let t = t0; t < t1; t++) {
      const r = rate[t]!;
      const cb = col[t]! * stride;
      for (let i = 0; i < j; i++) acc[o + i] += r * F[cb + i]!;
    }
    for (let i = 0; i < j; i++) acc[o + i] -= e * F[base + i]!;
  }
}

/** Runs the k levels on [0, len] from x and writes f^k(len), clamped to [0, 1], into out. */
export function runInterval(w: KstepWork, x: Float64Array, len: number, out: Float64Array): boolean {
  const { m, k, K1, active, acc } = w;
  const { actionStart, owner } = m;
  const S = m.nStates;
  w.pwPrev.clear();
  for (let j = 1; j <= k; j++) {
    const F = w.F;
    const G = w.G;
    const last = j === k;
    // Level 1 reads f⁰ ≡ x: the dense start vector (smaller than F, so kinder to the cache).
    const src = j === 1 ? x : F;
    const sstride = j === 1 ? 1 : K1;
    w.pwCur = new Map();
    for (let s = 0; s < S; s++) {
      if (!active[s]) {
        if (last) out[s] = x[s]!;
        continue;
      }
      const a0 = actionStart[s]!;
      const nA = actionStart[s + 1]! - a0;
      const sb = s * sstride;
      let nan = false;
      for (let q = 0; q < nA; q++) {
        accumulate(m, a0 + q, q * K1, j, src, sb, acc, sstride);
        if (acc[q * K1] !== acc[q * K1]) nan = true;
      }
      let best = 0;
      if (!nan && nA > 1) best = dominant(w, nA, j, len, owner[s]! < 0 ? -1 : 1);
      if (nan || best < 0) {
        const v = slowState(w, s, j, len, x);
        if (v !== v) return false;
        if (last) out[s] = v < 0 ? 0 : v > 1 ? 1 : v;
        continue;
      }
      const o = best * K1;
      const xs = x[s]!;
      let norm = Math.abs(xs);
      let p = 1;
      if (last) {
        // f^k(len) = x + Σ_i acc_i len^{i+1}/(i+1), by Horner in len; f^k is not stored.
        let v = acc[o + j - 1]! / j;
        for (let i = j - 2; i >= 0; i--) v = v * len + acc[o + i]! / (i + 1);
        v = xs + v * len;
        for (let i = 0; i < j; i++) {
          p *= len;
          norm += (Math.abs(acc[o + i]!) / (i + 1)) * p;
        }
        out[s] = v < 0 ? 0 : v > 1 ? 1 : v;
        if (nA > 1) w.dec[s] = a0 + best;
      } else {
        const base = s * K1;
        G[base] = xs;
        for (let i = 0; i < j; i++) {
          const c = acc[o + i]! / (i + 1);
          G[base + i + 1] = c;
          p *= len;
          norm += Math.abs(c) * p;
        }
      }
      if (norm > w.coefNorm) w.coefNorm = norm;
    }
    w.F = G;
    w.G = F;
    w.pwPrev = w.pwCur;
  }
  return true;
}
