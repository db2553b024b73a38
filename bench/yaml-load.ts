/**
 * Load benchmark for YAML against JSON: one seeded `states`-form model (default 200,000 states; each
 * state owned by max or min in turn and given two actions of two or three successors, rates with up
 * to 3 significant digits), written once as block YAML and once as JSON. The model is the same; only
 * the syntax differs. Measure each file as a user would, in a fresh process, e.g.
 *
 *   npx tsc -p . && node dist/bench/yaml-load.js /tmp/yaml-bench 200000
 *   /usr/bin/time -v node dist/harness/cli/main.js validate /tmp/yaml-bench/states.yaml
 *   /usr/bin/time -v node dist/harness/cli/main.js validate /tmp/yaml-bench/states.json
 *
 * (elapsed seconds and "Maximum resident set size"). With `--load` it also loads both files in this
 * process and prints the seconds of each, one run on a shared machine: compare them as a ratio.
 */
import { mkdirSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadModelFileWithWarnings } from '../corpus/format/load.js';
import { Prng } from '../corpus/generators/prng.js';

interface Draft {
  owner: 'max' | 'min';
  actions: [string, [string, number][]][];
}

function draft(S: number, seed: number): Draft[] {
  const rng = new Prng(seed);
  const out: Draft[] = [];
  for (let s = 0; s < S; s++) {
    const actions: Draft['actions'] = [];
    for (const a of ['go', 'wait']) {
      const succ = new Map<string, number>();
      const k = 2 + rng.int(2);
      for (let j = 0; j < k; j++) succ.set(`s${rng.int(S)}`, Number((10 ** (-2 * rng.next())).toPrecision(3)));
      actions.push([a, [...succ]]);
    }
    out.push({ owner: s % 2 ? 'min' : 'max', actions });
  }
  return out;
}

const HEAD = ['format: crossbound/1', 'name: bench-yaml', 'time_bound: 1', 'goal: [s0]', 'states:'];

/** Block YAML, the successors of an action as a flow mapping on one line. */
export function statesYaml(d: Draft[]): string {
  const lines = [...HEAD];
  d.forEach((st, s) => {
    lines.push(`  s${s}:`, `    owner: ${st.owner}`, '    actions:');
    for (const [a, succ] of st.actions) lines.push(`      ${a}: { ${succ.map(([t, r]) => `${t}: ${r}`).join(', ')} }`);
  });
  return `${lines.join('\n')}\n`;
}

export function statesJson(d: Draft[]): string {
  const states = d.map((st, s) => {
    const acts = st.actions.map(([a, succ]) => `"${a}":{${succ.map(([t, r]) => `"${t}":${r}`).join(',')}}`);
    return `"s${s}":{"owner":"${st.owner}","actions":{${acts.join(',')}}}`;
  });
  const head = '{"format":"crossbound/1","name":"bench-yaml","time_bound":1,"goal":["s0"],"states":{';
  return `${head}\n${states.join(',\n')}\n}}\n`;
}

function time(label: string, f: () => unknown): void {
  const t0 = performance.now();
  f();
  console.log(`${label}: ${((performance.now() - t0) / 1000).toFixed(2)} s`);
}

if (process.argv[1]?.endsWith('yaml-load.js')) {
  const dir = process.argv[2] ?? '/tmp/crossbound-yaml-bench';
  const S = Number(process.argv[3] ?? 200_000);
  mkdirSync(dir, { recursive: true });
  const d = draft(S, 1);
  const files = { yaml: join(dir, 'states.yaml'), json: join(dir, 'states.json') };
  writeFileSync(files.yaml, statesYaml(d));
  writeFileSync(files.json, statesJson(d));
  for (const [k, f] of Object.entries(files)) {
    console.log(`${k}: ${S} states, ${(statSync(f).size / 1e6).toFixed(1)} MB: ${f}`);
  }
  if (process.argv.includes('--load')) {
    time('load JSON', () => loadModelFileWithWarnings(files.json));
    time('load YAML', () => loadModelFileWithWarnings(files.yaml));
  }
}
