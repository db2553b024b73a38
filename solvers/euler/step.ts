/**
 * One explicit Euler step on the Bellman equations, over the CSR form, with compensated state
 * updates (the value of state s is the unevaluated sum hi[s] + lo[s]):
 *
 *     inc_s = opt_a Σ_j hR[j] · (hi[col j] − hi[s])        (hR = h · R, precomputed per step size)
 *     (hi'[s], lo'[s]) = TwoSum(hi[s], inc_s + lo[s])
 *
 * TwoSum (D. E. Knuth, "The Art of Computer Programming", vol. 2, 3rd ed., 1997, §4.2.2, Theorem B)
 * returns the rounded sum and its exact error, so an update loses only the rounding of the small
 * increment, not one unit of the value per step. Ties between actions go to the first action.
 * Only the states in `active` are written; frozen states hold the same value in both buffers.
 * Returns max_s |inc_s − lo_s|, the computed h·‖B(hi)‖ (for the a-posteriori bound of index.ts).
 */
import type { CompiledModel } from '../../corpus/format/compile.js';

export interface StepBuffers {
  hi: Float64Array;
  lo: Float64Array;
  hiNext: Float64Array;
  loNext: Float64Array;
}

export function eulerStep(
  m: CompiledModel,
  active: Int32Array,
  hR: Float64Array,
  b: StepBuffers,
  choice: Int32Array | undefined,
): number {
  const { actionStart, rowStart, col, owner } = m;
  const { hi, lo, hiNext, loNext } = b;
  const n = active.length;
  let maxInc = 0;
  for (let i = 0; i < n; i++) {
    const s = active[i]!;
    const vs = hi[s]!;
    const a0 = actionStart[s]!;
    const a1 = actionStart[s + 1]!;
    const own = owner[s]!;
    let best = 0;
    let bestA = a0;
    if (a1 - a0 === 1) {
      // One action: no choice to make (the common case of a CTMC).
      const j1 = rowStart[a1]!;
      for (let j = rowStart[a0]!; j < j1; j++) best += hR[j]! * (hi[col[j]!]! - vs);
    } else {
      for (let a = a0; a < a1; a++) {
        let acc = 0;
        const j1 = rowStart[a + 1]!;
        for (let j = rowStart[a]!; j < j1; j++) acc += hR[j]! * (hi[col[j]!]! - vs);
        if (a === a0 || (own > 0 ? acc > best : acc < best)) {
          best = acc;
          bestA = a;
        }
      }
    }
    const absBest = best < 0 ? -best : best;
    if (absBest > maxInc) maxInc = absBest;
    const inc = best + lo[s]!;
    const t = vs + inc;
    const bb = t - vs;
    hiNext[s] = t;
    loNext[s] = vs - (t - bb) + (inc - bb);
    if (choice) choice[s] = bestA;
  }
  b.hi = hiNext;
  b.lo = loNext;
  b.hiNext = hi;
  b.loNext = lo;
  return maxInc;
}
