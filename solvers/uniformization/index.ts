/**
 * Uniformization for time-bounded reachability in a CTMC, or in a CTMDP/CTMG under a fixed
 * (piecewise constant, time-dependent) scheduler.
 *
 * Method. A. Jensen, "Markoff chains as an aid in the study of Markoff processes", Skandinavisk
 * Aktuarietidskrift 36, 1953 (uniformization); Poisson weights by B. L. Fox and P. W. Glynn,
 * "Computing Poisson probabilities", CACM 31(4), 1988 (see foxGlynn.ts). The scheduler cuts the
 * elapsed time [0, T] into pieces of constant decisions; they are processed backwards, from elapsed
 * T (where v is the indicator of the goal) to elapsed 0. On a piece of length τ with uniformization
 * rate λ ≥ every exit rate of the chosen actions and P = I + Q/λ (stochastic),
 *     v ← e^{Qτ} v = Σ_k Poisson(k; λτ) P^k v,
 * truncated to the Fox–Glynn window [L, R] with weights normalised to sum 1. In mode `within` the
 * goal states are absorbing (value 1); in mode `at` they keep their actions.
 *
 * Bound. (1) Truncation: P^k v ∈ [0,1]^S, so a piece's truncation error is ≤ its neglected
 * Poisson mass δ_p (foxGlynn.ts); the exact piece map e^{Qτ} is stochastic, hence non-expansive
 * in the sup norm, so earlier errors are not amplified and the errors of the pieces add up.
 * (2) Rounding (binary64, u = 2^-53, first-order terms with a 1 % margin, which makes them rigorous:
 * γ_n = nu/(1 − nu) ≤ 1.01·nu whenever nu ≤ 1/101; Higham 2002, Lemma 3.1): one row of P x has
 * d + 1 products, its entries carry ≤ (d + 1)u (diagonal) and u (off-diagonal) relative error,
 * and recursive summation adds ≤ (d + 1)u, so one mat-vec adds ≤ (3d + 4)u in the sup norm, where
 * d is the largest row length (P is stochastic, so earlier rounding errors are not amplified).
 * The weighted sum of R − L + 1 vectors and the division by W add ≤ (R − L + 2)u; the weights
 * themselves carry ≤ roundingBound relative error. Per piece:
 *     ρ_p = 1.01 · u · [R_p (3d + 4) + (R_p − L_p + 2) + 3 λ_p τ_p] + roundingBound_p,
 * where 3uλτ covers the inputs: rates and times are decimals rounded to doubles (relative error
 * ≤ u each), which moves the generator by ≤ 2uλ in row-sum norm and the piece length by ≤ uτ;
 * since |dv/dt| ≤ λ and the flows are non-expansive, the value moves by ≤ 3uλτ.
 * errorBound = Σ_p δ_p + Σ_p ρ_p. The tail budget per piece is precision/(2·pieces), lowered
 * if rounding needs more than half of the precision.
 *
 * Refuses: a model with choices and no scheduler; a piece with λτ > 1e7 (that many mat-vecs);
 * a precision outside (0, 1), or below what the rounding allowance permits.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import type { Outcome, RefusalCode } from '../../corpus/format/result.js';
import { schedulerPieces, type Scheduler, type SchedulerPiece } from '../../corpus/format/scheduler.js';
import { UNIT_ROUNDOFF, clampUnit, goalIndicator, nowSeconds, precisionProblem } from '../shared/numeric.js';
import { MAX_QT, foxGlynn, type PoissonWindow } from './foxGlynn.js';
import { applyP, applyPAccumulate, buildPieceMatrix, pieceRate } from './pieceMatrix.js';

export { foxGlynn, MAX_QT } from './foxGlynn.js';

const METHOD = 'uniformization';

export function solveUniformization(m: CompiledModel, opts: { precision: number; scheduler?: Scheduler }): Outcome {
  const t0 = nowSeconds();
  const refuse = (reason: string, code: RefusalCode): Outcome => ({ kind: 'refused', method: METHOD, reason, code });
  const bad = precisionProblem(opts.precision);
  if (bad) return refuse(bad, 'invalid-input');

  const T = m.timeBound;
  let pieces: SchedulerPiece[];
  if (opts.scheduler) {
    pieces = schedulerPieces(opts.scheduler, T, m.stateNames, m.actionStart, m.actionNames);
  } else {
    for (let s = 0; s < m.nStates; s++) {
      if (m.owner[s] !== 0) {
        const n = m.actionStart[s + 1]! - m.actionStart[s]!;
        return refuse(`state '${m.stateNames[s]}' has ${n} actions: uniformization needs a CTMC or a fixed scheduler`, 'out-of-scope');
      }
    }
    const action = new Int32Array(m.nStates);
    for (let s = 0; s < m.nStates; s++) action[s] = m.actionStart[s + 1]! > m.actionStart[s]! ? m.actionStart[s]! : -1;
    pieces = [{ start: 0, end: T, action }];
  }
  const frozen = new Uint8Array(m.nStates);
  if (m.goalMode === 'within') for (let s = 0; s < m.nStates; s++) frozen[s] = m.goal[s]!;

  // Rates per piece; a piece where nothing moves (λτ = 0) leaves v unchanged.
  const rates = pieces.map((p) => {
    const r = pieceRate(m, p.action, frozen);
    return { ...r, qt: r.lambda * (p.end - p.start) };
  });
  for (let i = 0; i < pieces.length; i++) {
    if (!(rates[i]!.qt <= MAX_QT)) {
      const p = pieces[i]!;
      return refuse(`λτ = ${rates[i]!.qt} on elapsed time [${p.start}, ${p.end}] exceeds the limit ${MAX_QT} (that many mat-vecs)`, 'work-cap');
    }
  }
  const active = rates.filter((r) => r.qt > 0).length;

  // --- special case: nothing moves ---------------------------------------------------------------
  if (active === 0) {
    return {
      kind: 'solved', method: METHOD, params: { precision: opts.precision }, values: goalIndicator(m), errorBound: 0,
      stats: { iterations: 0, left: 0, right: 0, pieces: pieces.length, seconds: nowSeconds() - t0 },
    };
  }

  const plan = (budget: number): { windows: (PoissonWindow | undefined)[]; tails: number; rounding: number } => {
    let tails = 0;
    let rounding = 0;
    const windows = rates.map((r) => {
      if (r.qt === 0) return undefined;
      const w = foxGlynn(r.qt, budget);
      tails += w.tailBound;
      rounding += 1.01 * UNIT_ROUNDOFF * (w.right * (3 * r.maxRowNnz + 4) + (w.right - w.left + 2) + 3 * r.qt) + w.roundingBound;
      return w;
    });
    return { windows, tails, rounding };
  };
  let budget = opts.precision / (2 * active);
  if (budget < 1e-200) return refuse(`precision ${opts.precision} spread over ${active} pieces is below 1e-200 per piece`, 'precision-floor');
  let p = plan(budget);
  if (p.tails + p.rounding > opts.precision) {
    budget = (opts.precision - 1.1 * p.rounding) / active;
    if (!(budget >= 1e-200)) return refuse(`the rounding allowance ${p.rounding} leaves no room for precision ${opts.precision}`, 'precision-floor');
    p = plan(budget);
    if (p.tails + p.rounding > opts.precision) {
      return refuse(`cannot meet precision ${opts.precision}: rounding allowance ${p.rounding}, truncation ${p.tails}`, 'precision-floor');
    }
  }

  const S = m.nStates;
  let v = goalIndicator(m);
  let x = new Float64Array(S);
  let y = new Float64Array(S);
  const buf = { col: new Int32Array(m.nTransitions), val: new Float64Array(m.nTransitions) };
  let iterations = 0;
  let widest = { left: 0, right: 0 };
  for (let i = pieces.length - 1; i >= 0; i--) {
    const w = p.windows[i];
    if (!w) continue;
    const mat = buildPieceMatrix(m, pieces[i]!.action, frozen, buf);
    const sum = new Float64Array(S);
    x.set(v);
    if (w.left === 0) for (let s = 0; s < S; s++) sum[s] = w.weights[0]! * x[s]!;
    for (let k = 1; k <= w.right; k++) {
      if (k < w.left) applyP(mat, x, y);
      else applyPAccumulate(mat, x, y, w.weights[k - w.left]!, sum);
      const t = x;
      x = y;
      y = t;
    }
    iterations += w.right;
    for (let s = 0; s < S; s++) sum[s] = sum[s]! / w.totalWeight;
    v = clampUnit(sum); // true values lie in [0, 1]: clamping never adds error
    if (w.right > widest.right) widest = { left: w.left, right: w.right };
  }
  const errorBound = p.tails + p.rounding;
  if (!Number.isFinite(errorBound)) return refuse(`the error bound is not finite (${errorBound})`, 'precision-floor');
  return {
    kind: 'solved',
    method: METHOD,
    params: { precision: opts.precision },
    values: v,
    errorBound,
    stats: { iterations, left: widest.left, right: widest.right, pieces: pieces.length, seconds: nowSeconds() - t0 },
  };
}
