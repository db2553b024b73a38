/**
 * The one comparator of the harness. Two answers a and b disagree when, in some state s,
 *     |a_s − b_s| > bound_a + bound_b + 1e-15
 * (the 1e-15 absorbs the last-bit rounding of printing and reading doubles near 1). Every check and
 * every test compares through here, so the rule is written once.
 */

/** Allowance added to every comparison: one unit in the 15th decimal near 1 (doubles near 1 are spaced 2.2e-16). */
export const COMPARE_SLACK = 1e-15;

export interface Answer {
  readonly label: string;
  readonly values: ArrayLike<number>;
  readonly bound: number;
}

export interface Comparison {
  readonly a: string;
  readonly b: string;
  /** State index with the largest |difference| / allowed, −1 when there are no states. */
  readonly worstState: number;
  readonly difference: number;
  readonly allowed: number;
  /** max_s |a_s − b_s| / (bound_a + bound_b + slack); > 1 means a disagreement. */
  readonly ratio: number;
  readonly agree: boolean;
}

export function compareAnswers(a: Answer, b: Answer): Comparison {
  const allowed = a.bound + b.bound + COMPARE_SLACK;
  let worst = -1;
  let diff = 0;
  let nanSeen = false;
  for (let s = 0; s < a.values.length; s++) {
    const d = Math.abs(a.values[s]! - b.values[s]!);
    if (Number.isNaN(d)) {
      nanSeen = true;
      worst = s;
      diff = NaN;
      break;
    }
    if (worst < 0 || d > diff) {
      diff = d;
      worst = s;
    }
  }
  const ratio = nanSeen ? Infinity : diff / allowed;
  return { a: a.label, b: b.label, worstState: worst, difference: diff, allowed, ratio, agree: !nanSeen && diff <= allowed };
}

/** |value − reference| against a one-sided allowance (for `expect` values and the bound audit). */
export function withinTolerance(value: number, reference: number, allowed: number): boolean {
  return Math.abs(value - reference) <= allowed + COMPARE_SLACK;
}
