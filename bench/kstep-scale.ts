/**
 * Scale benchmark of the k-step scheme: a generated CTMDP with 10^5 states and about 10^6
 * transitions, λT = 10, k = 4, precision 1e-6. Reports the solve time, the peak resident set size,
 * and the time of one level pass against a bare CSR mat-vec over the same matrix.
 *
 *   npx tsc -p . && node dist/bench/kstep-scale.js [states] [successorsPerAction]
 *
 * The instance is made here (a seeded linear congruential generator; the numbers are our own): every
 * state has one action with `succ` random successors, every tenth state a second action too, owned
 * alternately by max and min; 1% of the states are goals; rates are scaled so that λ = 1, T = 10.
 */
import type { CompiledModel } from '../corpus/format/compile.js';
import { solveKstep } from '../solvers/kstep/index.js';
import { makeWork, runInterval } from '../solvers/kstep/interval.js';

export function bigModel(S: number, succ: number, seed = 12345): CompiledModel {
  let st = seed >>> 0;
  const rnd = (): number => ((st = (Math.imul(st, 1664525) + 1013904223) >>> 0) / 2 ** 32);
  const nA = S + Math.floor(S / 10);
  const actionStart = new Int32Array(S + 1);
  const rowStart = new Int32Array(nA + 1);
  const col = new Int32Array(nA * succ);
  const rate = new Float64Array(nA * succ);
  const exitRate = new Float64Array(nA);
  const owner = new Int8Array(S);
  const goal = new Uint8Array(S);
  const actionNames: string[] = [];
  let a = 0;
  let t = 0;
  let lambda = 0;
  for (let s = 0; s < S; s++) {
    actionStart[s] = a;
    if (rnd() < 0.01) goal[s] = 1;
    const acts = s % 10 === 0 ? 2 : 1;
    if (acts === 2) owner[s] = (s / 10) % 2 === 0 ? 1 : -1;
    for (let q = 0; q < acts; q++, a++) {
      rowStart[a] = t;
      actionNames.push(q === 0 ? 'a' : 'b');
      let e = 0;
      for (let i = 0; i < succ; i++) {
        let c = Math.floor(rnd() * S);
        if (c === s) c = (c + 1) % S;
        col[t] = c;
        rate[t] = 0.05 + rnd();
        e += rate[t]!;
        t++;
      }
      exitRate[a] = e;
      lambda = Math.max(lambda, e);
    }
  }
  actionStart[S] = a;
  rowStart[a] = t;
  for (let i = 0; i < t; i++) rate[i] = rate[i]! / lambda;
  for (let i = 0; i < a; i++) exitRate[i] = exitRate[i]! / lambda;
  return {
    name: `big-${S}`, stateNames: Array.from({ length: S }, (_, i) => `s${i}`), nStates: S, nActions: a, nTransitions: t,
    actionStart, actionNames, rowStart, col, rate, exitRate, owner, goal, lambda: 1, timeBound: 10, goalMode: 'within', initial: 0,
  };
}

/** Seconds per bare mat-vec y = R·x over every action row (median of reps). */
export function matVecSeconds(m: CompiledModel, reps: number): number {
  const x = new Float64Array(m.nStates).fill(0.5);
  const y = new Float64Array(m.nActions);
  const times: number[] = [];
  for (let r = 0; r < reps; r++) {
    const t0 = performance.now();
    for (let a = 0; a < m.nActions; a++) {
      let acc = 0;
      for (let t = m.rowStart[a]!; t < m.rowStart[a + 1]!; t++) acc += m.rate[t]! * x[m.col[t]!]!;
      y[a] = acc;
    }
    times.push(performance.now() - t0);
    x[r % m.nStates] = y[r % m.nActions]! * 1e-9;
  }
  times.sort((p, q) => p - q);
  return times[Math.floor(reps / 2)]! / 1000;
}

/**
 * Start values of a realistic interval: the solution with half the time left (a k = 4 solve at
 * precision 1e-4 of the same model with time bound T/2), goal states absorbing.
 */
export function midValues(m: CompiledModel): Float64Array {
  const out = solveKstep({ ...m, timeBound: m.timeBound / 2 }, { precision: 1e-4, k: 4 });
  if (out.kind === 'refused') throw new Error(out.reason);
  return out.values;
}

/** Seconds per interval of length len with k levels (median of reps) from the start values x. */
export function intervalSeconds(m: CompiledModel, x: Float64Array, k: number, len: number, reps: number): { secs: number; slow: number } {
  const S = m.nStates;
  const active = new Uint8Array(S);
  for (let s = 0; s < S; s++) active[s] = m.goal[s] ? 0 : 1;
  const w = makeWork(m, k, active, x, 32);
  const out = new Float64Array(S);
  const times: number[] = [];
  for (let r = 0; r < reps; r++) {
    const t0 = performance.now();
    runInterval(w, x, len, out);
    times.push(performance.now() - t0);
  }
  times.sort((p, q) => p - q);
  return { secs: times[Math.floor(reps / 2)]! / 1000, slow: w.slowStates / reps };
}

function main(): void {
  const S = Number(process.argv[2] ?? 1e5);
  const succ = Number(process.argv[3] ?? 9);
  const m = bigModel(S, succ);
  console.log(`model: ${m.nStates} states, ${m.nActions} actions, ${m.nTransitions} transitions, λT = ${m.lambda * m.timeBound}`);
  const x = midValues(m);
  const mv = matVecSeconds(m, 30);
  console.log(`bare CSR mat-vec: ${(mv * 1e3).toFixed(2)} ms`);
  const len = 0.0287; // the interval length the solve below uses (λ = 1, k = 4, precision 1e-6)
  let prev = 0;
  for (let k = 1; k <= 4; k++) {
    const { secs, slow } = intervalSeconds(m, x, k, len, 15);
    const mv2 = matVecSeconds(m, 15);
    console.log(`k = ${k}: interval ${(secs * 1e3).toFixed(2)} ms (${slow.toFixed(0)} slow state-levels), mean level pass ` +
      `${(secs / k / mv2).toFixed(2)}× mat-vec, level-${k} pass ≈ ${((secs - prev) / mv2).toFixed(2)}× mat-vec`);
    prev = secs;
  }
  const t0 = performance.now();
  const out = solveKstep(m, { precision: 1e-6, k: 4 });
  const secs = (performance.now() - t0) / 1000;
  if (out.kind === 'refused') throw new Error(out.reason);
  const rss = process.resourceUsage().maxRSS / 1024;
  console.log(`solve k = 4, precision 1e-6: ${secs.toFixed(2)} s, ${out.stats.intervals} intervals, maxPieces ${out.stats.maxPieces}, ` +
    `slow state-levels ${out.stats.slowStateLevels}, errorBound ${out.errorBound.toExponential(3)}, peak RSS ${rss.toFixed(0)} MB`);
  console.log(`mean level pass in the solve: ${((secs / (out.stats.intervals! * 4)) / mv).toFixed(2)}× mat-vec`);
}

if (process.argv[1]?.endsWith('kstep-scale.js')) main();
