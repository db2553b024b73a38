/**
 * Explicit Euler on the Bellman equations of time-bounded reachability (CTMC, CTMDP, CTMG; goal
 * modes `within` and `at`). The baseline against which the other solvers are cross-checked.
 *
 * Method. L. Euler's polygon method (Institutiones calculi integralis, 1768) applied to
 *     dv/dt = B(v),  B(v)_s = opt_{a ∈ Act(s)} Σ_{s'} R(s,a,s') (v_{s'} − v_s),  v(0) = 1_G,
 * with t the time left (in mode `within` goal states are frozen at 1; a state without actions is
 * frozen). With λ ≥ every exit rate and h ≤ 1/λ, one step E_h(x) = x + h·B(x) is, for every
 * action, the convex combination (1 − hE_a) x_s + Σ hR x_{s'}, so E_h is monotone, commutes with
 * adding constants, maps [0,1]^S into itself and is sup-norm non-expansive. The last step is a
 * partial step of length T − n·h, landing exactly on T.
 *
 * Bound (our derivation; cf. the Picard-type argument for k-step schemes). Write B = λ(M − I)
 * with M(y)_s = opt_a Σ P_a(s,s') y_{s'}, P_a = I + Q_a/λ stochastic. M is monotone and commutes
 * with constants, hence non-expansive, so (i) ‖B(y) − B(z)‖ ≤ 2λ‖y − z‖ and (ii) ‖B(y)‖ ≤ λ on
 * [0,1]^S (|B(y)_s| ≤ E·(max y − min y)). The exact flow Φ of dv/dt = B(v) is non-expansive in the
 * sup norm (B is quasi-monotone and commutes with constants: the comparison principle). The max/min
 * makes v only piecewise smooth, so we never use v''; in integral form, for x ∈ [0,1]^S and f the
 * exact solution from x,
 *     Φ_h(x) − E_h(x) = ∫₀^h [B(f(τ)) − B(x)] dτ,   ‖f(τ) − x‖ ≤ ∫₀^τ ‖B(f)‖ ≤ λτ,
 * so the local defect is ≤ ∫₀^h 2λ·λτ dτ = (λh)². Globally, with e_i the error after step i,
 *     e_i ≤ ‖E(v̂) − Φ(v̂)‖ + ‖Φ(v̂) − Φ(v)‖ ≤ (λh_i)² + e_{i−1},
 * hence |v̂_s(T) − v_s(T)| ≤ λ² Σ_i h_i² = λ²(n h² + h_last²) ≤ λ² h T.
 * A-posteriori sharpening (reported when smaller, which is almost always): the exact flow Φ is
 * non-expansive, so ‖f(σ+δ) − f(σ)‖ = ‖Φ_σ(f(δ)) − Φ_σ(x)‖ ≤ ‖f(δ) − x‖; dividing by δ gives
 * ‖f′(σ)‖ ≤ ‖B(x)‖ for all σ ≥ 0, hence ‖f(τ) − x‖ ≤ τ‖B(x)‖ and the local defect is
 * ≤ ∫₀^h 2λ·τ‖B(x)‖ dτ = λh²‖B(x)‖, with x = x̂_i the computed iterate. The step computes
 * h‖B(x̂_i)‖ up to (d + 2)uλh (its increments) + 2uλh (the ignored lo parts); summing,
 *     |v̂_s(T) − v_s(T)| ≤ Σ_i λ h_i (h_i‖B(x̂_i)‖ + (d + 4)uλh_i) + rounding.
 * Where the values settle (‖B‖ ≪ λ) this is far below the a-priori bound. The computed iterates stay
 * within δ ≤ precision of [0,1]^S, which scales (ii) by (1 + 2δ); that factor is included.
 * Rounding (u = 2^-53; see step.ts). Sums n·u below are first order; the 1 % margin makes them rigorous,
 * since γ_n = nu/(1 − nu) ≤ 1.01·nu whenever nu ≤ 1/101 (Higham 2002, Lemma 3.1): per step and state, the increment of
 * ≤ d terms (d = largest row) is off by ≤ (d + 2)u·λh, ignoring lo in differences costs ≤ 2u·λh,
 * and adding lo and the TwoSum cost ≤ u(λh + u). Summed: u[(d + 5)λT + n·u], plus u for the final
 * hi + lo, plus 2uλT for the rounded step lengths (|dv/dt| ≤ λ), plus 3uλT for the inputs (rates and
 * T are decimals rounded to doubles, relative error ≤ u each: the right-hand side moves by ≤ 2uλ
 * and the time by ≤ uT). Step choice:
 *     h = min( 1/(λ(1 + 2(d + 2)u)), (precision − rounding) / (λ² T (1 + 2·precision)) ).
 *
 * Refuses: a precision outside (0, 1) or below the rounding allowance; work = steps × (moving states
 * + their transitions) above MAX_WORK = 3e9 (minutes of run time: T/h = (λT)²/precision grows fast,
 * e.g. λT = 10 at precision 1e-8 needs 1e10 steps).
 * Returns the scheduler found (the decisions of every step, as segments in elapsed time) when the
 * model has choices and the decisions switch at most MAX_SWITCHES times.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import type { Outcome, RefusalCode } from '../../corpus/format/result.js';
import { UNIT_ROUNDOFF as u, clampUnit, goalIndicator, isFrozen, nowSeconds, precisionProblem } from '../shared/numeric.js';
import { eulerStep, type StepBuffers } from './step.js';
import { DecisionLog } from './decisions.js';

export const MAX_WORK = 3e9;
const METHOD = 'euler';

/** Steps between two calls of `onProgress` (a power of two: the test is one mask). */
const PROGRESS_EVERY = 4096;

/**
 * `maxWork` replaces the work cap MAX_WORK (steps × moving states and transitions); benchmarks raise it,
 * check lowers it. `onProgress(stepsDone, steps)` is called every PROGRESS_EVERY steps (for a progress
 * display; it has no effect on the result).
 */
export function solveEuler(
  m: CompiledModel,
  opts: { precision: number; maxWork?: number; onProgress?: (stepsDone: number, steps: number) => void },
): Outcome {
  const t0 = nowSeconds();
  const refuse = (reason: string, code: RefusalCode): Outcome => ({ kind: 'refused', method: METHOD, reason, code });
  const precision = opts.precision;
  const bad = precisionProblem(precision);
  if (bad) return refuse(bad, 'invalid-input');
  const T = m.timeBound;
  const S = m.nStates;

  // The states that move, their largest exit rate and row.
  const activeList: number[] = [];
  let lambda = 0;
  let d = 0;
  let work = 0;
  for (let s = 0; s < S; s++) {
    if (isFrozen(m, s)) continue;
    activeList.push(s);
    work += 1;
    for (let a = m.actionStart[s]!; a < m.actionStart[s + 1]!; a++) {
      const nnz = m.rowStart[a + 1]! - m.rowStart[a]!;
      work += nnz;
      if (nnz > d) d = nnz;
      if (m.exitRate[a]! > lambda) lambda = m.exitRate[a]!;
    }
  }
  const params = { precision };

  // --- special case: nothing moves (λ = 0): v(T) = v(0) ------------------------------------------
  if (lambda === 0) {
    return { kind: 'solved', method: METHOD, params, values: goalIndicator(m), errorBound: 0, stats: { steps: 0, h: T, seconds: nowSeconds() - t0 } };
  }

  const lt = lambda * T;
  const roundingFor = (steps: number): number => 1.01 * u * ((d + 5) * lt + steps * u + 1 + 5 * lt);
  const trunc = precision - roundingFor(MAX_WORK);
  if (!(trunc > 0)) return refuse(`precision ${precision} is below the rounding allowance ${roundingFor(MAX_WORK)}`, 'precision-floor');
  const h = Math.min(1 / (1 + 2 * (d + 2) * u), trunc / (lt * (1 + 2 * precision))) / lambda;
  let nFull = Math.floor(T / h);
  while (nFull > 0 && nFull * h > T) nFull--;
  const hLast = T - nFull * h;
  const steps = nFull + (hLast > 0 ? 1 : 0);
  const cap = opts.maxWork ?? MAX_WORK;
  if (steps * work > cap) {
    return refuse(`${steps} steps of step size ${h} over ${work} states and transitions exceed the work cap ${cap} (λT = ${lt})`, 'work-cap');
  }
  // In units of 1/λ (λh, λ·hLast), so that nothing over- or underflows for any finite λ and T.
  const lh = lambda * h;
  const lhLast = lambda * hLast;
  const errorBound = (nFull * lh * lh + lhLast * lhLast) * (1 + 2 * precision) + roundingFor(steps);

  const init = goalIndicator(m);
  const buf: StepBuffers = { hi: init, lo: new Float64Array(S), hiNext: Float64Array.from(init), loNext: new Float64Array(S) };
  const active = Int32Array.from(activeList);
  const hR = new Float64Array(m.nTransitions);
  const setStep = (step: number): void => {
    for (let j = 0; j < hR.length; j++) hR[j] = step * m.rate[j]!;
  };
  const log = DecisionLog.forModel(m, activeList);
  const choice = log ? new Int32Array(S) : undefined;

  // A-posteriori truncation bound (see the doc comment): Σ_i λ h_i (h_i‖B(x̂_i)‖ + rounding of it).
  const incSlack = (d + 4) * u;
  let post = 0;
  setStep(h);
  const onProgress = opts.onProgress;
  for (let i = 0; i < nFull; i++) {
    const inc = eulerStep(m, active, hR, buf, choice);
    post += lh * (inc + incSlack * lh);
    if (log && choice) log.record(choice, i * h);
    if (onProgress && (i & (PROGRESS_EVERY - 1)) === 0) onProgress(i, steps);
  }
  if (hLast > 0) {
    setStep(hLast);
    const inc = eulerStep(m, active, hR, buf, choice);
    post += lhLast * (inc + incSlack * lhLast);
    if (log && choice) log.record(choice, nFull * h);
  }
  // The sum above carries ≤ steps·u relative rounding; the margin covers it (steps ≤ 3e9 ≪ 1e7/u).
  const aPosteriori = post * (1 + 1e-6) + roundingFor(steps);
  const reported = Math.min(errorBound, aPosteriori);
  if (!Number.isFinite(reported)) return refuse(`the error bound is not finite (${reported})`, 'precision-floor');
  const values = new Float64Array(S);
  for (let s = 0; s < S; s++) values[s] = buf.hi[s]! + buf.lo[s]!;
  clampUnit(values); // true values lie in [0, 1]: clamping never adds error
  const scheduler = log?.scheduler(T);
  return {
    kind: 'solved',
    method: METHOD,
    params,
    values,
    errorBound: reported,
    ...(scheduler ? { scheduler } : {}),
    stats: { steps, h, seconds: nowSeconds() - t0, aPrioriBound: errorBound, ...(log ? { switches: log.switches } : {}) },
  };
}
