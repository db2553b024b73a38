/** `fuzz` and `selftest`. */
import { availableParallelism } from 'node:os';
import type { Command } from 'commander';
import { runFuzz } from '../fuzz/index.js';
import { solverProblem } from '../check/external.js';
import { parseMethodLabel } from '../check/methods.js';
import { loadPlantedFor } from '../check/planted.js';
import { runSelftest, formatSelftest } from '../selftest/index.js';
import type { SetExit } from './commands.js';
import { UsageError } from '../errors.js';
import { parsePositiveInt, parsePrecision } from './output.js';
import { formatSeconds } from '../numbers.js';
import { FuzzProgress, systemClock, viewFor } from './progress.js';

const collect = (v: string, prev: string[]): string[] => [...prev, v];

/** The labels of a --methods list, checked; planted variants are loaded only when one is asked for. */
export async function parseMethodList(text: string, option: string): Promise<string[]> {
  const list = text === 'none' ? [] : text.split(',').map((s) => s.trim()).filter(Boolean);
  await loadPlantedFor(list);
  for (const m of list) {
    try {
      parseMethodLabel(m);
    } catch (e) {
      throw new UsageError(`${option}: ${(e as Error).message}`);
    }
  }
  return list;
}

export function registerFuzz(program: Command, setExit: SetExit): void {
  program
    .command('fuzz')
    .description('random models through every method and solver; a disagreement is shrunk to a minimal model and saved')
    .option('--runs <n>', 'number of random models', '200')
    .option('--seed <s>', 'seed of the run (the same seed replays it exactly)', '1')
    .option('--max-states <m>', 'largest number of states of a random model', '8')
    .option('--precision <p>', 'requested precision of the methods under test', '1e-5')
    .option('--methods <list>', 'own methods under test, comma-separated, or none', 'uniformization,euler,kstep:1,kstep:2,kstep:3,defect')
    .option('--solver <template>', 'an external solver (repeatable)', collect, [])
    .option('--timeout <seconds>', 'time limit of one external solver run', '60')
    .option('--save <dir>', 'folder for the shrunk counterexample', 'corpus/regressions')
    .option('--no-save', 'do not save the counterexample')
    .action(async (o: { runs: string; seed: string; maxStates: string; precision: string; methods: string; solver: string[]; timeout: string; save: string | false }) => {
      const runs = parsePositiveInt(o.runs, '--runs', 1e7);
      const seed = Number(o.seed);
      if (!Number.isInteger(seed)) throw new UsageError(`--seed must be a whole number (got '${o.seed}')`);
      const maxStates = parsePositiveInt(o.maxStates, '--max-states', 40);
      const precision = parsePrecision(o.precision);
      const methods = await parseMethodList(o.methods, '--methods');
      const timeoutMs = parsePositiveInt(o.timeout, '--timeout', 86_400) * 1000;
      for (const t of o.solver) {
        const problem = solverProblem(t); // before anything is solved
        if (problem) throw new UsageError(problem);
      }
      const view = viewFor('fuzz');
      const progress = new FuzzProgress(view, systemClock);
      const summary = await runFuzz({
        runs,
        seed,
        maxStates,
        precision,
        methods,
        solvers: o.solver,
        timeoutMs,
        ...(o.save ? { save: o.save } : {}),
        onEvent: (e) => progress.event(e),
      }).finally(() => view.stop());
      progress.finish();
      const d = summary.drawn;
      const families = `fuzz: families drawn: ${d.random} random, ${d.switching} switching, ` +
        `${d.adversarial} adversarial (near-ties), ${d.dip} dip (near-tangent crossings)`;
      if (!summary.failure) {
        const head = `fuzz: ${summary.runs} random models (seed ${seed}, up to ${maxStates} states), no disagreement, ` +
          `in ${formatSeconds(summary.seconds)}`;
        process.stdout.write(`${head}\n${families}\n`);
        return setExit(0);
      }
      const f = summary.failure;
      const lines = [
        `fuzz: FAILED after ${summary.runs} model(s) (seed ${f.seed}, path ${f.path}), shrunk to ${f.states} state(s), in ${formatSeconds(summary.seconds)}`,
        ...f.failed.map((c, i) => `  ${i + 1}. ${c.name}: ${c.detail}`),
        f.savedTo ? `  saved: ${f.savedTo}` : '  (not saved)',
        `  reproduce: ${f.reproduce}`,
        families,
      ];
      process.stdout.write(`${lines.join('\n')}\n`);
      setExit(1);
    });

  program
    .command('selftest')
    .description('plant each broken variant of the own solvers and report whether the corpus and a short fuzz run catch it')
    .argument('[paths...]', 'model files or folders', ['corpus'])
    .option('--fuzz-runs <n>', 'fuzz runs per variant', '100')
    .option('--seed <s>', 'fuzz seed', '1')
    .option('--jobs <n>', 'worker threads for the corpus run', String(availableParallelism()))
    .action(async (paths: string[], o: { fuzzRuns: string; seed: string; jobs: string }) => {
      const runs = parsePositiveInt(o.fuzzRuns, '--fuzz-runs', 1e6);
      const seed = Number(o.seed);
      if (!Number.isInteger(seed)) throw new UsageError(`--seed must be a whole number (got '${o.seed}')`);
      const jobs = parsePositiveInt(o.jobs, '--jobs', 256);
      const rows = await runSelftest(paths, { fuzzRuns: runs, seed, jobs, onProgress: (v) => process.stderr.write(`selftest: ${v}\n`) });
      process.stdout.write(`${formatSelftest(rows)}\n`);
      setExit(rows.every((r) => r.caughtBy.length > 0) ? 0 : 1);
    });
}
