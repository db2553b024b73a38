/**
 * Family `birth-death`: a birth–death CTMC on states s0 … s(n−1) (common practice, no source: the
 * textbook M/M/1/K-type chain). From s_i: rate `arrival` to s_(i+1), rate `service` to s_(i−1).
 * The goal is the top state; the chain starts in s0. No randomness: the seed is only recorded.
 */
import type { ModelObject, RateInput } from '../format/build.js';
import { Params, provenance } from './params.js';
import type { Spec } from './params.js';

export function birthDeath(spec: Spec): ModelObject {
  const p = new Params(spec);
  const n = p.int('n', 10, 2, 5_000_000);
  const arrival = p.num('arrival', 1, 0, 1e12);
  const service = p.num('service', 2, 0, 1e12);
  const T = p.num('time_bound', 10, 0, 1e12, true);
  p.done('birth-death');
  const states: NonNullable<ModelObject['states']> = {};
  for (let i = 0; i < n; i++) {
    const succ: Record<string, RateInput> = {};
    if (i + 1 < n) succ[`s${i + 1}`] = arrival;
    if (i > 0) succ[`s${i - 1}`] = service;
    states[`s${i}`] = { actions: { step: succ } };
  }
  return {
    format: 'crossbound/1',
    name: `birth-death-${n}`,
    description: provenance('birth-death', p.seed, { n, arrival, service, time_bound: T },
      `birth-death CTMC; goal = top state s${n - 1}; start s0.`),
    time_bound: T,
    goal: [`s${n - 1}`],
    initial: 's0',
    states,
  };
}
