/**
 * A dense solution as a solver may hand it out, step by step, for an a-posteriori certificate
 * (solvers/defect/certificate.ts): on each step of length h, every state's value is one polynomial of
 * the time left since the step's start, of a common degree. Nothing about how the polynomials were
 * made is assumed by the certificate; a solver only reports what it computed.
 *
 * emitPieces turns an interval of the k-step scheme — per state a continuous piecewise polynomial with
 * its own breakpoints — into steps: the interval is cut at the union of all breakpoints, and on each
 * cut every state's piece is re-expanded around the cut's start (a Taylor shift by Horner's scheme,
 * common practice, no source). The shifted coefficients are rounded, so the shifted f is not exactly
 * the scheme's f; the certificate certifies the f it is given (and charges the jumps this leaves at the
 * cuts), so the bound stays rigorous for the values it reports.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import { mergeBreaks, pieceAt, pieceCount, type Piecewise } from '../piecewise/piecewise.js';

export interface DenseSink {
  /**
   * Called once, before any step: the model in the steps' time unit (a solver that scales time by a
   * power of two passes its scaled copy), the common degree, and the bound on the change of any value
   * caused by rates flushed to subnormal or zero by that scaling (0 when none).
   */
  begin(m: CompiledModel, degree: number, flushBound: number): void;
  /** One step: f_s(t_i + τ) = Σ_{j≤degree} coef[j·S + s] τ^j on [0, h]. coef may be reused after the call. */
  step(h: number, coef: Float64Array): void;
}

/**
 * One interval of length len as steps into `sink`: c_j(s) at coef[j·S + s] for the states with one
 * polynomial on [0, len] (degree ≤ K), and pieces.get(s) for the states with a piecewise function on
 * [0, len] (coefficients in the interval's own variable τ, stride ≥ K + 1).
 */
export function emitPieces(sink: DenseSink, len: number, coef: Float64Array, pieces: ReadonlyMap<number, Piecewise>, K: number): void {
  if (pieces.size === 0) {
    sink.step(len, coef);
    return;
  }
  const S = coef.length / (K + 1);
  const multi = [...pieces.values()].filter((p) => pieceCount(p) > 1).map((p) => p.breaks);
  const cuts = multi.length === 0 ? Float64Array.of(0, len) : mergeBreaks([Float64Array.of(0, len), ...multi]);
  const out = new Float64Array(coef.length);
  const q = new Float64Array(K + 1);
  for (let c = 0; c + 1 < cuts.length; c++) {
    const b = cuts[c]!;
    const h = cuts[c + 1]! - b;
    const mid = b + 0.5 * h;
    for (let s = 0; s < S; s++) {
      const p = pieces.get(s);
      if (p) {
        const off = pieceAt(p, mid) * p.stride;
        for (let j = 0; j <= K; j++) q[j] = j < p.stride ? p.coef[off + j]! : 0;
      } else {
        for (let j = 0; j <= K; j++) q[j] = coef[j * S + s]!;
      }
      // Taylor shift to the cut's start: q(τ) ← q(b + τ), by repeated synthetic division.
      if (b !== 0) for (let i = 0; i < K; i++) for (let j = K - 1; j >= i; j--) q[j] += b * q[j + 1]!;
      for (let j = 0; j <= K; j++) out[j * S + s] = q[j]!;
    }
    sink.step(h, out);
  }
}
