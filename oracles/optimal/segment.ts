/**
 * One segment of constant decisions d, from time left t0 until the first switch or T, in exact
 * fixed-point arithmetic (values X/2^P, ../fixed/numbers.ts; rates exact integers over 10^E).
 *
 * On the segment v(t0 + τ) = exp(Q_d τ) v(t0). The segment is cut into G equal cells of length
 * h = (T − t0)/G, G a power of two (so h is a finite decimal) with ν_d·h ≤ 4 (ν_d = 2·max exit rate
 * of the chosen actions ≥ ‖Q_d‖∞). On a cell starting at ṽ the Taylor terms ũ_k ≈ (hQ_d)^k ṽ/k!
 * (exact integer products, one truncation per entry and term) give v(· + σh) ≈ Σ_{k≤K} ũ_k σ^k,
 * σ ∈ [0, 1], with the rigorous bound of ../fixed/taylorSteps.ts (tail θ^{K+1}/(K+1)!/(1 − θ/(K+2)),
 * rounding Σ D_k); Horner's rule at a point σ̃ = S/2^P adds at most K + 1 units 2^−P. The exact flow
 * is non-expansive (a stochastic matrix), so the errors of the cells add.
 *
 * The same terms give every advantage of a non-chosen action as a polynomial on the cell,
 * P(σ) = sign·(q_a − q_{d(s)})·Σ ũ_k σ^k / ν. It is certified ≤ tol on the whole cell exactly, in
 * integers, when c_0 + Σ_{k≥1} max(c_k, 0) ≤ tol (σ^k ∈ [0, 1]); otherwise `firstExceedFixed` searches
 * it (its coefficients truncated to 2^−P) for the first point where it exceeds tol: the next switching
 * time. The switch is placed at σ̃ = S/2^P ≥ that point, and the exact time t0 + h(j + σ̃) is
 * rounded to td significant digits, chosen so that σ moves by at most wMin/8: the value moves by at
 * most ν_d·|Δt| through that rounding (added to the bound), and the switch lies within 1.25·wMin of
 * the crossing, which multiplies the switching loss w(tol + L·w) by at most 1.25².
 * The Bellman condition is re-checked directly on each cell's start and midpoint values
 * (stats.bellmanViolation, normalised by ν).
 */
import type { Dec, DecCtor, DecModel } from '../common/decModel.js';
import { sameRow } from '../common/decModel.js';
import { intGenerator, intMatVec, rowDot, type IntRow } from '../fixed/generator.js';
import { dyadicOf, rationalOf, pow10, toDoubleScaled } from '../fixed/numbers.js';
import { roundingPerStep, taylorTail } from '../fixed/taylorSteps.js';
import { firstExceedFixed, floorFixed } from './advantage.js';

export interface SegmentResult {
  readonly tEnd: Dec;
  readonly x: bigint[];
  readonly switched: boolean;
  readonly cells: number;
  /** Truncation, rounding and time-rounding bound of the values over this segment. */
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
  /** Bits after the binary point. */
  readonly P: number;
  /** Common decimal exponent of the rates (rates = integers / 10^E). */
  readonly E: number;
  readonly rows: readonly (readonly IntRow[])[];
  /** Decimal constructor of the times t0 and T, precise enough that R = T − t0, R/G and t0 + h·σ̃ are exact. */
  readonly DT: DecCtor;
}

export class TooManyCells extends Error {}
/** An internal inconsistency: the oracle refuses. */
export class Inconsistent extends Error {}

/** `prior` bounds the error of x0 (for the ‖ṽ‖ ≤ 1 + error factor of the Taylor tail). */
export function runSegment(
  dm: DecModel, x0: readonly bigint[], d: Int32Array, t0: Dec, T: Dec, o: SegmentOptions, prior = 0,
): SegmentResult {
  const { n } = dm;
  const { P, E, rows } = o;
  const g = intGenerator(dm, d, E);
  const nuD = 2 * g.maxExit;
  const pairs: { s: number; a: number; sign: bigint }[] = [];
  for (let s = 0; s < n; s++) {
    if (dm.sign[s] === 0) continue;
    const acts = dm.actions[s]!;
    for (let a = 0; a < acts.length; a++) {
      if (a !== d[s] && !sameRow(acts[a]!, acts[d[s]!]!)) pairs.push({ s, a, sign: dm.sign[s]! > 0 ? 1n : -1n });
    }
  }
  // An advantage numerator N is at scale 10^E·2^P·ν: adv = N / (10^E 2^P ν).
  const adv = (p: { s: number; a: number; sign: bigint }, V: readonly bigint[]): bigint =>
    p.sign * (rowDot(rows[p.s]![p.a]!, p.s, V) - rowDot(rows[p.s]![d[p.s]!]!, p.s, V));
  // Advantage numerators to binary fixed point at 2^P: N/(10^E·ν) with ν = νM·2^−νK exactly.
  const { m: nuM, k: nuK } = dyadicOf(o.nu);
  const den10 = pow10(E) * nuM;
  const toBinary = nuK >= 0
    ? (N: bigint): bigint => (N << BigInt(nuK)) / den10
    : (N: bigint): bigint => N / (den10 << BigInt(-nuK));
  const advDouble = (N: bigint): number => {
    const B = toBinary(N);
    return (B < 0n ? -1 : 1) * toDoubleScaled(B < 0n ? -B : B, P);
  };
  const tolInt = floorFixed(o.tol, P);
  let violation = 0;
  const check = (V: readonly bigint[]): void => {
    for (const p of pairs) violation = Math.max(violation, advDouble(adv(p, V)));
  };
  const R = T.minus(t0);
  const Rn = R.toNumber();
  // Special case: nothing moves under d, so every advantage stays constant (≤ tol by the decision).
  if (!(nuD * Rn > 0)) {
    check(x0);
    return { tEnd: T, x: [...x0], switched: false, cells: 0, bound: 0, lost: 0, violation };
  }
  let G = 32;
  while (G < (nuD * Rn) / 4) G *= 2;
  if (G > o.maxCells) throw new TooManyCells(`needs ${G} grid cells for ν·(T − t) = ${(nuD * Rn).toPrecision(3)}`);
  const theta = ((nuD * Rn) / G) * (1 + 1e-12);
  let K = Math.max(1, Math.ceil(2 * theta));
  while (taylorTail(theta, K) > 2 ** -P && K < 2000) K++;
  const cellRound = roundingPerStep(theta, K, P);
  const tail = taylorTail(theta, K);
  const ulp = 2 ** -P;
  // h = R/G exactly: R = m_R/10^{e_R}, so A ũ/k = (m_R / (10^{e_R+E}·G·k))·(Q_int ũ).
  const Rr = rationalOf(R);
  const dens = Array.from({ length: K + 1 }, (_, k) => pow10(Rr.e + E) * BigInt(G) * BigInt(Math.max(k, 1)));
  const h = R.div(G);
  const hn = h.toNumber();
  const DT = o.DT;
  const twoP = new DT(2).pow(P);
  // Digits of a switching time: its rounding moves σ by at most wMin/8 (|Δt| ≤ 10^{1−td}·T/2).
  const td = Math.ceil(2 + Math.log10((8 * T.toNumber()) / (hn * o.wMin)));
  const terms: bigint[][] = Array.from({ length: K + 1 }, () => new Array<bigint>(n).fill(0n));
  const horner = (S: bigint): bigint[] => {
    const out: bigint[] = new Array(n);
    for (let s = 0; s < n; s++) {
      let acc = terms[K]![s]!;
      for (let k = K - 1; k >= 0; k--) acc = ((acc * S) >> BigInt(P)) + terms[k]![s]!;
      out[s] = acc;
    }
    return out;
  };
  let V: bigint[] = [...x0];
  let bound = 0;
  let lost = 0;
  for (let j = 0; j < G; j++) {
    for (let s = 0; s < n; s++) terms[0]![s] = V[s]!;
    for (let k = 1; k <= K; k++) {
      const W = terms[k]!;
      intMatVec(g, terms[k - 1]!, W);
      for (const i of g.moving) W[i] = (W[i]! * Rr.m) / dens[k]!;
    }
    let first: bigint | undefined;
    let switchLoss = 0;
    for (const p of pairs) {
      const N = terms.map((t) => adv(p, t));
      let sup = N[0]!;
      for (let k = 1; k <= K; k++) if (N[k]! > 0n) sup += N[k]!;
      if (toBinary(sup) + 1n <= tolInt) continue;
      const r = firstExceedFixed(N.map(toBinary), P, o.tol, o.wMin);
      lost += r.unresolved * o.nu * hn;
      if (r.at !== undefined && (first === undefined || r.at < first)) first = r.at;
      if (r.at !== undefined) switchLoss += r.switchLoss;
    }
    bound += (cellRound + tail * (1 + prior + bound)) * (1 + 1e-9);
    check(V);
    const halfS = 1n << BigInt(P - 1);
    if (first !== undefined) {
      // σ̃ = S/2^P is the located point; the switching time is rounded to td digits.
      const S = first;
      const exactEnd = t0.plus(h.times(new DT(j).plus(new DT(S.toString()).div(twoP))));
      const tEnd = exactEnd.toSignificantDigits(td);
      const dt = Math.abs(tEnd.minus(exactEnd).toNumber()) * (1 + 1e-9);
      const dSigma = ulp + dt / hn;
      if (dSigma > o.wMin / 4) {
        throw new Inconsistent(`internal: the switching time moved by ${dSigma.toExponential(2)} cells when rounded`);
      }
      check(horner(S / 2n));
      // Switching within wMin + dSigma ≤ 1.25·wMin of the crossing: w(tol + L·w) grows by at most 1.25².
      lost += o.nu * hn * switchLoss * 1.5625;
      bound += (K + 1) * ulp + nuD * dt;
      return { tEnd, x: horner(S), switched: true, cells: j + 1, bound, lost, violation };
    }
    check(horner(halfS));
    V = new Array(n);
    for (let s = 0; s < n; s++) {
      let acc = 0n;
      for (let k = 0; k <= K; k++) acc += terms[k]![s]!;
      V[s] = acc;
    }
  }
  return { tEnd: T, x: V, switched: false, cells: G, bound, lost, violation };
}
