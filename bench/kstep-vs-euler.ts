/**
 * k-step scheme (k = 1 … 4) against explicit Euler at precision 1e-7 on a small CTMDP with λT = 10.
 *
 *   npx tsc -p . && node dist/bench/kstep-vs-euler.js [precision]
 *
 * The model (our own invention, seeded): 15 states in a ring with shortcuts; every third state
 * chooses (max) between a fast risky action and a slow safe one; state 14 is the goal.
 */
import type { CompiledModel } from '../corpus/format/compile.js';
import { buildModel, type ModelObject } from '../corpus/format/build.js';
import { compile } from '../corpus/format/compile.js';
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
  const m = smallModel();
  console.log(`model ${m.name}: ${m.nStates} states, λ = ${m.lambda}, λT = ${(m.lambda * m.timeBound).toFixed(2)}, precision ${precision}`);
  const run = (label: string, f: () => ReturnType<typeof solveKstep>): number | undefined => {
    const t0 = performance.now();
    const o = f();
    const s = (performance.now() - t0) / 1000;
    if (o.kind === 'refused') {
      console.log(`${label}: refused (${o.reason}) after ${s.toFixed(3)} s`);
      return undefined;
    }
    console.log(`${label}: ${s.toFixed(4)} s, steps/intervals ${o.stats.intervals ?? o.stats.steps}, bound ${o.errorBound.toExponential(2)}, v(s0) = ${o.values[0]}`);
    return s;
  };
  // Euler runs once, with its work cap lifted (at 1e-7 it takes minutes: that is the point), after a
  // warm-up at a coarse precision; the k-step runs are repeated and the second run is reported.
  run('euler warm-up at 1e-4', () => solveEuler(m, { precision: 1e-4 }));
  const euler = run('euler', () => solveEuler(m, { precision, maxWork: 1e12 }));
  for (let rep = 0; rep < 2; rep++) {
    console.log(rep === 0 ? '-- first run (includes JIT warm-up)' : '-- second run');
    for (const k of [1, 2, 3, 4]) {
      const t = run(`kstep k = ${k}`, () => solveKstep(m, { precision, k }));
      if (rep === 1 && t !== undefined && euler !== undefined) console.log(`   time ratio euler / kstep k = ${k}: ${(euler / t).toFixed(0)}`);
    }
  }
}

if (process.argv[1]?.endsWith('kstep-vs-euler.js')) main();
