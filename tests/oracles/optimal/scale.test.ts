/**
 * The optimal-control oracle at 60–100 states:
 *  - many independent one-switch gadgets sharing one goal, each with its own switching time, against
 *    the hand-derived closed form of closedForm.ts (derived there); min-owned states choosing between
 *    two rates into the goal, whose optimum is the smaller rate, 1 − e^{−r T} (exponential distribution
 *    function, common practice);
 *  - random piecewise schedulers on a 60-state CTMDP never beat the optimum (common practice, no
 *    source: an optimum dominates every fixed scheduler), each evaluated by the expm oracle.
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { buildModel, type ModelObject } from '../../../corpus/format/build.js';
import { stateIndex } from '../../../corpus/format/types.js';
import { solveExpm } from '../../../oracles/expm/index.js';
import { solveOptimal } from '../../../oracles/optimal/index.js';
import { randomStructure } from '../../../bench/oracleStructures.js';
import { DC, oneSwitch, within } from './closedForm.js';

function gadgets(k: number, withMin: boolean): { obj: ModelObject; params: [string, string, string][] } {
  const states: NonNullable<ModelObject['states']> = { g: {} };
  const params: [string, string, string][] = [];
  for (let i = 0; i < k; i++) {
    const mu = '1';
    const lambda = new Decimal(3).plus(new Decimal(i).div(8)).toString();
    const gamma = new Decimal(2).plus(new Decimal(i).div(20)).toString();
    params.push([mu, lambda, gamma]);
    states[`s${i}`] = { owner: 'max', actions: { direct: { g: mu }, via: { [`t${i}`]: lambda } } };
    states[`t${i}`] = { actions: { go: { g: gamma } } };
    if (withMin) states[`m${i}`] = { owner: 'min', actions: { slow: { g: `0.${i + 1}` }, fast: { g: `1.${i + 1}` } } };
  }
  return { obj: { time_bound: '2', goal: ['g'], states }, params };
}

describe('optimal oracle at scale', () => {
  it('49 one-switch gadgets (99 states): 25 digits against the closed form, 49 switches', () => {
    const { obj, params } = gadgets(49, false);
    const m = buildModel(obj);
    const out = solveOptimal(m, { digits: 25 });
    if (out.kind !== 'solved') throw new Error(out.reason);
    expect(out.stats.digitsConfirmed).toBe(25);
    expect(out.stats.switches).toBe(49);
    params.forEach(([mu, lambda, gamma], i) => {
      const ref = oneSwitch(mu, lambda, gamma, '2');
      expect(within(out.valuesDecimal![stateIndex(m, `s${i}`)]!, ref.vs, 25)).toBe(true);
      expect(within(out.valuesDecimal![stateIndex(m, `t${i}`)]!, ref.vt, 25)).toBe(true);
      const segs = out.scheduler!.choices[`s${i}`]!;
      expect(segs.map((g) => g.action)).toEqual(['via', 'direct']);
      expect(Math.abs(2 - segs[1]!.from - ref.tauStar.toNumber())).toBeLessThan(1e-14);
    });
  });

  it('a game: 20 gadgets and 20 min-owned states (61 states), 25 digits', () => {
    const { obj, params } = gadgets(20, true);
    const m = buildModel(obj);
    const out = solveOptimal(m, { digits: 25 });
    if (out.kind !== 'solved') throw new Error(out.reason);
    expect(out.stats.digitsConfirmed).toBe(25);
    params.forEach(([mu, lambda, gamma], i) => {
      expect(within(out.valuesDecimal![stateIndex(m, `s${i}`)]!, oneSwitch(mu, lambda, gamma, '2').vs, 25)).toBe(true);
      const slow = new DC(1).minus(new DC(`0.${i + 1}`).times(-2).exp());
      expect(within(out.valuesDecimal![stateIndex(m, `m${i}`)]!, slow, 25)).toBe(true);
    });
  });

  it('60-state CTMDP: random two-piece schedulers do not beat the optimum', () => {
    const m = buildModel(randomStructure(60, 2, 2, '1.5', 160));
    const out = solveOptimal(m, { digits: 20 });
    if (out.kind !== 'solved') throw new Error(out.reason);
    expect(out.stats.switches).toBeGreaterThan(0);
    let x = 7;
    const rnd = (): number => ((x = (Math.imul(x, 1664525) + 1013904223) >>> 0) / 2 ** 32);
    for (let run = 0; run < 3; run++) {
      const choices: Record<string, { from: number; action: string }[]> = {};
      const cut = 0.2 + 0.6 * rnd();
      for (const st of m.states) {
        if (st.actions.length < 2) continue;
        const a = st.actions[Math.floor(rnd() * 2)]!.name;
        const b = st.actions[Math.floor(rnd() * 2)]!.name;
        choices[st.name] = a === b ? [{ from: 0, action: a }] : [{ from: 0, action: a }, { from: cut * 1.5, action: b }];
      }
      const other = solveExpm(m, { digits: 20, scheduler: { choices } });
      if (other.kind !== 'solved') throw new Error(other.reason);
      for (let s = 0; s < m.states.length; s++) expect(other.values[s]! - out.values[s]!).toBeLessThanOrEqual(out.errorBound + other.errorBound);
    }
    // The optimum's own scheduler, evaluated independently, gives the optimum.
    const own = solveExpm(m, { digits: 20, scheduler: out.scheduler! });
    if (own.kind !== 'solved') throw new Error(own.reason);
    for (let s = 0; s < m.states.length; s++) expect(Math.abs(own.values[s]! - out.values[s]!)).toBeLessThanOrEqual(1e-18);
  });
});
