/** `solve`, `validate` and `export`. */
import type { Command } from 'commander';
import { Option } from 'commander';
import { compile } from '../../corpus/format/compile.js';
import { exportJson, exportTable } from '../../corpus/format/export.js';
import { loadModelFileWithWarnings } from '../../corpus/format/load.js';
import { loadSchedulerFile } from '../../corpus/format/loadScheduler.js';
import { toResultJson } from '../../corpus/format/result.js';
import { solveWith } from '../check/methods.js';
import { formatTable } from '../check/table.js';
import type { SetExit } from './commands.js';
import { UsageError } from '../errors.js';
import { parsePositiveInt, parsePrecision } from './output.js';
import { formatError, formatScalar, formatValue } from '../numbers.js';
import { BarView, SolveProgress, systemClock } from './progress.js';

function warn(warnings: readonly string[]): void {
  for (const w of warnings) process.stderr.write(`crossbound: ${w}\n`);
}

export function registerSolve(program: Command, setExit: SetExit): void {
  program
    .command('solve')
    .description('solve one model with one method and print v_s(T) for every state')
    .argument('<model>', 'model file (crossbound/1, YAML or JSON)')
    .addOption(new Option('--method <method>', 'solution method').choices(['uniformization', 'euler', 'kstep', 'defect', 'oracle']).makeOptionMandatory())
    .option('--precision <p>', 'requested absolute error in every state; for oracle, 1e-30 asks for 30 digits', '1e-6')
    .option('--k <k>', 'order of the k-step scheme', '3')
    .option('--scheduler <file>', 'a fixed scheduler (crossbound-scheduler/1), for uniformization and oracle')
    .option('--json', 'print only the result (crossbound-result/1) as JSON', false)
    .action((file: string, o: { method: string; precision: string; k: string; scheduler?: string; json: boolean }) => {
      const precision = parsePrecision(o.precision);
      const k = parsePositiveInt(o.k, '--k', 8);
      const { model, warnings } = loadModelFileWithWarnings(file);
      warn(warnings);
      if (o.scheduler && o.method !== 'uniformization' && o.method !== 'oracle') {
        throw new UsageError(`--scheduler applies to the methods uniformization and oracle, not ${o.method}`);
      }
      const scheduler = o.scheduler ? loadSchedulerFile(o.scheduler, model) : undefined;
      const compiled = compile(model);
      const label = o.method === 'kstep' ? `kstep:${k}` : o.method;
      const oracleDigits = Math.max(1, Math.round(-Math.log10(precision)));
      // Progress on a terminal only (never on stdout, never in a log); the solver calls it rarely.
      const bar = process.stderr.isTTY ? new BarView('solve', process.stderr, false) : undefined;
      const progress = bar ? new SolveProgress(bar, systemClock, label) : undefined;
      const onProgress = progress ? { onProgress: (done: number, total: number) => progress.report(done, total) } : {};
      let out;
      try {
        out = solveWith(label, { model, compiled, precision, oracleDigits, ...(scheduler ? { scheduler } : {}), ...onProgress }, precision);
      } finally {
        bar?.stop();
      }
      if (out.kind === 'refused' && out.code === 'internal') {
        // A failed self-check is a fault of the method, not a refusal and not bad input.
        process.stderr.write(`crossbound: ${file}: ${o.method} failed its own self-check (a fault): ${out.reason}\n`);
        return setExit(1);
      }
      if (out.kind === 'refused' && o.json) {
        // With --json a refusal is a result (crossbound-result/1, as an external solver gives it): exit 0.
        const refusal = { format: 'crossbound-result/1', model: model.name, method: out.method, refused: out.reason, ...(out.code ? { code: out.code } : {}) };
        process.stdout.write(`${JSON.stringify(refusal, null, 2)}\n`);
        return setExit(0);
      }
      if (out.kind === 'refused') throw new UsageError(`${file}: ${o.method} refused (${out.code ?? 'unspecified'}): ${out.reason}`);
      const json = toResultJson(out, { name: model.name, timeBound: model.timeBound, goalMode: model.goalMode, stateNames: compiled.stateNames });
      if (o.json) {
        process.stdout.write(`${JSON.stringify(json, null, 2)}\n`);
        return setExit(0);
      }
      const rows = compiled.stateNames.map((n, i) => [
        n + (i === compiled.initial ? ' (initial)' : ''),
        formatValue(out.values[i]!),
        ...(out.valuesDecimal ? [out.valuesDecimal[i]!] : []),
      ]);
      const params = Object.entries(json.params).map(([key, v]) => `${key}=${v}`).join(', ');
      const stats = Object.entries(json.stats).map(([key, v]) => `${key}=${Number.isInteger(v) ? v : formatScalar(Number(v))}`).join(', ');
      process.stdout.write(
        `${model.name}: ${json.method} (${params}), time bound ${model.timeBound}, goal mode ${model.goalMode}\n` +
          `error bound ${formatError(out.errorBound)} in every state; ${stats}\n\n` +
          `${formatTable(['state', 'v_s(T)', ...(out.valuesDecimal ? ['high precision'] : [])], rows)}\n`,
      );
      setExit(0);
    });
}

export function registerValidate(program: Command, setExit: SetExit): void {
  program
    .command('validate')
    .description('check model files against every rule of format crossbound/1; solve nothing')
    .argument('<models...>', 'model files')
    .action((files: string[]) => {
      for (const file of files) {
        const { model, warnings } = loadModelFileWithWarnings(file);
        warn(warnings);
        const c = compile(model);
        process.stdout.write(`${file}: valid (${c.nStates} states, ${c.nActions} actions, ${c.nTransitions} transitions)\n`);
      }
      setExit(0);
    });
}

export function registerExport(program: Command, setExit: SetExit): void {
  program
    .command('export')
    .description('print a model as crossbound/1 JSON or as a readable table')
    .argument('<model>', 'model file')
    .addOption(new Option('--to <form>', 'output form').choices(['json', 'table']).default('json'))
    .action((file: string, o: { to: 'json' | 'table' }) => {
      const { model, warnings } = loadModelFileWithWarnings(file);
      warn(warnings);
      process.stdout.write(o.to === 'json' ? `${JSON.stringify(exportJson(model), null, 2)}\n` : `${exportTable(model)}\n`);
      setExit(0);
    });
}
