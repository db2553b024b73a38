/**
 * `defect`: a dense solution of the Bellman equations, certified a posteriori by its defect.
 *
 * Method. With t the time left, the value solves v′ = B(v), B(y)_s = opt_a (Q_a y)_s, v(0) = 1_G (goal
 * states frozen at 1 in mode `within`). On each step [t_i, t_i + h] the decisions d are held fixed,
 * chosen at the step's start by comparing (Q_a x)_s and, on exact ties, (Q_a c_1)_s; f is then the
 * Taylor polynomial of degree K of the linear system y′ = Q_d y from the computed start x:
 * c_0 = x, c_{j+1} = (Q_d c_j)/(j+1) (a dense solution in the sense of W. H. Enright, "A new error
 * control for initial value solvers", Applied Mathematics and Computation 31, 1989, from memory).
 * Nothing below depends on how f was made: f is the piecewise polynomial with the stored doubles as
 * coefficients, exactly.
 *
 * Certificate (our derivation; the comparison principle for quasi-monotone systems, W. Walter,
 * "Differential and Integral Inequalities", 1970, from memory). Let r(t) = f′(t) − B(f(t)) be the
 * defect, z = f − v and U(t) = max_s z_s(t). At a state s attaining U, for every action a,
 * (Q_a f − Q_a v)_s = Σ R(s,a,s′)(z_{s′} − z_s) ≤ 0, and opt_a X_a − opt_a Y_a ≤ max_a (X_a − Y_a) for
 * both max and min, so z_s′ = r_s + B(f)_s − B(v)_s ≤ r_s. Hence the upper Dini derivative of U is at
 * most ρ⁺(t) = max_s max(r_s, 0), and likewise that of max_s(v_s − f_s) at most ρ⁻(t) = max_s max(−r_s, 0).
 * With f(0) = v(0) and jumps J at the step boundaries (the new start rounded from the old polynomial),
 *     f(T) − v(T) ≤ ∫ρ⁺ + J,    v(T) − f(T) ≤ ∫ρ⁻ + J,    |f(T) − v(T)| ≤ max(∫ρ⁺, ∫ρ⁻) + J,
 * for both players and both goal modes (a frozen goal state has f_s = v_s = 1 and r_s = 0). Clamping a
 * start value into [0, 1] moves it towards [0, 1] ∋ v_s and costs nothing.
 * Bounding r on a step: with e_a(τ) = f_s′(τ) − (Q_a f(τ))_s, a polynomial of degree K per action,
 * r_s = min_a e_a for a max state and max_a e_a for a min state. So for a max state r_s ≤ e_d and
 * r_s ≥ min_a e_a; for a min state r_s ≥ e_d and r_s ≤ max_a e_a. For the chosen action e_d is the
 * Taylor remainder −(Q_d c_K)_s τ^K (plus rounding); for the others it is what the decision loses
 * within the step. Each e_a's range over [0, h] is enclosed rigorously by its Bernstein coefficients
 * (./range.ts), its coefficients' rounding included: (Q_a c_j)_s is a dot product of d + 1 terms whose
 * error, with the computed exit rate's, is ≤ γ_{2d+2}·(Σ R|c_j(s′)| + E|c_j(s)|) (Higham 2002, Lemma 3.1).
 * J per boundary: Horner's error ≤ γ_{2K}·Σ|c_j|h^j (Higham 2002, §5.1). Inputs: rates and T rounded
 * from decimals (relative u each) move values by ≤ 3uλT, as for the other solvers.
 *
 * Steps. Time is scaled by a power of two so that λ ∈ [1, 2) (../shared/scale.ts). A step is accepted
 * when max(ρ⁺, ρ⁻) ≤ rate = budget/T on it; otherwise h shrinks (to the Taylor estimate or by half,
 * whichever is smaller); after an accepted step h grows by at most 2, to at most 2/λ. Near a switch
 * the decision loss is first order in the overlap, so steps end just past the crossing.
 *
 * Guarantee: |values_s − v_s(T)| ≤ errorBound, and valuesLower ≤ v(T) ≤ valuesUpper. Refuses: a
 * precision outside (0, 1), a choice state without an owner, more than MAX_STEPS steps or attempts,
 * or a bound above the precision. Returns the decisions of every step as a scheduler.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import type { Outcome, RefusalCode } from '../../corpus/format/result.js';
import { scaleTime } from '../shared/scale.js';
import { clampUnit, goalIndicator, nowSeconds, precisionProblem, UNIT_ROUNDOFF } from '../shared/numeric.js';
import { evaluateEnd, StepDefect } from './certificate.js';
import { DecisionTrace } from './trace.js';
import type { DenseSink } from '../shared/dense.js';

export interface DefectOptions {
  readonly precision: number;
  /** Taylor degree K (default 12). */
  readonly degree?: number;
  /** Largest number of step attempts (default 2e5). */
  readonly maxSteps?: number;
  /** Largest work, attempts × (K + 1) × (states + transitions) (default 3e9; `check` lowers it). */
  readonly maxWork?: number;
  /** Receives every accepted step (the dense solution), for a certificate outside the solver. */
  readonly dense?: DenseSink;
  /** Planted bug for `selftest` (variant:defect-ends) only: see StepDefect in ./certificate.ts. */
  readonly rangeAtEnds?: boolean;
}

const METHOD = 'defect';

export function solveDefect(model: CompiledModel, opts: DefectOptions): Outcome {
  const t0 = nowSeconds();
  const refuse = (reason: string, code: RefusalCode): Outcome => ({ kind: 'refused', method: METHOD, reason, code });
  const bad = precisionProblem(opts.precision);
  if (bad) return refuse(bad, 'invalid-input');
  const K = opts.degree ?? 12;
  if (!Number.isInteger(K) || K < 1 || K > 30) return refuse(`degree must be an integer from 1 to 30, got ${K}`, 'invalid-input');
  const S = model.nStates;
  const frozen = new Uint8Array(S);
  let lambda = 0;
  for (let s = 0; s < S; s++) {
    const nA = model.actionStart[s + 1]! - model.actionStart[s]!;
    if (nA >= 2 && model.owner[s] === 0) return refuse(`state '${model.stateNames[s]}' has a choice and no owner`, 'invalid-input');
    if (nA === 0 || (model.goalMode === 'within' && model.goal[s])) frozen[s] = 1;
    else for (let a = model.actionStart[s]!; a < model.actionStart[s + 1]!; a++) lambda = Math.max(lambda, model.exitRate[a]!);
  }
  const params = { precision: opts.precision, degree: K };
  // --- special case: nothing moves ------------------------------------------------------------
  if (lambda === 0) {
    const v = goalIndicator(model);
    return { kind: 'solved', method: METHOD, params, values: v, errorBound: 0, valuesLower: v, valuesUpper: v, stats: { steps: 0, seconds: nowSeconds() - t0 } };
  }
  const scaled = scaleTime(model, lambda, frozen);
  if ('refused' in scaled) return refuse(scaled.refused, 'out-of-scope');
  const m = scaled.m;
  const T = m.timeBound;
  const lam = lambda * scaled.c;
  const inputs = 3 * UNIT_ROUNDOFF * lam * T * (1 + 1e-12) + scaled.flushBound;
  const budget = 0.9 * opts.precision - inputs;
  if (!(budget > 0)) return refuse(`precision ${opts.precision} is below the input rounding allowance ${inputs}`, 'precision-floor');
  const rateTarget = budget / T;

  const w = new Work(m, K, frozen, opts.rangeAtEnds ?? false);
  opts.dense?.begin(m, K, scaled.flushBound);
  const trace = new DecisionTrace(m, T, scaled.c);
  let x = goalIndicator(m);
  let t = 0;
  let h = Math.min(T, 0.5 / lam);
  let intPlus = 0;
  let intMinus = 0;
  let jumps = 0;
  let steps = 0;
  let attempts = 0;
  const maxSteps = opts.maxSteps ?? 2e5;
  const maxWork = opts.maxWork ?? 3e9;
  const perAttempt = (K + 1) * (m.nStates + m.nTransitions);
  while (t < T) {
    if (T - t < h) h = T - t;
    if (++attempts > maxSteps) return refuse(`more than ${maxSteps} step attempts (λT = ${lam * T})`, 'work-cap');
    if (attempts * perAttempt > maxWork) return refuse(`work cap ${maxWork} reached after ${steps} steps at time left ${t * scaled.c} of ${model.timeBound}`, 'work-cap');
    w.decide(x);
    w.taylor(x);
    const { plus, minus } = w.defect(h);
    const worst = Math.max(plus, minus);
    const est = w.remainderScale; // |Q_d c_K|: the Taylor remainder rate is about est·h^K
    if (worst > rateTarget) {
      const taylorH = est > 0 ? h * Math.min(0.9, 0.9 * Math.pow(rateTarget / (est * h ** K), 1 / K)) : h / 2;
      h = Math.min(h / 2, Math.max(taylorH, h / 16));
      if (!(h > 0) || t + h === t) return refuse(`the step length underflowed at time left ${t * scaled.c}`, 'precision-floor');
      continue;
    }
    opts.dense?.step(h, w.C);
    intPlus += h * plus;
    intMinus += h * minus;
    const end = t + h === T || T - (t + h) < 1e-15 * T;
    const next = new Float64Array(S);
    jumps += w.evaluate(h, next);
    trace.record(w.dec, t);
    x = clampUnit(next);
    steps++;
    t = end ? T : t + h;
    const grow = worst > 0 ? Math.min(2, 0.9 * Math.pow(rateTarget / worst, 1 / K)) : 2;
    h = Math.min(h * Math.max(1, grow), 2 / lam);
  }
  const lowerDev = intPlus + jumps + inputs; // f − v ≤ this
  const upperDev = intMinus + jumps + inputs; // v − f ≤ this
  // 1e-9 covers the rounding of the sums; the second 1e-9 lets a re-certification of the same steps
  // (harness/check/certified.ts), whose sums round differently in the last bits, confirm the claim.
  const errorBound = Math.max(lowerDev, upperDev) * (1 + 2e-9);
  if (!Number.isFinite(errorBound)) return refuse(`the error bound is not finite (${errorBound})`, 'precision-floor');
  if (errorBound > opts.precision) return refuse(`the certified bound ${errorBound} is above the precision ${opts.precision}`, 'precision-floor');
  const valuesLower = new Float64Array(S);
  const valuesUpper = new Float64Array(S);
  for (let s = 0; s < S; s++) {
    valuesLower[s] = Math.max(0, x[s]! - lowerDev * (1 + 1e-9));
    valuesUpper[s] = Math.min(1, x[s]! + upperDev * (1 + 1e-9));
  }
  return {
    kind: 'solved', method: METHOD, params, values: x, errorBound, valuesLower, valuesUpper,
    scheduler: trace.finish(),
    stats: { steps, attempts, seconds: nowSeconds() - t0, defectPlus: intPlus, defectMinus: intMinus, jumps, switches: trace.switches },
  };
}

/** One step's buffers: coefficients c_j(s) at j·S + s, decisions, and the defect evaluator. */
class Work {
  readonly S: number;
  readonly C: Float64Array;
  readonly dec: Int32Array;
  readonly sd: StepDefect;
  readonly q: Float64Array;
  remainderScale = 0;
  constructor(readonly m: CompiledModel, readonly K: number, readonly frozen: Uint8Array, rangeAtEnds: boolean) {
    this.S = m.nStates;
    this.C = new Float64Array((K + 1) * this.S);
    this.dec = new Int32Array(this.S).fill(-1);
    this.sd = new StepDefect(m, K, frozen, rangeAtEnds);
    this.q = this.sd.q;
  }

  private apply(j: number): void {
    this.sd.apply(this.C, j);
  }

  /** Decisions at start values x: best (Q_a x)_s; exact ties decided by (Q_a c_1)_s; then the lower index. */
  decide(x: Float64Array): void {
    const { m, S, C, q, K } = this;
    C.set(x, 0);
    this.apply(0);
    const tied: number[] = [];
    for (let s = 0; s < S; s++) {
      const a0 = m.actionStart[s]!;
      const nA = m.actionStart[s + 1]! - a0;
      if (this.frozen[s] || nA === 0) continue;
      const sense = m.owner[s]! < 0 ? -1 : 1;
      let best = a0;
      let ties = false;
      for (let a = a0 + 1; a < a0 + nA; a++) {
        const d = sense * (q[a * (K + 1)]! - q[best * (K + 1)]!);
        if (d > 0) {
          best = a;
          ties = false;
        } else if (d === 0) ties = true;
      }
      this.dec[s] = best;
      if (ties) tied.push(s);
    }
    if (tied.length === 0) return;
    // c_1 from the order-0 decisions, then the tied states by their slopes.
    for (let s = 0; s < S; s++) C[S + s] = this.frozen[s] ? 0 : q[this.dec[s]! * (K + 1)]!;
    this.apply(1);
    for (const s of tied) {
      const a0 = m.actionStart[s]!;
      const sense = m.owner[s]! < 0 ? -1 : 1;
      const v0 = q[this.dec[s]! * (K + 1)]!;
      let best = this.dec[s]!;
      for (let a = a0; a < m.actionStart[s + 1]!; a++) {
        if (q[a * (K + 1)] !== v0) continue;
        if (sense * (q[a * (K + 1) + 1]! - q[best * (K + 1) + 1]!) > 0) best = a;
      }
      this.dec[s] = best;
    }
  }

  /** c_{j+1} = (Q_d c_j)/(j+1) for j < K, and (Q_a c_j)_s for every action and j ≤ K. */
  taylor(x: Float64Array): void {
    const { S, C, q, K, frozen, dec } = this;
    C.set(x, 0);
    for (let j = 0; j <= K; j++) {
      this.apply(j);
      if (j === K) break;
      const off = (j + 1) * S;
      for (let s = 0; s < S; s++) C[off + s] = frozen[s] ? 0 : q[dec[s]! * (K + 1) + j]! / (j + 1);
    }
    let r = 0;
    for (let s = 0; s < S; s++) if (!frozen[s]) r = Math.max(r, Math.abs(q[dec[s]! * (K + 1) + K]!));
    this.remainderScale = r;
  }

  /** Means of ρ⁺ and ρ⁻ over [0, h], rigorously (./certificate.ts). */
  defect(h: number): { plus: number; minus: number } {
    return this.sd.rates(this.C, h, this.dec);
  }

  /** f(h) into out; returns the largest Horner rounding bound (the jump to the next step's start). */
  evaluate(h: number, out: Float64Array): number {
    return evaluateEnd(this.C, this.S, this.K, h, out, this.frozen);
  }
}
