/** `check`: the cross-checking run over a corpus. */
import { availableParallelism } from 'node:os';
import type { Command } from 'commander';
import { runCheck, parseShard } from '../check/index.js';
import { INTERNAL_METHODS } from '../check/methods.js';
import { parseMethodList } from './fuzz.js';
import { formatCheckReport } from '../check/table.js';
import { checkJson } from '../reports/json.js';
import { junitXml } from '../reports/junit.js';
import { runIdentity, runStamp } from '../reports/identity.js';
import type { SetExit } from './commands.js';
import { UsageError } from '../errors.js';
import { parsePositiveInt, parsePrecision, writeFileAtomic } from './output.js';
import { CheckProgress, systemClock, viewFor } from './progress.js';
import { toSnakeKeys } from '../jsonKeys.js';

function parseDefaultBound(text: string): 'precision' | number {
  if (text === 'precision') return 'precision';
  const b = Number(text);
  if (text.trim() === '' || !(Number.isFinite(b) && b >= 0 && b < 1)) throw new UsageError(`--default-bound must be 'precision' or a number in [0, 1) (got '${text}')`);
  return b;
}

const collect = (v: string, prev: string[]): string[] => [...prev, v];

interface CheckCliOptions {
  solver: string[];
  precision: string;
  methods?: string;
  json?: string;
  junit?: string;
  report?: string;
  shard?: string;
  timeout: string;
  oracleDigits: string;
  jobs: string;
  allowUnchecked: boolean;
  defaultBound?: string;
}

export function registerCheck(program: Command, setExit: SetExit): void {
  program
    .command('check')
    .description('solve every model with every applicable method and solver, and flag every disagreement beyond the stated bounds')
    .argument('[paths...]', 'model files or folders (searched recursively)', ['corpus'])
    .option('--solver <template>', "an external solver, e.g. 'mysolver {model} --eps {precision}' (repeatable; placeholders {model} {precision} {time})", collect, [])
    .option('--precision <p>', 'requested absolute error for every method', '1e-6')
    .option('--methods <list>', 'own methods to run, comma-separated (uniformization, euler, kstep:1..kstep:8, defect, oracle), or none', INTERNAL_METHODS.join(','))
    .option('--oracle-digits <n>', 'digits asked of the high-precision oracle', '20')
    .option('--timeout <seconds>', 'time limit of one external solver run', '60')
    .option('--json <file>', 'write every result and verdict as JSON')
    .option('--junit <file>', 'write JUnit XML (one test case per model and check)')
    .option('--report <file>', 'write the self-contained HTML qualification report')
    .option('--shard <I/N>', 'check only the I-th of N deterministic parts of the corpus')
    .option('--jobs <n>', 'worker threads', String(availableParallelism()))
    .option('--default-bound <b>', "bound of an external result without error_bound: 'precision' (the precision asked of it) or a number; marked as assumed")
    .option('--allow-unchecked', 'models where nothing independent was compared do not make the exit code 1', false)
    .action(async (paths: string[], o: CheckCliOptions) => {
      const startedAt = new Date();
      const precision = parsePrecision(o.precision);
      const methods = await parseMethodList(o.methods ?? '', '--methods');
      const shard = o.shard ? parseShard(o.shard) : undefined;
      const jobs = parsePositiveInt(o.jobs, '--jobs', 256);
      const timeoutMs = parsePositiveInt(o.timeout, '--timeout', 86_400) * 1000;
      const oracleDigits = parsePositiveInt(o.oracleDigits, '--oracle-digits', 200);
      const view = viewFor('check');
      const progress = new CheckProgress(view, systemClock);
      // A sign of life while long models run (fires between models when --jobs 1).
      const timer = setInterval(() => progress.tick(), 1000).unref();
      const allowUnchecked = o.allowUnchecked;
      const defaultBound = o.defaultBound === undefined ? undefined : parseDefaultBound(o.defaultBound);
      const { reports, exitCode, coverage } = await runCheck(paths, {
        allowUnchecked,
        ...(defaultBound !== undefined ? { defaultBound } : {}),
        precision,
        methods,
        solvers: o.solver,
        timeoutMs,
        oracleDigits,
        jobs,
        ...(shard ? { shard } : {}),
        onStart: (index, total, model) => {
          if (index === 0) progress.plan(total, Math.min(jobs, total));
          progress.start(index, model);
        },
        onProgress: (_done, _total, _model, index) => progress.finish(index),
      }).finally(() => {
        clearInterval(timer);
        view.stop();
      });
      for (const r of reports) for (const w of r.warnings) process.stderr.write(`crossbound: ${w}\n`);
      const emptyShard = reports.length === 0 ? { ...coverage.shard, corpusFiles: coverage.corpusFiles } : undefined;
      process.stdout.write(`${formatCheckReport(reports, { allowUnchecked, ...(emptyShard ? { emptyShard } : {}) })}\n`);
      const seconds = (Date.now() - startedAt.getTime()) / 1000;
      const stamp = runStamp({ started: startedAt, seconds, precision, templates: o.solver, args: process.argv.slice(2) });
      const identity = runIdentity(stamp, reports);
      if (o.json) writeFileAtomic(o.json, `${JSON.stringify(toSnakeKeys(checkJson(reports, precision, coverage, allowUnchecked, stamp)), null, 1)}
`);
      if (o.junit) writeFileAtomic(o.junit, junitXml(reports, { allowUnchecked, shard: coverage.shard, identity }));
      if (o.report) {
        // Loaded on demand: the plotting library is large and only the report needs it.
        const { htmlReport } = await import('../reports/html.js');
        writeFileAtomic(o.report, await htmlReport(reports, { allowUnchecked, identity }));
      }
      setExit(exitCode);
    });
}
