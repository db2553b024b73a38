/**
 * Certifying a trajectory: values of every state at increasing times left 0 = t_0 < … < t_n = T, as
 * an external solver may return them (result key `trajectory`). The dense solution is the cubic
 * Hermite interpolant through the values with slopes B(f(t_i)) at the nodes, B the Bellman right-hand
 * side (common practice, no source: piecewise cubic Hermite interpolation, C¹ by construction), and
 * ./certificate.ts bounds |f(T) − v(T)| from its defect. A trajectory whose values are wrong gets a
 * large bound, not a small one: nothing is assumed about how the values were made.
 *
 * Refuses (returns a reason) when the times do not increase from 0 to T (relative 1e-12), when a
 * state lacks a value at some time, or when a value is not finite.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import { certify, type Certificate, type DenseStep } from './certificate.js';

export interface Trajectory {
  readonly timeLeft: readonly number[];
  /** values[i][s]: the value of state s at time left timeLeft[i]. */
  readonly values: readonly ArrayLike<number>[];
}

/** B(y)_s = opt_a (Q_a y)_s for evolving states, 0 for the others. */
function bellman(m: CompiledModel, y: ArrayLike<number>, out: Float64Array): void {
  for (let s = 0; s < m.nStates; s++) {
    const a0 = m.actionStart[s]!;
    const a1 = m.actionStart[s + 1]!;
    out[s] = 0;
    if (a1 === a0 || (m.goalMode === 'within' && m.goal[s])) continue;
    const sense = m.owner[s]! < 0 ? -1 : 1;
    let best = -Infinity;
    for (let a = a0; a < a1; a++) {
      let acc = -m.exitRate[a]! * y[s]!;
      for (let t = m.rowStart[a]!; t < m.rowStart[a + 1]!; t++) acc += m.rate[t]! * y[m.col[t]!]!;
      if (sense * acc > best) best = sense * acc;
    }
    out[s] = sense * best;
  }
}

export function certifyTrajectory(m: CompiledModel, tr: Trajectory): Certificate | { refused: string } {
  const n = tr.timeLeft.length;
  const S = m.nStates;
  const T = m.timeBound;
  if (n < 2 || tr.values.length !== n) return { refused: 'a trajectory needs at least two times and values at every time' };
  if (tr.timeLeft[0] !== 0 || Math.abs(tr.timeLeft[n - 1]! - T) > 1e-12 * T) return { refused: `the times must run from 0 to the time bound ${T}` };
  for (let i = 0; i < n; i++) {
    if (i > 0 && !(tr.timeLeft[i]! > tr.timeLeft[i - 1]!)) return { refused: `the times must increase (at index ${i})` };
    const v = tr.values[i]!;
    if (v.length !== S) return { refused: `time index ${i} has ${v.length} values for ${S} states` };
    for (let s = 0; s < S; s++) if (!Number.isFinite(v[s]!)) return { refused: `state '${m.stateNames[s]}' has no finite value at time index ${i}` };
  }
  const slope = (i: number): Float64Array => {
    const d = new Float64Array(S);
    bellman(m, tr.values[i]!, d);
    return d;
  };
  const steps: DenseStep[] = [];
  let d0 = slope(0);
  for (let i = 0; i + 1 < n; i++) {
    const h = tr.timeLeft[i + 1]! - tr.timeLeft[i]!;
    const d1 = slope(i + 1);
    const coef = new Float64Array(4 * S);
    const f0 = tr.values[i]!;
    const f1 = tr.values[i + 1]!;
    for (let s = 0; s < S; s++) {
      const delta = (f1[s]! - f0[s]!) / h;
      coef[s] = f0[s]!;
      coef[S + s] = d0[s]!;
      coef[2 * S + s] = (3 * delta - 2 * d0[s]! - d1[s]!) / h;
      coef[3 * S + s] = (d0[s]! + d1[s]! - 2 * delta) / (h * h);
    }
    steps.push({ h, coef });
    d0 = d1;
  }
  return certify(m, steps, 3);
}
