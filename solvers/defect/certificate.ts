/**
 * The a-posteriori certificate of a dense solution: for any continuous-in-pieces polynomial f of the
 * time left, a rigorous bound on |f(T) − v(T)| from its Bellman defect r = f′ − B(f). The derivation
 * (comparison principle, one-sided versions, jumps) is in ./index.ts; nothing here depends on how f
 * was made, so the same function certifies the solver's own steps and any other dense solution.
 *
 * On a step of length h with f_s(τ) = Σ_{j≤K} c_j(s) τ^j: for an evolving state and each action a,
 * e_a = f_s′ − (Q_a f)_s; r_s = min_a e_a (max state) or max_a e_a (min state). A state that does not
 * evolve (no actions, or a goal state in mode `within`) has B = 0 there and r_s = f_s′. Every e is
 * enclosed in Bernstein form (./range.ts); per Bernstein index i, P_i is the largest upper and M_i the
 * largest negated lower enclosure over the states, so ∫ρ⁺ ≤ h·ΣP_i/(K+1) and ∫ρ⁻ ≤ h·ΣM_i/(K+1).
 * For r_s = min_a e_a any one action's upper enclosure bounds r_s from above; the one with the
 * smallest Σ max(hi_i, 0) is used (for the solver: its own decision). Likewise for min states below.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import { gamma, UNIT_ROUNDOFF } from '../piecewise/poly.js';
import { bernsteinEnclosure, bernsteinWeights } from './range.js';

export class StepDefect {
  readonly S: number;
  /** (Q_a c_j)_s at a·(K+1) + j, and its rounding bound. */
  readonly q: Float64Array;
  readonly qErr: Float64Array;
  private readonly g: number;
  private readonly wts: Float64Array;
  private readonly e: Float64Array;
  private readonly de: Float64Array;
  private readonly scratch: Float64Array;
  private readonly lo: Float64Array;
  private readonly hi: Float64Array;
  private readonly bestLo: Float64Array;
  private readonly bestHi: Float64Array;
  private readonly P: Float64Array;
  private readonly M: Float64Array;

  /**
   * `rangeAtEnds` is a planted bug for `selftest` only (variant:defect-ends): each e_a is "enclosed" by
   * its values at the step's two ends, which misses a defect that peaks inside the step.
   */
  constructor(readonly m: CompiledModel, readonly K: number, readonly frozen: Uint8Array, private readonly rangeAtEnds = false) {
    this.S = m.nStates;
    this.q = new Float64Array((K + 1) * m.nActions);
    this.qErr = new Float64Array((K + 1) * m.nActions);
    let d = 0;
    for (let a = 0; a < m.nActions; a++) d = Math.max(d, m.rowStart[a + 1]! - m.rowStart[a]!);
    this.g = gamma(2 * d + 2);
    this.wts = bernsteinWeights(K);
    const n = K + 1;
    [this.e, this.de, this.scratch, this.lo, this.hi, this.bestLo, this.bestHi, this.P, this.M] = Array.from({ length: 9 }, () => new Float64Array(n));
  }

  /** (Q_a c_j)_s for every action of every evolving state, with c_j(s) = C[j·S + s], and its rounding bound. */
  apply(C: Float64Array, j: number): void {
    const { m, S, q, qErr, K, g } = this;
    const off = j * S;
    for (let s = 0; s < S; s++) {
      if (this.frozen[s]) continue;
      const cs = C[off + s]!;
      for (let a = m.actionStart[s]!; a < m.actionStart[s + 1]!; a++) {
        let acc = 0;
        let abs = 0;
        for (let t = m.rowStart[a]!; t < m.rowStart[a + 1]!; t++) {
          const v = m.rate[t]! * C[off + m.col[t]!]!;
          acc += v;
          abs += Math.abs(v);
        }
        const ex = m.exitRate[a]! * cs;
        q[a * (K + 1) + j] = acc - ex;
        qErr[a * (K + 1) + j] = g * (abs + Math.abs(ex)) * (1 + 1e-12);
      }
    }
  }

  /** Encloses e = f_s′ − (Q_a f)_s (a < 0: f_s′ alone) in Bernstein form into lo, hi. */
  private enclose(C: Float64Array, s: number, a: number, h: number): void {
    const { S, K, q, qErr, e, de } = this;
    for (let j = 0; j <= K; j++) {
      const fd = j < K ? (j + 1) * C[(j + 1) * S + s]! : 0;
      const qa = a < 0 ? 0 : q[a * (K + 1) + j]!;
      const v = fd - qa;
      e[j] = v;
      de[j] = (a < 0 ? 0 : qErr[a * (K + 1) + j]!) + UNIT_ROUNDOFF * (Math.abs(fd) + Math.abs(v));
    }
    if (this.rangeAtEnds) return this.atEnds(h);
    bernsteinEnclosure(e, de, K, h, this.wts, this.scratch, this.lo, this.hi);
  }

  /** The planted bug (see the constructor): lo, hi from e(0) and e(h) alone. */
  private atEnds(h: number): void {
    const { e, K } = this;
    let end = e[K]!;
    for (let j = K - 1; j >= 0; j--) end = end * h + e[j]!;
    this.lo.fill(Math.min(e[0]!, end));
    this.hi.fill(Math.max(e[0]!, end));
  }

  private take(plus: boolean, minus: boolean, lo: Float64Array, hi: Float64Array): void {
    for (let i = 0; i <= this.K; i++) {
      if (plus && hi[i]! > this.P[i]!) this.P[i] = hi[i]!;
      if (minus && -lo[i]! > this.M[i]!) this.M[i] = -lo[i]!;
    }
  }

  /**
   * Bounds on the mean of ρ⁺ and ρ⁻ over a step of length h (the integrals are h times these), for
   * the coefficients C of every order (apply() must have run for j = 0 … K). `dec[s]`, when given, is
   * the action whose enclosure bounds r_s on the owner's side.
   */
  rates(C: Float64Array, h: number, dec?: Int32Array): { plus: number; minus: number } {
    const { m, S, K, lo, hi, bestLo, bestHi } = this;
    this.P.fill(0);
    this.M.fill(0);
    const pos = (x: Float64Array, sign: number): number => {
      let acc = 0;
      for (let i = 0; i <= K; i++) {
        const v = sign * x[i]!;
        if (v > 0) acc += v;
      }
      return acc;
    };
    for (let s = 0; s < S; s++) {
      const a0 = m.actionStart[s]!;
      const a1 = m.actionStart[s + 1]!;
      if (this.frozen[s] || a1 === a0) {
        this.enclose(C, s, -1, h);
        this.take(true, true, lo, hi);
        continue;
      }
      const maxOwner = m.owner[s]! >= 0;
      const own = dec && dec[s]! >= 0 ? dec[s]! : -1;
      let bestScore = Infinity;
      for (let a = a0; a < a1; a++) {
        this.enclose(C, s, a, h);
        // The owner's side takes one action's enclosure; the other side takes every action's.
        this.take(!maxOwner, maxOwner, lo, hi);
        const score = own >= 0 ? (a === own ? 0 : Infinity) : pos(maxOwner ? hi : lo, maxOwner ? 1 : -1);
        if (score < bestScore) {
          bestScore = score;
          bestLo.set(lo);
          bestHi.set(hi);
        }
      }
      this.take(maxOwner, !maxOwner, bestLo, bestHi);
    }
    let plus = 0;
    let minus = 0;
    for (let i = 0; i <= K; i++) {
      plus += this.P[i]!;
      minus += this.M[i]!;
    }
    // The factor covers the rounding of these sums of non-negative terms.
    return { plus: (plus / (K + 1)) * (1 + 1e-12), minus: (minus / (K + 1)) * (1 + 1e-12) };
  }
}

/**
 * f(h) of a step into out, by Horner's rule; returns the largest rounding bound γ_{2K+1}·Σ|c_j|h^j
 * (Higham 2002, §5.1). States marked in `frozen` keep c_0 exactly.
 */
export function evaluateEnd(C: Float64Array, S: number, K: number, h: number, out: Float64Array, frozen?: Uint8Array): number {
  const gH = gamma(2 * K + 1);
  let err = 0;
  for (let s = 0; s < S; s++) {
    if (frozen?.[s]) {
      out[s] = C[s]!;
      continue;
    }
    let v = C[K * S + s]!;
    let abs = Math.abs(v);
    for (let j = K - 1; j >= 0; j--) {
      v = v * h + C[j * S + s]!;
      abs = abs * h + Math.abs(C[j * S + s]!);
    }
    out[s] = v;
    err = Math.max(err, gH * abs * (1 + 1e-12));
  }
  return err;
}

/** One step of a dense solution: f_s(t_i + τ) = Σ_j coef[j·S + s] τ^j on [0, h]. */
export interface DenseStep {
  readonly h: number;
  readonly coef: Float64Array;
}

export interface Certificate {
  /** f(T), computed (its rounding is part of the bounds). */
  readonly values: Float64Array;
  /** f(T) − v(T) ≤ lowerDev and v(T) − f(T) ≤ upperDev in every state. */
  readonly lowerDev: number;
  readonly upperDev: number;
  readonly errorBound: number;
}

/**
 * Certifies a dense solution step by step (time left from 0, in the model's time unit), so that a
 * long solution need not be held in memory: add() each step in order, then finish(). The steps'
 * lengths should sum to T — the end of the last step is taken as T, and a difference is charged as
 * λ·|T − Σh|, since |v′| ≤ λ. Every step has polynomials of degree K.
 */
export class Certifier {
  private readonly S: number;
  private readonly sd: StepDefect;
  private readonly lambda: number;
  private prev: Float64Array;
  private prevErr = 0;
  private plus = 0;
  private minus = 0;
  private jumpUp = 0;
  private jumpDown = 0;
  private total = 0;
  private readonly still: Uint8Array;
  private spare: Float64Array;
  /** Steps added so far. */
  steps = 0;

  constructor(private readonly m: CompiledModel, private readonly K: number) {
    const S = (this.S = m.nStates);
    const frozen = new Uint8Array(S);
    let lambda = 0;
    for (let s = 0; s < S; s++) {
      if (m.actionStart[s + 1] === m.actionStart[s] || (m.goalMode === 'within' && m.goal[s])) frozen[s] = 1;
      else for (let a = m.actionStart[s]!; a < m.actionStart[s + 1]!; a++) lambda = Math.max(lambda, m.exitRate[a]!);
    }
    this.lambda = lambda;
    this.sd = new StepDefect(m, K, frozen);
    this.prev = new Float64Array(S);
    for (let s = 0; s < S; s++) this.prev[s] = m.goal[s]!;
    this.still = new Uint8Array(S);
    this.spare = new Float64Array(S);
  }

  add(st: DenseStep): void {
    const { S, K, sd } = this;
    // Jump from the previous end (or v(0)) to this start, with the previous evaluation's rounding.
    let up = 0;
    let down = 0;
    for (let s = 0; s < S; s++) {
      const d = st.coef[s]! - this.prev[s]!;
      up = Math.max(up, d);
      down = Math.max(down, -d);
    }
    this.jumpUp += (up + this.prevErr) * (1 + 1e-12);
    this.jumpDown += (down + this.prevErr) * (1 + 1e-12);
    for (let j = 0; j <= K; j++) sd.apply(st.coef, j);
    const r = sd.rates(st.coef, st.h);
    this.plus += st.h * r.plus;
    this.minus += st.h * r.minus;
    // A state whose higher coefficients are all 0 is constant on the step: its end is c_0, exactly.
    const still = this.still;
    for (let s = 0; s < S; s++) {
      let c = 1;
      for (let j = 1; j <= K && c; j++) if (st.coef[j * S + s] !== 0) c = 0;
      still[s] = c;
    }
    const next = this.spare;
    this.prevErr = evaluateEnd(st.coef, S, K, st.h, next, still);
    this.spare = this.prev;
    this.prev = next;
    this.total += st.h;
    this.steps++;
  }

  finish(): Certificate {
    const timeGap = this.lambda * Math.abs(this.m.timeBound - this.total) * (1 + 1e-12);
    const lowerDev = (this.plus + this.jumpUp + this.prevErr + timeGap) * (1 + 1e-9);
    const upperDev = (this.minus + this.jumpDown + this.prevErr + timeGap) * (1 + 1e-9);
    return { values: this.prev, lowerDev, upperDev, errorBound: Math.max(lowerDev, upperDev) };
  }
}

/** Certifies the dense solution given by `steps` at once (see Certifier). */
export function certify(m: CompiledModel, steps: readonly DenseStep[], K: number): Certificate {
  const c = new Certifier(m, K);
  for (const st of steps) c.add(st);
  return c.finish();
}
