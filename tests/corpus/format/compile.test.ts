import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';

describe('compile', () => {
  it('drops self-loops and zero rates, and takes λ as the largest exit rate', () => {
    const m = buildModel({
      time_bound: 1,
      goal: ['b'],
      states: {
        a: { owner: 'max', actions: { x: { a: 5, b: 1 }, y: { b: 2, c: 0 } } },
        b: {},
        c: { actions: { z: { a: '0.5' } } },
      },
    });
    const c = compile(m);
    expect(c.nStates).toBe(3);
    expect(c.nActions).toBe(3);
    expect(c.nTransitions).toBe(3);
    expect([...c.exitRate]).toEqual([1, 2, 0.5]);
    expect(c.lambda).toBe(2);
    expect([...c.owner]).toEqual([1, 0, 0]);
    expect([...c.goal]).toEqual([0, 1, 0]);
    expect([...c.actionStart]).toEqual([0, 2, 2, 3]);
  });
});

describe('buildModel, flat form', () => {
  it('adds repeated rows exactly: the rate text is the decimal sum and the rate its nearest double', () => {
    const m = buildModel({ time_bound: 1, goal: ['b'], transitions: [['a', 'x', 'b', '0.1'], ['a', 'x', 'b', '0.2']] });
    expect(m.states[0]!.actions[0]!.successors).toEqual([{ target: 1, rate: 0.3, rateText: '0.3' }]);
  });
});
