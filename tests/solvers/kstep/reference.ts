/**
 * Test-only references for the k-step scheme (no solver code is shared):
 *  - `expmValues`: v(T) = e^{QT}·x for a CTMC by a dense matrix exponential in float64, Taylor series
 *    with scaling and squaring (Moler & Van Loan, "Nineteen dubious ways to compute the exponential
 *    of a matrix, twenty-five years later", SIAM Review 2003, §3 and §6); for the tiny models here
 *    its error is a few hundred ulps, so 1e-12 is a generous bound (common practice, no source).
 *  - `schedulerValues`: the value of a fixed piecewise-constant scheduler by classical RK4 on each
 *    segment, run at steps h and h/2; the difference (×2) is returned as the error estimate.
 */
import type { CompiledModel } from '../../../corpus/format/compile.js';
import { schedulerPieces, type Scheduler } from '../../../corpus/format/scheduler.js';

function startVector(m: CompiledModel): Float64Array {
  return Float64Array.from(m.goal, (g) => (g ? 1 : 0));
}

/** Dense generator of the CTMC obtained by fixing action[s] (−1: absorbing) in every state. */
function generator(m: CompiledModel, action: Int32Array): number[][] {
  const S = m.nStates;
  const Q = Array.from({ length: S }, () => new Array<number>(S).fill(0));
  for (let s = 0; s < S; s++) {
    const a = action[s]!;
    if (a < 0 || (m.goalMode === 'within' && m.goal[s])) continue;
    for (let t = m.rowStart[a]!; t < m.rowStart[a + 1]!; t++) {
      Q[s]![m.col[t]!]! += m.rate[t]!;
      Q[s]![s]! -= m.rate[t]!;
    }
  }
  return Q;
}

function matMul(A: number[][], B: number[][]): number[][] {
  const n = A.length;
  const C = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) for (let j = 0; j < n; j++) C[i]![j]! += A[i]![k]! * B[k]![j]!;
  return C;
}

export function expm(Q: number[][], t: number): number[][] {
  const n = Q.length;
  let norm = 0;
  for (const row of Q) norm = Math.max(norm, row.reduce((a, b) => a + Math.abs(b * t), 0));
  let sq = 0;
  while (norm / 2 ** sq > 0.5) sq++;
  const A = Q.map((r) => r.map((v) => (v * t) / 2 ** sq));
  let term: number[][] = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0)));
  let sum = term.map((r) => [...r]);
  for (let k = 1; k <= 30; k++) {
    term = matMul(term, A).map((r) => r.map((v) => v / k));
    sum = sum.map((r, i) => r.map((v, j) => v + term[i]![j]!));
  }
  for (let i = 0; i < sq; i++) sum = matMul(sum, sum);
  return sum;
}

/** v(T) of a CTMC (each state's only action, if any) by the dense matrix exponential. */
export function expmValues(m: CompiledModel, T = m.timeBound): Float64Array {
  const action = Int32Array.from({ length: m.nStates }, (_, s) => (m.actionStart[s + 1]! > m.actionStart[s]! ? m.actionStart[s]! : -1));
  const E = expm(generator(m, action), T);
  const x = startVector(m);
  return Float64Array.from(E, (row) => row.reduce((a, v, j) => a + v * x[j]!, 0));
}

function rk4(m: CompiledModel, action: Int32Array, v: Float64Array, span: number, steps: number): void {
  const Q = generator(m, action);
  const S = m.nStates;
  const f = (y: Float64Array): Float64Array => Float64Array.from(Q, (row) => row.reduce((a, q, j) => a + q * y[j]!, 0));
  const h = span / steps;
  for (let i = 0; i < steps; i++) {
    const k1 = f(v);
    const k2 = f(v.map((y, s) => y + 0.5 * h * k1[s]!));
    const k3 = f(v.map((y, s) => y + 0.5 * h * k2[s]!));
    const k4 = f(v.map((y, s) => y + h * k3[s]!));
    for (let s = 0; s < S; s++) v[s] = v[s]! + (h / 6) * (k1[s]! + 2 * k2[s]! + 2 * k3[s]! + k4[s]!);
  }
}

/** Value at time T of the fixed scheduler, by RK4 with about T/h steps, and an error estimate. */
export function schedulerValues(m: CompiledModel, sched: Scheduler, h: number): { values: Float64Array; estimate: number } {
  const run = (step: number): Float64Array => {
    const pieces = schedulerPieces(sched, m.timeBound, m.stateNames, m.actionStart, m.actionNames);
    const v = startVector(m);
    // Time left grows as elapsed time falls: integrate the pieces from the last one back to the first.
    for (let p = pieces.length - 1; p >= 0; p--) {
      const { start, end, action } = pieces[p]!;
      rk4(m, action, v, end - start, Math.max(1, Math.ceil((end - start) / step)));
    }
    return v;
  };
  const a = run(h);
  const b = run(h / 2);
  let est = 0;
  for (let s = 0; s < m.nStates; s++) est = Math.max(est, Math.abs(a[s]! - b[s]!));
  return { values: b, estimate: 2 * est };
}
