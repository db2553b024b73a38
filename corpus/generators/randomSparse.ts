/**
 * Family `random-sparse`: a random sparse CTMDP (or CTMG with player = mixed). States s0 … s(n−1);
 * every state has `actions` actions, each with `branching` distinct successors other than the state
 * itself, drawn uniformly from the seed. Rates are log-uniform over `spread` decades below `rate`
 * (rate · 10^(−u · spread), 4 significant digits). `goals` states, drawn from the seed, form the goal.
 * Owners: `max`, `min`, or `mixed` (each owned state's player drawn from the seed).
 * Size: n · actions · branching transitions (n = 10^5, 2 actions, 5 successors: 10^6). Written in the
 * flat form (rows), so states are numbered in order of first appearance, not s0, s1, ….
 */
import type { ModelObject, RateInput } from '../format/build.js';
import type { Owner } from '../format/types.js';
import { GeneratorError, Params, provenance } from './params.js';
import type { Spec } from './params.js';
import { Prng } from './prng.js';

export function randomSparse(spec: Spec): ModelObject {
  const p = new Params(spec);
  const n = p.int('states', 50, 2, 5_000_000);
  const nActions = p.int('actions', 2, 1, 16);
  const branching = p.int('branching', 3, 1, 64);
  const spread = p.num('spread', 2, 0, 12);
  const top = p.num('rate', 1, 0, 1e12, true);
  const goals = p.int('goals', 1, 0, n);
  const player = p.choice('player', 'max', ['max', 'min', 'mixed'] as const);
  const T = p.num('time_bound', 1, 0, 1e12, true);
  p.done('random-sparse');
  if (branching > n - 1) throw new GeneratorError('branching', `branching must be at most states − 1 = ${n - 1} (got ${branching})`);
  const rng = new Prng(p.seed);
  const names = Array.from({ length: n }, (_, i) => `s${i}`);
  const transitions: [string, string, string, RateInput][] = [];
  const owners: Record<string, Owner> = {};
  const actionNames = Array.from({ length: nActions }, (_, a) => `a${a}`);
  const picked = new Int32Array(branching);
  for (let s = 0; s < n; s++) {
    for (let a = 0; a < nActions; a++) {
      for (let k = 0; k < branching; k++) {
        let t: number;
        do t = rng.int(n);
        while (t === s || picked.subarray(0, k).includes(t));
        picked[k] = t;
        transitions.push([names[s]!, actionNames[a]!, names[t]!, Number((top * 10 ** (-rng.next() * spread)).toPrecision(4))]);
      }
    }
    const owner: Owner = player === 'mixed' ? (rng.next() < 0.5 ? 'max' : 'min') : player;
    if (nActions >= 2) owners[names[s]!] = owner;
  }
  // Goal states: a partial Fisher–Yates shuffle of the indices.
  const idx = Int32Array.from({ length: n }, (_, i) => i);
  for (let i = 0; i < goals; i++) {
    const j = i + rng.int(n - i);
    const t = idx[i]!;
    idx[i] = idx[j]!;
    idx[j] = t;
  }
  const goal = Array.from(idx.subarray(0, goals)).sort((x, y) => x - y).map((i) => names[i]!);
  return {
    format: 'crossbound/1',
    name: `random-sparse-${n}-${p.seed}`,
    description: provenance('random-sparse', p.seed, { states: n, actions: nActions, branching, spread, rate: top, goals, player, time_bound: T },
      'random sparse model; successors, rates, goal and owners drawn from the seed.'),
    time_bound: T,
    goal,
    initial: 's0',
    transitions,
    owners,
  };
}
