/**
 * The k-step scheme on a random two-player game against an explicit Runge–Kutta integrator of the
 * same Bellman equations (scipy's DOP853, Hairer, Nørsett & Wanner, "Solving Ordinary Differential
 * Equations I", 1993; no error guarantee), one model file shared by both.
 *
 *   npx tsc -p . && node dist/bench/kstep-game.js [--states 20000] [--succ 4] [--seed 1] [--precision 1e-8]
 *        [--k 4] [--rtol 1e-12] [--no-scipy] [--level-pass] [--keep FILE] [--baseline DIR]
 *
 * The model (our own numbers; deterministic by seed, a linear congruential generator): every state has
 * two actions of `succ` random successors with rates 0.05 + U(0, 1) written with 6 decimals, owned by
 * max or min at random; 1 % of the states are goals (mode within); the time bound makes λT = 10. It is
 * written as flat JSON (crossbound/1). Figures:
 *   - kstep: the whole process `node dist/harness/cli/main.js solve FILE --method kstep …` under
 *     /usr/bin/time (wall seconds, peak RSS), with its stats;
 *   - scipy: bench/kstep_game_scipy.py, the integration alone (loading excluded), its RHS evaluations;
 *   - the largest difference of the two answers, and the ratio kstep wall / scipy compute;
 *   - with --level-pass: in this process, the mean time of one level pass over a whole interval of the
 *     solve's own length, against a bare CSR mat-vec over the same matrix.
 * The machine is shared: ratios are meaningful only within one run.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { compile } from '../corpus/format/compile.js';
import { loadModelFile } from '../corpus/format/load.js';
import { matVecSeconds } from './kstep-scale.js';
import { makeWork, runInterval } from '../solvers/kstep/interval.js';

export interface GameSpec {
  readonly states: number;
  readonly succ: number;
  readonly seed: number;
}

/** The game as a crossbound/1 flat-form object (see the header). */
export function gameObject(g: GameSpec): Record<string, unknown> {
  let st = g.seed >>> 0;
  const rnd = (): number => (st = (Math.imul(st, 1664525) + 1013904223) >>> 0) / 2 ** 32;
  const rows: [string, string, string, number][] = [];
  const owners: Record<string, string> = {};
  const goal: string[] = [];
  let lambda = 0;
  for (let s = 0; s < g.states; s++) {
    if (rnd() < 0.01) goal.push(`s${s}`);
    owners[`s${s}`] = rnd() < 0.5 ? 'max' : 'min';
    for (const a of ['a', 'b']) {
      let e = 0;
      for (let i = 0; i < g.succ; i++) {
        let c = Math.floor(rnd() * g.states);
        if (c === s) c = (c + 1) % g.states;
        const r = Math.round((0.05 + rnd()) * 1e6) / 1e6;
        rows.push([`s${s}`, a, `s${c}`, r]);
        e += r;
      }
      lambda = Math.max(lambda, e);
    }
  }
  if (goal.length === 0) goal.push('s0');
  const T = Math.round((10 / lambda) * 1e6) / 1e6;
  return {
    format: 'crossbound/1', name: `game-${g.states}-${g.succ}-${g.seed}`,
    description: 'Random two-player game for bench/kstep-game.ts (seeded, our own numbers).',
    time_bound: T, goal, goal_mode: 'within', initial: 's0', transitions: rows, owners,
  };
}

function arg(name: string, dflt: string): string {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1]! : dflt;
}

interface Timed { wall: number; rssMB: number; stdout: string }

let baselineWall = 0;

/** Runs a command under /usr/bin/time -f '%e %M' and returns its wall seconds and peak RSS. */
function timed(cmd: string, args: string[]): Timed {
  const r = spawnSync('/usr/bin/time', ['-f', '@@time %e %M', cmd, ...args], { encoding: 'utf8', maxBuffer: 1 << 30 });
  const m = /@@time ([\d.]+) (\d+)/.exec(r.stderr);
  if (r.status !== 0 || !m) throw new Error(`${cmd} ${args.join(' ')} failed (${r.status}): ${r.stderr.slice(-2000)}`);
  return { wall: Number(m[1]), rssMB: Number(m[2]) / 1024, stdout: r.stdout };
}

function main(): void {
  const spec = { states: Number(arg('states', '20000')), succ: Number(arg('succ', '4')), seed: Number(arg('seed', '1')) };
  const precision = arg('precision', '1e-8');
  const k = arg('k', '4');
  const rtol = arg('rtol', '1e-12');
  const dir = mkdtempSync(join(tmpdir(), 'kstep-game-'));
  const file = process.argv.includes('--keep') ? arg('keep', '') : join(dir, 'game.json');
  writeFileSync(file, JSON.stringify(gameObject(spec)));
  const model = compile(loadModelFile(file));
  console.log(`model ${model.name}: ${model.nStates} states, ${model.nActions} actions, ${model.nTransitions} transitions, ` +
    `λT = ${(model.lambda * model.timeBound).toFixed(3)}`);
  const baseline = process.argv.includes('--baseline') ? arg('baseline', '') : '';
  if (baseline) {
    // The same solve with another build (a checkout of an earlier commit, built), for a before/after ratio.
    const b = timed(process.execPath, [join(baseline, 'dist/harness/cli/main.js'), 'solve', file, '--method', 'kstep', '--k', k, '--precision', precision, '--json']);
    const bs = (JSON.parse(b.stdout) as { stats: Record<string, number>; error_bound: number });
    console.log(`baseline ${baseline}: ${b.wall.toFixed(2)} s, peak RSS ${b.rssMB.toFixed(0)} MB, bound ${bs.error_bound.toExponential(2)}, ` +
      `intervals ${bs.stats.intervals}, slow state-levels ${bs.stats.slowStateLevels}`);
    baselineWall = b.wall;
  }
  const solve = timed(process.execPath, ['dist/harness/cli/main.js', 'solve', file, '--method', 'kstep', '--k', k, '--precision', precision, '--json']);
  if (baselineWall > 0) console.log(`(ratio baseline / this build, whole process: ${(baselineWall / solve.wall).toFixed(2)})`);
  const res = JSON.parse(solve.stdout) as { values: Record<string, number>; error_bound: number; stats: Record<string, number> };
  const st = res.stats;
  console.log(`kstep k = ${k} at ${precision} (whole process): ${solve.wall.toFixed(2)} s, peak RSS ${solve.rssMB.toFixed(0)} MB, ` +
    `bound ${res.error_bound.toExponential(2)}, intervals ${st.intervals}, slow state-levels ${st.slowStateLevels}, ` +
    `halvings ${st.halvings}, rejected ${st.rejected}, shortcut state-levels ${st.shortcutStateLevels}, solver seconds ${Number(st.seconds).toFixed(2)}`);
  if (!process.argv.includes('--no-scipy')) {
    const out = join(dir, 'scipy.json');
    const py = execFileSync('python3', ['bench/kstep_game_scipy.py', file, out, rtol], { encoding: 'utf8', maxBuffer: 1 << 30 });
    const sp = JSON.parse(py) as { seconds: number; nfev: number };
    const vals = JSON.parse(readFileSync(out, 'utf8')) as Record<string, number>;
    let diff = 0;
    for (const [n, v] of Object.entries(res.values)) diff = Math.max(diff, Math.abs(v - vals[n]!));
    console.log(`scipy DOP853 rtol = atol = ${rtol} (integration alone): ${sp.seconds.toFixed(2)} s, ${sp.nfev} RHS evaluations`);
    console.log(`largest difference ${diff.toExponential(2)} (kstep bound ${res.error_bound.toExponential(2)})`);
    console.log(`ratio kstep whole process / scipy integration: ${(solve.wall / sp.seconds).toFixed(2)}`);
  }
  if (process.argv.includes('--level-pass')) {
    const S = model.nStates;
    const active = new Uint8Array(S);
    for (let s = 0; s < S; s++) active[s] = model.goal[s] ? 0 : 1;
    // An interval of the solve's own mean length, from start values half way (the solve's answer at
    // T scaled: any values in [0, 1] with the model's structure will do for a throughput figure).
    const x = new Float64Array(S);
    for (let s = 0; s < S; s++) x[s] = res.values[model.stateNames[s]!]! * 0.5 + (model.goal[s] ? 0.5 : 0);
    const len = (model.lambda * model.timeBound) / st.intervals! / model.lambda;
    const kk = Number(k);
    const w = makeWork(model, kk, active, x, 32);
    const o = new Float64Array(S);
    // Interleaved (the machine is shared): each interval is timed beside k bare mat-vecs, and the
    // median of the per-pair ratios is reported.
    const ratios: number[] = [];
    const passes: number[] = [];
    runInterval(w, x, len, o);
    for (let r = 0; r < 11; r++) {
      const t0 = performance.now();
      runInterval(w, x, len, o);
      const t1 = performance.now();
      const mv = matVecSeconds(model, kk) * 1000;
      passes.push((t1 - t0) / kk);
      ratios.push((t1 - t0) / kk / mv);
    }
    ratios.sort((p, q) => p - q);
    passes.sort((p, q) => p - q);
    console.log(`level pass (interval λε = ${(len * model.lambda).toExponential(2)}, median of 11): ${passes[5]!.toFixed(2)} ms = ` +
      `${ratios[5]!.toFixed(2)}× a bare CSR mat-vec over the same matrix (timed beside it)`);
  }
  if (!process.argv.includes('--keep')) rmSync(dir, { recursive: true, force: true });
}

if (process.argv[1]?.endsWith('kstep-game.js')) main();
