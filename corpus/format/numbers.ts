/**
 * Reading rates, time bounds and tolerances: a finite JSON/YAML number, or a decimal string such as
 * "0.1" or "2.5e-3" (the high-precision oracles read the string's digits exactly). Booleans,
 * "Infinity", "NaN", hexadecimal and other forms are refused. A nonzero decimal that underflows to 0
 * in double precision is refused as well: the fast solvers would drop it while the oracles keep it.
 */

const DECIMAL = /^-?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][-+]?[0-9]+)?$/;
const NONZERO_MANTISSA = /^-?[0-9.]*[1-9]/;

export type NumberCheck = { ok: true; value: number; text: string } | { ok: false; reason: 'type' | 'finite' | 'underflow' };

/** Parse a number or decimal string; does not check the sign. */
export function readDecimal(v: unknown): NumberCheck {
  if (typeof v === 'number') {
    if (!Number.isFinite(v)) return { ok: false, reason: 'finite' };
    return { ok: true, value: v, text: String(v) };
  }
  if (typeof v !== 'string' || !DECIMAL.test(v)) return { ok: false, reason: 'type' };
  const value = Number(v);
  if (!Number.isFinite(value)) return { ok: false, reason: 'finite' };
  if (value === 0 && NONZERO_MANTISSA.test(v)) return { ok: false, reason: 'underflow' };
  return { ok: true, value, text: v };
}

/** True when `s` is a decimal string (the form required for exact reference values). */
export function isDecimalString(s: unknown): s is string {
  return typeof s === 'string' && DECIMAL.test(s);
}
