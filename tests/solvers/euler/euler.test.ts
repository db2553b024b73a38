import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import type { Outcome, Solved } from '../../../corpus/format/result.js';
import { solveEuler } from '../../../solvers/euler/index.js';
import { solveUniformization } from '../../../solvers/uniformization/index.js';
import { chain, errorOf, erlangCdf, hypoexponentialCdf, twoState, twoStateExact, D } from '../uniformization/closedForms.js';

function solved(o: Outcome): Solved {
  if (o.kind !== 'solved') throw new Error(`refused: ${o.reason}`);
  return o;
}

describe('Euler against closed forms (50-digit references)', () => {
  for (const precision of [1e-3, 1e-5]) {
    for (const mode of ['within', 'at'] as const) {
      it(`two-state chain, mode ${mode}, precision ${precision}`, () => {
        for (const [alpha, beta, T] of [[0.5, 2, 1], [3, 0.25, 0.8]] as const) {
          const out = solved(solveEuler(twoState(alpha, beta, T, mode), { precision }));
          expect(out.errorBound).toBeLessThanOrEqual(precision);
          expect(errorOf(out.values[0]!, twoStateExact(alpha, beta, T, mode))).toBeLessThanOrEqual(out.errorBound);
        }
      });
    }
    it(`Erlang and hypoexponential chains, precision ${precision}`, () => {
      const erl = solved(solveEuler(chain([4, 4, 4], 0.9), { precision }));
      for (let i = 0; i < 3; i++) expect(errorOf(erl.values[i]!, erlangCdf(3 - i, 4, 0.9))).toBeLessThanOrEqual(erl.errorBound);
      const rates = [0.8, 2.5, 4];
      const hyp = solved(solveEuler(chain(rates, 0.6), { precision }));
      for (let i = 0; i < 3; i++) expect(errorOf(hyp.values[i]!, hypoexponentialCdf(rates.slice(i), 0.6))).toBeLessThanOrEqual(hyp.errorBound);
    });
  }
  it('precision 1e-9 on a tiny model with λT = 0.1', () => {
    const out = solved(solveEuler(twoState(0.1, 0.05, 1, 'at'), { precision: 1e-9 }));
    expect(errorOf(out.values[0]!, twoStateExact(0.1, 0.05, 1, 'at'))).toBeLessThanOrEqual(out.errorBound);
  });
  it('the last step is partial and lands on T: steps = ⌊T/h⌋ + 1', () => {
    const out = solved(solveEuler(twoState(1, 1, 1, 'at'), { precision: 1e-3 }));
    expect(out.stats.steps).toBe(Math.floor(1 / out.stats.h!) + 1);
  });
});

describe('Euler on decision processes and games', () => {
  // min state s0 chooses between s1 (max, exits to g at rate 3 or 1) and s2 (exits to g at 0.5), both at rate 1.
  // s2 is always worse for reaching g, so min goes to s2 and max picks rate 3:
  // v(s0) = hypoexponential(1, 0.5), v(s1) = 1 − e^{−3T} (closed forms as above).
  const game = compile(buildModel({
    name: 'min-then-max', time_bound: 1.5, goal: ['g'], initial: 's0',
    states: {
      s0: { owner: 'min', actions: { up: { s1: 1 }, down: { s2: 1 } } },
      s1: { owner: 'max', actions: { fast: { g: 3 }, slow: { g: 1 } } },
      s2: { actions: { go: { g: 0.5 } } },
      g: {},
    },
  }));
  it('a CTMG: both players optimal, against closed forms, with the scheduler found', () => {
    const out = solved(solveEuler(game, { precision: 1e-4 }));
    expect(errorOf(out.values[0]!, hypoexponentialCdf([1, 0.5], 1.5))).toBeLessThanOrEqual(out.errorBound);
    expect(errorOf(out.values[1]!, new D(1).minus(new D(-4.5).exp()))).toBeLessThanOrEqual(out.errorBound);
    expect(out.scheduler?.choices.s1).toEqual([{ from: 0, action: 'fast' }]);
    // With no time left s1 and s2 both have value 0: a tie, broken towards the first action 'up'; the
    // tie lasts one step only, so 'down' holds on all of elapsed [0, T − h].
    const s0 = out.scheduler!.choices.s0!;
    expect(s0[0]).toEqual({ from: 0, action: 'down' });
    for (const seg of s0.slice(1)) expect(seg.from).toBeGreaterThanOrEqual(1.5 - 1.01 * out.stats.h!);
  });
  it('mode at, with a goal that can be left: Euler agrees with uniformization under the right scheduler', () => {
    const m = compile(buildModel({
      name: 'keep-or-leave', time_bound: 2, goal: ['g'], goal_mode: 'at', initial: 's',
      states: { s: { actions: { go: { g: 2 } } }, g: { owner: 'max', actions: { stay: {}, leave: { s: 5 } } } },
    }));
    const eu = solved(solveEuler(m, { precision: 1e-4 }));
    const un = solved(solveUniformization(m, { precision: 1e-12, scheduler: { choices: { g: [{ from: 0, action: 'stay' }] } } }));
    for (let s = 0; s < 2; s++) expect(Math.abs(eu.values[s]! - un.values[s]!)).toBeLessThanOrEqual(eu.errorBound + un.errorBound);
    expect(un.values[0]).toBeCloseTo(1 - Math.exp(-4), 12); // s reaches g and stays: 1 − e^{−2T} (common practice, no source)
  });
});

describe('Euler special cases and refusals', () => {
  it('λ = 0: nothing moves, even with empty actions and absorbing states', () => {
    const m = compile(buildModel({ time_bound: 5, goal: ['g'], goal_mode: 'at', states: { s: { owner: 'max', actions: { x: {}, y: { s: 2 } } }, g: {} } }));
    const out = solved(solveEuler(m, { precision: 1e-9 }));
    expect([...out.values]).toEqual([0, 1]);
    expect(out.errorBound).toBe(0);
  });
  it('an empty action competes: max keeps a goal state in mode at by choosing it', () => {
    const m = compile(buildModel({ time_bound: 1, goal: ['g'], goal_mode: 'at', states: { g: { owner: 'max', actions: { leave: { s: 1 }, idle: {} } }, s: {} } }));
    const out = solved(solveEuler(m, { precision: 1e-4 }));
    expect(out.values[0]).toBe(1);
    const mn = compile(buildModel({ time_bound: 1, goal: ['g'], goal_mode: 'at', states: { g: { owner: 'min', actions: { leave: { s: 1 }, idle: {} } }, s: {} } }));
    const low = solved(solveEuler(mn, { precision: 1e-4 }));
    expect(errorOf(low.values[0]!, new D(-1).exp())).toBeLessThanOrEqual(low.errorBound);
  });
  it('refuses when the work would exceed the cap, saying so', () => {
    const out = solveEuler(twoState(5, 5, 2, 'at'), { precision: 1e-12 });
    expect(out.kind).toBe('refused');
    if (out.kind === 'refused') expect(out.reason).toMatch(/work cap/);
  });
  it('refuses a precision outside (0, 1)', () => {
    expect(solveEuler(twoState(1, 1, 1, 'at'), { precision: -1 }).kind).toBe('refused');
    expect(solveEuler(twoState(1, 1, 1, 'at'), { precision: 1 }).kind).toBe('refused');
  });
});
