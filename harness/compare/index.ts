/**
 * The one comparator of the harness. Two answers a and b disagree when, in some state s,
 *     |a_s − b_s| > bound_a + bound_b + 1e-15
 * (the 1e-15 absorbs the last-bit rounding of printing and reading doubles near 1). One-sided forms
 * (a_s ≤ b_s within the bounds: monotone in T, dominance, the range [0, 1]) and the comparison with a
 * reference at some states (an `expect` value with its tolerance as its bound) use the same rule. Every
 * check and every test compares through here, so the rule is written once.
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
  /** State index with the largest difference (two-sided) or excess (one-sided), −1 when there are no states. */
  readonly worstState: number;
  /** Two-sided: max |a_s − b_s|; one-sided: max (a_s − b_s), which may be negative. NaN if a value is NaN. */
  readonly difference: number;
  readonly allowed: number;
  /** max(0, difference) / allowed; > 1 means a disagreement; Infinity for a NaN. */
  readonly ratio: number;
  readonly agree: boolean;
}

function compareBy(a: Answer, b: Answer, diffAt: (x: number, y: number) => number): Comparison {
  if (a.values.length !== b.values.length) {
    throw new RangeError(`cannot compare ${a.label} (${a.values.length} states) with ${b.label} (${b.values.length} states)`);
  }
  const allowed = a.bound + b.bound + COMPARE_SLACK;
  let worst = -1;
  let diff = -Infinity;
  for (let s = 0; s < a.values.length; s++) {
    const d = diffAt(a.values[s]!, b.values[s]!);
    if (Number.isNaN(d) || Number.isNaN(allowed)) {
      return { a: a.label, b: b.label, worstState: s, difference: NaN, allowed, ratio: Infinity, agree: false };
    }
    if (d > diff) [diff, worst] = [d, s];
  }
  if (worst < 0) diff = 0;
  return { a: a.label, b: b.label, worstState: worst, difference: diff, allowed, ratio: Math.max(0, diff) / allowed, agree: diff <= allowed };
}

/** |a_s − b_s| ≤ bound_a + bound_b + slack in every state. */
export function compareAnswers(a: Answer, b: Answer): Comparison {
  return compareBy(a, b, (x, y) => Math.abs(x - y));
}

/** a_s ≤ b_s + bound_a + bound_b + slack in every state (a is not larger than b beyond the bounds). */
export function compareAtMost(a: Answer, b: Answer): Comparison {
  return compareBy(a, b, (x, y) => x - y);
}

/** Every value in [0, 1] up to the answer's bound: the worse of a ≤ 1 and 0 ≤ a. */
export function compareRange(a: Answer): Comparison {
  const n = a.values.length;
  const above = compareAtMost(a, { label: '1', values: new Float64Array(n).fill(1), bound: 0 });
  const below = compareAtMost({ label: '0', values: new Float64Array(n), bound: 0 }, a);
  return below.ratio > above.ratio ? below : above;
}

/**
 * The answer against reference values at some states (`states[i]` has the value `values[i]`), the
 * reference's tolerance as its bound. `worstState` is an index into the answer's states.
 */
export function compareWithReference(a: Answer, ref: { label: string; states: readonly number[]; values: readonly number[]; tolerance: number }): Comparison {
  const c = compareAnswers(
    { label: a.label, values: ref.states.map((s) => a.values[s]!), bound: a.bound },
    { label: ref.label, values: ref.values, bound: ref.tolerance },
  );
  return { ...c, worstState: c.worstState < 0 ? -1 : ref.states[c.worstState]! };
}

