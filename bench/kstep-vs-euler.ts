/**
 * k-step scheme (k = 1 … 4) against explicit Euler at precision 1e-7 on a small CTMDP with λT = 10.
 *
 *   npx tsc -p . && node dist/bench/kstep-vs-euler.js [precision] [model file]
 *
 * With a model file (any crossbound/1 model, e.g. corpus/generated/queue-control-6.yaml) that model
 * is used instead. Euler runs once (at 1e-7 it takes minutes); each k-step time is the median of five
 * runs after a warm-up, since single runs of a few milliseconds are at the mercy of a shared machine.
 *
 * The model (our own invention, seeded): 15 states in a ring with shortcuts; every third state
 * chooses (max) between a fast risky action and a slow safe one; state 14 is the goal.
 */
import type { CompiledModel } from '../corpus/format/compile.js';
import { buildModel, type ModelObject } from '../corpus/format/build.js';
import { compile } from '../corpus/format/compile.js';
import { loadModelFile } from '../corpus/format/load.js';
import { solveEuler } from '../solvers/euler/index.js';
import { solveKstep } from '../solvers/kstep/index.js';

export function smallModel(): CompiledModel {
  const n = 15;
  const states: NonNullable<ModelObject['states']> = {};
  for (let i = 0; i < n - 1; i++) {
    const next = `s${i + 1}`;
    const back = `s${Math.max(0, i - 2)}`;
    const skip = `s${Math.min(n - 1, i + 3)}`;
    states[`s${i}`] =
      i % 3 === 0
        ? { owner: 'max', actions: { risky: { [skip]: 0.6, [back]: 0.4 }, safe: { [next]: 0.7 } } }
        : { actions: { go: { [next]: 0.5 + 0.03 * i, [back]: 0.2 } } };
  }
  states[`s${n - 1}`] = {};
  const m = compile(buildModel({ name: 'ring15', time_bound: 1, goal: [`s${n - 1}`], initial: 's0', states }));
  return { ...m, timeBound: 10 / m.lambda };
}

function main(): void {
  const precision = Number(process.argv[2] ?? 1e-7);
  const m = process.argv[3] ? compile(loadModelFile(process.argv[3])) : smallModel();
  console.log(`model ${m.name}: ${m.nStates} states, λ = ${m.lambda}, λT = ${(m.lambda * m.timeBound).toFixed(2)}, precision ${precision}`);
  const run = (label: string, f: () => ReturnType<typeof solveKstep>, reps = 1): number | undefined => {
    const times: number[] = [];
    let o: ReturnType<typeof solveKstep> | undefined;
    for (let r = 0; r < reps; r++) {
      const t0 = performance.now();
      o = f();
      times.push((performance.now() - t0) / 1000);
    }
    times.sort((p, q) => p - q);
    const s = times[Math.floor(reps / 2)]!;
    if (!o || o.kind === 'refused') {
      console.log(`${label}: refused (${o?.kind === 'refused' ? o.reason : ''}) after ${s.toFixed(3)} s`);
      return undefined;
    }
    console.log(`${label}: ${s.toFixed(4)} s${reps > 1 ? ` (median of ${reps})` : ''}, steps/intervals ${o.stats.intervals ?? o.stats.steps}, ` +
      `bound ${o.errorBound.toExponential(2)}, v(s0) = ${o.values[0]}`);
    return s;
  };
  // Euler runs once, with its work cap lifted, after a warm-up at a coarse precision.
  run('euler warm-up at 1e-4', () => solveEuler(m, { precision: 1e-4 }));
  const euler = run('euler', () => solveEuler(m, { precision, maxWork: 1e12 }));
  for (const k of [1, 2, 3, 4]) run(`kstep k = ${k} warm-up`, () => solveKstep(m, { precision, k }));
  for (const k of [1, 2, 3, 4]) {
    const t = run(`kstep k = ${k}`, () => solveKstep(m, { precision, k }), 5);
    if (t !== undefined && euler !== undefined) console.log(`   time ratio euler / kstep k = ${k}: ${(euler / t).toFixed(0)}`);
  }
}

if (process.argv[1]?.endsWith('kstep-vs-euler.js')) main();
