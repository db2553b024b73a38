/**
 * Family `random-game`: one draw of the fuzzing arbitrary (random.ts) at the given seed — a small
 * random CTMG (or CTMC, CTMDP) with log-uniform rates over `decades` decades, random owners, goals,
 * goal mode, self-loops and absorbing states — so that a fuzz-style model can live in the corpus
 * as a three-line file. Deterministic for a seed and the pinned fast-check version.
 */
import fc from 'fast-check';
import type { ModelObject } from '../format/build.js';
import { Params, provenance } from './params.js';
import type { Spec } from './params.js';
import { arbModelObject } from './random.js';

export function randomGame(spec: Spec): ModelObject {
  const p = new Params(spec);
  const states = p.int('states', 6, 1, 40);
  const actions = p.int('actions', 3, 1, 8);
  const successors = p.int('successors', 3, 0, 8);
  const decades = p.num('decades', 4, 0, 8);
  const kind = p.choice('kind', 'any', ['ctmc', 'ctmdp', 'ctmg', 'any'] as const);
  const maxTime = p.num('max_time', 5, 0.05, 1e6);
  p.done('random-game');
  // fast-check draws small values first; the tenth draw is a typical one.
  const draws = fc.sample(arbModelObject({ maxStates: states, maxActions: actions, maxSuccessors: successors, decades, kind, maxTime }), { seed: p.seed, numRuns: 10 });
  return {
    ...draws[9]!,
    name: `random-game-${p.seed}`,
    description: provenance('random-game', p.seed, { states, actions, successors, decades, kind, max_time: maxTime },
      `a random model drawn by fast-check at this seed (up to ${states} states).`),
  };
}
