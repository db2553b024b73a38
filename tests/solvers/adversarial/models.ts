/**
 * Models built to hit the weak points of the solvers' derivations: near-ties between actions at a
 * chosen order, frozen goal states and unrelated states with huge rates, and whole models scaled by
 * a power of ten (rates up, time down). Each is given as a model object (format crossbound/1).
 */
import type { ModelObject } from '../../../corpus/format/build.js';

export interface NearTie {
  /** The right-hand sides of the two actions agree in their coefficients below `order`. */
  readonly order: number;
  /** Relative gap of the last stage rate of action b against action a. */
  readonly gap: number;
  readonly owner: 'max' | 'min';
  readonly goalMode: 'within' | 'at';
  /** Rate out of the goal state (frozen in mode `within`; none in mode `at`); 0: none. */
  readonly goalRate: number;
  /** Rate of an unrelated state that evolves (it sets λ for every solver with one global step); 0: none. */
  readonly fastRate: number;
  /** Multiply every rate by 10^scale and divide the time bound by it. */
  readonly scale: number;
}

/**
 * State s chooses between two chains of order + 1 stages into the goal g, a: rates 1.5, 1.2, …, and
 * b: the same with the last stage's rate times (1 + gap). Starting with no time left, v_s(t) under
 * either action is ~ c·t^{order+1}, so the right-hand sides of s agree up to τ^{order−1} and differ
 * at τ^order by the relative gap: a near-tie at that order (common practice, no source: the Taylor
 * expansion of the Erlang/hypoexponential distribution function at 0 starts at t^n for n stages).
 */
export function nearTie(p: NearTie): ModelObject {
  const f = 10 ** p.scale;
  const r = (x: number): number => x * f;
  const stages = [1.5, 1.2, 0.9, 1.1, 1.3];
  const states: Record<string, unknown> = {};
  const chain = (name: string, lastFactor: number): string => {
    const n = p.order + 1;
    for (let i = 1; i < n; i++) {
      const next = i + 1 < n ? `${name}${i + 1}` : 'g';
      const rate = i + 1 < n ? stages[i]! : stages[i]! * lastFactor;
      states[`${name}${i}`] = { actions: { go: { [next]: r(rate) } } };
    }
    return n > 1 ? `${name}1` : 'g';
  };
  const aFirst = chain('a', 1);
  const bFirst = chain('b', 1 + p.gap);
  const bRate = p.order === 0 ? stages[0]! * (1 + p.gap) : stages[0]!;
  states.s = { owner: p.owner, actions: { a: { [aFirst]: r(stages[0]!) }, b: { [bFirst]: r(bRate) } } };
  states.z = {};
  // In mode `within` the goal is frozen, so its huge rate must not matter; in mode `at` it would.
  states.g = p.goalRate > 0 && p.goalMode === 'within' ? { actions: { boom: { z: r(p.goalRate) } } } : {};
  if (p.fastRate > 0) states.fast = { actions: { spin: { z: r(p.fastRate) } } };
  return {
    format: 'crossbound/1',
    name: `near-tie-${p.order}`,
    time_bound: 1.3 / f,
    goal: ['g'],
    goal_mode: p.goalMode,
    initial: 's',
    states,
  } as ModelObject;
}
