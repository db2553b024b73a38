/**
 * Continuous piecewise polynomials on an interval [lo, hi]: evaluation, linear combinations (merging
 * breakpoints), integration with continuity, and the pointwise max/min (upper/lower envelope) of
 * several of them, whose new breakpoints are real roots of pairwise differences (./roots.ts).
 *
 * Representation: `breaks` = lo = b_0 < b_1 < … < b_n = hi and, for piece i on [b_i, b_{i+1}],
 * coefficients coef[i·stride … i·stride + deg] of a polynomial in the interval's own variable τ.
 * Every function built here is continuous (sums and envelopes of continuous functions, integrals),
 * so a breakpoint closer than 1e-13·(hi − lo) to another is dropped; the error that this adds is
 * below |p′|·1e-13·(hi − lo), far under the rounding allowance of the callers.
 *
 * Envelope method: on each piece common to all inputs, collect the roots in the open piece of every
 * pairwise difference, and on each sub-interval between consecutive roots pick the best input at the
 * midpoint (no two inputs cross inside a sub-interval, so the best there is best throughout). Ties
 * (identical polynomials) give no root and the lower index wins; tangencies give a root with the same
 * winner on both sides, and the two sub-intervals merge again (no switch). Cost: O(m²) root searches
 * per common piece for m inputs. Where it breaks down: a crossing whose two sides differ by less than
 * the evaluation error may be missed; the loss is then at the level of that evaluation error.
 */
import { horner } from './poly.js';
import { realRoots } from './roots.js';

export interface Piecewise {
  readonly breaks: Float64Array;
  readonly coef: Float64Array;
  readonly stride: number;
  /** For envelopes: which input is taken on each piece. */
  readonly choice?: Int32Array;
}

export function pieceCount(p: Piecewise): number {
  return p.breaks.length - 1;
}

/** One polynomial (coefficients c[off … off+deg]) as a one-piece function on [lo, hi]. */
export function single(c: ArrayLike<number>, off: number, deg: number, stride: number, lo: number, hi: number): Piecewise {
  const coef = new Float64Array(stride);
  for (let i = 0; i <= deg; i++) coef[i] = c[off + i]!;
  return { breaks: Float64Array.of(lo, hi), coef, stride };
}

/** Index of the piece containing τ (the last piece for τ ≥ its left end). */
export function pieceAt(p: Piecewise, tau: number): number {
  const b = p.breaks;
  let lo = 0;
  let hi = b.length - 2;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (b[mid]! <= tau) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

export function evaluate(p: Piecewise, tau: number, deg: number): number {
  return horner(p.coef, pieceAt(p, tau) * p.stride, deg, tau);
}

/** Sorted union of breakpoints, dropping those within 1e-13·(hi − lo) of a kept one. */
export function mergeBreaks(list: readonly Float64Array[]): Float64Array {
  const first = list[0]!;
  const lo = first[0]!;
  const hi = first[first.length - 1]!;
  const all: number[] = [];
  for (const b of list) for (let i = 1; i + 1 < b.length; i++) all.push(b[i]!);
  all.sort((a, b) => a - b);
  const tol = 1e-13 * (hi - lo);
  const out = [lo];
  for (const x of all) if (x - out[out.length - 1]! > tol && hi - x > tol) out.push(x);
  out.push(hi);
  return Float64Array.from(out);
}

/** Σ w_i f_i on the merged breakpoints (every f_i on the same [lo, hi], degree ≤ deg). */
export function linearCombination(terms: readonly { w: number; f: Piecewise }[], deg: number, stride: number): Piecewise {
  const breaks = mergeBreaks(terms.map((t) => t.f.breaks));
  const n = breaks.length - 1;
  const coef = new Float64Array(n * stride);
  for (const { w, f } of terms) {
    let k = 0;
    for (let i = 0; i < n; i++) {
      const mid = 0.5 * (breaks[i]! + breaks[i + 1]!);
      while (k + 2 < f.breaks.length && f.breaks[k + 1]! <= mid) k++;
      for (let d = 0; d <= deg; d++) coef[i * stride + d] += w * f.coef[k * f.stride + d]!;
    }
  }
  return { breaks, coef, stride };
}

/**
 * F(τ) = x0 + ∫_lo^τ p, continuous: on piece i, F = P_i + C_i with P_i the antiderivative without
 * constant term and C_i chosen so that F is continuous at b_i. Degree deg + 1 must fit the stride.
 */
export function integrate(p: Piecewise, x0: number, deg: number): Piecewise {
  const n = pieceCount(p);
  const s = p.stride;
  const coef = new Float64Array(n * s);
  let left = x0;
  for (let i = 0; i < n; i++) {
    const o = i * s;
    for (let d = 0; d <= deg; d++) coef[o + d + 1] = p.coef[o + d]! / (d + 1);
    const b = p.breaks[i]!;
    coef[o] = 0;
    coef[o] = left - horner(coef, o, deg + 1, b);
    left = horner(coef, o, deg + 1, p.breaks[i + 1]!);
  }
  return p.choice ? { breaks: p.breaks, coef, stride: s, choice: p.choice } : { breaks: p.breaks, coef, stride: s };
}

/**
 * Pointwise best of fs (sense +1: max, −1: min), with `choice` naming the input on each piece.
 */
export function envelope(fs: readonly Piecewise[], sense: 1 | -1, deg: number): Piecewise {
  const stride = fs[0]!.stride;
  const common = mergeBreaks(fs.map((f) => f.breaks));
  const m = fs.length;
  const outB: number[] = [common[0]!];
  const outC: number[] = [];
  const outK: number[] = [];
  const diff = new Float64Array(deg + 1);
  const idx = new Int32Array(m);
  const lo0 = common[0]!;
  const hi0 = common[common.length - 1]!;
  const tol = 1e-13 * (hi0 - lo0);
  for (let p = 0; p + 1 < common.length; p++) {
    const a = common[p]!;
    const b = common[p + 1]!;
    const mid = 0.5 * (a + b);
    for (let i = 0; i < m; i++) idx[i] = pieceAt(fs[i]!, mid) * stride;
    const cuts: number[] = [];
    for (let i = 0; i < m; i++)
      for (let j = i + 1; j < m; j++) {
        for (let d = 0; d <= deg; d++) diff[d] = fs[i]!.coef[idx[i]! + d]! - fs[j]!.coef[idx[j]! + d]!;
        for (const r of realRoots(diff, 0, deg, a, b)) if (r - a > tol && b - r > tol) cuts.push(r);
      }
    cuts.sort((x, y) => x - y);
    const pts = [a, ...cuts, b];
    let first = true;
    for (let q = 0; q + 1 < pts.length; q++) {
      if (pts[q + 1]! - pts[q]! <= tol && q + 2 < pts.length) continue;
      const t = 0.5 * (pts[q]! + pts[q + 1]!);
      let best = 0;
      let bv = sense * horner(fs[0]!.coef, idx[0]!, deg, t);
      for (let i = 1; i < m; i++) {
        const v = sense * horner(fs[i]!.coef, idx[i]!, deg, t);
        if (v > bv) {
          bv = v;
          best = i;
        }
      }
      const last = outK.length - 1;
      // Same winner on the same common piece: extend the previous output piece (tangency, no switch).
      if (!first && outK[last] === best) {
        outB[outB.length - 1] = pts[q + 1]!;
        continue;
      }
      first = false;
      for (let d = 0; d < stride; d++) outC.push(d <= deg ? fs[best]!.coef[idx[best]! + d]! : 0);
      outK.push(best);
      outB.push(pts[q + 1]!);
    }
  }
  return { breaks: Float64Array.from(outB), coef: Float64Array.from(outC), stride, choice: Int32Array.from(outK) };
}
