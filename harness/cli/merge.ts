/** `merge`: the JSON reports of several shards of one check, as one report with one verdict. */
import { readFileSync } from 'node:fs';
import type { Command } from 'commander';
import { formatCheckReport } from '../check/table.js';
import type { ModelReport } from '../check/types.js';
import { modelPassed } from '../check/types.js';
import { checkJson, type CheckJson } from '../reports/json.js';
import { junitXml } from '../reports/junit.js';
import type { SetExit } from './commands.js';
import { UsageError } from './errors.js';
import { writeFileAtomic } from './output.js';

function readReport(file: string): CheckJson {
  let data: unknown;
  try {
    data = JSON.parse(readFileSync(file, 'utf8'));
  } catch (e) {
    throw new UsageError(`${file}: not a readable JSON file (${(e as Error).message.split('\n')[0]})`);
  }
  const r = data as CheckJson;
  if (!r || r.format !== 'crossbound-check/1' || !Array.isArray(r.models)) throw new UsageError(`${file}: not a check report of format crossbound-check/1`);
  return r;
}

export function mergeReports(files: readonly string[]): { precision: number; models: ModelReport[] } {
  const seen = new Map<string, string>();
  const models: ModelReport[] = [];
  let precision: number | undefined;
  for (const f of files) {
    const r = readReport(f);
    if (precision !== undefined && r.precision !== precision) throw new UsageError(`${f}: precision ${r.precision} differs from ${precision} of the other reports`);
    precision = r.precision;
    for (const m of r.models) {
      const other = seen.get(m.file);
      if (other) throw new UsageError(`${f}: model file ${m.file} is also in ${other}`);
      seen.set(m.file, f);
      models.push(m);
    }
  }
  models.sort((a, b) => (a.file < b.file ? -1 : a.file > b.file ? 1 : 0));
  return { precision: precision ?? 1e-6, models };
}

export function registerMerge(program: Command, setExit: SetExit): void {
  program
    .command('merge')
    .description('merge the --json reports of several shards into one report and one verdict')
    .argument('<reports...>', 'JSON reports written by check --json')
    .option('--json <file>', 'write the merged report as JSON')
    .option('--junit <file>', 'write the merged report as JUnit XML')
    .action((files: string[], o: { json?: string; junit?: string }) => {
      const { precision, models } = mergeReports(files);
      process.stdout.write(`${formatCheckReport(models)}\n`);
      if (o.json) writeFileAtomic(o.json, `${JSON.stringify(checkJson(models, precision), null, 1)}\n`);
      if (o.junit) writeFileAtomic(o.junit, junitXml(models));
      setExit(models.every(modelPassed) ? 0 : 1);
    });
}
