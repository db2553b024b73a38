/**
 * Good inputs load to the expected model; warnings are returned; the generated form resolves
 * with positioned parameter errors; the file size limit is checked before reading.
 */
import { mkdtempSync, rmSync, truncateSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Decimal } from 'decimal.js';
import { afterAll, describe, expect, test } from 'vitest';
import { loadModelFile, loadModelFileWithWarnings, loadModelText, loadModelTextWithWarnings, ModelError } from '../../../corpus/format/load.js';
import { MAX_FILE_BYTES } from '../../../corpus/format/limits.js';

const FIX = join(import.meta.dirname, '../../fixtures/models');
const tmp = mkdtempSync(join(tmpdir(), 'crossbound-load-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

function errorOf(f: () => unknown): ModelError {
  try {
    f();
  } catch (e) {
    if (e instanceof ModelError) return e;
    throw e;
  }
  throw new Error('accepted');
}

describe('good files', () => {
  test('the greenhouse example loads with every field in place', () => {
    const m = loadModelFile(join(FIX, 'greenhouse.yaml'));
    expect(m.name).toBe('greenhouse-pumps');
    expect(m.timeBound).toBe(12);
    expect(m.goalMode).toBe('within');
    expect(m.states.map((s) => s.name)).toEqual(['both_ok', 'a_worn', 'b_worn', 'dry']);
    expect(m.goal).toEqual([3]);
    expect(m.initial).toBe(0);
    expect(m.states[0]!.owner).toBe('max');
    expect(m.states[0]!.actions.map((a) => a.name)).toEqual(['run_a', 'run_b']);
    expect(m.states[0]!.actions[1]!.successors).toEqual([
      { target: 2, rate: 0.25, rateText: '0.25' },
      { target: 0, rate: 0.05, rateText: '0.05' },
    ]);
    expect(m.states[2]!.actions[0]!.successors[1]).toEqual({ target: 0, rate: 1.5, rateText: '1.5' });
    expect(m.states[3]!.actions).toEqual([]);
  });
  test('the same model in JSON, and in the flat form, is the same model', () => {
    const y = loadModelFile(join(FIX, 'greenhouse.yaml'));
    expect(loadModelFile(join(FIX, 'greenhouse.json'))).toEqual(y);
    expect(loadModelFile(join(FIX, 'greenhouse-flat.yaml'))).toEqual(y);
  });
  test('a JSON file with a byte order mark and a YAML flow mapping that is not JSON both load', () => {
    const json = `\ufeff{"format":"crossbound/1","time_bound":1,"goal":["b"],"states":{"b":{}}}`;
    expect(loadModelText(json, 'x.json').states).toHaveLength(1);
    expect(loadModelText('{format: crossbound/1, time_bound: 1, goal: [b], states: {b: {}},}', 'x.yaml').name).toBe('x');
  });
  test('expectations are read exactly; the reference digits agree with decimal.js', () => {
    const m = loadModelFile(join(FIX, 'two-state.yaml'));
    expect(m.timeBoundText).toBe('2');
    expect(m.states[1]!.actions).toEqual([]);
    const ref = m.expect!.values.lit!;
    // Cross-check of the fixture's digits: 1 − e^(−1) by decimal.js 10.6.0 at 60 digits.
    const D = Decimal.clone({ precision: 60 });
    expect(new D(1).minus(new D(-1).exp()).toFixed(50)).toBe(ref);
    expect(m.expect!.tolerance).toBe(1e-40);
  });
  test('repeated flat rows add up exactly', () => {
    const m = loadModelText(
      'format: crossbound/1\ntime_bound: 1\ngoal: [b]\ntransitions: [[a, go, b, 0.1], [a, go, b, "0.2"], [a, go, a, 1]]\n',
      'x.yaml',
    );
    expect(m.states[0]!.actions[0]!.successors).toEqual([
      { target: 1, rate: 0.3, rateText: '0.3' },
      { target: 0, rate: 1, rateText: '1' },
    ]);
  });
  test('the model name defaults to the file name', () => {
    expect(loadModelText('format: crossbound/1\ntime_bound: 1\ngoal: []\nstates: {b: {}}\n', 'dir/lamp.yaml').name).toBe('lamp');
  });
});

describe('warnings', () => {
  test('an empty goal, an action without successors, a goal listed twice', () => {
    const { warnings } = loadModelTextWithWarnings(
      'format: crossbound/1\ntime_bound: 1\ngoal: []\nstates:\n  a:\n    actions:\n      idle: {}\n',
      'w.yaml',
    );
    expect(warnings).toEqual([
      "w.yaml:7:7: warning: action 'a.idle' has no successors (it leaves the state unchanged)",
      'w.yaml:3:1: warning: the goal is empty (every value is 0)',
    ]);
    const twice = loadModelTextWithWarnings('format: crossbound/1\ntime_bound: 1\ngoal: [b, b]\nstates: {b: {}}\n', 'w.yaml');
    expect(twice.warnings).toEqual(["w.yaml:3:11: warning: goal state 'b' is listed twice"]);
    expect(twice.model.goal).toEqual([0]);
  });
  test('many warnings: the first 20 with positions, one line for the rest, the empty goal always', () => {
    // 5,000 actions without successors: each located warning costs a pass over the text, so only 20 are located.
    const states = Array.from({ length: 5000 }, (_, i) => `"s${i}":{"actions":{"idle":{}}}`).join(',\n');
    const text = `{"format":"crossbound/1","time_bound":1,"goal":[],"states":{\n${states}\n}}`;
    const { warnings } = loadModelTextWithWarnings(text, 'many.json');
    expect(warnings.length).toBe(22);
    expect(warnings[0]).toBe("many.json:2:18: warning: action 's0.idle' has no successors (it leaves the state unchanged)");
    expect(warnings[19]).toBe("many.json:21:19: warning: action 's19.idle' has no successors (it leaves the state unchanged)");
    expect(warnings[20]).toBe('many.json: warning: further warnings not shown (only the first 20 are listed)');
    expect(warnings[21]).toBe('many.json:1:41: warning: the goal is empty (every value is 0)');
  });
});

describe('generated form', () => {
  test('a generated model takes its top-level keys from the file and records its provenance', () => {
    const { model } = loadModelFileWithWarnings(join(FIX, 'generated.yaml'));
    expect(model.name).toBe('small-queue');
    expect(model.timeBound).toBe(4);
    expect(model.generated).toEqual({ family: 'queue-control', seed: 3, capacity: 3 });
    expect(model.description).toContain('family queue-control, seed 3');
    expect(model.goal.map((g) => model.states[g]!.name)).toEqual(['q3_ok', 'q3_broken']);
  });
  const gen = (g: string, extra = ''): string => `format: crossbound/1\n${extra}generate: ${g}\n`;
  const cases: [string, string, number, number, string][] = [
    ['unknown family', gen('{family: pinball, seed: 1}'), 2, 20, 'pinball'],
    ['bad parameter', gen('{family: birth-death, seed: 1, n: 1}'), 2, 45, 'n must be an integer in [2, 5000000]'],
    ['unknown parameter', gen('{family: birth-death, seed: 1, m: 4}'), 2, 42, "unknown parameter 'm'"],
    ['missing seed', gen('{family: birth-death}'), 2, 1, 'needs a seed'],
    ['bad seed', gen('{family: birth-death, seed: -1}'), 2, 39, 'seed must be an integer'],
    ['not a mapping', gen('birth-death'), 2, 11, 'generate must be a mapping'],
  ];
  test.each(cases)('%s', (_name, text, line, column, words) => {
    const e = errorOf(() => loadModelText(text, 'g.yaml'));
    expect([e.line, e.column]).toEqual([line, column]);
    expect(e.message).toContain(words);
  });
  test('top-level keys beside generate are checked against the generated states', () => {
    const e = errorOf(() => loadModelText(gen('{family: birth-death, seed: 1, n: 3}', 'initial: s9\n'), 'g.yaml'));
    expect([e.line, e.column, e.rule]).toEqual([2, 10, 'initial must name a declared state']);
    const f = errorOf(() => loadModelText(gen('{family: birth-death, seed: 1}', 'owners: {s0: max}\n'), 'g.yaml'));
    expect(f.rule).toBe('owners belongs to the transitions form');
  });
});

describe('size limit', () => {
  test('a file over the limit is refused before it is read', () => {
    const big = join(tmp, 'huge.json');
    writeFileSync(big, '');
    truncateSync(big, MAX_FILE_BYTES + 1); // sparse: no disk space, and reading it would take seconds
    const e = errorOf(() => loadModelFile(big));
    expect(e.rule).toBe('file is larger than the limit of 256 MiB');
    expect(e.line).toBeUndefined();
  });
  test('a missing file is a ModelError, not a crash', () => {
    expect(errorOf(() => loadModelFile(join(tmp, 'nope.yaml'))).rule).toBe('cannot read the file');
  });
});
