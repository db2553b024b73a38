/**
 * Oracle scale: model size, λT (λ = largest exit rate), digits confirmed and seconds, for CTMCs of
 * 100, 300 and 1,000 states (expm oracle, 30 digits asked) and CTMDPs / CTMGs of 30, 60 and 100
 * states (optimal-control oracle, 25 digits asked). Figures from one run on a shared machine.
 * Run: npx tsc -p . && node dist/bench/oracle-scale.js [ctmc|ratio|optimal]
 * Models: rings (rate a forward, b backward) and seeded random structures invented here.
 */
import { buildModel, type ModelObject } from '../corpus/format/build.js';
import { compile } from '../corpus/format/compile.js';
import type { Outcome } from '../corpus/format/result.js';
import { formatTable } from '../harness/check/table.js';
import { decimalAt, decModel } from '../oracles/common/decModel.js';
import { solveExpm, valueOfPieces } from '../oracles/expm/index.js';
import { propagate } from '../oracles/expm/propagate.js';
import { solveOptimal } from '../oracles/optimal/index.js';
import { randomStructure, ring } from './oracleStructures.js';

const which = process.argv[2] ?? 'all';
const rows: string[][] = [];
function row(name: string, obj: ModelObject, solve: (m: ReturnType<typeof buildModel>) => Outcome): void {
  const m = buildModel(obj);
  const c = compile(m);
  let trans = 0;
  for (const st of m.states) for (const a of st.actions) trans += a.successors.length;
  const started = performance.now();
  const out = solve(m);
  const secs = ((performance.now() - started) / 1000).toFixed(1);
  const lt = (c.lambda * c.timeBound).toPrecision(3);
  rows.push(out.kind === 'solved'
    ? [name, String(m.states.length), String(trans), lt, String(out.stats.digitsConfirmed), secs, String(out.stats.switches ?? '-')]
    : [name, String(m.states.length), String(trans), lt, 'refused', secs, out.reason.slice(0, 70)]);
  console.error(rows[rows.length - 1]!.join('  '));
}

if (which === 'all' || which === 'ctmc') {
  for (const n of [100, 300, 1000]) {
    row('CTMC ring a=0.75 b=0.25', ring(n, '0.75', '0.25', '100'), (m) => solveExpm(m, { digits: 30 }));
    row('CTMC random, 3 successors', randomStructure(n, 1, 3, '12', n), (m) => solveExpm(m, { digits: 30 }));
  }
  // A fixed scheduler of 10 pieces on a 1,000-state model with two actions per state.
  row('fixed scheduler, 10 pieces', randomStructure(1000, 2, 3, '12', 7), (m) => {
    const choices: Record<string, { from: number; action: string }[]> = {};
    m.states.forEach((st, s) => {
      if (st.actions.length < 2) return;
      choices[st.name] = Array.from({ length: 10 }, (_, i) => ({ from: i * 1.2, action: st.actions[(s + i) % 2]!.name }));
    });
    return solveExpm(m, { digits: 30, scheduler: { choices } });
  });
}
if (which === 'all' || which === 'ratio') {
  // The previous path (dense decimal scaling and squaring, at its two precisions 45 and 55) against the
  // fixed-point steps, on one 60-state CTMC, in the same run.
  const m = buildModel(randomStructure(60, 1, 3, '2', 60));
  const pieces = [{ length: '2', choice: Int32Array.from(m.states, (st) => (st.actions.length > 0 ? 0 : -1)) }];
  const t0 = performance.now();
  for (const p of [45, 55]) propagate(decModel(m, decimalAt(p)), pieces);
  const dense = (performance.now() - t0) / 1000;
  const t1 = performance.now();
  const steps = valueOfPieces(m, pieces, 30);
  const fixed = (performance.now() - t1) / 1000;
  if ('code' in steps) throw new Error(steps.reason);
  console.log(`60-state CTMC, 30 digits: dense decimal ${dense.toFixed(2)} s, fixed-point steps ${fixed.toFixed(2)} s, ` +
    `ratio ${(dense / fixed).toFixed(0)}`);
}
if (which === 'all' || which === 'optimal') {
  for (const n of [30, 60, 100]) {
    row('CTMDP random, 2 actions × 2 succ.', randomStructure(n, 2, 2, '1.5', 100 + n), (m) => solveOptimal(m, { digits: 25 }));
    row('CTMG random, 2 actions × 2 succ.', randomStructure(n, 2, 2, '1.5', 200 + n, true), (m) => solveOptimal(m, { digits: 25 }));
  }
  for (const n of [30, 60, 100]) {
    row('CTMDP random, T = 6', randomStructure(n, 2, 2, '6', 300 + n), (m) => solveOptimal(m, { digits: 25 }));
    row('CTMG random, T = 6', randomStructure(n, 2, 2, '6', 400 + n, true), (m) => solveOptimal(m, { digits: 25 }));
  }
  row('CTMG random, 3 actions × 3 succ., T = 3', randomStructure(100, 3, 3, '3', 500, true), (m) => solveOptimal(m, { digits: 25 }));
}
console.log(formatTable(['model', 'states', 'transitions', 'λT', 'digits confirmed', 'seconds', 'switches / note'], rows));
