/**
 * Oracle measurements: digits confirmed and seconds per model size (small sizes; oracle-scale.ts has
 * 100–1,000-state CTMCs and 30–100-state CTMDPs and CTMGs), and per corpus model.
 * Run: npm run build && node dist/bench/oracles.js
 * The sized models are seeded pseudo-random structures invented here (oracleStructures.ts).
 */
import { buildModel } from '../corpus/format/build.js';
import { loadModelFile } from '../corpus/format/load.js';
import { collectModelFiles } from '../harness/check/collect.js';
import { formatTable } from '../harness/check/table.js';
import { solveExpm } from '../oracles/expm/index.js';
import { solveOracle } from '../oracles/index.js';
import { solveOptimal } from '../oracles/optimal/index.js';
import { randomStructure } from './oracleStructures.js';

const rows: string[][] = [];
const row = (name: string, out: ReturnType<typeof solveExpm>): void => {
  rows.push(out.kind === 'solved'
    ? [name, String(out.stats.digitsConfirmed), out.stats.seconds!.toFixed(2), String(out.stats.switches ?? '-')]
    : [name, 'refused', '-', out.reason.slice(0, 60)]);
  console.error(rows[rows.length - 1]!.join('  '));
};
for (const n of [20, 40, 60]) row(`CTMC, ${n} states, 30 digits asked`, solveExpm(buildModel(randomStructure(n, 1, 3, '2', n)), { digits: 30 }));
for (const [n, game] of [[10, false], [20, false], [30, false], [30, true]] as const) {
  row(`${game ? 'CTMG' : 'CTMDP'}, ${n} states, 25 digits asked`, solveOptimal(buildModel(randomStructure(n, 2, 2, '1.5', 100 + n, game)), { digits: 25 }));
}
for (const f of collectModelFiles(['corpus'])) {
  const model = loadModelFile(f);
  row(`${f} (30 digits asked)`, solveOracle(model, { digits: 30 }));
}
console.log(formatTable(['model', 'digits confirmed', 'seconds', 'switches'], rows));
