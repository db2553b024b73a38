/**
 * Real roots of a polynomial inside a closed interval [lo, hi].
 *
 * Method, by degree (after dropping exactly-zero leading coefficients):
 *   1: the linear root;
 *   2: the quadratic formula in the cancellation-free form q = −(b + sign(b)·√Δ)/2, roots q/a and
 *      c/q (Press, Teukolsky, Vetterling & Flannery, Numerical Recipes, 3rd ed. 2007, §5.6);
 *   3: the depressed cubic t³ + pt + q; three real roots by the trigonometric (Viète) form
 *      t = 2√(−p/3)·cos(θ/3 − 2πk/3), one real root by Cardano's formula written without
 *      cancellation (Numerical Recipes §5.6); every closed-form root is then polished by Newton steps
 *      that are kept only while they shrink the residual;
 *   ≥ 4, and as a fallback when the closed form of a cubic disagrees with the signs at the ends:
 *      isolation by the derivative's roots (recursively), which cut [lo, hi] into monotone segments,
 *      then bisection to the last bit on every segment whose ends differ in sign (common practice,
 *      no source). This finds every root of odd multiplicity, whatever the degree.
 * A double root (a tangency) is reported when it shows up as a critical point whose value is at the
 * level of its own evaluation error; callers that need sign changes must test the signs between roots.
 * The zero polynomial (identical inputs: a tie) has no roots here.
 * Accuracy: a root of odd multiplicity with a sign change is returned within a few ulps of an exact
 * root of the rounded polynomial; roots closer together than ~1e-13·(hi − lo) are reported once.
 */
import { absSum, derivative, gamma, horner, trueDegree } from './poly.js';

function sortUniq(rs: number[], lo: number, hi: number): number[] {
  const tol = 1e-13 * (hi - lo);
  // Roots a few ulps outside (a root at an end, computed with rounding) are clamped onto the end.
  const inside = rs
    .filter((r) => Number.isFinite(r) && r >= lo - tol && r <= hi + tol)
    .map((r) => Math.min(hi, Math.max(lo, r)))
    .sort((a, b) => a - b);
  const out: number[] = [];
  for (const r of inside) if (out.length === 0 || r - out[out.length - 1]! > tol) out.push(r);
  return out;
}

/** Newton steps from r, kept only while the residual shrinks. */
function polish(c: ArrayLike<number>, off: number, deg: number, r: number): number {
  let best = r;
  let fb = Math.abs(horner(c, off, deg, r));
  for (let it = 0; it < 4 && fb > 0; it++) {
    let p = c[off + deg]!;
    let dp = 0;
    for (let i = deg - 1; i >= 0; i--) {
      dp = dp * best + p;
      p = p * best + c[off + i]!;
    }
    if (dp === 0) break;
    const next = best - p / dp;
    const fn = Math.abs(horner(c, off, deg, next));
    if (!(fn < fb)) break;
    best = next;
    fb = fn;
  }
  return best;
}

function quadratic(c0: number, c1: number, c2: number): number[] {
  const disc = c1 * c1 - 4 * c2 * c0;
  const scale = c1 * c1 + Math.abs(4 * c2 * c0);
  if (disc < 0) return disc >= -8 * 2 ** -53 * scale ? [-c1 / (2 * c2)] : [];
  const q = -0.5 * (c1 + (c1 >= 0 ? 1 : -1) * Math.sqrt(disc));
  if (q === 0) return [0];
  return [q / c2, c0 / q];
}

function cubic(c0: number, c1: number, c2: number, c3: number): number[] {
  const a = c2 / c3;
  const b = c1 / c3;
  const c = c0 / c3;
  const p = b - (a * a) / 3;
  const q = (2 * a * a * a) / 27 - (a * b) / 3 + c;
  const shift = -a / 3;
  const disc = (q * q) / 4 + (p * p * p) / 27;
  if (disc < 0) {
    const m = 2 * Math.sqrt(-p / 3);
    const arg = Math.max(-1, Math.min(1, (3 * q) / (p * m)));
    const theta = Math.acos(arg);
    return [0, 1, 2].map((k) => m * Math.cos(theta / 3 - (2 * Math.PI * k) / 3) + shift);
  }
  const sq = Math.sqrt(disc);
  const u = Math.cbrt(-q / 2 - (q >= 0 ? 1 : -1) * sq);
  const t = u === 0 ? 0 : u - p / (3 * u);
  const roots = [t + shift];
  if (disc <= 1e-14 * ((q * q) / 4 + Math.abs(p * p * p) / 27) && u !== 0) roots.push(-u / 2 + p / (6 * u) + shift);
  return roots;
}

/** Every root of odd multiplicity in [lo, hi] by monotone segments and bisection (any degree). */
export function isolateRoots(c: ArrayLike<number>, off: number, deg: number, lo: number, hi: number): number[] {
  const d = trueDegree(c, off, deg);
  if (d <= 0) return [];
  if (d === 1) return sortUniq([-c[off]! / c[off + 1]!], lo, hi);
  const crit = isolateRoots(derivative(c, off, d), 0, d - 1, lo, hi);
  const pts = [lo, ...crit.filter((r) => r > lo && r < hi), hi];
  const roots: number[] = [];
  for (const x of pts) {
    const v = horner(c, off, d, x);
    if (v === 0 || Math.abs(v) <= 4 * gamma(2 * d) * absSum(c, off, d, x)) {
      if (x === lo || x === hi || crit.includes(x)) roots.push(x);
    }
  }
  for (let i = 0; i + 1 < pts.length; i++) {
    let a = pts[i]!;
    let b = pts[i + 1]!;
    let fa = horner(c, off, d, a);
    const fb = horner(c, off, d, b);
    if (fa === 0 || fb === 0 || fa > 0 === fb > 0) continue;
    for (let it = 0; it < 200; it++) {
      const mid = 0.5 * (a + b);
      if (mid <= a || mid >= b) break;
      const fm = horner(c, off, d, mid);
      if (fm === 0) {
        a = b = mid;
        break;
      }
      if (fm > 0 === fa > 0) {
        a = mid;
        fa = fm;
      } else b = mid;
    }
    roots.push(0.5 * (a + b));
  }
  return sortUniq(roots, lo, hi);
}

/**
 * Whether the closed-form roots explain the signs: with no inner root the ends must agree in sign,
 * and p must be clearly nonzero (beyond its evaluation error) between consecutive roots.
 */
function consistent(c: ArrayLike<number>, off: number, d: number, lo: number, hi: number, roots: number[]): boolean {
  const fl = horner(c, off, d, lo);
  const fh = horner(c, off, d, hi);
  if (fl === 0 || fh === 0) return true;
  const inner = roots.filter((r) => r > lo && r < hi);
  if (inner.length === 0) return fl > 0 === fh > 0;
  const pts = [lo, ...inner, hi];
  for (let i = 0; i + 1 < pts.length; i++) {
    const m = horner(c, off, d, 0.5 * (pts[i]! + pts[i + 1]!));
    const e = 4 * gamma(2 * d) * absSum(c, off, d, 0.5 * (pts[i]! + pts[i + 1]!));
    if (Math.abs(m) <= e) return false;
  }
  return true;
}

/** Real roots of c[off] + c[off+1]τ + … + c[off+deg]τ^deg in [lo, hi], ascending, each once. */
export function realRoots(c: ArrayLike<number>, off: number, deg: number, lo: number, hi: number): number[] {
  const d = trueDegree(c, off, deg);
  if (d <= 0) return [];
  if (d === 1) return sortUniq([-c[off]! / c[off + 1]!], lo, hi);
  if (d >= 4) return isolateRoots(c, off, d, lo, hi);
  const raw = d === 2 ? quadratic(c[off]!, c[off + 1]!, c[off + 2]!) : cubic(c[off]!, c[off + 1]!, c[off + 2]!, c[off + 3]!);
  const roots = sortUniq(raw.map((r) => polish(c, off, d, r)), lo, hi);
  return consistent(c, off, d, lo, hi, roots) ? roots : isolateRoots(c, off, d, lo, hi);
}
