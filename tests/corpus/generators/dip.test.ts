/**
 * The near-tangent crossing family (corpus/generators/dip.ts): for every draw, the advantage of `a` over
 * `b`, per unit rate F_x(t) − βF_y(t) with F_x the exponential and F_y the Erlang-2 distribution
 * function (S. M. Ross, Introduction to Probability Models, the exponential and gamma/Erlang
 * distributions), is positive, then negative, then positive again within the time bound: the better
 * action changes twice. Evaluated here from the model's own rates, independently of the generator's search.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { arbDipDraw, buildDip } from '../../../corpus/generators/dip.js';

describe('dip generator', () => {
  it('every draw of 200 (seed 5) switches twice inside the time bound, and builds a valid model', () => {
    for (const d of fc.sample(arbDipDraw(), { seed: 5, numRuns: 200 })) {
      const obj = buildDip(d);
      const model = buildModel(obj, 'dip');
      const s = model.states.find((x) => x.name === 's')!;
      const rate = (act: string, to: string): number => s.actions.find((a) => a.name === act)!.successors.find((t) => model.states[t.target]!.name === to)!.rate;
      const r = rate('a', 'x');
      const beta = rate('b', 'y1') / r;
      const alpha = Number(obj.states!.x!.actions!.go!.goal);
      const gamma = Number(obj.states!.y2!.actions!.go!.goal);
      const g = (t: number): number => -Math.expm1(-alpha * t) - beta * (1 - Math.exp(-gamma * t) * (1 + gamma * t));
      const T = model.timeBound;
      const signs: number[] = [];
      for (let i = 1; i <= 20000; i++) {
        const v = g((T * i) / 20000);
        const sg = v > 0 ? 1 : v < 0 ? -1 : 0;
        if (sg !== 0 && sg !== signs[signs.length - 1]) signs.push(sg);
      }
      expect(signs, JSON.stringify(d)).toEqual([1, -1, 1]);
    }
  });
});
