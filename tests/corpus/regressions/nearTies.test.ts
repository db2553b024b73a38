/**
 * The near-tie regressions against closed forms computed here in decimal arithmetic (decimal.js
 * 10.6.0, independent of the oracles): each file's `expect` value, which came from the
 * optimal-control oracle, must match the value of the action that is optimal throughout, and that
 * action must satisfy the Bellman optimality condition on a grid of times.
 *
 * Closed forms (probability textbooks, e.g. S. M. Ross, Introduction to Probability Models, from
 * memory): an exponential time with rate a is ≤ T with probability 1 − e^{−aT}; the density of a sum
 * of independent exponential times with distinct rates a_1 … a_n at T is
 * (Π a_i) Σ_i e^{−a_i T} / Π_{j≠i} (a_j − a_i) (the hypoexponential distribution).
 */
import { readFileSync } from 'node:fs';
import { Decimal } from 'decimal.js';
import { describe, expect, test } from 'vitest';
import { loadModelText } from '../../../corpus/format/load.js';

const D = Decimal.clone({ precision: 50 });
type Dec = InstanceType<typeof D>;
const exp = (x: Dec | number): Dec => D.exp(new D(x));

function expected(file: string): { value: Dec; tolerance: number } {
  const model = loadModelText(readFileSync(`corpus/regressions/${file}`, 'utf8'), file);
  return { value: new D(model.expect!.values.s!), tolerance: model.expect!.tolerance };
}

/** Σ_i e^{−a_i T} / Π_{j≠i} (a_j − a_i): the convolution of e^{−a_1 x}, …, e^{−a_n x} at T. */
function convolution(rates: Dec[], T: Dec): Dec {
  let sum = new D(0);
  rates.forEach((a, i) => {
    let den = new D(1);
    rates.forEach((b, j) => {
      if (j !== i) den = den.times(b.minus(a));
    });
    sum = sum.plus(exp(a.times(T).neg()).div(den));
  });
  return sum;
}

describe('near-tie regressions against closed forms', () => {
  test('tie-frozen-goal: v_s = 1 − e^{−1.0005} (exponential distribution; g absorbing in mode within)', () => {
    const { value, tolerance } = expected('tie-frozen-goal.yaml');
    const closed = new D(1).minus(exp(-1.0005));
    expect(closed.minus(value).abs().toNumber()).toBeLessThanOrEqual(tolerance);
    // The reference quoted when the bug was found (30 digits).
    expect(closed.toSignificantDigits(30).toString()).toBe('0.632304452571876450235804744899');
  });

  test('min-tie-order1-fast: v_s = γ/(γ+ζ)(1 − e^{−(γ+ζ)T}), the larger rate to the sink (linear ODE)', () => {
    const { value, tolerance } = expected('min-tie-order1-fast.yaml');
    const g = new D('0.5');
    const z = new D('0.250075');
    const closed = g.div(g.plus(z)).times(new D(1).minus(exp(g.plus(z).times(2).neg())));
    expect(closed.minus(value).abs().toNumber()).toBeLessThanOrEqual(tolerance);
    // a1 (rate 0.25 to the sink) is worse for min by more than any precision the harness asks for.
    const z1 = new D('0.25');
    const a1 = g.div(g.plus(z1)).times(new D(1).minus(exp(g.plus(z1).times(2).neg())));
    expect(a1.minus(closed).toNumber()).toBeGreaterThan(2.5e-5);
  });

  test('at-tie-order2: the value of a2 (sums of exponentials), optimal on a grid of times', () => {
    const { value, tolerance } = expected('at-tie-order2.yaml');
    const leak = new D('0.3');
    const mu = new D('0.8');
    const Eu = new D('1.0');
    const vG = (t: Dec): Dec => exp(leak.times(t).neg());
    const vU = (t: Dec): Dec => mu.times(convolution([Eu, leak], t));
    // Under a fixed action (g: 0.4, z: pz, u: pu): P(in g at t) by the two paths s→g and s→u→g.
    const vS = (pz: string, pu: string, t: Dec): Dec => {
      const Es = new D('0.4').plus(pz).plus(pu);
      const direct = new D('0.4').times(convolution([Es, leak], t));
      return direct.plus(new D(pu).times(mu).times(convolution([Es, Eu, leak], t)));
    };
    const T = new D('1.5');
    expect(vS('0.2995', '0.5995', T).minus(value).abs().toNumber()).toBeLessThanOrEqual(tolerance);
    expect(vS('0.3', '0.6', T).toNumber()).toBeLessThan(value.toNumber());
    // Bellman optimality of a2 along its own value: Σ (R_a2 − R_a1)(v_succ − v_s) ≥ 0 at every grid time.
    for (let i = 1; i <= 300; i++) {
      const t = T.times(i).div(300);
      const vs = vS('0.2995', '0.5995', t);
      const adv = new D('-0.0005').times(vs.neg()).plus(new D('-0.0005').times(vU(t).minus(vs)));
      expect(adv.toNumber()).toBeGreaterThan(0);
    }
    // The successors' values at T as the oracle reported them in the file's run (g and u).
    expect(vG(T).toNumber()).toBeCloseTo(0.637628151621773293143743438312, 15);
    expect(vU(T).toNumber()).toBeCloseTo(0.473711990255249673383386248627, 15);
  });
});
