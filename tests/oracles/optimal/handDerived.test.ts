/**
 * The optimal oracle against optima derived by hand (closedForm.ts), to 25+ digits, and its
 * switching times against τ*.
 */
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { solveOptimal } from '../../../oracles/optimal/index.js';
import { DC, oneSwitch, within } from './closedForm.js';

function oneSwitchModel(mu: string, lambda: string, gamma: string, T: string) {
  return buildModel({
    time_bound: T, goal: ['g'],
    states: {
      s: { owner: 'max', actions: { direct: { g: mu }, via: { t: lambda } } },
      t: { actions: { go: { g: gamma } } },
      g: {},
    },
  });
}

function solvedOf(m: ReturnType<typeof buildModel>, digits: number) {
  const out = solveOptimal(m, { digits });
  if (out.kind !== 'solved') throw new Error(out.reason);
  return out;
}

describe('optimal oracle: hand-derived optimum with one switch (closedForm.ts, derived here)', () => {
  it('μ = 1, λ = 3, γ = 2, T = 2: value to 30 digits, switch at elapsed T − ln(3/2)', () => {
    const out = solvedOf(oneSwitchModel('1', '3', '2', '2'), 30);
    const ref = oneSwitch('1', '3', '2', '2');
    // v_s(2) = 1 − 3e^{−4} + (9/4)e^{−6}, derived by hand.
    const byHand = new DC(1).minus(new DC(-4).exp().times(3)).plus(new DC(-6).exp().times('2.25'));
    expect(ref.vs.minus(byHand).abs().toNumber()).toBeLessThan(1e-50);
    expect(out.stats.digitsConfirmed).toBe(30);
    expect(within(out.valuesDecimal![0]!, ref.vs, 30)).toBe(true);
    expect(within(out.valuesDecimal![1]!, ref.vt, 30)).toBe(true);
    const segs = out.scheduler!.choices['s']!;
    expect(segs.map((g) => g.action)).toEqual(['via', 'direct']);
    expect(Math.abs(segs[1]!.from - (2 - Math.log(1.5)))).toBeLessThan(1e-15);
    expect(out.stats.switches).toBe(1);
    expect(out.stats.bellmanViolation).toBeLessThanOrEqual(1e-30);
  });

  it('an early switch (λ = 1000: τ* ≈ 1.0005e-3 before the deadline), 25 digits', () => {
    const out = solvedOf(oneSwitchModel('1', '1000', '2', '1.5'), 25);
    const ref = oneSwitch('1', '1000', '2', '1.5');
    expect(within(out.valuesDecimal![0]!, ref.vs, 25)).toBe(true);
    const segs = out.scheduler!.choices['s']!;
    expect(segs.length).toBe(2);
    expect(Math.abs(1.5 - segs[1]!.from - ref.tauStar.toNumber())).toBeLessThan(1e-15);
  });
});
