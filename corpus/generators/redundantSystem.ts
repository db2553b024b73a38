/**
 * Family `redundant-system`: a CTMDP of n repairable components (common practice, no source: the
 * textbook k-out-of-n system with one repair crew). A state is the set of failed components,
 * written as a bit string (`f0110`: components 1 and 2 failed), 2^n states. Working component i
 * fails at rate failure_i = failure · 10^(u_i · spread) (u_i uniform from the seed); the crew repairs
 * one failed component at rate `repair`. With two or more failed components the crew's choice
 * (`repair_lo`: the lowest-numbered, `repair_hi`: the highest-numbered) is owned by `player`
 * (max: the worst repair order, min: the best). Goal: at least `down` components failed.
 * Size: 2^n states, about (n + 2) · 2^n transitions (n = 17: 131 072 states, ~2.4 · 10^6). Written in
 * the flat form (rows): states are numbered in order of first appearance.
 */
import type { ModelObject, RateInput } from '../format/build.js';
import { Params, provenance } from './params.js';
import type { Spec } from './params.js';
import { Prng } from './prng.js';

export function redundantSystem(spec: Spec): ModelObject {
  const p = new Params(spec);
  const n = p.int('components', 4, 1, 20);
  const failure = p.num('failure', 0.1, 0, 1e12);
  const repair = p.num('repair', 1, 0, 1e12);
  const spread = p.num('spread', 1, 0, 12);
  const down = p.int('down', n, 1, n);
  const player = p.choice('player', 'max', ['max', 'min'] as const);
  const T = p.num('time_bound', 10, 0, 1e12, true);
  p.done('redundant-system');
  const rng = new Prng(p.seed);
  const fail: number[] = [];
  for (let i = 0; i < n; i++) fail.push(Number((failure * 10 ** (rng.next() * spread)).toPrecision(4)));
  const names: string[] = [];
  for (let m = 0; m < 1 << n; m++) {
    let s = 'f';
    for (let i = 0; i < n; i++) s += (m >> i) & 1 ? '1' : '0';
    names.push(s);
  }
  const transitions: [string, string, string, RateInput][] = [];
  const owners: Record<string, 'max' | 'min'> = {};
  const goal: string[] = [];
  for (let m = 0; m < 1 << n; m++) {
    const failures: number[] = [];
    let count = 0;
    let lo = -1;
    let hi = -1;
    for (let i = 0; i < n; i++) {
      if ((m >> i) & 1) {
        count++;
        if (lo < 0) lo = i;
        hi = i;
      } else failures.push(i);
    }
    if (count >= down) goal.push(names[m]!);
    const from = names[m]!;
    const emit = (action: string, fixed: number): void => {
      for (const i of failures) transitions.push([from, action, names[m | (1 << i)]!, fail[i]!]);
      if (fixed >= 0) transitions.push([from, action, names[m & ~(1 << fixed)]!, repair]);
    };
    if (count === 0) emit('run', -1);
    else if (lo === hi) emit('repair', lo);
    else {
      owners[from] = player;
      emit('repair_lo', lo);
      emit('repair_hi', hi);
    }
  }
  return {
    format: 'crossbound/1',
    name: `redundant-system-${n}`,
    description: provenance('redundant-system', p.seed, { components: n, failure, repair, spread, down, player, time_bound: T },
      `CTMDP of ${n} components with failure rates ${fail.join(', ')}; the ${player} player orders the repairs; goal = at least ${down} failed.`),
    time_bound: T,
    goal,
    initial: names[0]!,
    transitions,
    owners,
  };
}
