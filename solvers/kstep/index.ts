/**
 * `kstep`: the k-step interval scheme for time-bounded reachability in CTMCs, CTMDPs and CTMGs.
 *
 * Method: time left runs from 0 to T in intervals of length ε (the last one may be shorter). On each
 * interval the Bellman right-hand side B is replaced k times by its value on the previous Picard
 * level: f⁰ ≡ x, f^j = x + ∫ B(f^{j−1}), where B takes the pointwise max/min over actions of
 * polynomials, so f^j is a continuous piecewise polynomial of degree j (./interval.ts,
 * ../piecewise/). x for the next interval is f^k(ε). The idea of k-step approximation per interval,
 * with O(ε^{k+1}) error per interval and O((T/π)^{1/k}) intervals for precision π, is from memory:
 * Fearnley, Rabe, Schewe & Zhang, "Efficient approximation of optimal control for continuous-time
 * Markov games" (FSTTCS 2011; Information and Computation 2016). The error bound used here is derived
 * in ./bound.ts: per interval (2λε)^{k+1}/(2·(k+1)!), summed over intervals, plus a rounding allowance;
 * or, where smaller, the a-posteriori bound e^{2λε}·2λ∫‖f^k − f^{k−1}‖ of ./aposteriori.ts, from
 * which the interval lengths adapt (an interval is accepted when the truncation spent so far is within
 * the budget's share of the time covered; the a-priori length always is). At level k, a state whose
 * successors are piecewise but whose choice is proved fixed takes its value from integrals
 * (./shortcut.ts).
 *
 * Guarantee: |values_s − v_s(T)| ≤ errorBound ≤ precision in every state s.
 * Refuses: k not an integer in 1 … 8, precision not in (0, ∞), a choice state without an owner, more
 * than `maxIntervals` intervals (default 10^7) or more than ~4·10^10 transition-coefficient updates,
 * a rounding allowance above ~0.6 of the precision, or a piece count that halving the interval
 * ten times does not bring under the cap.
 * Scheduler: per interval and owned state, the action chosen at level k; where that choice changes
 * inside the interval (the level-k envelope has breakpoints), the switch is placed at the breakpoint,
 * not at the interval's end. In elapsed time: time left t0 + τ is elapsed T − t0 − τ.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import type { Outcome, RefusalCode } from '../../corpus/format/result.js';
import type { Scheduler, Segment } from '../../corpus/format/scheduler.js';
import { aposterioriBound } from './aposteriori.js';
import { chooseEpsilon, inputBound, localBound, roundingBound, singleCoefNorm } from './bound.js';
import { scaleTime } from '../shared/scale.js';
import { makeWork, runInterval, type KstepWork } from './interval.js';
import { emitPieces, type DenseSink } from '../shared/dense.js';

export interface KstepOptions {
  readonly precision: number;
  readonly k: number;
  /** Largest number of pieces one state may carry in an interval before it is halved (default 32). */
  readonly pieceCap?: number;
  readonly maxIntervals?: number;
  /** Use exactly this many equal intervals instead of choosing ε from the precision (for studies
   *  of convergence); the bound is still reported, and the result refused if it exceeds precision. */
  readonly intervals?: number;
  /** Receives the level-k functions of every interval, for an a-posteriori certificate (../shared/dense.ts). */
  readonly dense?: DenseSink;
  /** Lengths adapted interval by interval from the a-posteriori bound (default true; ignored, i.e.
   *  false, when `intervals` is given). With false, every interval has the a-priori length ε₀. */
  readonly adaptive?: boolean;
  /** Planted bug for `selftest` (variant:loose-tie) only: a tie tolerance the bound does not pay for. */
  readonly looseTie?: number;
}

const refuse = (reason: string, code: RefusalCode): Outcome => ({ kind: 'refused', method: 'kstep', reason, code });

export function solveKstep(model: CompiledModel, opts: KstepOptions): Outcome {
  const started = performance.now();
  const { precision, k } = opts;
  let m = model;
  let T = m.timeBound;
  const S = m.nStates;
  // --- special cases -------------------------------------------------------------------------
  if (!Number.isInteger(k) || k < 1 || k > 8) return refuse(`k must be an integer from 1 to 8, got ${k}`, 'invalid-input');
  if (!(precision > 0) || !Number.isFinite(precision)) return refuse(`precision must be a finite number > 0, got ${precision}`, 'invalid-input');
  if (!(T > 0) || !Number.isFinite(T)) return refuse(`time bound must be finite and > 0, got ${T}`, 'invalid-input');
  for (let s = 0; s < S; s++)
    if (m.actionStart[s + 1]! - m.actionStart[s]! >= 2 && m.owner[s] === 0) return refuse(`state '${m.stateNames[s]}' has a choice and no owner`, 'invalid-input');
  const within = m.goalMode === 'within';
  const x0 = new Float64Array(S);
  const active = new Uint8Array(S);
  let lambda = 0;
  let rowLen = 1;
  for (let s = 0; s < S; s++) {
    x0[s] = m.goal[s] ? 1 : 0;
    if (within && m.goal[s]) continue;
    for (let a = m.actionStart[s]!; a < m.actionStart[s + 1]!; a++) {
      if (m.exitRate[a]! > 0) active[s] = 1;
      lambda = Math.max(lambda, m.exitRate[a]!);
      rowLen = Math.max(rowLen, m.rowStart[a + 1]! - m.rowStart[a]! + 1);
    }
  }
  const params = { k, precision };
  const scheduler = (): Scheduler => ({ choices: constantChoices(m) });
  if (lambda === 0) {
    const stats = { intervals: 0, maxPieces: 1, seconds: (performance.now() - started) / 1000, lambda: 0 };
    return { kind: 'solved', method: 'kstep', params, values: x0, errorBound: 0, scheduler: scheduler(), stats };
  }
  // --- time in units of about 1/λ (exact: a power of two), so powers of λε cannot over/underflow ---
  const frozen = new Uint8Array(S);
  if (within) for (let s = 0; s < S; s++) frozen[s] = m.goal[s]!;
  const scaled = scaleTime(m, lambda, frozen);
  if ('refused' in scaled) return refuse(scaled.refused, 'out-of-scope');
  const unit = scaled.c; // original time = scaled time · c
  m = scaled.m;
  T = m.timeBound;
  lambda *= unit;
  // --- interval length from the bound ----------------------------------------------------------
  if (opts.intervals !== undefined && !(Number.isInteger(opts.intervals) && opts.intervals >= 1))
    return refuse(`intervals must be an integer ≥ 1, got ${opts.intervals}`, 'invalid-input');
  // Truncation gets 0.9 of the precision, less when the rounding allowance (estimated with
  // C = e^{2λε}, see ./bound.ts) needs more than the remaining tenth; refuse when it needs half.
  const maxIntervals = opts.maxIntervals ?? 1e7;
  let budget = 0.9 * precision;
  let eps = 0;
  let N = 0;
  for (let it = 0; ; it++) {
    eps = opts.intervals ? T / opts.intervals : chooseEpsilon(lambda, T, k, budget);
    N = opts.intervals ?? Math.ceil(T / eps);
    if (!(N <= maxIntervals)) break;
    const roundEstimate = N * roundingBound(lambda, eps, k, rowLen, singleCoefNorm(lambda, eps, k, rowLen)) + inputBound(lambda * T);
    if (opts.intervals || roundEstimate + budget <= 0.99 * precision) break;
    budget = 0.99 * precision - 1.5 * roundEstimate;
    if (it >= 3 || budget < 0.4 * precision)
      return refuse(`precision ${precision} is too close to the rounding of ${N} intervals in double precision (about ${roundEstimate.toExponential(2)})`, 'precision-floor');
  }
  const work = N * (m.nTransitions + m.nStates) * k;
  if (!(N <= maxIntervals) || work > 4e10)
    return refuse(`precision ${precision} with k = ${k} needs ${N} intervals (λT = ${lambda * T}); the limit is ${maxIntervals} intervals and 4e10 updates`, 'work-cap');

  // --- the intervals -------------------------------------------------------------------------
  // Each interval's truncation term is min(L, A): the a-priori bound (L) of ./bound.ts or the
  // a-posteriori bound (A) of ./aposteriori.ts, both valid beside the rounding term ρ. With fixed
  // lengths (option `intervals`, or `adaptive: false`) the lengths are T/N. Otherwise lengths adapt:
  // an interval [t0, t1] is accepted when the truncation spent so far stays within budget·t1/T;
  // one of length ≤ ε₀ (the a-priori length) always is, since then L ≤ budget·len/T. A rejected one
  // is run again shorter (never below ε₀); the next length aims A at 0.8·budget·len/T.
  const w = makeWork(m, k, active, x0, opts.pieceCap ?? 32, opts.looseTie ?? 0);
  if (opts.dense) {
    w.levelK = { coef: new Float64Array((k + 1) * S), pieces: new Map() };
    opts.dense.begin(m, k, scaled.flushBound);
  }
  let x = Float64Array.from(x0);
  let next = new Float64Array(S);
  let trunc = 0;
  let round = 0;
  let intervals = 0;
  let halvings = 0;
  let rejected = 0;
  let maxPieces = 1;
  let tieLoss = 0;
  let aposteriori = 0;
  const rec = new ChoiceRecorder(m, T, unit);
  /** Runs [t0, t0 + len]; the truncation term, or NaN when the piece cap is exceeded. */
  const attempt = (len: number): number => {
    w.coefNorm = 1;
    w.tieLoss = 0;
    w.maxPieces = 1;
    w.pieceDec.clear();
    if (!runInterval(w, x, len, next)) return NaN;
    const C = Math.max(w.coefNorm, singleCoefNorm(lambda, len, k, rowLen));
    rho = roundingBound(lambda, len, k, rowLen, C, w.maxPieces, w.tieLoss) + w.shortcutRound;
    // States that took the shortcut (./shortcut.ts) add the rounding δ_{k−1} ≤ ρ/2 to their D.
    const A = aposterioriBound(w, lambda, len) + (w.shortcutStates > 0 ? Math.exp(2 * lambda * len) * 2 * lambda * len * rho : 0);
    const L = localBound(lambda, len, k);
    return Math.min(A, L);
  };
  let rho = 0;
  const commit = (t0: number, len: number, b: number): void => {
    trunc += b;
    if (b < localBound(lambda, len, k)) aposteriori++;
    round += rho;
    maxPieces = Math.max(maxPieces, w.maxPieces);
    tieLoss += w.tieLoss;
    intervals++;
    rec.record(w, t0);
    if (opts.dense) emitPieces(opts.dense, len, w.levelK!.coef, w.levelK!.pieces, k);
    const tmp = x;
    x = next;
    next = tmp;
  };
  const capped = (len: number): string => `more than ${w.pieceCap} pieces in one state even on an interval of length ${len * unit}`;
  // The planted bug looseTie runs on the a-priori lengths by default: its unpaid loss per interval
  // is what selftest must catch, and adaptive lengths (fewer intervals) would only hide it less often.
  const adaptive = opts.intervals === undefined && (opts.adaptive ?? !(opts.looseTie !== undefined && opts.looseTie > 0));
  if (!adaptive) {
    const span = (t0: number, t1: number, depth: number): string | undefined => {
      const len = t1 - t0;
      const b = attempt(len);
      if (b === b) {
        commit(t0, len, b);
        return undefined;
      }
      if (depth >= 10) return capped(len);
      halvings++;
      const mid = t0 + 0.5 * len;
      return span(t0, mid, depth + 1) ?? span(mid, t1, depth + 1);
    };
    for (let i = 0; i < N; i++) {
      const t0 = i * eps;
      const t1 = i + 1 === N ? T : Math.min(T, (i + 1) * eps);
      if (!(t1 > t0)) continue;
      const why = span(t0, t1, 0);
      if (why) return refuse(why, 'work-cap');
    }
  } else {
    const rate = budget / T;
    const eps0 = eps;
    const epsMax = Math.max(eps0, 1 / lambda);
    const floor = eps0 * 2 ** -10;
    let t0 = 0;
    let len = eps0;
    let attempts = 0;
    while (t0 < T) {
      if (++attempts > 2048 * N + 1000) return refuse(`more than ${attempts} interval attempts (piece cap and halvings)`, 'work-cap');
      // The last interval ends exactly at T; rather than leave a sliver, the rest is cut in halves.
      const rest = T - t0;
      const l = rest <= len ? rest : rest < 1.5 * len ? 0.5 * rest : len;
      const b = attempt(l);
      if (b !== b) {
        halvings++;
        if (0.5 * l < floor) return refuse(capped(l), 'work-cap');
        len = 0.5 * l;
        continue;
      }
      const t1 = l === rest ? T : t0 + l;
      const allowed = rate * t1;
      const aim = b > 0 ? Math.pow((0.8 * rate * l) / b, 1 / k) : 4;
      if (l > eps0 && trunc + b > allowed) {
        rejected++;
        len = Math.max(eps0, l * Math.min(0.9, aim));
        continue;
      }
      commit(t0, l, b);
      t0 = t1;
      len = Math.min(epsMax, Math.max(eps0, l * Math.min(2, Math.max(0.5, aim))));
    }
  }
  // Summing the bounds in floating point: a relative margin of 1e-9 covers its rounding.
  const errorBound = (trunc + round + inputBound(lambda * T) + scaled.flushBound) * (1 + 1e-9);
  if (!Number.isFinite(errorBound)) return refuse(`the error bound is not finite (${errorBound})`, 'precision-floor');
  if (errorBound > precision) return refuse(`the bound reached ${errorBound}, above the precision ${precision}`, 'precision-floor');
  const stats = {
    intervals, maxPieces, seconds: (performance.now() - started) / 1000, lambda: lambda / unit, epsilon: eps * unit,
    truncationBound: trunc, roundingBound: round, tieLoss, slowStateLevels: w.slowStates, dirtyStateLevels: w.dirtyStates, halvings,
    rejected, aposterioriIntervals: aposteriori, shortcutStateLevels: w.shortcuts, skippedActionLevels: w.skippedRows,
  };
  return { kind: 'solved', method: 'kstep', params, values: x, errorBound, scheduler: { choices: rec.finish() }, stats };
}

/** Every owned state takes its first action throughout. */
function constantChoices(m: CompiledModel): Record<string, Segment[]> {
  const out: Record<string, Segment[]> = {};
  for (let s = 0; s < m.nStates; s++) if (m.owner[s] !== 0) out[m.stateNames[s]!] = [{ from: 0, action: m.actionNames[m.actionStart[s]!]! }];
  return out;
}

/** Collects level-k decisions interval by interval (time left increasing = elapsed decreasing). */
class ChoiceRecorder {
  private readonly cur: Int32Array;
  private readonly segs = new Map<number, Segment[]>();
  private readonly owned: Int32Array;
  /** T and times in scaled units; `unit` converts them back (elapsed time = (T − t)·unit). */
  constructor(private readonly m: CompiledModel, private readonly T: number, private readonly unit: number) {
    this.cur = new Int32Array(m.nStates).fill(-1);
    const owned: number[] = [];
    for (let s = 0; s < m.nStates; s++) if (m.owner[s] !== 0) owned.push(s);
    this.owned = Int32Array.from(owned);
  }
  record(w: KstepWork, t0: number): void {
    const inside = w.pieceDec.size > 0;
    for (const s of this.owned) {
      // The decision changes inside the interval: switch at the envelope's breakpoints.
      const pieces = inside ? w.pieceDec.get(s) : undefined;
      if (pieces) for (let i = 0; i < pieces.tau.length; i++) this.step(s, pieces.action[i]!, t0 + pieces.tau[i]!);
      else if (w.dec[s] !== this.cur[s]) this.step(s, w.dec[s]!, t0);
    }
  }
  /** From time left `t` on, state s takes global action d (the earlier action holds below t). */
  private step(s: number, d: number, t: number): void {
    if (d < 0) return;
    const c = this.cur[s]!;
    if (c >= 0 && c !== d) {
      let list = this.segs.get(s);
      if (!list) this.segs.set(s, (list = []));
      list.push({ from: (this.T - t) * this.unit, action: this.m.actionNames[c]! });
    }
    this.cur[s] = d;
  }
  finish(): Record<string, Segment[]> {
    const out = constantChoices(this.m);
    for (const s of this.owned) {
      const c = this.cur[s]!;
      if (c < 0) continue;
      const list = this.segs.get(s) ?? [];
      list.push({ from: 0, action: this.m.actionNames[c]! });
      out[this.m.stateNames[s]!] = list.reverse();
    }
    return out;
  }
}
