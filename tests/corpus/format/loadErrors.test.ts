/**
 * Every rule of crossbound/1: each bad input is refused with a ModelError whose line, column and
 * rule are checked (positions counted by hand in the texts below).
 */
import { describe, expect, test } from 'vitest';
import type { ModelError } from '../../../corpus/format/load.js';
import { errorOf as errorIn } from '../../helpers/modelErrors.js';

const errorOf = (text: string, file = 'm.yaml'): ModelError => errorIn(text, file);

const HEAD = ['format: crossbound/1', 'time_bound: 1', 'goal: [b]'];
const yaml = (...lines: string[]): string => `${lines.join('\n')}\n`;
/** A valid model with the given lines for its `states`. */
const withStates = (...lines: string[]): string => yaml(...HEAD, 'states:', ...lines);


function expectError(text: string, line: number, column: number, rule: string, file = 'm.yaml'): ModelError {
  const e = errorOf(text, file);
  expect({ line: e.line, column: e.column, rule: e.rule }).toEqual({ line, column, rule });
  expect(e.message.startsWith(`${file}:${line}:${column}: ${rule}`)).toBe(true);
  expect(e.message).not.toContain('\n');
  return e;
}

describe('top level', () => {
  test('empty file and whitespace-only file', () => {
    expectError('', 1, 1, 'file is empty');
    expectError('  \n\n', 1, 1, 'file is empty');
  });
  test('a model must be a mapping', () => {
    expectError('- a\n- b\n', 1, 1, 'a model must be a mapping');
  });
  test('unknown key at the top', () => {
    const e = expectError(yaml(...HEAD, 'colour: red', 'states: {b: {}}'), 4, 1, 'unknown key');
    expect(e.message).toContain("'colour'");
  });
  test('format missing or wrong', () => {
    expectError(yaml('time_bound: 1', 'goal: []', 'states: {b: {}}'), 1, 1, 'format must be crossbound/1');
    expectError(yaml('format: crossbound/2', 'time_bound: 1', 'goal: []', 'states: {b: {}}'), 1, 9, 'format must be crossbound/1');
  });
  test('name and description must be strings', () => {
    expectError(yaml(...HEAD, 'name: 5', 'states: {b: {}}'), 4, 7, 'name must be a string');
    expectError(yaml(...HEAD, 'description: [a]', 'states: {b: {}}'), 4, 14, 'description must be a string');
  });
  test('exactly one of states, transitions, generate', () => {
    expectError(yaml(...HEAD), 1, 1, 'exactly one of states, transitions, generate must be given');
    expectError(yaml(...HEAD, 'states: {b: {}}', 'transitions: [[b, x, b, 1]]'), 5, 1, 'exactly one of states, transitions, generate must be given');
  });
  test('time bound missing, zero, negative, infinite, not a number', () => {
    expectError(yaml('format: crossbound/1', 'goal: [b]', 'states: {b: {}}'), 1, 1, 'time_bound is required');
    for (const bad of ['0', '-1', '"0"', 'abc', 'true', '"Infinity"']) {
      expectError(yaml('format: crossbound/1', `time_bound: ${bad}`, 'goal: [b]', 'states: {b: {}}'), 2, 13, 'time_bound must be a finite number > 0');
    }
    expectError(yaml('format: crossbound/1', 'time_bound: .inf', 'goal: [b]', 'states: {b: {}}'), 2, 13, 'numbers must be finite and written in decimal');
  });
  test('goal missing, not a list, naming an unknown state', () => {
    expectError(yaml('format: crossbound/1', 'time_bound: 1', 'states: {b: {}}'), 1, 1, 'goal is required');
    expectError(yaml('format: crossbound/1', 'time_bound: 1', 'goal: b', 'states: {b: {}}'), 3, 7, 'goal must be a list of state names');
    expectError(yaml('format: crossbound/1', 'time_bound: 1', 'goal: [b, zz]', 'states: {b: {}}'), 3, 11, 'goal must name declared states');
  });
  test('goal_mode within or at', () => {
    expectError(yaml(...HEAD, 'goal_mode: before', 'states: {b: {}}'), 4, 12, 'goal_mode must be within or at');
  });
  test('initial must name a declared state', () => {
    expectError(yaml(...HEAD, 'initial: q', 'states: {b: {}}'), 4, 10, 'initial must name a declared state');
  });
});

describe('states form', () => {
  test('state and action names', () => {
    expectError(withStates('  b: {}', '  9lives: {}'), 6, 3, 'state and action names must match [A-Za-z_][A-Za-z0-9_.-]*');
    expectError(withStates('  b:', '    actions:', '      "go now": {b: 1}'), 7, 7, 'state and action names must match [A-Za-z_][A-Za-z0-9_.-]*');
  });
  test('unknown key in a state', () => {
    expectError(withStates('  b:', '    colour: red'), 6, 5, 'unknown key');
  });
  test('rates: negative, boolean, Infinity, NaN, hex (string and YAML number), underflow', () => {
    const at = (r: string): string => withStates('  a:', '    actions:', `      go: {b: ${r}}`, '  b: {}');
    expectError(at('-1'), 7, 15, 'rate must be a finite number ≥ 0');
    expectError(at('true'), 7, 15, 'rate must be a finite number ≥ 0');
    expectError(at('"Infinity"'), 7, 15, 'rate must be a finite number ≥ 0');
    expectError(at('"NaN"'), 7, 15, 'rate must be a finite number ≥ 0');
    expectError(at('"0x1F"'), 7, 15, 'rate must be a finite number ≥ 0');
    expectError(at('"-0.5"'), 7, 15, 'rate must be a finite number ≥ 0');
    expectError(at('"1e-400"'), 7, 15, 'rate must be a finite number ≥ 0');
    expectError(at('0x1F'), 7, 15, 'numbers must be finite and written in decimal');
    expectError(at('.nan'), 7, 15, 'numbers must be finite and written in decimal');
    expectError(at('1e999'), 7, 15, 'rate must be a finite number ≥ 0');
  });
  test('unknown successor', () => {
    expectError(withStates('  a:', '    actions:', '      go: {b: 1, c: 2}', '  b: {}'), 7, 18, 'successor must name a declared state');
  });
  test('duplicate state (YAML) and duplicate action', () => {
    expectError(withStates('  b: {}', '  b: {}'), 6, 3, 'duplicate key');
    expectError(withStates('  b:', '    actions:', '      go: {b: 1}', '      go: {b: 2}'), 8, 7, 'duplicate key');
  });
  test('duplicate key in JSON', () => {
    const text = '{"format": "crossbound/1", "time_bound": 1, "goal": [],\n "states": {"b": {}, "b": {}}}';
    expectError(text, 2, 22, 'duplicate key', 'm.json');
  });
  test('two actions and no owner; owner other than max/min', () => {
    const two = (owner: string): string => withStates('  b:', ...(owner ? [`    owner: ${owner}`] : []), '    actions:', '      x: {b: 1}', '      y: {b: 2}');
    expectError(two(''), 8, 7, 'a state with two or more actions needs an owner');
    expectError(two('maxi'), 6, 12, 'owner must be max or min');
  });
});

describe('flat form', () => {
  const flat = (...lines: string[]): string => yaml(...HEAD, ...lines);
  test('rows of width 4 with the right types', () => {
    expectError(flat('transitions:', '  - [a, go, b]'), 5, 5, 'a row must be a list [state, action, successor, rate]');
    expectError(flat('transitions:', '  - [a, 7, b, 1]'), 5, 9, 'state and action names must match [A-Za-z_][A-Za-z0-9_.-]*');
    expectError(flat('transitions:', '  - [a, go, b, -2]'), 5, 16, 'rate must be a finite number ≥ 0');
    expectError(flat('transitions: {a: b}'), 4, 14, 'transitions must be a list of rows [state, action, successor, rate]');
    expectError(flat('transitions: []'), 4, 14, 'a model needs at least one state');
  });
  test('owners name states of the rows, max or min; needed for two actions', () => {
    expectError(flat('transitions: [[a, go, b, 1]]', 'owners: {zz: max}'), 5, 10, 'owners must name states that appear in the rows');
    expectError(flat('transitions: [[a, go, b, 1]]', 'owners: {a: mid}'), 5, 13, 'owner must be max or min');
    expectError(flat('transitions:', '  - [a, go, b, 1]', '  - [a, stay, a, 1]'), 6, 9, 'a state with two or more actions needs an owner');
    expectError(yaml(...HEAD, 'states: {b: {}}', 'owners: {b: max}'), 5, 1, 'owners belongs to the transitions form');
  });
});

describe('expect', () => {
  const exp = (...lines: string[]): string => yaml(...HEAD, 'states: {b: {}}', 'expect:', ...lines);
  test('unknown key, missing parts', () => {
    expectError(exp('  values: {b: "1"}', '  tolerance: 0', '  source: x', '  note: y'), 9, 3, 'unknown key');
    expectError(exp('  values: {b: "1"}', '  source: x'), 5, 1, 'expect needs values, tolerance and source');
  });
  test('values: decimal strings in [0, 1] naming declared states', () => {
    expectError(exp('  values: {b: 1}', '  tolerance: 0', '  source: x'), 6, 15, 'expected values must be decimal strings (quoted)');
    expectError(exp('  values: {b: "1.5"}', '  tolerance: 0', '  source: x'), 6, 15, 'expected values must be probabilities in [0, 1]');
    expectError(exp('  values: {q: "0.5"}', '  tolerance: 0', '  source: x'), 6, 12, 'expect.values must name declared states');
  });
  test('tolerance ≥ 0 and a non-empty source', () => {
    expectError(exp('  values: {b: "1"}', '  tolerance: -1', '  source: x'), 7, 14, 'tolerance must be a finite number ≥ 0');
    expectError(exp('  values: {b: "1"}', '  tolerance: 0', '  source: ""'), 8, 11, 'source must name where the expected values come from');
    expectError(exp('  values: {b: "1"}', '  tolerance: 0', '  source: 3'), 8, 11, 'source must be a string');
  });
});

describe('syntax and resource limits', () => {
  test('JSON syntax errors are located', () => {
    expectError('{"format": "crossbound/1",\n  "goal": [],\n}', 3, 1, 'JSON syntax error', 'm.json');
    expectError('{"format": "crossbound/1" "goal": []}', 1, 27, 'JSON syntax error', 'm.json');
    expectError('{"a": "x\ty"}', 1, 9, 'JSON syntax error', 'm.json');
  });
  test('YAML syntax errors, unknown tags and several documents are refused', () => {
    // An unclosed flow mapping is noticed at the end of the input.
    expectError(yaml(...HEAD, 'states: {b: {}', ''), 6, 1, 'YAML syntax error');
    expectError(yaml(...HEAD, 'name: !secret x', 'states: {b: {}}'), 4, 7, 'YAML syntax error');
    expect(errorOf(yaml(...HEAD, 'states: {b: {}}', '---', 'a: 1')).rule).toBe('YAML syntax error');
  });
  test('deep nesting is refused without a stack overflow', () => {
    expectError(`${'['.repeat(100_000)}1`, 1, 65, 'nesting too deep');
    expectError(`{"a": ${'['.repeat(100_000)}1`, 1, 70, 'nesting too deep', 'm.json');
    const block = Array.from({ length: 1200 }, (_, i) => `${' '.repeat(i)}k${i}:`).join('\n');
    expect(errorOf(block).rule).toBe('nesting too deep');
  });
  test('a YAML alias bomb is refused', () => {
    const lines = ['a0: &a0 [x, x, x, x, x, x, x, x, x, x]'];
    for (let i = 1; i < 10; i++) lines.push(`a${i}: &a${i} [${Array(10).fill(`*a${i - 1}`).join(', ')}]`);
    expect(errorOf(yaml(...lines)).rule).toBe('too many YAML alias expansions');
  });
});
