/** JSON keys in one style (harness/jsonKeys.ts): snake_case out, both styles in, model names untouched. */
import { describe, expect, test } from 'vitest';
import { camelKey, snakeKey, toCamelKeys, toSnakeKeys } from '../../harness/jsonKeys.js';

describe('key style', () => {
  test.each([
    ['errorBound', 'error_bound'],
    ['lambdaT', 'lambda_t'],
    ['aPrioriBound', 'a_priori_bound'],
    ['valuesDecimal', 'values_decimal'],
    ['k2Bound', 'k2_bound'],
    ['seconds', 'seconds'],
  ])('%s ↔ %s', (camel, snake) => {
    expect(snakeKey(camel)).toBe(snake);
    expect(camelKey(snake)).toBe(camel);
    expect(camelKey(camel)).toBe(camel); // an old camelCase report reads as it is
  });
  test('nested objects and arrays are converted; the state names of a scheduler are not', () => {
    const report = {
      allowUnchecked: false,
      models: [{ stateNames: ['i0_0_P', 'gateOpen'], methods: [{ errorBound: 1e-6, scheduler: { choices: { gateOpen: [{ from: 0, action: 'waitHere' }], i0_0_P: [] } } }] }],
    };
    const snake = toSnakeKeys(report);
    expect(snake).toEqual({
      allow_unchecked: false,
      models: [{ state_names: ['i0_0_P', 'gateOpen'], methods: [{ error_bound: 1e-6, scheduler: { choices: { gateOpen: [{ from: 0, action: 'waitHere' }], i0_0_P: [] } } }] }],
    });
    expect(toCamelKeys(snake)).toEqual(report);
    expect(toCamelKeys(report)).toEqual(report);
  });
});
