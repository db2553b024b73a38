/**
 * The one number grammar (corpus/format/numbers.ts): every string the validator accepts means one
 * real number to every reader. The exact reader (decimal.js 10.6.0, as the oracles use it) keeps its
 * digits; the double builders (build.ts, flatBuild.ts, also through the loader) give its nearest
 * double, ties to even. "Nearest double" is judged exactly: the double's binary value is expanded
 * into decimal with BigInt and compared with its two neighbours (IEEE 754-2019, roundTiesToEven;
 * common practice). Generators draw every exponent form, signs, leading zeros, long mantissas and
 * exponents near the overflow and underflow limits of double.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { loadModelText } from '../../../corpus/format/load.js';
import { DECIMAL_TEXT, exactSum, readDecimal, readExact } from '../../../corpus/format/numbers.js';
import { decimalAt, parseExact } from '../../../oracles/common/decModel.js';

const Big = Decimal.clone({ precision: 5000, toExpNeg: -9e15, toExpPos: 9e15 });
type Big = Decimal;

/** The exact value of a finite double m·2^e, as a decimal. */
function exactOfDouble(x: number): Big {
  if (x === 0) return new Big(0);
  const dv = new DataView(new ArrayBuffer(8));
  dv.setFloat64(0, Math.abs(x));
  const bits = dv.getBigUint64(0);
  const field = Number(bits >> 52n);
  const frac = bits & ((1n << 52n) - 1n);
  const m = field === 0 ? frac : frac | (1n << 52n);
  const e = (field === 0 ? 1 : field) - 1075;
  const v = e >= 0 ? new Big((m << BigInt(e)).toString()) : new Big(`${m * 5n ** BigInt(-e)}e-${-e}`);
  return x < 0 ? v.neg() : v;
}

/** The neighbouring double of a positive finite double; above the largest double, 2^1024 (where rounding overflows). */
function neighbour(x: number, up: boolean): Big {
  const dv = new DataView(new ArrayBuffer(8));
  dv.setFloat64(0, x);
  const bits = dv.getBigUint64(0);
  if (up && x === Number.MAX_VALUE) return new Big(2).pow(1024);
  if (!up && bits === 0n) return new Big(0);
  dv.setBigUint64(0, up ? bits + 1n : bits - 1n);
  return exactOfDouble(dv.getFloat64(0));
}

/** True when d is the double nearest to the real x (ties to the even significand). */
function isNearestDouble(x: Big, d: number): boolean {
  if (!Number.isFinite(d)) return false;
  if (x.isZero()) return d === 0;
  if (x.isNeg() !== (d < 0 || Object.is(d, -0))) return false;
  const ax = x.abs();
  const ad = Math.abs(d);
  const err = ax.minus(exactOfDouble(ad)).abs();
  const odd = ad !== 0 && (new DataView(new Float64Array([ad]).buffer).getUint8(0) & 1) === 1;
  for (const up of [true, false]) {
    if (!up && ad === 0) continue;
    const other = ax.minus(neighbour(ad, up)).abs();
    if (err.gt(other) || (err.eq(other) && odd)) return false;
  }
  return true;
}

const digits = (min: number, max: number): fc.Arbitrary<string> =>
  fc.array(fc.constantFrom(...'0123456789'), { minLength: min, maxLength: max }).map((a) => a.join(''));
const mantissaDigits = fc.oneof(
  { weight: 5, arbitrary: digits(1, 20) },
  { weight: 2, arbitrary: fc.tuple(digits(0, 6).map((z) => z.replace(/./g, '0')), digits(1, 25)).map(([z, d]) => z + d) },
  { weight: 1, arbitrary: digits(30, 800) },
);
/** Mantissa forms: "12", "12.", "12.5", ".5" (with leading zeros and long digit strings). */
const mantissa = fc.oneof(
  mantissaDigits,
  mantissaDigits.map((d) => `${d}.`),
  fc.tuple(mantissaDigits, mantissaDigits).map(([a, b]) => `${a}.${b}`),
  mantissaDigits.map((d) => `.${d}`),
);
/** Decimal exponent of the leading nonzero digit of a mantissa (0 when it has none). */
function leadExponent(m: string): number {
  const [int = '', frac = ''] = m.split('.');
  const i = int.replace(/^0+/, '');
  if (i !== '') return i.length - 1;
  const k = frac.search(/[1-9]/);
  return k < 0 ? 0 : -(k + 1);
}
/** The value's order of magnitude: ordinary, or near the overflow (~1.8e308) or underflow (~4.9e-324) limits. */
const magnitude = fc.oneof(
  { weight: 4, arbitrary: fc.integer({ min: -30, max: 30 }) },
  { weight: 2, arbitrary: fc.integer({ min: 300, max: 312 }) },
  { weight: 2, arbitrary: fc.integer({ min: -330, max: -300 }) },
  { weight: 1, arbitrary: fc.integer({ min: -400000, max: 400000 }) },
);
const exponentText = (e: number): fc.Arbitrary<string> =>
  fc.tuple(fc.constantFrom('e', 'E'), fc.boolean(), digits(0, 3).map((z) => z.replace(/./g, '0'))).map(
    ([mark, plus, zeros]) => `${mark}${e < 0 ? '-' : plus ? '+' : e === 0 ? '-' : ''}${zeros}${Math.abs(e)}`,
  );
/** A string of the grammar: sign, mantissa, and an exponent (or none) placing it at the drawn magnitude. */
const decimalText: fc.Arbitrary<string> = fc
  .tuple(fc.constantFrom('', '-'), mantissa, magnitude, fc.integer({ min: 0, max: 4 }))
  .chain(([sign, m, mag, form]) => {
    const e = mag - leadExponent(m);
    if (form === 0 && e === 0) return fc.constant(`${sign}${m}`);
    return exponentText(e).map((x) => `${sign}${m}${x}`);
  });
const fixedForms = fc.constantFrom('1e+0', '2.5E+1', '1e-0', '1E5', '.5', '5.', '-0', '007', '0.000', '0e999999',
  '1e308', '1.7976931348623157e308', '1.7976931348623158e308', '1.797693134862315807e308',
  '5e-324', '2.4703282292062328e-324', '2.4703282292062327e-324');

const rateObject = (rows: [string, string, string, string][]): Parameters<typeof buildModel>[0] => ({
  time_bound: 1, goal: [], transitions: rows,
});
const D60 = decimalAt(60);

describe('the one number grammar', () => {
  test('every accepted string is one real number: exact to decimal.js, its nearest double to the builders', () => {
    fc.assert(
      fc.property(fc.oneof(decimalText, fixedForms), (s) => {
        expect(DECIMAL_TEXT.test(s)).toBe(true);
        const exact = readExact(Big, s);
        const r = readDecimal(s);
        if (!r.ok) {
          // Refused only for its value: beyond the largest double, or nonzero and below the smallest.
          if (r.reason === 'finite') expect(exact.abs().gte(new Big(2).pow(1024).minus(new Big(2).pow(970)))).toBe(true);
          else expect(r.reason === 'underflow' && !exact.isZero() && Number(s) === 0).toBe(true);
          return;
        }
        expect(r.text).toBe(s);
        expect(Object.is(r.value, Number(s))).toBe(true);
        expect(isNearestDouble(exact, r.value)).toBe(true);
        // The oracles' reader (at any working precision) keeps every digit.
        expect(parseExact(D60, s).eq(exact)).toBe(true);
        if (r.value < 0) return;
        // The builders: one row, and a row repeated (their exact sum, to its nearest double).
        const one = buildModel(rateObject([['a', 'go', 'b', s]])).states[0]!.actions[0]!.successors[0]!;
        expect(one).toEqual({ target: 1, rate: r.value, rateText: s });
        const sum = exact.plus(exact);
        const twice = exactSum(s, s);
        if (!twice.ok) {
          expect(twice.reason).toBe('finite');
          return;
        }
        expect(DECIMAL_TEXT.test(twice.text)).toBe(true);
        expect(readExact(Big, twice.text).eq(sum)).toBe(true);
        expect(isNearestDouble(sum, twice.value)).toBe(true);
        const rows: [string, string, string, string][] = [['a', 'go', 'b', s], ['a', 'go', 'b', s]];
        const built = buildModel(rateObject(rows)).states[0]!.actions[0]!.successors[0]!;
        const json = JSON.stringify({ format: 'crossbound/1', time_bound: '1e+0', goal: [], transitions: rows });
        const loaded = loadModelText(json, 'sum.json').states[0]!.actions[0]!.successors[0]!;
        expect(built).toEqual({ target: 1, rate: twice.value, rateText: twice.text });
        expect(loaded).toEqual(built);
        expect(parseExact(D60, loaded.rateText).eq(sum)).toBe(true);
      }),
      { numRuns: 1500, seed: 20261202 },
    );
  });

  test('the nearest-double judge itself: it refuses a double one step away', () => {
    expect(isNearestDouble(new Big('0.1'), 0.1)).toBe(true);
    expect(isNearestDouble(new Big('0.1'), 0.1 + 2 ** -56)).toBe(false);
    // 2^-1075 lies halfway between 0 and the smallest subnormal: ties to even give 0.
    expect(isNearestDouble(new Big(2).pow(-1075), 0)).toBe(true);
    expect(isNearestDouble(new Big(2).pow(-1075), 5e-324)).toBe(false);
  });

  const outside = ['+1', ' 1', '1 ', '1e', 'e5', '.', '-.e1', '0x10', '0b1', 'Infinity', '-Infinity', 'NaN', '1_000',
    '1.2.3', '', '1e+', '--1', '١'];
  test.each(outside)(
    'outside the grammar, refused by the validator and by the exact reader alike: %j',
    (s) => {
      expect(readDecimal(s).ok).toBe(false);
      expect(() => readExact(Big, s)).toThrow(/not a decimal text/);
      expect(() => parseExact(D60, s)).toThrow(/not a decimal text/);
    },
  );

  test('the JSON Schema states the same grammar for non-negative decimal strings', () => {
    const schema = readFileSync(join(import.meta.dirname, '../../../corpus/format/model.schema.json'), 'utf8');
    const found = [...schema.matchAll(/"pattern": "(\^\(\?:\[0-9\][^"]*)"/g)];
    const patterns = found.map((m) => new RegExp(JSON.parse(`"${m[1]}"`), 'u'));
    expect(patterns.length).toBeGreaterThanOrEqual(3);
    const refused = ['+1', ' 1', '1e', 'e5', '.', '0x10', 'Infinity', 'NaN', '1_000', '1.2.3', '', '1e+', '-1'];
    for (const re of patterns) for (const r of refused) expect(re.test(r)).toBe(false);
    fc.assert(
      fc.property(fc.oneof(decimalText, fixedForms).filter((x) => !x.startsWith('-')), (x) => {
        for (const re of patterns) expect(re.test(x)).toBe(DECIMAL_TEXT.test(x));
      }),
      { numRuns: 500, seed: 20261202 },
    );
  });

  test('repeated flat rows whose exact sum overflows double are refused at the row, not built', () => {
    const rows = [['a', 'go', 'b', '1e308'], ['a', 'go', 'b', '1e308']];
    const json = JSON.stringify({ format: 'crossbound/1', time_bound: 1, goal: [], transitions: rows });
    const rule = /^over\.json:1:\d+: rate must be a finite number ≥ 0 \(the repeated rows/;
    expect(() => loadModelText(json, 'over.json')).toThrow(rule);
  });
});
