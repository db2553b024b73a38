/**
 * A generator with exact integer entries: Q = Q_int / 10^E, with one decimal exponent E for the whole
 * model, built from the exact decimal rates of decModel.ts (nothing is rounded). Rows are kept in a
 * compressed sparse row form (typed arrays for the structure, BigInt for the entries: the entries
 * are exact integers of any size). `diag[i]` is the exact exit rate Σ_{j≠i} R(i,j) times 10^E.
 */
import type { DecAction, DecModel } from '../common/decModel.js';
import { pow10, rationalOf } from './numbers.js';

export interface IntGenerator {
  readonly n: number;
  /** Q = Q_int / 10^E. */
  readonly E: number;
  readonly rowStart: Int32Array;
  readonly col: Int32Array;
  readonly rate: readonly bigint[];
  /** Exit rate per state (integer, same scale); 0n for a state without an action. */
  readonly diag: readonly bigint[];
  /** Rows that move (exit rate > 0), the only ones a product has to visit. */
  readonly moving: Int32Array;
  /** An upper bound (double) on the largest exit rate: ‖Q‖∞ ≤ 2·maxExit. */
  readonly maxExit: number;
  /** Stored off-diagonal entries. */
  readonly nnz: number;
}

/** The common exponent of every rate of the model (so that every rate is an integer times 10^−E). */
export function commonExponent(dm: DecModel): number {
  let E = 0;
  for (const acts of dm.actions) for (const a of acts) for (const r of a.rate) E = Math.max(E, rationalOf(r).e);
  return E;
}

/** The generator of the rows chosen by `choice` (local action index per state, −1 for none). */
export function intGenerator(dm: DecModel, choice: Int32Array, E: number): IntGenerator {
  const n = dm.n;
  const rows: (DecAction | undefined)[] = dm.actions.map((acts, s) => (choice[s]! >= 0 ? acts[choice[s]!] : undefined));
  const rowStart = new Int32Array(n + 1);
  for (let s = 0; s < n; s++) rowStart[s + 1] = rowStart[s]! + (rows[s]?.target.length ?? 0);
  const nnz = rowStart[n]!;
  const col = new Int32Array(nnz);
  const rate: bigint[] = new Array(nnz);
  const diag: bigint[] = new Array(n).fill(0n);
  const moving: number[] = [];
  let maxExit = 0;
  for (let s = 0; s < n; s++) {
    const r = rows[s];
    if (!r || r.target.length === 0) continue;
    let sum = 0n;
    for (let q = 0; q < r.target.length; q++) {
      const x = rationalOf(r.rate[q]!);
      const v = x.m * pow10(E - x.e);
      col[rowStart[s]! + q] = r.target[q]!;
      rate[rowStart[s]! + q] = v;
      sum += v;
    }
    diag[s] = sum;
    if (sum > 0n) moving.push(s);
    maxExit = Math.max(maxExit, r.exitUpper);
  }
  return { n, E, rowStart, col, rate, diag, moving: Int32Array.from(moving), maxExit, nnz };
}

/** W = Q_int·X (exact integers, same scale as X): the sparse product, rows that move only. */
export function intMatVec(g: IntGenerator, X: readonly bigint[], W: bigint[]): void {
  W.fill(0n);
  const { rowStart, col, rate, diag, moving } = g;
  for (let k = 0; k < moving.length; k++) {
    const i = moving[k]!;
    let acc = -diag[i]! * X[i]!;
    for (let q = rowStart[i]!; q < rowStart[i + 1]!; q++) acc += rate[q]! * X[col[q]!]!;
    W[i] = acc;
  }
}

/** One action as an exact integer row (rates × 10^E). */
export interface IntRow {
  readonly col: Int32Array;
  readonly rate: readonly bigint[];
  readonly exit: bigint;
}

/** Every action of every state as an exact integer row. */
export function intRows(dm: DecModel, E: number): IntRow[][] {
  return dm.actions.map((acts) => acts.map((a) => {
    const rate = a.rate.map((r) => {
      const x = rationalOf(r);
      return x.m * pow10(E - x.e);
    });
    let exit = 0n;
    for (const r of rate) exit += r;
    return { col: a.target, rate, exit };
  }));
}

/** (q_a · X)·10^E = Σ R_int(s,a,s') X_{s'} − E_int(s,a) X_s, exactly. */
export function rowDot(row: IntRow, s: number, X: readonly bigint[]): bigint {
  let acc = -row.exit * X[s]!;
  for (let q = 0; q < row.col.length; q++) acc += row.rate[q]! * X[row.col[q]!]!;
  return acc;
}
