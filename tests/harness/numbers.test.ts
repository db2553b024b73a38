import { describe, expect, it } from 'vitest';
import { formatError, formatPrecision, formatScalar, formatSeconds, formatValue } from '../../harness/numbers.js';

// One formatter for every message and table: the forms below are the tool's own convention.
describe('numbers: one way to write each kind of number', () => {
  it.each([
    [0.26370426758980137, '0.2637042676'],
    [0.00002420721374940398, '0.00002420721375'],
    [6.249993076965756e-10, '6.249993077e-10'],
    [1, '1.000000000'],
    [0, '0'],
  ])('value %s → %s', (x, shown) => expect(formatValue(x)).toBe(shown));

  it.each([
    [0.00002420721374940398, '2.42e-5'],
    [6.249993076965756e-10, '6.25e-10'],
    [1e6, '1.00e6'],
    [0, '0'],
    [Infinity, 'inf'],
  ])('error %s → %s', (x, shown) => expect(formatError(x)).toBe(shown));

  it.each([[1e-6, '1e-6'], [2.5e-7, '2.5e-7'], [1e21, '1e21']])('precision %s → %s', (p, shown) => {
    expect(formatPrecision(p)).toBe(shown);
    expect(Number(formatPrecision(p))).toBe(p); // reads back as the same double
  });

  it.each([[10.0004, '10'], [0.5, '0.5'], [2e7, '2.00e7'], [1.23456e-5, '1.23e-5']])('scalar %s → %s', (x, shown) => expect(formatScalar(x)).toBe(shown));

  it.each([[0.031, '0.0310 s'], [12.34, '12.3 s'], [123.4, '2 min 03 s'], [3725, '1 h 02 min 05 s']])('seconds %s → %s', (s, shown) => expect(formatSeconds(s)).toBe(shown));

  it('no value form is a raw double of more than 10 significant digits', () => {
    for (const x of [Math.PI / 7, 1 / 3, 2 ** -40, 0.1 + 0.2]) expect(formatValue(x).replace(/e.*$/, '').replace(/^0\.0*/, '').replace('.', '').length).toBeLessThanOrEqual(10);
  });
});
