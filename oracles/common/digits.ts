/**
 * Confirmed digits and the honest error bound of an oracle answer.
 *
 * Digits are absolute decimal places (values lie in [0, 1]). With `ref` the more precise values,
 * `bound` a rigorous bound on |ref − true| and `diff` the largest disagreement with an independent
 * computation, c digits are confirmed when 2·max(bound, diff) ≤ 10^-c: then the decimal string of
 * ref rounded to c places is within 0.5·10^-c + bound ≤ 10^-c of the truth. The double nearest to
 * ref adds at most 2^-53·|ref|, so the reported errorBound is 10^-c + 2^-53·max|ref| (tiny margin).
 */
import type { Dec } from './decModel.js';

export function confirmedDigits(bound: number, diff: number, requested: number): number {
  const e = 2 * Math.max(bound, diff);
  if (!(e > 0)) return requested;
  return Math.max(0, Math.min(requested, Math.floor(-Math.log10(e) - 1e-12)));
}

export function errorBoundFor(confirmed: number, values: Float64Array): number {
  let vmax = 0;
  for (const v of values) vmax = Math.max(vmax, Math.abs(v));
  return 10 ** -confirmed * (1 + 1e-12) + vmax * 2 ** -53 * (1 + 1e-12) + 1e-300;
}

export function maxAbsDiff(a: readonly Dec[], b: readonly Dec[]): number {
  let d = 0;
  for (let i = 0; i < a.length; i++) d = Math.max(d, Math.abs(a[i]!.minus(b[i]!).toNumber()));
  return d;
}

/** The decimal string of v rounded to c places (no exponent notation). */
export function toDigits(v: Dec, c: number): string {
  return v.toFixed(c);
}

/** Valid requests: an integer number of digits in 1 … 300. */
export function badDigits(digits: number): string | undefined {
  if (!Number.isInteger(digits) || digits < 1 || digits > 300) return `digits must be an integer in 1 … 300, got ${digits}`;
  return undefined;
}

/** Below this many confirmed digits an oracle refuses instead of answering. */
export const MIN_DIGITS = 10;
