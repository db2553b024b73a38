/**
 * Writing an exact decimal as rate text in the forms that format crossbound/1 accepts: plain digits,
 * an exponent with 'e' or 'E', with and without an explicit '+', a zero exponent written '-0', a
 * leading dot, and a JSON number. Every form denotes the same decimal exactly (the number form only
 * where the decimal has at most 15 significant digits, which a double round-trips), so the
 * high-precision oracles read the same value whichever form was drawn.
 */
import { Decimal } from 'decimal.js';

/** Significant digits kept by the decimals of the generators (far above double precision). */
export const Dec = Decimal.clone({ precision: 60, rounding: Decimal.ROUND_HALF_EVEN, toExpNeg: -9e15, toExpPos: 9e15 });
export type Dec = InstanceType<typeof Dec>;

export const TEXT_FORMS = ['plain', 'e', 'e+', 'E+', 'e-0', 'dot', 'number'] as const;
export type TextForm = (typeof TEXT_FORMS)[number];

/** Mantissa digits (no trailing zeros) and exponent n with x = 0.d₁d₂… × 10^(n+1) = d₁.d₂… × 10^n. */
function parts(x: Dec): { digits: string; exp: number } {
  const [m, e] = x.toExponential().split('e') as [string, string];
  return { digits: m.replace('.', '').replace(/0+$/, '') || '0', exp: Number(e) };
}

const mantissa = (digits: string): string => (digits.length > 1 ? `${digits[0]}.${digits.slice(1)}` : digits);
const signed = (n: number): string => (n < 0 ? `-${-n}` : `+${n}`);

/**
 * The text of x > 0 in the given form, e.g. 25 as "25", "2.5e1", "2.5e+1", "2.5E+1", "25e-0",
 * ".25e2", 25; 1 as "1e+0", "1e-0"; 0.5 as ".5".
 */
export function decimalText(x: Dec, form: TextForm): string | number {
  const { digits, exp } = parts(x);
  switch (form) {
    case 'plain':
      return x.toFixed();
    case 'e':
      return `${mantissa(digits)}e${exp}`;
    case 'e+':
      return `${mantissa(digits)}e${signed(exp)}`;
    case 'E+':
      return `${mantissa(digits)}E${signed(exp)}`;
    case 'e-0':
      return exp >= -20 && exp <= 20 ? `${x.toFixed()}e-0` : `${mantissa(digits)}e${exp}`;
    case 'dot':
      return exp + 1 === 0 ? `.${digits}` : `.${digits}e${exp + 1}`;
    case 'number':
      return digits.length <= 15 ? Number(x.toString()) : `${mantissa(digits)}e${signed(exp)}`;
  }
}
