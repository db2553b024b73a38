/**
 * The one number grammar of crossbound/1, shared by the validator, the double builders (build.ts,
 * flatBuild.ts) and the exact readers of the oracles: rates, time bounds and tolerances are finite
 * JSON/YAML numbers or decimal strings
 *
 *     -? ( digits ( . digits? )? | . digits ) ( [eE] [-+]? digits )?
 *
 * such as "0.1", "2.5e-3", "1e+0", ".5" or "5.". Booleans, "Infinity", "NaN", hexadecimal, a leading
 * '+', whitespace and every other form are refused. The text means one real number: the double
 * solvers read it as its nearest double (`Number`, correctly rounded), the oracles read its digits
 * exactly (`readExact`, a decimal.js constructor, which never rounds). A text whose double
 * overflows is refused; so is a nonzero text that underflows to 0 in double precision (the fast
 * solvers would drop it while the oracles keep it). A number given as a number has the text
 * `String(n)` (its shortest round-trip decimal, which is in the grammar).
 */
import { Decimal } from 'decimal.js';

const BODY = '(?:[0-9]+(?:\\.[0-9]*)?|\\.[0-9]+)(?:[eE][-+]?[0-9]+)?';
/** A decimal string of the format. */
export const DECIMAL_TEXT = new RegExp(`^-?${BODY}$`);
/** The source of a YAML scalar that resolves to a number (YAML also allows a leading '+'). */
export const YAML_DECIMAL = new RegExp(`^[-+]?${BODY}$`);
const NONZERO_MANTISSA = /^-?[0-9.]*[1-9]/;

export type NumberCheck =
  | { ok: true; value: number; text: string }
  | { ok: false; reason: 'type' | 'finite' | 'underflow' };

/** Parse a number or decimal string into its nearest double and its exact text; does not check the sign. */
export function readDecimal(v: unknown): NumberCheck {
  if (typeof v === 'number') {
    if (!Number.isFinite(v)) return { ok: false, reason: 'finite' };
    return { ok: true, value: v, text: String(v) };
  }
  if (typeof v !== 'string' || !DECIMAL_TEXT.test(v)) return { ok: false, reason: 'type' };
  const value = Number(v);
  if (!Number.isFinite(value)) return { ok: false, reason: 'finite' };
  if (value === 0 && NONZERO_MANTISSA.test(v)) return { ok: false, reason: 'underflow' };
  return { ok: true, value, text: v };
}

/** True when `s` is a decimal string (the form required for exact reference values). */
export function isDecimalString(s: unknown): s is string {
  return typeof s === 'string' && DECIMAL_TEXT.test(s);
}

/**
 * The exact value of a decimal text in an arbitrary-precision type such as a decimal.js constructor
 * (whose string constructor keeps every digit, whatever its precision). Text outside the grammar is
 * refused with an Error rather than handed to a constructor that reads a wider grammar.
 */
export function readExact<T>(D: new (text: string) => T, text: string): T {
  if (!DECIMAL_TEXT.test(text)) throw new Error(`'${text}' is not a decimal text of the model format`);
  return new D(text);
}

/** Precision high enough that the sum of two texts the grammar admits in a model file is exact. */
const Exact = Decimal.clone({ precision: 1e9, toExpNeg: -7, toExpPos: 21 });

/**
 * The exact decimal sum of two texts of the grammar (repeated flat rows for one transition add up),
 * read back by `readDecimal`: its text and its nearest double, or `finite` when the sum overflows.
 * Exact: two texts within the file-size limit have a sum of far fewer than 10^9 significant digits.
 */
export function exactSum(a: string, b: string): NumberCheck {
  return readDecimal(readExact(Exact, a).plus(readExact(Exact, b)).toString());
}
