/**
 * Near-tangent crossings for `fuzz`: models where the better action of a state changes twice within a
 * short time, so that the advantage of the held decision dips below zero inside one time step of a
 * solver and is positive again at both of the step's ends. A solver (or a bound) that looks at a step's
 * ends only does not see the dip.
 *
 * The gadget: state s, owned by the max or the min player, chooses between `a`, to x, which reaches
 * the goal at rate α (exponential: F_x(t) = 1 − e^{−αt}), and `b`, to y1 with probability β and to a
 * sink otherwise, where y1 → y2 → goal at rate γ each (Erlang-2: F_y(t) = 1 − e^{−γt}(1 + γt)); both
 * actions have exit rate r. With γ ≥ 2α the Erlang-2 time overtakes the exponential one (so that
 * β* ≤ 0.96, well below 1) and loses again to it for β < 1: the advantage F_x − βF_y (per unit rate) is positive, then negative, then positive
 * for β just above β* = min_t F_x(t)/F_y(t) (the distribution functions are textbook facts of the
 * exponential and Erlang distributions, common practice, no source). The dip's depth is about
 * (β − β*)·F_y and its width grows like √(β − β*); β = β*(1 + ε) with ε from 10^-4 to 3·10^-2.
 * β* is found numerically here (a grid over t, then golden-section refinement); only the model's rates
 * matter to the checks, not the accuracy of β*.
 */
import fc from 'fast-check';
import type { ModelObject } from '../format/build.js';
import type { GoalMode } from '../format/types.js';

export interface DipDraw {
  /** α = alpha/100 (0.2 … 5), γ = α·ratio/100 (ratio 200 … 400), the choice's rate r = rate/100 (0.2 … 5). */
  readonly alpha: number;
  readonly ratio: number;
  readonly rate: number;
  /** ε = 10^(−epsExp/10): epsExp 15 … 40 (ε from 3·10^-2 down to 10^-4). */
  readonly epsExp: number;
  /** The time bound: the end of the dip × (1.1 + time/100), time 0 … 200. */
  readonly time: number;
  readonly owner: 'max' | 'min';
  readonly mode: GoalMode;
}

/** min_t F_x(t)/F_y(t) and where it is reached, for rates α < γ. */
export function criticalMix(alpha: number, gamma: number): { beta: number; t: number } {
  const ratio = (t: number): number => -Math.expm1(-alpha * t) / -(Math.expm1(-gamma * t) + gamma * t * Math.exp(-gamma * t));
  const hi = 40 / alpha;
  let best = 1;
  let bestT = hi;
  for (let i = 1; i <= 4000; i++) {
    const t = (hi * i) / 4000;
    const r = ratio(t);
    if (r < best) [best, bestT] = [r, t];
  }
  let lo = Math.max(bestT - hi / 4000, 1e-9);
  let up = bestT + hi / 4000;
  const g = (Math.sqrt(5) - 1) / 2;
  for (let i = 0; i < 80; i++) {
    const m1 = up - g * (up - lo);
    const m2 = lo + g * (up - lo);
    if (ratio(m1) < ratio(m2)) up = m2;
    else lo = m1;
  }
  const t = 0.5 * (lo + up);
  return { beta: ratio(t), t };
}

export function arbDipDraw(): fc.Arbitrary<DipDraw> {
  return fc.record({
    alpha: fc.integer({ min: 20, max: 500 }),
    ratio: fc.integer({ min: 200, max: 400 }),
    rate: fc.integer({ min: 20, max: 500 }),
    epsExp: fc.integer({ min: 15, max: 40 }),
    time: fc.integer({ min: 0, max: 200 }),
    owner: fc.constantFrom<'max' | 'min'>('max', 'min'),
    mode: fc.constantFrom<GoalMode>('within', 'at'),
  });
}

export function buildDip(d: DipDraw): ModelObject {
  const alpha = d.alpha / 100;
  const gamma = Number(((alpha * d.ratio) / 100).toPrecision(6));
  const r = d.rate / 100;
  const { beta: crit, t } = criticalMix(alpha, gamma);
  const eps = 10 ** (-d.epsExp / 10);
  const beta = Number((crit * (1 + eps)).toPrecision(9));
  // The end of the dip: the first time after t where the advantage is positive again.
  const adv = (u: number): number => -Math.expm1(-alpha * u) - beta * -(Math.expm1(-gamma * u) + gamma * u * Math.exp(-gamma * u));
  let end = t;
  while (adv(end) <= 0 && end < 200 / alpha) end += 0.01 / alpha;
  const rb = Number((r * beta).toPrecision(9));
  const rz = Number((r - rb).toPrecision(9));
  return {
    format: 'crossbound/1',
    name: 'dip',
    description: `Near-tangent crossing: exponential (rate ${alpha}) against a ${beta} share of Erlang-2 (rate ${gamma}); ` +
      `the critical share is about ${crit.toPrecision(9)} at time left ${t.toPrecision(4)}, ε = ${eps.toPrecision(3)}.`,
    time_bound: Number((end * (1.1 + d.time / 100)).toPrecision(6)),
    goal: ['goal'],
    goal_mode: d.mode,
    initial: 's',
    states: {
      s: { owner: d.owner, actions: { a: { x: r }, b: { y1: rb, sink: rz } } },
      x: { actions: { go: { goal: alpha } } },
      y1: { actions: { go: { y2: gamma } } },
      y2: { actions: { go: { goal: gamma } } },
      goal: {},
      sink: {},
    },
  };
}

export function arbDipModelObject(): fc.Arbitrary<ModelObject> {
  return arbDipDraw().map(buildDip);
}
