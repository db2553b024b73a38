/**
 * Properties of the optimal oracle on random small models (corpus/generators/random.ts):
 *  - on single-action models it equals the exact exponential (expm) of the CTMC;
 *  - its scheduler's value, recomputed by expm from the emitted scheduler, equals its value;
 *  - no random positional (or two-piece timed) scheduler does better for the max player, and
 *    none does worse for the min player, where one player owns every choice.
 * Common practice, no source: an optimum dominates every fixed scheduler.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import type { Solved } from '../../../corpus/format/result.js';
import type { Scheduler } from '../../../corpus/format/scheduler.js';
import { modelKind, type Model } from '../../../corpus/format/types.js';
import { arbModelObject } from '../../../corpus/generators/random.js';
import { solveExpm } from '../../../oracles/expm/index.js';
import { solveOptimal } from '../../../oracles/optimal/index.js';

const DIGITS = 20;
const small = { maxStates: 4, maxSuccessors: 2, decades: 2, maxTime: 2 } as const;

function solved(o: ReturnType<typeof solveOptimal>): Solved {
  if (o.kind !== 'solved') throw new Error(o.reason);
  return o;
}

describe('optimal oracle: properties on random models', () => {
  it('equals expm on single-action models (CTMCs)', () => {
    fc.assert(
      fc.property(arbModelObject({ ...small, kind: 'ctmc' }), (obj) => {
        const m = buildModel(obj);
        const a = solved(solveOptimal(m, { digits: DIGITS }));
        const b = solved(solveExpm(m, { digits: DIGITS }));
        for (let s = 0; s < m.states.length; s++) {
          expect(Math.abs(a.values[s]! - b.values[s]!)).toBeLessThanOrEqual(a.errorBound + b.errorBound);
          expect(a.valuesDecimal![s]!.slice(0, DIGITS)).toBe(b.valuesDecimal![s]!.slice(0, DIGITS));
        }
      }),
      { numRuns: 10, seed: 7 },
    );
  });

  it("its scheduler's value by expm equals its value, and random schedulers never beat it", () => {
    let withChoices = 0;
    let switched = 0;
    const arb = fc.record({
      obj: arbModelObject({ ...small, kind: 'ctmdp', maxActions: 3 }),
      picks: fc.array(fc.array(fc.nat(5), { minLength: 2, maxLength: 2 }), { minLength: 4, maxLength: 4 }),
      cut: fc.double({ min: 0.05, max: 0.95, noNaN: true }),
    });
    fc.assert(
      fc.property(arb, ({ obj, picks, cut }) => {
        const m: Model = buildModel(obj);
        const out = solved(solveOptimal(m, { digits: DIGITS }));
        const own = solved(solveExpm(m, { digits: DIGITS, scheduler: out.scheduler! }));
        // The emitted switching times are doubles: the value moves by O(δt²) ≈ 1e-32 only.
        for (let s = 0; s < m.states.length; s++) expect(Math.abs(own.values[s]! - out.values[s]!)).toBeLessThanOrEqual(1e-18);
        if (modelKind(m) === 'CTMC') return;
        withChoices++;
        switched += out.stats.switches! > 0 ? 1 : 0;
        const sign = m.states.some((st) => st.actions.length >= 2 && st.owner === 'min') ? -1 : 1;
        const T = m.timeBound;
        const choices: Record<string, { from: number; action: string }[]> = {};
        m.states.forEach((st, s) => {
          if (st.actions.length < 2) return;
          const [p, q] = picks[s]!;
          const first = st.actions[p! % st.actions.length]!.name;
          const second = st.actions[q! % st.actions.length]!.name;
          choices[st.name] = first === second ? [{ from: 0, action: first }] : [{ from: 0, action: first }, { from: cut * T, action: second }];
        });
        const sched: Scheduler = { choices };
        const other = solved(solveExpm(m, { digits: DIGITS, scheduler: sched }));
        for (let s = 0; s < m.states.length; s++) {
          expect(sign * (other.values[s]! - out.values[s]!)).toBeLessThanOrEqual(out.errorBound + other.errorBound);
        }
      }),
      { numRuns: 30, seed: 11 },
    );
    // The property must have been exercised on real choices, some of them with switches.
    expect(withChoices).toBeGreaterThan(10);
    console.log(`random CTMDPs: ${withChoices} with choices, ${switched} with switches`);
  });

  it('games: the certificate holds (scheduler value = value, Bellman violation below the tolerance)', () => {
    fc.assert(
      fc.property(arbModelObject({ ...small, kind: 'ctmg' }), (obj) => {
        const m = buildModel(obj);
        const out = solved(solveOptimal(m, { digits: DIGITS }));
        expect(out.stats.bellmanViolation!).toBeLessThan(1e-20);
        expect(out.stats.certificateDisagreement!).toBeLessThan(1e-25);
        const own = solved(solveExpm(m, { digits: DIGITS, scheduler: out.scheduler! }));
        for (let s = 0; s < m.states.length; s++) expect(Math.abs(own.values[s]! - out.values[s]!)).toBeLessThanOrEqual(1e-18);
      }),
      { numRuns: 10, seed: 13 },
    );
  });
});
