/**
 * The hard cases of corpus/oracle-cases/: each file's expectation (closed forms derived in the
 * files' descriptions), plus the structure of the optimal scheduler (switch counts and times).
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { buildModel, type ModelObject } from '../../../corpus/format/build.js';
import type { Solved } from '../../../corpus/format/result.js';
import { stateIndex, type Model } from '../../../corpus/format/types.js';
import { solveExpm } from '../../../oracles/expm/index.js';
import { solveOptimal } from '../../../oracles/optimal/index.js';
import { DC, within } from './closedForm.js';

export function loadCase(name: string): Model {
  const obj = parse(readFileSync(new URL(`../../../corpus/oracle-cases/${name}.yaml`, import.meta.url), 'utf8')) as ModelObject;
  return buildModel(obj, name);
}

function solveCase(name: string, digits: number): { m: Model; out: Solved } {
  const m = loadCase(name);
  const out = solveOptimal(m, { digits });
  if (out.kind !== 'solved') throw new Error(`${name}: ${out.reason}`);
  console.log(`${name}: ${out.stats.digitsConfirmed} digits, ${out.stats.seconds!.toFixed(2)} s (certificate ${out.stats.secondsCertificate!.toFixed(2)} s), ${out.stats.cells} cells, ${out.stats.switches} switches`);
  return { m, out };
}

function checkExpect(m: Model, out: Solved, digits: number): void {
  expect(out.stats.digitsConfirmed).toBe(digits);
  for (const [name, ref] of Object.entries(m.expect!.values)) {
    const s = stateIndex(m, name);
    expect(within(out.valuesDecimal![s]!, new DC(ref), Math.min(digits, -Math.log10(m.expect!.tolerance)))).toBe(true);
    expect(Math.abs(out.values[s]! - Number(ref))).toBeLessThanOrEqual(out.errorBound);
  }
}

const switchTimes = (out: Solved, state: string) => out.scheduler!.choices[state]!.map((g) => [g.from, g.action] as const);

describe('optimal oracle on corpus/oracle-cases', () => {
  it('stiff rates 1e-4 … 1e4: closed form to 25 digits, switch 1.0001e-8 before the deadline', () => {
    const { m, out } = solveCase('stiff-rates', 25);
    checkExpect(m, out, 25);
    const segs = switchTimes(out, 's');
    expect(segs.map((g) => g[1])).toEqual(['tube', 'post']);
    // τ* ≈ 1.0001000150018e-8 from the closed form; the elapsed switch time is a double near 0.5.
    expect(Math.abs(0.5 - segs[1]![0] - 1.0001000150018335e-8)).toBeLessThan(1e-16);
  });

  it('two actions whose advantages differ by 1e-12: the switch is found, 25 digits', () => {
    const { m, out } = solveCase('tiny-advantage', 25);
    checkExpect(m, out, 25);
    expect(switchTimes(out, 's').map((g) => g[1])).toEqual(['blend', 'direct']);
    expect(Math.abs(2 - switchTimes(out, 's')[1]![0] - Math.log(1.5))).toBeLessThan(1e-15);
    // Not the direct-only value 1 − e^{−2}, which is ~2.2e-13 lower.
    expect(new DC(out.valuesDecimal![0]!).minus(new DC(-2).exp().neg().plus(1)).toNumber()).toBeGreaterThan(2e-13);
  });

  it('simultaneous switches in two states', () => {
    const { m, out } = solveCase('simultaneous-switch', 30);
    checkExpect(m, out, 30);
    expect(out.stats.switches).toBe(2);
    expect(out.stats.segments).toBe(2);
    expect(switchTimes(out, 's1')).toEqual(switchTimes(out, 's2'));
  });

  it('a switch at the very start: 1.0005e-3 before the deadline', () => {
    const { m, out } = solveCase('early-switch', 25);
    checkExpect(m, out, 25);
    expect(Math.abs(1.5 - switchTimes(out, 's')[1]![0] - Math.log(1000 / 999))).toBeLessThan(1e-15);
  });

  it('a tie of first derivatives at the deadline, broken by the second', () => {
    const { m, out } = solveCase('start-tie', 30);
    checkExpect(m, out, 30);
    expect(out.stats.decisionOrder).toBe(1);
    expect(switchTimes(out, 's')).toEqual([[0, 'ridge']]);
  });

  it('identical actions (one with a self-loop) are a tie that is no switch', () => {
    const { m, out } = solveCase('identical-actions', 30);
    checkExpect(m, out, 30);
    expect(out.stats.switches).toBe(1);
    expect(switchTimes(out, 's').map((g) => g[1])).toEqual(['via', 'walk']);
  });

  it('a max-owned and a min-owned state switching in opposite directions', () => {
    const { m, out } = solveCase('opposite-switches', 30);
    checkExpect(m, out, 30);
    expect(switchTimes(out, 'sender').map((g) => g[1])).toEqual(['courier', 'direct']);
    const censor = switchTimes(out, 'censor');
    expect(censor.map((g) => g[1])).toEqual(['direct', 'courier']);
    expect(Math.abs(2 - censor[1]![0] - Math.log(4 / 3))).toBeLessThan(1e-15);
  });

  it('goal mode at (gate not absorbing): solved with 30 digits and a small Bellman violation', () => {
    const { out } = solveCase('goal-at', 30);
    expect(out.stats.digitsConfirmed).toBe(30);
    expect(out.stats.bellmanViolation).toBeLessThan(1e-30);
    for (const v of out.values) expect(v).toBeGreaterThan(0);
  });

  it('one-switch', () => {
    const { m, out } = solveCase('one-switch', 30);
    checkExpect(m, out, 30);
  });
});

describe('no fixed scheduler beats the optimum on the max-only cases (common practice, no source)', () => {
  for (const name of ['one-switch', 'tiny-advantage', 'simultaneous-switch', 'early-switch', 'start-tie', 'identical-actions']) {
    it(`${name}: random two-piece schedulers and a shifted switch do no better`, () => {
      const m = loadCase(name);
      const out = solveOptimal(m, { digits: 20 });
      if (out.kind !== 'solved') throw new Error(out.reason);
      const T = m.timeBound;
      fc.assert(
        fc.property(fc.array(fc.nat(2), { minLength: 2 * m.states.length, maxLength: 2 * m.states.length }), fc.double({ min: 0, max: 1, noNaN: true }), (picks, cut) => {
          const choices: Record<string, { from: number; action: string }[]> = {};
          m.states.forEach((st, s) => {
            if (st.actions.length < 2) return;
            const a = st.actions[picks[2 * s]! % st.actions.length]!.name;
            const b = st.actions[picks[2 * s + 1]! % st.actions.length]!.name;
            choices[st.name] = a === b || cut * T <= 0 ? [{ from: 0, action: a }] : [{ from: 0, action: a }, { from: cut * T, action: b }];
          });
          const other = solveExpm(m, { digits: 20, scheduler: { choices } });
          if (other.kind !== 'solved') throw new Error(other.reason);
          for (let s = 0; s < m.states.length; s++) expect(other.values[s]! - out.values[s]!).toBeLessThanOrEqual(out.errorBound + other.errorBound);
        }),
        { numRuns: 8, seed: 3 },
      );
      // Moving every switch of the optimal scheduler by 1% of T loses value (strictly).
      const shifted: Record<string, { from: number; action: string }[]> = {};
      for (const [st, segs] of Object.entries(out.scheduler!.choices)) shifted[st] = segs.map((g, i) => (i === 0 ? g : { ...g, from: g.from - 0.01 * T }));
      const moved = solveExpm(m, { digits: 20, scheduler: { choices: shifted } });
      if (moved.kind !== 'solved') throw new Error(moved.reason);
      // (Not for early-switch: by elapsed time 1.48 the tender has left s with probability 1 − e^{−1480}.)
      if (out.stats.switches! > 0 && name !== 'early-switch') {
        const loss = Math.max(...out.valuesDecimal!.map((v, s) => new DC(v).minus(new DC(moved.valuesDecimal![s]!)).toNumber()));
        expect(loss).toBeGreaterThan(1e-19);
      }
    });
  }
});
