/** `bench`: intervals or steps, seconds, reported bound and actual error per model, method and precision. */
import type { Command } from 'commander';
import { compile } from '../../corpus/format/compile.js';
import { solveOracle } from '../../oracles/index.js';
import { loadAll } from '../check/index.js';
import type { SetExit } from './commands.js';
import { UsageError } from '../errors.js';
import { parsePrecision, writeFileAtomic } from './output.js';
import { toSnakeKeys } from '../jsonKeys.js';

export function registerBench(program: Command, setExit: SetExit): void {
  program
    .command('bench')
    .description('measure steps, time, reported bound and actual error per model, method and precision')
    .argument('[paths...]', 'model files or folders', ['corpus'])
    .option('--precisions <list>', 'requested precisions, comma-separated', '1e-4,1e-6,1e-8')
    .option('--methods <list>', 'methods: kstep, euler, uniformization', 'kstep')
    .option('--ks <list>', 'orders of the k-step scheme', '1,2,3,4')
    .option('--json <file>', 'write the rows as JSON')
    .action(async (paths: string[], o: { precisions: string; methods: string; ks: string; json?: string }) => {
      const precisions = o.precisions.split(',').map((p) => parsePrecision(p.trim(), '--precisions'));
      const methods = o.methods.split(',').map((m) => m.trim());
      for (const m of methods) if (!['kstep', 'euler', 'uniformization'].includes(m)) throw new UsageError(`--methods: unknown method '${m}'`);
      const ks = o.ks.split(',').map((k) => Number(k));
      if (ks.some((k) => !(Number.isInteger(k) && k >= 1 && k <= 8))) throw new UsageError(`--ks must list whole numbers from 1 to 8 (got '${o.ks}')`);
      // The reference: the high-precision oracle at 25 digits, where it applies (it refuses what it cannot do in time).
      const models = loadAll(paths).map(({ model }) => {
        const ref = model.states.length <= 100 ? solveOracle(model, { digits: 25 }) : undefined;
        return {
          name: model.name,
          compiled: compile(model),
          ...(ref?.kind === 'solved' ? { reference: ref.values, referenceBound: ref.errorBound } : {}),
        };
      });
      const { runBench, formatBenchTable } = await import('../bench/index.js');
      const rows = runBench(models, { methods: methods as ('kstep' | 'euler' | 'uniformization')[], ks, precisions });
      process.stdout.write(`${formatBenchTable(rows)}\n`);
      if (o.json) writeFileAtomic(o.json, `${JSON.stringify(toSnakeKeys(rows), null, 1)}\n`);
      setExit(0);
    });
}
