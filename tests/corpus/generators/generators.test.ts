/**
 * The generator families: deterministic per seed, different across seeds where the family is
 * random, valid crossbound/1 (loaded through the validator), provenance in the description, and the
 * sizes and structure their doc comments state.
 */
import { describe, expect, test } from 'vitest';
import { validateModelObject } from '../../../corpus/format/load.js';
import { isCtmc, modelKind } from '../../../corpus/format/types.js';
import { FAMILIES, GeneratorError, generateModel } from '../../../corpus/generators/index.js';
import { Prng } from '../../../corpus/generators/prng.js';

const SMALL: Record<string, Record<string, unknown>> = {
  'birth-death': { n: 5 },
  'redundant-system': { components: 3, spread: 1 },
  'grid-patrol': { side: 3, walls: 1 },
  'random-sparse': { states: 30, branching: 3, player: 'mixed' },
  'queue-control': { capacity: 4 },
  'random-game': { states: 6 },
};
const RANDOM = ['redundant-system', 'grid-patrol', 'random-sparse', 'random-game'];

describe.each(Object.keys(FAMILIES))('%s', (family) => {
  const spec = (seed: number) => ({ family, seed, ...SMALL[family] });
  test('same seed, same model; valid; provenance in the description', () => {
    const a = generateModel(spec(11));
    expect(generateModel(spec(11))).toEqual(a);
    const { model } = validateModelObject(a, `${family}.yaml`);
    expect(model.description).toContain(`family ${family}, seed 11`);
    expect(model.goal.length).toBeGreaterThan(0);
    expect(model.initial).toBeDefined();
  });
  if (RANDOM.includes(family)) {
    test('another seed, another model', () => {
      expect(generateModel(spec(12))).not.toEqual(generateModel(spec(11)));
    });
  }
  test('unknown parameters are refused', () => {
    expect(() => generateModel({ ...spec(1), colour: 'red' })).toThrow(GeneratorError);
  });
});

describe('family structure', () => {
  test('birth-death is a CTMC chain with the top state as goal', () => {
    const { model } = validateModelObject(generateModel({ family: 'birth-death', seed: 0, n: 4, arrival: 3, service: 5 }));
    expect(isCtmc(model)).toBe(true);
    expect(model.states.map((s) => s.name)).toEqual(['s0', 's1', 's2', 's3']);
    expect(model.states[1]!.actions[0]!.successors.map((t) => [t.target, t.rate])).toEqual([[2, 3], [0, 5]]);
    expect(model.goal).toEqual([3]);
  });
  test('redundant-system: 2^n states, the choice owned by the chosen player', () => {
    const { model } = validateModelObject(generateModel({ family: 'redundant-system', seed: 4, components: 4, player: 'min' }));
    expect(model.states).toHaveLength(16);
    expect(modelKind(model)).toBe('CTMDP');
    expect(model.states.filter((s) => s.actions.length === 2).every((s) => s.owner === 'min')).toBe(true);
    expect(model.goal.map((g) => model.states[g]!.name)).toEqual(['f1111']);
  });
  test('grid-patrol is a game of both players', () => {
    const { model } = validateModelObject(generateModel({ family: 'grid-patrol', seed: 1, side: 3 }));
    expect(modelKind(model)).toBe('CTMG');
    // 9 × 9 position pairs minus 9 meetings minus 8 with the intruder on the target, per turn; plus caught, breach.
    expect(model.states).toHaveLength(2 * (81 - 9 - 8) + 2);
  });
  test('random-sparse has the stated size, no self-loops, distinct successors', () => {
    const obj = generateModel({ family: 'random-sparse', seed: 5, states: 200, actions: 3, branching: 4, goals: 7 });
    expect(obj.transitions).toHaveLength(200 * 3 * 4);
    const { model } = validateModelObject(obj);
    expect(model.goal).toHaveLength(7);
    for (const [i, s] of model.states.entries()) {
      for (const a of s.actions) {
        const ts = a.successors.map((t) => t.target);
        expect(new Set(ts).size).toBe(4);
        expect(ts).not.toContain(i);
      }
    }
  });
  test('queue-control: the min player chooses service in every working non-empty state', () => {
    const { model } = validateModelObject(generateModel({ family: 'queue-control', seed: 0, capacity: 3 }));
    expect(model.states).toHaveLength(7);
    expect(model.states.filter((s) => s.owner === 'min').map((s) => s.name)).toEqual(['q1_ok', 'q2_ok', 'q3_ok']);
  });
  test('unknown family and bad parameters name the parameter', () => {
    const err = (spec: Record<string, unknown>): string | undefined => {
      try {
        generateModel(spec);
      } catch (e) {
        if (e instanceof GeneratorError) return e.param;
      }
      return 'not refused';
    };
    expect(err({ family: 'nope', seed: 1 })).toBe('family');
    expect(err({ family: 'random-sparse', seed: 1, states: 3, branching: 3 })).toBe('branching');
    expect(err({ family: 'grid-patrol', seed: 1, side: 2, walls: 2 })).toBe('walls');
    expect(err({ family: 'birth-death', seed: 1.5 })).toBe('seed');
  });
});

describe('Prng', () => {
  test('deterministic, in [0, 1), roughly uniform', () => {
    const a = new Prng(42);
    const b = new Prng(42);
    const xs = Array.from({ length: 10_000 }, () => a.next());
    expect(Array.from({ length: 10_000 }, () => b.next())).toEqual(xs);
    expect(xs.every((x) => x >= 0 && x < 1)).toBe(true);
    const mean = xs.reduce((s, x) => s + x, 0) / xs.length;
    // Standard error of the mean of 10^4 uniforms is 0.0029; 5 sigma.
    expect(Math.abs(mean - 0.5)).toBeLessThan(0.015);
    expect(new Prng(43).next()).not.toBe(xs[0]);
  });
});
