/**
 * Small numerical helpers shared by the fast solvers.
 *
 * Rounding model (common practice, no source beyond the standard model of IEEE 754 binary64
 * arithmetic as in N. J. Higham, "Accuracy and Stability of Numerical Algorithms", 2nd ed., 2002,
 * §2.2): every basic operation on doubles returns fl(x ∘ y) = (x ∘ y)(1 + δ) with |δ| ≤ u = 2^-53,
 * as long as no underflow occurs. Rounding allowances in the solvers are stated in multiples of u.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';

/** Unit roundoff of binary64 with round-to-nearest. */
export const UNIT_ROUNDOFF = 2 ** -53;

/** Wall-clock seconds since an arbitrary origin. */
export function nowSeconds(): number {
  return performance.now() / 1000;
}

/**
 * True when state s never changes value: it has no actions, or it is a goal state in mode
 * `within` (goal states are absorbing there and their value is identically 1).
 */
export function isFrozen(m: CompiledModel, s: number): boolean {
  if (m.goalMode === 'within' && m.goal[s] === 1) return true;
  return m.actionStart[s + 1]! === m.actionStart[s]!;
}

/** The values at t = 0 (no time left): the indicator of the goal states. */
export function goalIndicator(m: CompiledModel): Float64Array {
  const v = new Float64Array(m.nStates);
  for (let s = 0; s < m.nStates; s++) v[s] = m.goal[s]!;
  return v;
}

/** Clamp every value into [0, 1] in place. True values lie in [0, 1], so this never adds error. */
export function clampUnit(v: Float64Array): Float64Array {
  for (let s = 0; s < v.length; s++) {
    const x = v[s]!;
    if (x < 0) v[s] = 0;
    else if (x > 1) v[s] = 1;
  }
  return v;
}

/** A precision the solvers accept: a finite number in (0, 1). */
export function precisionProblem(precision: number): string | undefined {
  if (!Number.isFinite(precision) || !(precision > 0) || !(precision < 1)) {
    return `precision must be a finite number in (0, 1), got ${String(precision)}`;
  }
  return undefined;
}
