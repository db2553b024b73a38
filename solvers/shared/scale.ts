/**
 * Rescaling time by a power of two, so that a solver works in time units of about 1/λ.
 *
 * Scaling every rate by c and the time bound by 1/c leaves every value v_s(T) unchanged (the Bellman
 * equations of section "Semantics" depend on rates and time only through R·t). With c = 2^−e the
 * scaling is exact in binary floating point (only the exponent changes), except where a scaled rate
 * leaves the normal range. After it the largest exit rate of an evolving state lies in [1, 2), so
 * powers of λ and of the interval length in a polynomial scheme neither overflow nor underflow
 * (common practice, no source: rates near 1e−180 with a time bound near 1e+180 are the same model as
 * rates near 1 and a time bound near 1).
 *
 * Special cases: λ = 0 (nothing moves) is returned unscaled. Refuses (returns a reason) when the
 * scaled time bound λT would overflow or when some scaled rate would overflow (rates of the model
 * that span more than about 10^300 — a frozen goal state's rate included — are refused rather than
 * flushed). A rate that becomes subnormal or 0 loses at most 2^−1075 absolutely; its effect on a
 * value is at most 2·d·2^−1075·λT (d the longest row; the right-hand side moves by at most the
 * row-sum of the rate changes, the flow is non-expansive), reported as `flushBound`.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';

export interface Scaled {
  readonly m: CompiledModel;
  /** c = 2^−e: scaled rates are c·R, the scaled time bound T/c. */
  readonly c: number;
  /** Bound on the change of any value from rates flushed to subnormal or zero (0 if none). */
  readonly flushBound: number;
}

/**
 * Scales so that `lambda` (the caller's uniformization rate over evolving states) becomes 2^0 … 2^1.
 * The actions of states marked in `frozen` (they never change value) get rate 0 in the copy.
 */
export function scaleTime(m: CompiledModel, lambda: number, frozen?: Uint8Array): Scaled | { refused: string } {
  if (!(lambda > 0)) return { m, c: 1, flushBound: 0 };
  const e = Math.floor(Math.log2(lambda));
  if (e === 0) return { m, c: 1, flushBound: 0 };
  // Two steps so that 2^−e itself does not overflow or underflow for |e| up to 2098.
  const c1 = 2 ** -Math.trunc(e / 2);
  const c2 = 2 ** -(e - Math.trunc(e / 2));
  const c = c1 * c2;
  const T = m.timeBound / c1 / c2;
  if (!Number.isFinite(T)) return { refused: `the time bound in units of 1/λ (λT) overflows: λ = ${lambda}, T = ${m.timeBound}` };
  let flushed = false;
  const rate = new Float64Array(m.rate.length);
  const exitRate = new Float64Array(m.exitRate.length);
  let lam = 0;
  for (let st = 0; st < m.nStates; st++) {
    if (frozen?.[st]) continue;
    for (let a = m.actionStart[st]!; a < m.actionStart[st + 1]!; a++) {
      for (let t = m.rowStart[a]!; t < m.rowStart[a + 1]!; t++) {
        const v = m.rate[t]! * c1 * c2;
        if (v < 2 ** -1022) flushed = true;
        rate[t] = v;
      }
      exitRate[a] = m.exitRate[a]! * c1 * c2;
      if (!Number.isFinite(exitRate[a]!)) return { refused: `rates span too many orders of magnitude to share one time unit (largest evolving exit rate ${lambda})` };
      lam = Math.max(lam, exitRate[a]!);
    }
  }
  let d = 0;
  for (let a = 0; a < m.nActions; a++) d = Math.max(d, m.rowStart[a + 1]! - m.rowStart[a]!);
  const flushBound = flushed ? 4 * (d + 1) * (2 ** -1074 * T) : 0;
  return { m: { ...m, rate, exitRate, lambda: lam, timeBound: T }, c, flushBound };
}
