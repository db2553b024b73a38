/**
 * Family `random-game`: one draw of the fuzzing arbitrary (random.ts) at the given seed — a small
 * random CTMG (or CTMC, CTMDP) with log-uniform rates over `decades` decades, random owners, goals,
 * goal mode, self-loops and absorbing states — so that a fuzz-style model can live in the corpus
 * as a three-line file. Deterministic for a seed and the pinned fast-check version.
 *
 * An action drawn without successors is written as a self-loop at rate 1: the same dynamics (a rate
 * from s to s has no effect), stated on purpose, so that a corpus model raises no "no successors"
 * warning (that warning is for hand-written files, where an empty action is more often a slip).
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
  const draw = draws[9]!;
  return {
    ...draw,
    states: explicitSelfLoops(draw.states ?? {}),
    name: `random-game-${p.seed}`,
    description: provenance('random-game', p.seed, { states, actions, successors, decades, kind, max_time: maxTime },
      `a random model drawn by fast-check at this seed (up to ${states} states).`),
  };
}

/** Every action without successors becomes a self-loop at rate 1 (no effect on the dynamics). */
function explicitSelfLoops(states: NonNullable<ModelObject['states']>): NonNullable<ModelObject['states']> {
  const out: NonNullable<ModelObject['states']> = {};
  for (const [s, st] of Object.entries(states)) {
    const actions = Object.fromEntries(
      Object.entries(st.actions ?? {}).map(([a, succ]) => [a, Object.keys(succ).length === 0 ? { [s]: 1 } : succ]),
    );
    out[s] = { ...st, actions };
  }
  return out;
}
