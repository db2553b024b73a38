/**
 * The last level of a state whose successors are piecewise but whose own choice does not change:
 * its value at len from integrals, without building its pieces (./interval.ts, level k only).
 *
 * Why. A switch inside an interval makes the switching state piecewise at one level, its
 * predecessors at the next, and so on: by level k a switch has spread to all states within k − 1
 * steps, most of them at level k (in-degree d: about d^{k−1} states), and each costs the piecewise
 * path (merged breakpoints, envelopes, integrals). At level k only f^k_s(len) is needed, plus a
 * majorant of |f^k_s − f^{k−1}_s| for the a-posteriori bound (./aposteriori.ts).
 *
 * Value. Write g_a = Σ_t R(s,a,t) f^{k−1}_t − E(s,a) f^{k−1}_s (level k − 1, computed functions). If
 * some action b has g_a ≤ g_b on all of [0, len] for every other a (max; ≥ for min), the Picard image
 * is f^k_s(len) = x_s + ∫₀^len g_b = x_s + Σ_t R(s,b,t) I_t − E(s,b) I_s with I_t = ∫₀^len f^{k−1}_t.
 * Dominance is proved with proxies: each piecewise f^{k−1}_t is replaced by one of its pieces p_t
 * (the one containing len/2), with η_t ≥ sup |f^{k−1}_t − p_t| bounded piece by piece after a Taylor
 * shift (as in ./aposteriori.ts); single polynomials are their own proxies (η = 0). Then
 * g_a − g_b ≤ q_a − q_b + Σ_t (R(s,a,t) + R(s,b,t)) η_t + (E_a + E_b) η_s, q the same sums of proxies,
 * and b dominates when the shifted range bound of q_a − q_b plus that slack (and the rounding of the
 * coefficient sums, γ_{2d+2k+4} times the same sums in absolute values) is ≤ 0. Otherwise the
 * caller takes the piecewise path. What is proved is dominance for the computed functions, so no tie
 * is decided here and nothing is charged.
 * Rounding. I_t sums, over pieces, differences of the antiderivative (coefficients c_i/(i+1)) at the
 * piece's ends by Horner's rule: within γ_{2k+4}·Σ_pieces (A_t(hi) + A_t(lo)), A_t the same
 * evaluation in absolute values (Higham 2002, §5.1; the division by i + 1 adds a u inside γ); the dot
 * product adds γ_{2d+2}·(Σ R|I_t| + E|I_s|) (Higham 2002, eq. (3.5)). Their sum bounds |computed −
 * exact| for this state and is returned in `round`; ./index.ts adds the largest over states to the
 * interval's bound (the exact flow does not amplify it).
 * Majorant. For every state, the exact Picard images satisfy |Φ(y)_s(σ) − Φ(z)_s(σ)| ≤ 2λ∫₀^σ ‖y − z‖,
 * so D^k_s(σ) = |f^k_s − f^{k−1}_s|(σ) ≤ 2λ∫₀^σ D^{k−1}(ρ) dρ + δ_k + δ_{k−1}, with D^{k−1} the largest
 * level-(k−1) difference over all states and δ the levels' rounding. ./interval.ts keeps a majorant
 * Σ_i P_i ρ^i + Q of D^{k−1} (levelDiff), and ./index.ts adds the rounding constant.
 */
import type { Piecewise } from '../piecewise/piecewise.js';
import { gamma } from '../piecewise/poly.js';
import type { KstepWork } from './interval.js';

/** Σ_pieces ∫ of a piecewise polynomial of degree deg over [0, len], with its rounding bound. */
function integral(f: Piecewise, deg: number, g: number): { I: number; err: number } {
  let I = 0;
  let err = 0;
  const n = f.breaks.length - 1;
  for (let q = 0; q < n; q++) {
    const o = q * f.stride;
    let hiV = 0;
    let loV = 0;
    let hiA = 0;
    let loA = 0;
    const lo = f.breaks[q]!;
    const hi = f.breaks[q + 1]!;
    for (let i = deg; i >= 0; i--) {
      const c = f.coef[o + i]! / (i + 1);
      const ac = c < 0 ? -c : c;
      hiV = hiV * hi + c;
      loV = loV * lo + c;
      hiA = hiA * hi + ac;
      loA = loA * lo + ac;
    }
    I += hiV * hi - loV * lo;
    err += hiA * hi + loA * lo;
  }
  return { I, err: g * err * (1 + 1e-12) };
}

/**
 * The proxy of state t at level k − 1, computed once per interval into typed arrays (w.proxyStamp[t]
 * = w.stamp marks it current): coefficients at w.proxyP[t·k …], η, I and the rounding of I.
 */
export function proxyOf(w: KstepWork, t: number, x: Float64Array, len: number): void {
  if (w.proxyStamp[t] === w.stamp) return;
  w.proxyStamp[t] = w.stamp;
  const k = w.k;
  const deg = k - 1;
  const g = gamma(2 * k + 4);
  const P = w.proxyP;
  const o = t * k;
  if (w.dPrev[t] === 2) {
    const f = w.pwPrev.get(t)!;
    let q = 0;
    while (q + 2 < f.breaks.length && f.breaks[q + 1]! <= 0.5 * len) q++;
    for (let i = 0; i < k; i++) P[o + i] = f.coef[q * f.stride + i]!;
    const b = w.shiftBuf;
    const tail = gamma(2 * deg + 2) + 2 * 2 ** -53;
    let eta = 0;
    for (let r = 0; r + 1 < f.breaks.length; r++) {
      if (r === q) continue;
      const lo = f.breaks[r]!;
      const hi = f.breaks[r + 1]!;
      const c = 0.5 * (lo + hi);
      const h = 0.5 * (hi - lo);
      let crude = 0;
      for (let i = deg; i >= 0; i--) {
        const d = f.coef[r * f.stride + i]! - P[o + i]!;
        b[i] = d;
        crude = crude * hi + (d < 0 ? -d : d);
      }
      for (let i = 0; i < deg; i++) for (let z = deg - 1; z >= i; z--) b[z] += c * b[z + 1]!;
      let acc = 0;
      for (let i = deg; i >= 0; i--) acc = acc * h + (b[i]! < 0 ? -b[i]! : b[i]!);
      eta = Math.max(eta, (acc + tail * crude) * (1 + 1e-12));
    }
    const { I, err } = integral(f, deg, g);
    w.proxyEta[t] = eta;
    w.proxyI[t] = I;
    w.proxyErr[t] = err;
  } else {
    P[o] = x[t]!;
    for (let i = 1; i < k; i++) P[o + i] = w.C[i]![t]!;
    let I = 0;
    let A = 0;
    for (let i = deg; i >= 0; i--) {
      const c = P[o + i]! / (i + 1);
      I = I * len + c;
      A = A * len + (c < 0 ? -c : c);
    }
    w.proxyEta[t] = 0;
    w.proxyI[t] = I * len;
    w.proxyErr[t] = g * A * len * (1 + 1e-12);
  }
}

/**
 * f^k_s(len) by the shortcut, or NaN when no action is proved dominant (the caller then takes the
 * piecewise path). On success sets w.dec[s] and returns the rounding bound in w.scratchRound.
 */
export function lastLevelShortcut(w: KstepWork, s: number, x: Float64Array, len: number): number {
  const { m, k } = w;
  const { rowStart, col, rate, exitRate, actionStart } = m;
  const a0 = actionStart[s]!;
  const nA = actionStart[s + 1]! - a0;
  const sense = m.owner[s]! < 0 ? -1 : 1;
  const q = w.proxyQ;
  const slack = w.proxySlack;
  const P = w.proxyP;
  proxyOf(w, s, x, len);
  const os = s * k;
  const etaS = w.proxyEta[s]!;
  // q_a (sense-adjusted) and its slack, per action.
  for (let a = 0; a < nA; a++) {
    const act = a0 + a;
    const o = a * k;
    const e = exitRate[act]!;
    for (let i = 0; i < k; i++) q[o + i] = -e * P[os + i]!;
    let sl = e * etaS;
    for (let t = rowStart[act]!; t < rowStart[act + 1]!; t++) {
      const u = col[t]!;
      proxyOf(w, u, x, len);
      const r = rate[t]!;
      for (let i = 0; i < k; i++) q[o + i] += r * P[u * k + i]!;
      sl += r * w.proxyEta[u]!;
    }
    // Σ over the sum's terms of |term|·len^i (for the rounding of the coefficient sums).
    let mag = 0;
    let p = 1;
    for (let i = 0; i < k; i++) {
      let m = e * Math.abs(P[os + i]!);
      for (let t = rowStart[act]!; t < rowStart[act + 1]!; t++) m += rate[t]! * Math.abs(P[col[t]! * k + i]!);
      mag += m * p;
      p *= len;
    }
    for (let i = 0; i < k; i++) q[o + i] *= sense;
    slack[a] = sl + gamma(2 * (rowStart[act + 1]! - rowStart[act]!) + 2 * k + 4) * mag * (1 + 1e-12);
  }
  let best = 0;
  if (nA > 1) {
    // Candidate: the largest sensed proxy value at len/2; then prove it against every other action.
    let bv = -Infinity;
    for (let a = 0; a < nA; a++) {
      let v = 0;
      for (let i = k - 1; i >= 0; i--) v = v * 0.5 * len + q[a * k + i]!;
      if (v > bv) {
        bv = v;
        best = a;
      }
    }
    const d = w.diff;
    for (let a = 0; a < nA; a++) {
      if (a === best) continue;
      let crude = 0;
      let p = 1;
      for (let i = 0; i < k; i++) {
        d[i] = q[a * k + i]! - q[best * k + i]!;
        crude += Math.abs(d[i]!) * p;
        p *= len;
      }
      if (!(shifted(w.shiftBuf, d, k - 1, len, crude) + slack[a]! + slack[best]! <= 0)) return NaN;
    }
  }
  // The value: x + Σ R I_t − E I_s for action best, with its rounding bound.
  const act = a0 + best;
  let acc = 0;
  let mag = 0;
  let errI = 0;
  for (let t = rowStart[act]!; t < rowStart[act + 1]!; t++) {
    const u = col[t]!;
    acc += rate[t]! * w.proxyI[u]!;
    mag += rate[t]! * Math.abs(w.proxyI[u]!);
    errI += rate[t]! * w.proxyErr[u]!;
  }
  acc -= exitRate[act]! * w.proxyI[s]!;
  mag += exitRate[act]! * Math.abs(w.proxyI[s]!);
  errI += exitRate[act]! * w.proxyErr[s]!;
  const n = rowStart[act + 1]! - rowStart[act]!;
  // The final x + acc adds one rounding of a number in [−1, 2]: 2u.
  w.scratchRound = (gamma(2 * n + 4) * mag + errI + 2 ** -52) * (1 + 1e-9);
  if (nA > 1) w.dec[s] = act;
  return x[s]! + acc;
}

/** Upper bound of d (degree deg) on [0, len] from its Taylor shift about len/2 (see shiftedMax). */
function shifted(b: Float64Array, d: Float64Array, deg: number, len: number, crude: number): number {
  for (let i = 0; i <= deg; i++) b[i] = d[i]!;
  const c = 0.5 * len;
  for (let i = 0; i < deg; i++) for (let z = deg - 1; z >= i; z--) b[z] += c * b[z + 1]!;
  let acc = 0;
  for (let i = deg; i >= 1; i--) acc = (acc + (b[i]! < 0 ? -b[i]! : b[i]!)) * c;
  return b[0]! + acc + gamma(2 * deg + 2) * crude * (1 + 1e-12);
}
