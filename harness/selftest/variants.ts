/**
 * Deliberately broken variants of the project's own solvers, each one realistic bug, for
 * `crossbound selftest`: the harness must catch every one of them on the corpus or in a short fuzz
 * run. Each wraps a correct solver and plants its bug in the input or the claim, so the correct
 * code stays untouched.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import { registerPlanted, type PlantedMethod } from '../check/planted.js';
import type { Outcome } from '../../corpus/format/result.js';
import type { Model } from '../../corpus/format/types.js';
import { solveEuler } from '../../solvers/euler/index.js';
import { CHECK_DEFECT_MAX_WORK, CHECK_EULER_MAX_WORK } from '../check/methods.js';
import { solveDefect } from '../../solvers/defect/index.js';
import { chooseEpsilon } from '../../solvers/kstep/bound.js';
import { solveKstep } from '../../solvers/kstep/index.js';
import { solveUniformization } from '../../solvers/uniformization/index.js';

export type Variant = PlantedMethod;

const relabel = (out: Outcome, name: string): Outcome => ({ ...out, method: `variant:${name}` });

/** Self-loop rates of the model, added per action (compile drops them; a buggy solver counts them). */
function selfLoopExit(model: Model, m: CompiledModel): Float64Array {
  const exit = Float64Array.from(m.exitRate);
  let a = 0;
  model.states.forEach((s, i) => {
    for (const act of s.actions) {
      for (const t of act.successors) if (t.target === i) exit[a] += t.rate;
      a++;
    }
  });
  return exit;
}

export const VARIANTS: readonly Variant[] = [
  {
    name: 'min-as-max',
    bug: 'the minimising player is treated as maximising (k-step scheme)',
    solve: (_model, m, p) => relabel(solveKstep({ ...m, owner: m.owner.map((o) => (o !== 0 ? 1 : 0)) as Int8Array }, { precision: p, k: 3 }), 'min-as-max'),
  },
  {
    name: 'selfloop-exit',
    bug: 'a self-loop rate is counted in the exit rate (k-step scheme)',
    solve: (model, m, p) => {
      const exitRate = selfLoopExit(model, m);
      const lambda = Math.max(m.lambda, ...exitRate);
      return relabel(solveKstep({ ...m, exitRate, lambda }, { precision: p, k: 3 }), 'selfloop-exit');
    },
  },
  {
    name: 'short-tail',
    bug: 'the Poisson tail is truncated at a thousand times the budget while the bound claims the budget (uniformization)',
    solve: (_model, m, p) => {
      const out = solveUniformization(m, { precision: Math.min(0.5, p * 1000) });
      return relabel(out.kind === 'solved' ? { ...out, errorBound: Math.min(out.errorBound, p) } : out, 'short-tail');
    },
  },
  {
    name: 'at-absorbing',
    bug: 'goal states are made absorbing in goal mode `at` (k-step scheme)',
    solve: (_model, m, p) => relabel(solveKstep({ ...m, goalMode: 'within' }, { precision: p, k: 3 }), 'at-absorbing'),
  },
  {
    name: 'skip-last',
    bug: 'the last, partial interval is skipped (k-step scheme)',
    solve: (_model, m, p) => {
      const eps = chooseEpsilon(Math.max(m.lambda, 1e-300), m.timeBound, 3, 0.9 * p);
      const whole = Math.floor(m.timeBound / eps) * eps;
      const T = whole > 0 && whole < m.timeBound ? whole : m.timeBound;
      return relabel(solveKstep({ ...m, timeBound: T }, { precision: p, k: 3 }), 'skip-last');
    },
  },
  {
    name: 'loose-tie',
    bug: 'coefficient differences below 1e-6 of a scale with the largest exit rate are ties the bound does not pay for (k-step scheme)',
    solve: (_model, m, p) => relabel(solveKstep(m, { precision: p, k: 3, looseTie: 1e-6 }), 'loose-tie'),
  },
  {
    name: 'defect-ends',
    bug: "the defect's range on a step is taken from its values at the step's two ends only, so a defect peaking inside a step is missed (defect)",
    solve: (_model, m, p) => relabel(solveDefect(m, { precision: p, maxWork: CHECK_DEFECT_MAX_WORK, rangeAtEnds: true }), 'defect-ends'),
  },
  {
    name: 'bound-third',
    bug: 'the reported bound is a third of the derived one (Euler)',
    solve: (_model, m, p) => {
      const out = solveEuler(m, { precision: p, maxWork: CHECK_EULER_MAX_WORK });
      return relabel(out.kind === 'solved' ? { ...out, errorBound: out.errorBound / 3 } : out, 'bound-third');
    },
  },
];

export function variantByName(name: string): Variant | undefined {
  return VARIANTS.find((v) => v.name === name);
}

// Loading this module plants the variants, under labels variant:NAME (../check/planted.ts).
registerPlanted(VARIANTS);
