/**
 * Family `queue-control`: a CTMDP queue of capacity n whose service rate is chosen by a controller
 * (the minimising player) trying to avoid overflow (common practice, no source: controlled M/M/1/K
 * queues). States q{k}_ok and q{k}_broken, k = 0 … n. Arrivals at rate `arrival`. With a working
 * server and k ≥ 1 the controller picks `slow` (rate `slow`) or `fast` (rate `fast`, but the server
 * breaks at rate `wear`); a broken server serves nothing and is repaired at rate `repair`.
 * Goal: the queue is full (q{n}_ok or q{n}_broken). No randomness: the seed is only recorded.
 */
import type { ModelObject, RateInput } from '../format/build.js';
import { Params, provenance } from './params.js';
import type { Spec } from './params.js';

export function queueControl(spec: Spec): ModelObject {
  const p = new Params(spec);
  const n = p.int('capacity', 10, 1, 2_000_000);
  const arrival = p.num('arrival', 1, 0, 1e12);
  const slow = p.num('slow', 0.8, 0, 1e12);
  const fast = p.num('fast', 2, 0, 1e12);
  const wear = p.num('wear', 0.2, 0, 1e12);
  const repair = p.num('repair', 0.5, 0, 1e12);
  const T = p.num('time_bound', 10, 0, 1e12, true);
  p.done('queue-control');
  const states: NonNullable<ModelObject['states']> = {};
  for (let k = 0; k <= n; k++) {
    const up: Record<string, RateInput> = k < n ? { [`q${k + 1}_ok`]: arrival } : {};
    if (k === 0) states.q0_ok = { actions: { idle: up } };
    else {
      states[`q${k}_ok`] = {
        owner: 'min',
        actions: {
          slow: { ...up, [`q${k - 1}_ok`]: slow },
          fast: { ...up, [`q${k - 1}_ok`]: fast, [`q${k}_broken`]: wear },
        },
      };
    }
  }
  for (let k = 1; k <= n; k++) {
    const wait: Record<string, RateInput> = { [`q${k}_ok`]: repair };
    if (k < n) wait[`q${k + 1}_broken`] = arrival;
    states[`q${k}_broken`] = { actions: { wait } };
  }
  return {
    format: 'crossbound/1',
    name: `queue-control-${n}`,
    description: provenance('queue-control', p.seed, { capacity: n, arrival, slow, fast, wear, repair, time_bound: T },
      `controlled queue; the min player chooses slow or fast (wearing) service; goal = queue full.`),
    time_bound: T,
    goal: [`q${n}_ok`, `q${n}_broken`],
    initial: 'q0_ok',
    states,
  };
}
