/**
 * Load benchmark of the model loader: a flat JSON model (`transitions` rows) with 10^6 transitions
 * (10^5 states, 2 actions of 5 successors each, seeded; rates with up to 4 significant digits), written
 * to a temporary file and loaded with every rule checked. Also times the generator families at
 * their benchmark sizes. Reports seconds and the file size.
 *
 *   npx tsc -p . && node dist/bench/load-flat.js [states]
 */
import { mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadModelFileWithWarnings } from '../corpus/format/load.js';
import { generateModel } from '../corpus/generators/index.js';
import { Prng } from '../corpus/generators/prng.js';

function flatJson(S: number, actions: number, succ: number, seed: number): string {
  const rng = new Prng(seed);
  const rows: string[] = [];
  for (let s = 0; s < S; s++) {
    for (let a = 0; a < actions; a++) {
      for (let k = 0; k < succ; k++) {
        const t = rng.int(S);
        rows.push(`["s${s}","a${a}","s${t}",${Number((10 ** (-2 * rng.next())).toPrecision(4))}]`);
      }
    }
  }
  const owners = Array.from({ length: S }, (_, s) => `"s${s}":"${s % 2 ? 'min' : 'max'}"`).join(',');
  return `{"format":"crossbound/1","name":"bench-flat","time_bound":1,"goal":["s0"],"transitions":[\n${rows.join(',\n')}\n],"owners":{${owners}}}\n`;
}

function time<T>(label: string, f: () => T): T {
  const t0 = performance.now();
  const r = f();
  console.log(`${label}: ${((performance.now() - t0) / 1000).toFixed(2)} s`);
  return r;
}

const S = Number(process.argv[2] ?? 100_000);
const dir = mkdtempSync(join(tmpdir(), 'crossbound-bench-'));
try {
  const file = join(dir, 'flat.json');
  writeFileSync(file, flatJson(S, 2, 5, 1));
  console.log(`flat JSON: ${S} states, ${S * 10} rows, ${(statSync(file).size / 1e6).toFixed(1)} MB`);
  const { model } = time('load (parse + validate + build)', () => loadModelFileWithWarnings(file));
  let n = 0;
  for (const s of model.states) for (const a of s.actions) n += a.successors.length;
  console.log(`  model: ${model.states.length} states, ${n} transitions`);
  const rs = time('generate random-sparse 10^5 states, 2 × 5 successors', () =>
    generateModel({ family: 'random-sparse', seed: 1, states: 100_000, actions: 2, branching: 5 }));
  console.log(`  ${rs.transitions?.length ?? 0} rows`);
  time('generate redundant-system, 17 components', () => generateModel({ family: 'redundant-system', seed: 1, components: 17 }));
  writeFileSync(join(dir, 'gen.yaml'), 'format: crossbound/1\ngenerate: { family: random-sparse, seed: 1, states: 100000, actions: 2, branching: 5 }\n');
  time('load generate form (random-sparse 10^5 × 2 × 5)', () => loadModelFileWithWarnings(join(dir, 'gen.yaml')));
} finally {
  rmSync(dir, { recursive: true, force: true });
}
