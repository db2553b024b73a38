/**
 * Keys of YAML mappings: the loader's own duplicate-key check (one set per mapping) finds a repeated
 * key deep inside a large model at its line and column, treats keys that become the same property
 * (`1` and "1") as the same key, refuses keys that are not scalars, and keeps a state called
 * `__proto__` as an ordinary state. Positions are counted by hand from the generated text; the
 * large cases are sized by work (20,000 states), with no timing assertion.
 */
import { describe, expect, test } from 'vitest';
import { loadModelText, type ModelError } from '../../../corpus/format/load.js';
import { errorOf as errorIn } from '../../helpers/modelErrors.js';

const errorOf = (text: string, file = 'big.yaml'): ModelError => errorIn(text, file);
import { MAX_YAML_BYTES, MAX_YAML_NODES, scanYaml } from '../../../corpus/format/limits.js';

const HEAD = ['format: crossbound/1', 'time_bound: 1', 'goal: [s0]', 'states:'];
const N = 20_000;

/** A model of N states in block YAML, 4 lines per state after the 4 head lines; `edit` may change lines. */
function bigModel(edit: (lines: string[]) => void = () => {}): string {
  const lines = [...HEAD];
  for (let s = 0; s < N; s++) {
    const a = `s${(s * 7 + 1) % N}`;
    const b = `s${(s * 7 + 2) % N}`;
    lines.push(`  s${s}:`, `    owner: ${s % 2 ? 'min' : 'max'}`, '    actions:', `      go: { ${a}: 0.5, ${b}: 1.25 }`);
  }
  edit(lines);
  return `${lines.join('\n')}\n`;
}
/** 1-based line of the state line of state s, and of its `go` action. */
const stateLine = (s: number): number => HEAD.length + 4 * s + 1;

const where = (e: ModelError): { line?: number; column?: number; rule: string } =>
  ({ line: e.line, column: e.column, rule: e.rule });


describe('duplicate keys in a YAML model of 20,000 states', () => {
  test('the model without duplicates loads', () => {
    expect(loadModelText(bigModel(), 'big.yaml').states.length).toBe(N);
  });
  test('a repeated successor deep inside (state 17,345) is refused at the second key', () => {
    const s = 17_345;
    const text = bigModel((l) => {
      l[stateLine(s) + 2] = '      go: { s3: 0.5, s9: 1, s3: 2 }';
    });
    const e = errorOf(text);
    expect(where(e)).toEqual({ line: stateLine(s) + 3, column: 29, rule: 'duplicate key' });
    expect(e.message).toBe(`big.yaml:${stateLine(s) + 3}:29: duplicate key: key "s3" appears twice in this mapping`);
  });
  test('a state declared twice (the second near the end) is refused at the second declaration', () => {
    const s = 19_990;
    const text = bigModel((l) => {
      l[stateLine(s) - 1] = '  s12:';
    });
    const e = errorOf(text);
    expect(where(e)).toEqual({ line: stateLine(s), column: 3, rule: 'duplicate key' });
  });
  test('an action repeated in block style is refused at the repeated action', () => {
    const s = 9_999;
    const text = bigModel((l) => {
      l[stateLine(s) + 2] = `      go: { s1: 1 }\n      wait: { s2: 1 }\n      go: { s3: 1 }`;
    });
    const e = errorOf(text);
    expect(where(e)).toEqual({ line: stateLine(s) + 5, column: 7, rule: 'duplicate key' });
  });
});

describe('keys of a small YAML model', () => {
  const small = (...states: string[]): string => [...HEAD, ...states, ''].join('\n');
  test('keys that become the same property are the same key: 1 and "1"', () => {
    const e = errorOf(small('  s0:', '    actions:', '      go: { s0: 1 }', '  1: {}', '  "1": {}'), 'k.yaml');
    expect(where(e)).toEqual({ line: 9, column: 3, rule: 'duplicate key' });
  });
  test('a key that is a collection is refused', () => {
    const e = errorOf(small('  s0: {}', '  ? [a, b]', '  : {}'), 'k.yaml');
    expect(where(e)).toEqual({ line: 6, column: 5, rule: 'mapping keys must be scalars' });
  });
  test('a state called __proto__ is an ordinary state, in YAML and in JSON', () => {
    const y = loadModelText(small('  s0:', '    actions:', '      go: { __proto__: 2 }', '  __proto__: {}'), 'p.yaml');
    const json = '{"format":"crossbound/1","time_bound":1,"goal":["s0"],'
      + '"states":{"s0":{"actions":{"go":{"__proto__":2}}},"__proto__":{}}}';
    const j = loadModelText(json, 'p.json');
    for (const m of [y, j]) {
      expect(m.states.map((s) => s.name)).toEqual(['s0', '__proto__']);
      expect(m.states[0]!.actions[0]!.successors).toEqual([{ target: 1, rate: 2, rateText: '2' }]);
    }
  });
  test('a dense YAML list over the node budget is refused before it is parsed', () => {
    // Two bytes per node: well under the byte limit, over the node budget (about 1 KB each when parsed).
    const text = `goal: [${'0,'.repeat(MAX_YAML_NODES)}0]\n`;
    expect(text.length).toBeLessThan(MAX_YAML_BYTES);
    const e = errorOf(text, 'dense.yaml');
    const rule = `YAML input has more than the limit of ${MAX_YAML_NODES} nodes`;
    expect(where(e)).toEqual({ line: 1, column: 1, rule });
  });
  test('the node estimate counts at least one per key, value or item of the model shapes', () => {
    // The 20,000-state model: per state 6 keys, 3 scalar values and 3 mappings, 12 nodes.
    const n = scanYaml(bigModel(), 64).nodes;
    expect(n).toBeGreaterThanOrEqual(N * 12);
    expect(n).toBeLessThan(MAX_YAML_NODES);
    // Nodes below the root: a, [..], 1, 2, {..}, b, 3, c, x.
    expect(scanYaml('a: [1, 2, {b: 3}]\nc: x\n', 64).nodes).toBeGreaterThanOrEqual(9);
  });
  test('a YAML text over the byte limit is refused before it is parsed', () => {
    const text = `${small('  s0: {}')}#${'x'.repeat(MAX_YAML_BYTES)}\n`;
    const e = errorOf(text, 'huge.yaml');
    expect(e.rule).toMatch(/^YAML input is larger than the limit of \d+ MiB$/);
  });
});
