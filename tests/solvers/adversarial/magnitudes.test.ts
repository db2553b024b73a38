/**
 * Extreme magnitudes: the same models with every rate scaled by 10^e and the time bound by 10^−e, for
 * e from −300 to +300. The values do not depend on e (they depend on rates and time only through
 * R·t; common practice, no source), so every solver must either give them within its bound — a finite
 * number — or refuse. References: the two-state chain's closed form p(T) = a/(a+b)(1 − e^{−(a+b)T})
 * (S. Ross, "Introduction to Probability Models", the two-state continuous-time chain) and the
 * optimal-control oracle on the unscaled game.
 */
import { describe, expect, it } from 'vitest';
import { buildModel, type ModelObject } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import type { Outcome } from '../../../corpus/format/result.js';
import { solveOracle } from '../../../oracles/index.js';
import { solveEuler } from '../../../solvers/euler/index.js';
import { solveKstep } from '../../../solvers/kstep/index.js';
import { solveUniformization } from '../../../solvers/uniformization/index.js';

const twoState = (e: number): ModelObject => ({
  format: 'crossbound/1', name: 'two-state', time_bound: 3 * 10 ** -e, goal: ['g'], goal_mode: 'at', initial: 's',
  states: { s: { actions: { go: { g: 0.4 * 10 ** e } } }, g: { actions: { back: { s: 1.1 * 10 ** e } } } },
}) as ModelObject;

const game = (e: number): ModelObject => ({
  format: 'crossbound/1', name: 'scaled-game', time_bound: 10 ** -e, goal: ['g'], initial: 's',
  states: {
    s: { owner: 'max', actions: { a: { g: 10 ** e }, b: { m: 2 * 10 ** e } } },
    m: { owner: 'min', actions: { go: { g: 1.5 * 10 ** e, s: 0.5 * 10 ** e }, wait: { s: 3 * 10 ** e } } },
    g: {},
  },
}) as ModelObject;

const EXPONENTS = [-300, -180, -150, -20, 0, 20, 150, 180, 300];

function expectSound(o: Outcome, ref: ArrayLike<number>, refBound: number, label: string): void {
  if (o.kind === 'refused') {
    expect(o.reason.length, label).toBeGreaterThan(0);
    return;
  }
  expect(Number.isFinite(o.errorBound), `${label}: bound ${o.errorBound}`).toBe(true);
  for (let s = 0; s < ref.length; s++) {
    const err = Math.abs(o.values[s]! - ref[s]!);
    expect(err, `${label}, state ${s}`).toBeLessThanOrEqual(o.errorBound + refBound);
  }
}

describe('rates scaled by 10^±300 with the time bound scaled back', () => {
  it('two-state chain: uniformization, Euler and kstep agree with the closed form, with finite bounds', () => {
    const a = 0.4;
    const b = 1.1;
    const pT = (a / (a + b)) * (1 - Math.exp(-(a + b) * 3)); // from s; from g: 1 − b/(a+b)(1 − e^{−(a+b)T})
    const ref = [pT, 1 - (b / (a + b)) * (1 - Math.exp(-(a + b) * 3))];
    let solved = 0;
    for (const e of EXPONENTS) {
      const m = compile(buildModel(twoState(e)));
      const outs = [
        solveUniformization(m, { precision: 1e-12 }),
        solveEuler(m, { precision: 1e-5 }),
        solveKstep(m, { precision: 1e-10, k: 4 }),
        solveKstep(m, { precision: 1e-4, k: 1 }),
      ];
      for (const o of outs) {
        // The closed form in double precision: a few ulps (common practice, no source).
        expectSound(o, ref, 1e-15, `${o.method} at 10^${e}`);
        if (o.kind === 'solved') solved++;
      }
    }
    // Scaling is exact in the solvers' own time unit: nothing needs to refuse.
    expect(solved).toBe(EXPONENTS.length * 4);
  });

  it('a two-player game: Euler and kstep agree with the optimal-control oracle on the unscaled model', () => {
    const ref = solveOracle(buildModel(game(0)), { digits: 25 });
    if (ref.kind !== 'solved') throw new Error(ref.reason);
    let solved = 0;
    for (const e of EXPONENTS) {
      const m = compile(buildModel(game(e)));
      for (const o of [solveEuler(m, { precision: 1e-4 }), solveKstep(m, { precision: 1e-9, k: 4 })]) {
        expectSound(o, ref.values, ref.errorBound, `${o.method} at 10^${e}`);
        if (o.kind === 'solved') solved++;
      }
    }
    expect(solved).toBe(EXPONENTS.length * 2);
  });

  it('rates that span more than the double range are refused by kstep, not flushed', () => {
    const obj = {
      format: 'crossbound/1', name: 'span', time_bound: 1e300, goal: ['g'], initial: 's',
      states: { s: { actions: { go: { g: 1e-300, u: 1e-300 } } }, u: { actions: { spin: { z: 1e300 } } }, g: {}, z: {} },
    } as ModelObject;
    const o = solveKstep(compile(buildModel(obj)), { precision: 1e-6, k: 3 });
    expect(o.kind).toBe('refused');
  });
});
