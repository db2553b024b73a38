/**
 * The whole path for rates written in every exponent form: loader, exact reader and oracle, through
 * the built command line (`solve MODEL --method oracle --precision 1e-30`). A single transition of
 * rate r into the goal is reached within T with probability 1 − e^{−rT}, the exponential
 * distribution function (S. M. Ross, Introduction to Probability Models; common practice), evaluated
 * here with decimal.js 10.6.0 at 60 digits.
 */
import { Decimal } from 'decimal.js';
import { describe, expect, test } from 'vitest';
import { crossbound, tempFile } from '../integration/cli.js';

const D = Decimal.clone({ precision: 60 });
const closedForm = (r: string, T: string): Decimal => new D(1).minus(new D(r).times(T).neg().exp());

function oracle(model: string, name: string): { digits: string; confirmed: number } {
  const r = crossbound(['solve', tempFile(name, model), '--method', 'oracle', '--precision', '1e-30', '--json']);
  expect(r.stderr).toBe('');
  expect(r.code).toBe(0);
  const res = JSON.parse(r.stdout);
  return { digits: res.values_decimal.a as string, confirmed: res.stats.digitsConfirmed as number };
}

describe('oracle on decimal-string rates in exponent form', () => {
  test.each([
    ['1e+0', '1', '2'],
    ['2.5E+1', '25', '2'],
    ['1e-0', '1', '2.0e+0'],
  ])('rate "%s" (= %s), T = %s: 30 digits of 1 − e^{−rT}', (text, value, T) => {
    const model = ['format: crossbound/1', `time_bound: "${T}"`, 'goal: [b]', 'states:', '  a:', '    actions:',
      `      go: { b: "${text}" }`, '  b: {}', ''].join('\n');
    const out = oracle(model, 'one-step.yaml');
    expect(out.confirmed).toBeGreaterThanOrEqual(30);
    expect(out.digits).toMatch(/^0\.\d{30}$/);
    // 30 digits after the point, rounded: within half a unit of the last digit, plus the oracle's own error.
    expect(new D(out.digits).minus(closedForm(value, T)).abs().lte('1e-30')).toBe(true);
  });

  test('flat rows "1e+0" and "1e-0" for one transition add up exactly to rate 2', () => {
    const model = JSON.stringify({ format: 'crossbound/1', time_bound: '1.5', goal: ['b'],
      transitions: [['a', 'go', 'b', '1e+0'], ['a', 'go', 'b', '1e-0']] });
    const out = oracle(model, 'flat.json');
    expect(out.confirmed).toBeGreaterThanOrEqual(30);
    expect(new D(out.digits).minus(closedForm('2', '1.5')).abs().lte('1e-30')).toBe(true);
  });
});
