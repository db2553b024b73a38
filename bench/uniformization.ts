/**
 * Benchmark of the uniformization and Euler kernels on a birth–death chain of 10^6 states.
 *
 *   npx tsc -p . && node dist/bench/uniformization.js [states] [repeats]
 *
 * Prints (1) the time per mat-vec of uniformization at λT = 100 (whole solve, Fox–Glynn and setup
 * included, divided by the number of mat-vecs) as a ratio to a bare typed-array CSR mat-vec
 * y = P x over the same matrix (diagonal stored as an explicit entry) in the same run — the target
 * is ≤ 1.5 — and (2) Euler's throughput in transitions per second. Best of `repeats` runs each.
 * The chain (our own invention): state i moves up at rate 1 and down at rate 0.5; goal: the top.
 */
import type { CompiledModel } from '../corpus/format/compile.js';
import { solveEuler } from '../solvers/euler/index.js';
import { solveUniformization } from '../solvers/uniformization/index.js';
import { nowSeconds } from '../solvers/shared/numeric.js';

const UP = 1;
const DOWN = 0.5;

function birthDeath(n: number, T: number): CompiledModel {
  const rowStart = new Int32Array(n + 1);
  const col = new Int32Array(2 * n - 2);
  const rate = new Float64Array(2 * n - 2);
  const exitRate = new Float64Array(n);
  let k = 0;
  for (let i = 0; i < n; i++) {
    rowStart[i] = k;
    if (i > 0) {
      col[k] = i - 1;
      rate[k++] = DOWN;
    }
    if (i < n - 1) {
      col[k] = i + 1;
      rate[k++] = UP;
    }
    exitRate[i] = (i > 0 ? DOWN : 0) + (i < n - 1 ? UP : 0);
  }
  rowStart[n] = k;
  const actionStart = new Int32Array(n + 1);
  for (let i = 0; i <= n; i++) actionStart[i] = i;
  const goal = new Uint8Array(n);
  goal[n - 1] = 1;
  return {
    name: `birth-death-${n}`, stateNames: Array.from({ length: n }, (_, i) => `s${i}`), nStates: n, nActions: n,
    nTransitions: k, actionStart, actionNames: new Array<string>(n).fill('step'), rowStart, col, rate, exitRate,
    owner: new Int8Array(n), goal, lambda: UP + DOWN, timeBound: T, goalMode: 'within', initial: 0,
  };
}

/** The bare kernel: CSR of P = I + Q/λ with the diagonal as an explicit entry, y = P x, `reps` times. */
function bareMatVecSeconds(m: CompiledModel, lambda: number, reps: number): number {
  const n = m.nStates;
  const ptr = new Int32Array(n + 1);
  const col = new Int32Array(m.nTransitions + n);
  const val = new Float64Array(m.nTransitions + n);
  let k = 0;
  for (let s = 0; s < n; s++) {
    ptr[s] = k;
    col[k] = s;
    val[k++] = 1 - m.exitRate[s]! / lambda;
    for (let j = m.rowStart[s]!; j < m.rowStart[s + 1]!; j++) {
      col[k] = m.col[j]!;
      val[k++] = m.rate[j]! / lambda;
    }
  }
  ptr[n] = k;
  let x = new Float64Array(n);
  let y = new Float64Array(n);
  x[n - 1] = 1;
  const t0 = nowSeconds();
  for (let r = 0; r < reps; r++) {
    for (let s = 0; s < n; s++) {
      let acc = 0;
      const end = ptr[s + 1]!;
      for (let j = ptr[s]!; j < end; j++) acc += val[j]! * x[col[j]!]!;
      y[s] = acc;
    }
    const t = x;
    x = y;
    y = t;
  }
  const sec = nowSeconds() - t0;
  if (!(x[n - 1]! >= 0)) throw new Error('unexpected'); // keeps the loop observable
  return sec;
}

function main(): void {
  const n = Number(process.argv[2] ?? 1e6);
  const repeats = Number(process.argv[3] ?? 3);
  const lambda = UP + DOWN;
  const model = birthDeath(n, 100 / lambda);
  // Warm-up on a small chain so that both kernels are optimised before timing.
  solveUniformization(birthDeath(1000, 100 / lambda), { precision: 1e-6 });
  bareMatVecSeconds(birthDeath(1000, 1), lambda, 200);
  solveEuler(birthDeath(1000, 0.5 / lambda), { precision: 1e-3 });

  let perUnif = Infinity;
  let perBare = Infinity;
  let iterations = 0;
  for (let r = 0; r < repeats; r++) {
    const out = solveUniformization(model, { precision: 1e-6 });
    if (out.kind !== 'solved') throw new Error(out.reason);
    iterations = out.stats.iterations!;
    perUnif = Math.min(perUnif, out.stats.seconds! / iterations);
    perBare = Math.min(perBare, bareMatVecSeconds(model, lambda, iterations) / iterations);
  }
  console.log(`birth–death chain: ${n} states, ${model.nTransitions} transitions, λT = 100`);
  console.log(`uniformization: ${iterations} mat-vecs, ${(perUnif * 1e3).toFixed(3)} ms per mat-vec (whole solve)`);
  console.log(`bare CSR mat-vec: ${(perBare * 1e3).toFixed(3)} ms`);
  console.log(`ratio uniformization / bare mat-vec: ${(perUnif / perBare).toFixed(3)} (target ≤ 1.5)`);

  const eulerModel = birthDeath(n, 0.5 / lambda);
  let best = Infinity;
  let steps = 0;
  for (let r = 0; r < repeats; r++) {
    const out = solveEuler(eulerModel, { precision: 1e-3 });
    if (out.kind !== 'solved') throw new Error(out.reason);
    steps = out.stats.steps!;
    best = Math.min(best, out.stats.seconds!);
  }
  const tps = (steps * eulerModel.nTransitions) / best;
  console.log(`Euler (λT = 0.5, precision 1e-3): ${steps} steps in ${best.toFixed(3)} s, ${(tps / 1e6).toFixed(1)} M transitions/s`);
}

main();
