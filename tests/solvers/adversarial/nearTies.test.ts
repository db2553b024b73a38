/**
 * Near-ties between actions (adversarial models, ./models.ts): the decision rule of the k-step scheme
 * must not call a real advantage a tie unless its bound pays for it. References: the optimal-control
 * oracle (decimal arithmetic, no code shared with solvers/) on the unscaled model, and for one model
 * the closed form 1 − e^{−rT} of the exponential distribution (probability textbooks, e.g. S. Ross,
 * "Introduction to Probability Models", ch. 5), evaluated with decimal.js 10.6.0.
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { buildModel, type ModelObject } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import { solveOracle } from '../../../oracles/index.js';
import { solveEuler } from '../../../solvers/euler/index.js';
import { solveKstep } from '../../../solvers/kstep/index.js';
import { nearTie, type NearTie } from './models.js';

const tieFrozenGoal: ModelObject = {
  format: 'crossbound/1',
  name: 'tie-frozen-goal',
  time_bound: 1,
  goal: ['g'],
  initial: 's',
  states: {
    s: { owner: 'max', actions: { a1: { g: 1 }, a2: { g: 1.0005 } } },
    g: { actions: { boom: { z: 1e9 } } },
    z: {},
  },
} as ModelObject;

describe('near-ties against independent references', () => {
  it('tie-frozen-goal: kstep k = 2, 3, 4 at 1e-6 and 1e-9 within its bound of 1 − e^{−1.0005}', () => {
    const D = Decimal.clone({ precision: 40 });
    const exact = new D(1).minus(new D(-1.0005).exp());
    expect(exact.toFixed(30)).toBe('0.632304452571876450235804744899');
    const m = compile(buildModel(tieFrozenGoal));
    const s = m.stateNames.indexOf('s');
    for (const k of [2, 3, 4]) {
      for (const precision of [1e-6, 1e-9]) {
        const o = solveKstep(m, { precision, k });
        if (o.kind !== 'solved') throw new Error(`refused: ${o.reason}`);
        expect(Math.abs(o.values[s]! - exact.toNumber())).toBeLessThanOrEqual(o.errorBound);
      }
    }
  });

  it('the planted loose tie rule (not paid for by the bound) breaks the bound on tie-frozen-goal', () => {
    const m = compile(buildModel(tieFrozenGoal));
    const s = m.stateNames.indexOf('s');
    const o = solveKstep(m, { precision: 1e-9, k: 3, looseTie: 1e-12 });
    if (o.kind !== 'solved') throw new Error(`refused: ${o.reason}`);
    const exact = 1 - Math.exp(-1.0005);
    expect(Math.abs(o.values[s]! - exact)).toBeGreaterThan(100 * o.errorBound);
  });

  it('ties at orders 0–3, relative gaps 1e-3 … 1e-13, both players, both goal modes, fast states, scaled by 10^±150', () => {
    const cases: NearTie[] = [];
    const gaps = [1e-3, 1e-6, 1e-9, 1e-13];
    let i = 0;
    for (const order of [0, 1, 2, 3]) {
      for (const gap of gaps) {
        cases.push({
          order, gap, owner: i % 2 ? 'min' : 'max', goalMode: i % 3 === 2 ? 'at' : 'within',
          goalRate: i % 4 < 2 ? 1e9 : 0, fastRate: i % 5 < 2 ? 10 : 0, scale: [0, 150, -150][i % 3]!,
        });
        i++;
      }
    }
    let compared = 0;
    for (const c of cases) {
      // The oracle refuses the stiff fast states; they do not reach s (the goal's rate is frozen in
      // mode within, the unrelated state leads to a non-goal trap), so the reference model omits them
      // and every state it lacks has value 0 (z, fast) — g has value 1 in mode within.
      const refModel = buildModel(nearTie({ ...c, scale: 0, goalRate: 0, fastRate: 0 }));
      const ref = solveOracle(refModel, { digits: 25 });
      if (ref.kind !== 'solved') throw new Error(`oracle refused ${JSON.stringify(c)}: ${ref.reason}`);
      const m = compile(buildModel(nearTie(c)));
      // Work grows like (λT)^{1+1/k}/precision^{1/k}: the low orders run where no fast state sets λ.
      const slow = c.fastRate === 0;
      const runs = [
        ...(slow ? [solveKstep(m, { precision: 1e-6, k: 2 }), solveEuler(m, { precision: 1e-5 })] : []),
        solveKstep(m, { precision: 1e-8, k: 3 }),
        solveKstep(m, { precision: 1e-9, k: 4 }),
      ];
      for (const o of runs) {
        if (o.kind !== 'solved') throw new Error(`${o.method} refused ${JSON.stringify(c)}: ${o.reason}`);
        expect(Number.isFinite(o.errorBound)).toBe(true);
        for (let s = 0; s < m.nStates; s++) {
          const r = refModel.states.findIndex((st) => st.name === m.stateNames[s]);
          const err = Math.abs(o.values[s]! - (r >= 0 ? ref.values[r]! : 0));
          if (!(err <= o.errorBound + ref.errorBound)) throw new Error(`${o.method} ${JSON.stringify(c)} state ${m.stateNames[s]}: error ${err} > bound ${o.errorBound}`);
        }
        compared++;
      }
    }
    expect(compared).toBe(cases.length * 2 + 2 * cases.filter((c) => c.fastRate === 0).length);
  });
});
