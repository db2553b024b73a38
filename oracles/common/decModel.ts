/**
 * The model read exactly into decimal arithmetic, for the high-precision oracles.
 *
 * Every rate and the time bound are read from their exact decimal text (`rateText`, `timeBoundText`)
 * by the one number grammar of corpus/format/numbers.ts, the grammar the loader checked. Reading is
 * exact: a decimal.js string constructor never rounds. Only the exit rates E(s,a) = Σ_{s'≠s} R(s,a,s')
 * are rounded, with relative error ≤ m·u (m terms, unit roundoff u = 5·10^-p at p significant
 * digits), which the callers fold into their a priori bounds.
 *
 * Self-loops and zero rates are dropped: a rate from s to s multiplies v_s − v_s = 0 in the Bellman
 * right-hand side. In goal mode `within` goal states are made absorbing (no actions) and the
 * terminal vector is the goal indicator in both modes.
 *
 * Nothing here is shared with the fast solvers: the oracles must stay an independent computation.
 */
import { Decimal } from 'decimal.js';
import { readExact } from '../../corpus/format/numbers.js';
import type { Model } from '../../corpus/format/types.js';

export type Dec = Decimal;
export type DecCtor = Decimal.Constructor;

/** One action as a sparse generator row: successors, their rates, and the exit rate. */
export interface DecAction {
  readonly name: string;
  readonly target: Int32Array;
  readonly rate: readonly Dec[];
  readonly exit: Dec;
  /** An upper bound on the exit rate as a double (for choosing step sizes, never for values). */
  readonly exitUpper: number;
}

export interface DecModel {
  readonly D: DecCtor;
  /** Significant digits of D. */
  readonly precision: number;
  /** Unit roundoff of D: 5·10^-precision (round half up). */
  readonly u: number;
  readonly n: number;
  /** Per state; empty for absorbing states and, in mode `within`, goal states. */
  readonly actions: readonly (readonly DecAction[])[];
  /** +1 max, −1 min, 0 for states with fewer than two (effective) actions. */
  readonly sign: Int8Array;
  /** The terminal vector v(0) = [s ∈ G]. */
  readonly terminal: readonly Dec[];
  /** Largest exit rate (upper bound, double). */
  readonly maxExit: number;
  /** Largest number of successors of an action. */
  readonly maxRow: number;
}

/** A Decimal constructor of its own at `precision` significant digits (independent of others). */
export function decimalAt(precision: number): DecCtor {
  return Decimal.clone({ precision, rounding: Decimal.ROUND_HALF_UP, toExpNeg: -9e15, toExpPos: 9e15 });
}

/** Exact value of a decimal text such as "0.1", "3e-4" or "1e+0" (refused outside the model grammar). */
export function parseExact(D: DecCtor, text: string): Dec {
  return readExact(D, text);
}

export function decModel(model: Model, D: DecCtor): DecModel {
  const n = model.states.length;
  const precision = D.precision;
  const goal = new Uint8Array(n);
  for (const g of model.goal) goal[g] = 1;
  const actions: DecAction[][] = [];
  const sign = new Int8Array(n);
  let maxExit = 0;
  let maxRow = 0;
  model.states.forEach((st, s) => {
    const acts: DecAction[] = [];
    if (!(model.goalMode === 'within' && goal[s])) {
      for (const a of st.actions) {
        const target: number[] = [];
        const rate: Dec[] = [];
        let exit = new D(0);
        let exitUpper = 0;
        for (const t of a.successors) {
          if (t.target === s) continue;
          const r = parseExact(D, t.rateText);
          if (r.isZero()) continue;
          target.push(t.target);
          rate.push(r);
          exit = exit.plus(r);
          exitUpper += t.rate;
        }
        exitUpper = exitUpper * (1 + 1e-12) + 1e-300;
        if (exitUpper > maxExit) maxExit = exitUpper;
        if (target.length > maxRow) maxRow = target.length;
        acts.push({ name: a.name, target: Int32Array.from(target), rate, exit, exitUpper });
      }
    }
    actions.push(acts);
    if (acts.length >= 2) sign[s] = st.owner === 'min' ? -1 : 1;
  });
  const terminal = Array.from({ length: n }, (_, s) => new D(goal[s]!));
  return { D, precision, u: 5 * 10 ** -precision, n, actions, sign, terminal, maxExit, maxRow };
}

/** q_a · v = Σ R(s,a,s') v_{s'} − E(s,a) v_s: the generator row of action a applied to v. */
export function rowTimes(a: DecAction, s: number, v: readonly Dec[]): Dec {
  let acc = a.exit.times(v[s]!).neg();
  for (let i = 0; i < a.target.length; i++) acc = acc.plus(a.rate[i]!.times(v[a.target[i]!]!));
  return acc;
}

/** True when two actions of one state have the same generator row (a tie that is never a switch). */
export function sameRow(a: DecAction, b: DecAction): boolean {
  if (a.target.length !== b.target.length) return false;
  const m = new Map<number, Dec>();
  for (let i = 0; i < a.target.length; i++) m.set(a.target[i]!, a.rate[i]!);
  for (let i = 0; i < b.target.length; i++) {
    const r = m.get(b.target[i]!);
    if (r === undefined || !r.eq(b.rate[i]!)) return false;
  }
  return true;
}
