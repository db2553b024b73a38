/**
 * The uniformized matrix P = I + Q/λ of one piece of constant decisions, in CSR form, and the
 * fused kernel of uniformization: y = P x and acc += w · y in one pass.
 *
 * Per row s (the chosen action a of s, or none): diag[s] = 1 − E(s,a)/λ and the off-diagonal
 * entries R(s,a,s')/λ. A state without a chosen action, and a goal state in mode `within`, has
 * diag = 1 and no entries (it keeps its value). Rounding: each entry carries ≤ (nnz + 2)·u relative
 * to the exact P (the exit rate is a sum of nnz rates, then a division and a subtraction).
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import { UNIT_ROUNDOFF } from '../shared/numeric.js';

export interface PieceMatrix {
  readonly diag: Float64Array;
  readonly rowPtr: Int32Array;
  readonly col: Int32Array;
  readonly val: Float64Array;
  /** Uniformization rate: ≥ the exact exit rate of every chosen action (0 if nothing moves). */
  readonly lambda: number;
  /** Largest number of off-diagonal entries in a row. */
  readonly maxRowNnz: number;
}

/**
 * Build P for the chosen global action of every state (−1: none). `frozen[s]` = 1 forces state s
 * to keep its value. Reuses `buf` (sized for the whole model) when given.
 */
export function buildPieceMatrix(
  m: CompiledModel,
  chosen: Int32Array,
  frozen: Uint8Array,
  buf?: { col: Int32Array; val: Float64Array },
): PieceMatrix {
  const S = m.nStates;
  const { lambda, maxRowNnz } = pieceRate(m, chosen, frozen);
  const diag = new Float64Array(S);
  const rowPtr = new Int32Array(S + 1);
  const col = buf?.col ?? new Int32Array(m.nTransitions);
  const val = buf?.val ?? new Float64Array(m.nTransitions);
  let k = 0;
  for (let s = 0; s < S; s++) {
    rowPtr[s] = k;
    const a = chosen[s]!;
    if (a < 0 || frozen[s] === 1 || lambda === 0) {
      diag[s] = 1;
      continue;
    }
    diag[s] = 1 - m.exitRate[a]! / lambda;
    const j1 = m.rowStart[a + 1]!;
    for (let j = m.rowStart[a]!; j < j1; j++) {
      col[k] = m.col[j]!;
      val[k] = m.rate[j]! / lambda;
      k++;
    }
  }
  rowPtr[S] = k;
  return { diag, rowPtr, col, val, lambda, maxRowNnz };
}

/**
 * The uniformization rate of a piece and its largest row. The largest computed exit rate is
 * raised by the factor (1 + 2(d + 2)u): a computed exit rate (a sum of d rates) may fall short of
 * the exact one by d·u relative, and λ must be ≥ every exact exit rate for P to be stochastic.
 */
export function pieceRate(m: CompiledModel, chosen: Int32Array, frozen: Uint8Array): { lambda: number; maxRowNnz: number } {
  let maxExit = 0;
  let maxRowNnz = 0;
  for (let s = 0; s < m.nStates; s++) {
    const a = chosen[s]!;
    if (a < 0 || frozen[s] === 1) continue;
    if (m.exitRate[a]! > maxExit) maxExit = m.exitRate[a]!;
    const nnz = m.rowStart[a + 1]! - m.rowStart[a]!;
    if (nnz > maxRowNnz) maxRowNnz = nnz;
  }
  return { lambda: maxExit * (1 + 2 * (maxRowNnz + 2) * UNIT_ROUNDOFF), maxRowNnz };
}

/** y = P x. */
export function applyP(p: PieceMatrix, x: Float64Array, y: Float64Array): void {
  const { diag, rowPtr, col, val } = p;
  const S = diag.length;
  let j = 0;
  for (let s = 0; s < S; s++) {
    const end = rowPtr[s + 1]!;
    let acc = diag[s]! * x[s]!;
    for (; j < end; j++) acc += val[j]! * x[col[j]!]!;
    y[s] = acc;
  }
}

/** y = P x and sum += w · y, in one pass. */
export function applyPAccumulate(p: PieceMatrix, x: Float64Array, y: Float64Array, w: number, sum: Float64Array): void {
  const { diag, rowPtr, col, val } = p;
  const S = diag.length;
  let j = 0;
  for (let s = 0; s < S; s++) {
    const end = rowPtr[s + 1]!;
    let acc = diag[s]! * x[s]!;
    for (; j < end; j++) acc += val[j]! * x[col[j]!]!;
    y[s] = acc;
    sum[s] += w * acc;
  }
}
