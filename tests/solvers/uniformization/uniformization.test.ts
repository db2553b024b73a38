import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import type { Outcome, Solved } from '../../../corpus/format/result.js';
import { solveUniformization } from '../../../solvers/uniformization/index.js';
import { chain, errorOf, erlangCdf, hypoexponentialCdf, twoState, twoStateExact, D } from './closedForms.js';

function solved(o: Outcome): Solved {
  if (o.kind !== 'solved') throw new Error(`refused: ${o.reason}`);
  return o;
}

describe('uniformization against closed forms (50-digit references)', () => {
  for (const precision of [1e-6, 1e-12]) {
    for (const mode of ['within', 'at'] as const) {
      it(`two-state chain, mode ${mode}, precision ${precision}`, () => {
        for (const [alpha, beta, T] of [[0.5, 2, 1], [3, 0.25, 4], [40, 7, 0.3]] as const) {
          const out = solved(solveUniformization(twoState(alpha, beta, T, mode), { precision }));
          expect(out.errorBound).toBeLessThanOrEqual(precision);
          expect(errorOf(out.values[0]!, twoStateExact(alpha, beta, T, mode))).toBeLessThanOrEqual(out.errorBound);
          // From b: `within` is 1 (goal), `at` is 1 − p_a(t) by symmetry with α and β swapped.
          const fromB = mode === 'within' ? new D(1) : new D(1).minus(twoStateExact(beta, alpha, T, 'at'));
          expect(errorOf(out.values[1]!, fromB)).toBeLessThanOrEqual(out.errorBound);
        }
      });
    }
    it(`Erlang chain, precision ${precision}`, () => {
      for (const [n, lambda, T] of [[1, 2, 0.7], [4, 1.5, 2], [12, 10, 1.3]] as const) {
        const out = solved(solveUniformization(chain(new Array(n).fill(lambda), T), { precision }));
        expect(out.errorBound).toBeLessThanOrEqual(precision);
        for (let i = 0; i < n; i++) expect(errorOf(out.values[i]!, erlangCdf(n - i, lambda, T))).toBeLessThanOrEqual(out.errorBound);
      }
    });
    it(`hypoexponential chain with distinct rates, precision ${precision}`, () => {
      const rates = [0.8, 2.5, 4, 9.5];
      const T = 1.7;
      const out = solved(solveUniformization(chain(rates, T), { precision }));
      expect(out.errorBound).toBeLessThanOrEqual(precision);
      for (let i = 0; i < rates.length; i++) {
        expect(errorOf(out.values[i]!, hypoexponentialCdf(rates.slice(i), T))).toBeLessThanOrEqual(out.errorBound);
      }
    });
  }
  it('at precision 1e-12 the bound is spent, not wasted: 1e-14 < bound ≤ 1e-12, and it holds', () => {
    const out = solved(solveUniformization(chain([3, 3, 3], 2), { precision: 1e-12 }));
    expect(out.errorBound).toBeGreaterThan(1e-14);
    expect(out.errorBound).toBeLessThanOrEqual(1e-12);
    expect(errorOf(out.values[0]!, erlangCdf(3, 3, 2))).toBeLessThanOrEqual(out.errorBound);
  });
});

describe('uniformization under a fixed scheduler', () => {
  // s has two actions: fast (rate 3 to goal g) and slow (rate 1 to g). Elapsed [0, 0.5): slow,
  // [0.5, 2]: fast. Hand computation: P(reach g by T = 2) = 1 − e^{−1·0.5} e^{−3·1.5} = 1 − e^{−5}.
  const model = compile(buildModel({
    name: 'two-speeds', time_bound: 2, goal: ['g'], initial: 's',
    states: { s: { owner: 'max', actions: { fast: { g: 3 }, slow: { g: 1 } } }, g: {} },
  }));
  const scheduler = { choices: { s: [{ from: 0, action: 'slow' }, { from: 0.5, action: 'fast' }] } };
  it('two segments agree with the hand computation 1 − e^{−5}', () => {
    const out = solved(solveUniformization(model, { precision: 1e-12, scheduler }));
    expect(out.stats.pieces).toBe(2);
    expect(errorOf(out.values[0]!, new D(1).minus(new D(-5).exp()))).toBeLessThanOrEqual(out.errorBound);
  });
  it('mode at, with a way back: segments processed backwards from the end', () => {
    // s → g at rate a (segment action), g → s at rate 2. Elapsed [0, 0.5): slow (a = 1); then fast (a = 3).
    const m = compile(buildModel({
      name: 'two-speeds-back', time_bound: 2, goal: ['g'], goal_mode: 'at', initial: 's',
      states: { s: { owner: 'max', actions: { fast: { g: 3 }, slow: { g: 1 } } }, g: { actions: { back: { s: 2 } } } },
    }));
    const out = solved(solveUniformization(m, { precision: 1e-12, scheduler }));
    // Hand computation: the probability q of being in g evolves by dq/dt = a(1 − q) − 2q from q(0) = 0 (forwards in
    // elapsed time): q(0.5) = (1/3)(1 − e^{−1.5}); then q(2) = 3/5 + (q(0.5) − 3/5) e^{−5·1.5}.
    const q1 = new D(1).div(3).times(new D(1).minus(new D(-1.5).exp()));
    const q2 = new D(0.6).plus(q1.minus(0.6).times(new D(-7.5).exp()));
    expect(errorOf(out.values[0]!, q2)).toBeLessThanOrEqual(out.errorBound);
  });
});

describe('uniformization special cases and refusals', () => {
  it('refuses a model with choices and no scheduler, naming the state', () => {
    const m = compile(buildModel({ time_bound: 1, goal: ['g'], states: { s: { owner: 'min', actions: { x: { g: 1 }, y: { g: 2 } } }, g: {} } }));
    const out = solveUniformization(m, { precision: 1e-6 });
    expect(out.kind).toBe('refused');
    if (out.kind === 'refused') expect(out.reason).toMatch(/'s' has 2 actions/);
  });
  it('refuses λT above 1e7', () => {
    const out = solveUniformization(twoState(2e7, 1, 1, 'at'), { precision: 1e-6 });
    expect(out.kind).toBe('refused');
    if (out.kind === 'refused') expect(out.reason).toMatch(/exceeds the limit/);
  });
  it('refuses a precision outside (0, 1)', () => {
    expect(solveUniformization(twoState(1, 1, 1, 'at'), { precision: 0 }).kind).toBe('refused');
    expect(solveUniformization(twoState(1, 1, 1, 'at'), { precision: Number.NaN }).kind).toBe('refused');
  });
  it('nothing moves: values are the goal indicator, bound 0', () => {
    const m = compile(buildModel({ time_bound: 3, goal: ['g'], states: { s: { actions: { idle: {}, } }, g: {}, h: { actions: { loop: { h: 4 } } } } }));
    const out = solved(solveUniformization(m, { precision: 1e-9 }));
    expect([...out.values]).toEqual([0, 1, 0]);
    expect(out.errorBound).toBe(0);
  });
  it('tiny λT = 1e-6 is solved within a bound of order 1e-15', () => {
    const out = solved(solveUniformization(twoState(1e-6, 0, 1, 'within'), { precision: 1e-13 }));
    expect(out.errorBound).toBeLessThan(1e-14);
    expect(errorOf(out.values[0]!, twoStateExact(1e-6, 0, 1, 'within'))).toBeLessThanOrEqual(out.errorBound);
  });
  it('large λT = 1e5 is solved and honours the bound', () => {
    for (const mode of ['within', 'at'] as const) {
      const out = solved(solveUniformization(twoState(1e5, 3e4, 1, mode), { precision: 1e-8 }));
      expect(out.errorBound).toBeLessThanOrEqual(1e-8);
      expect(errorOf(out.values[0]!, twoStateExact(1e5, 3e4, 1, mode))).toBeLessThanOrEqual(out.errorBound);
      expect(out.stats.iterations).toBeGreaterThan(1e5);
    }
  });
});
