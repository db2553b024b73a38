/**
 * Exact fixed-point numbers for the oracles: a value x is the BigInt X with x = X / 2^P (P bits after
 * the binary point, the same P for a whole vector). Sums of such numbers are exact; a product with an
 * exact rational a/b is X·a/b truncated towards zero, whose error is below one unit 2^−P (BigInt
 * division truncates; common practice, no source). Rates and times enter as exact decimal rationals
 * (integer mantissa over a power of ten), read from the exact decimal.js values of decModel.ts.
 */
import type { Dec, DecCtor } from '../common/decModel.js';

/** An exact decimal rational m / 10^e (e ≥ 0). */
export interface DecRational {
  readonly m: bigint;
  readonly e: number;
}

/** The exact rational of a decimal.js value (its unrounded normal notation). */
export function rationalOf(x: Dec): DecRational {
  const text = x.toFixed();
  const neg = text.startsWith('-');
  const body = neg ? text.slice(1) : text;
  const dot = body.indexOf('.');
  const digits = dot < 0 ? body : body.slice(0, dot) + body.slice(dot + 1);
  const m = BigInt(digits);
  return { m: neg ? -m : m, e: dot < 0 ? 0 : body.length - dot - 1 };
}

export const pow10 = (e: number): bigint => 10n ** BigInt(e);

/** Fixed-point bits that hold `digits` decimal places: ⌈digits·log2(10)⌉. */
export function bitsForDigits(digits: number): number {
  return Math.ceil(digits * Math.log2(10));
}

/** The exact decimal value of X / 2^P as a decimal.js value (X·5^P / 10^P: a finite decimal). */
export function fixedToDec(D: DecCtor, X: bigint, P: number): Dec {
  const neg = X < 0n;
  const s = ((neg ? -X : X) * 5n ** BigInt(P)).toString().padStart(P + 1, '0');
  const text = `${neg ? '-' : ''}${s.slice(0, s.length - P)}.${s.slice(s.length - P)}`;
  return new D(text);
}

/** |X/2^P − Y/2^Q| as a double rounded up (a tiny relative margin), exactly from the integers. */
export function fixedDiff(X: bigint, P: number, Y: bigint, Q: number): number {
  const R = Math.max(P, Q);
  let d = X * 2n ** BigInt(R - P) - Y * 2n ** BigInt(R - Q);
  if (d < 0n) d = -d;
  return toDoubleScaled(d, R) * (1 + 1e-12);
}

/** D / 2^R as a double (nonnegative D), within a relative 1e-15. */
export function toDoubleScaled(d: bigint, R: number): number {
  if (d === 0n) return 0;
  const bits = d.toString(2).length;
  const shift = Math.max(0, bits - 60);
  return Number(d >> BigInt(shift)) * 2 ** (shift - R);
}

/** The exact dyadic form x = m·2^−k of a positive finite double (scaling by 2 is exact). */
export function dyadicOf(x: number): { m: bigint; k: number } {
  if (!(x > 0) || !Number.isFinite(x)) throw new Error(`dyadicOf: ${x} is not a positive finite number`);
  let y = x;
  let k = 0;
  while (y < 2 ** 52) { y *= 2; k++; }
  while (y >= 2 ** 53) { y /= 2; k--; }
  return { m: BigInt(y), k };
}
