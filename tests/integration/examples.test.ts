/**
 * The examples keep working: the Python example solver passes `check` on corpus models as an external
 * solver (and its bound is honoured, and confirmed by the certificate of the trajectory it returns), and the CI workflow's `run:` steps, run here in order with the
 * matrix filled in, check a small corpus in three shards and merge them into one verdict.
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { CHILD_LIMIT_MS, CLI, crossbound } from './cli.js';

const hasPython = spawnSync('python3', ['--version']).status === 0;

describe('examples', () => {
  it.skipIf(!hasPython && !process.env.CI)('examples/solvers/euler_adapter.py passes check on three corpus models', () => {
    const dir = mkdtempSync(join(tmpdir(), 'crossbound-adapter-'));
    const r = crossbound([
      'check', 'corpus/models/kettle-scale.yaml', 'corpus/models/ferry-crossing.yaml', 'corpus/models/thermostat-duel.yaml',
      '--methods', 'oracle', '--precision', '1e-3', '--jobs', '1', '--json', join(dir, 'out.json'),
      '--solver', 'python3 examples/solvers/euler_adapter.py {model} {precision}',
    ]);
    expect(r.code, r.stdout + r.stderr).toBe(0);
    type Check = { kind: string; status: string; certified?: { bound: number; claim: number; outcome: string } };
    const report = JSON.parse(readFileSync(join(dir, 'out.json'), 'utf8')) as { verdict: string; models: { verdict: string; checks: Check[] }[] };
    expect(report.verdict).toBe('pass');
    expect(report.models.map((m) => m.verdict)).toEqual(['pass', 'pass', 'pass']);
    // Its trajectory is certified on every model, and the certificate confirms its claimed bound.
    for (const m of report.models) {
      const c = m.checks.find((x) => x.kind === 'certified');
      expect(c?.status).toBe('passed');
      expect(c!.certified!.bound).toBeLessThanOrEqual(c!.certified!.claim);
    }
  });

  it('examples/ci/github-actions.yml: its run steps check three shards and merge them', () => {
    const wf = parse(readFileSync('examples/ci/github-actions.yml', 'utf8')) as {
      env: Record<string, string>;
      jobs: Record<string, { strategy?: { matrix: { shard: number[] } }; steps: { run?: string }[] }>;
    };
    const work = mkdtempSync(join(tmpdir(), 'crossbound-ci-'));
    const corpus = join(work, 'corpus');
    mkdirSync(corpus);
    for (const f of ['kettle-scale.yaml', 'dough-proofing.yaml', 'relay-race.yaml', 'ferry-crossing.yaml']) copyFileSync(join('corpus/models', f), join(corpus, f));
    const env = { ...process.env, ...wf.env, CROSSBOUND: `${process.execPath} ${CLI}`, CORPUS: corpus };
    const run = (cmd: string): number | null => {
      if (/^npm /.test(cmd)) return 0; // the suite has installed and built already
      const r = spawnSync('bash', ['-c', cmd], { cwd: work, env, encoding: 'utf8', timeout: CHILD_LIMIT_MS, killSignal: 'SIGKILL' });
      if (r.signal) throw new Error(`${cmd}: killed by ${r.signal}`);
      return r.status;
    };
    const check = wf.jobs.check!;
    for (const shard of check.strategy!.matrix.shard) {
      for (const step of check.steps) if (step.run) expect(run(step.run.replaceAll('${{ matrix.shard }}', String(shard))), step.run).toBe(0);
    }
    for (const step of wf.jobs.merge!.steps) if (step.run) expect(run(step.run), step.run).toBe(0);
    const verdict = JSON.parse(readFileSync(join(work, 'verdict.json'), 'utf8')) as { verdict: string; models: unknown[] };
    expect(verdict.verdict).toBe('pass');
    expect(verdict.models).toHaveLength(4);
  });
});

describe('what an external solver is given', () => {
  it('the model file, without the reference values of the corpus file', () => {
    const dir = mkdtempSync(join(tmpdir(), 'crossbound-peek-'));
    const script = join(dir, 'peek.mjs');
    writeFileSync(script, [
      "import { readFileSync } from 'node:fs';",
      'const m = JSON.parse(readFileSync(process.argv[2], "utf8"));',
      'const seen = [m.format, m.goal_mode, "expect" in m ? "expect" : "no-expect", Object.keys(m.states).length].join(" ");',
      'console.log(JSON.stringify({ format: "crossbound-result/1", method: "peek", refused: seen }));',
    ].join('\n'));
    const r = crossbound(['check', 'corpus/models/kettle-scale.yaml', '--methods', 'oracle', '--jobs', '1', '--json', join(dir, 'out.json'),
      '--solver', `node ${script} {model}`]);
    expect([0, 1]).toContain(r.code);
    const text = readFileSync(join(dir, 'out.json'), 'utf8');
    expect(text).toContain('crossbound/1 at no-expect 2');
    expect(text).not.toContain('crossbound/1 at expect');
  });
});
