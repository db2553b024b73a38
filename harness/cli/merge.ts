/**
 * `merge`: the JSON reports of the shards of one check, as one report with one verdict. The set must
 * be complete and disjoint: every report of the same corpus (size and digest of its file list) and
 * shard count N, the shards 1 … N each exactly once, no model file twice, and together exactly the
 * corpus's files. Otherwise merge refuses with exit code 1 (the run is not known to be covered) and
 * writes nothing.
 */
import { readFileSync } from 'node:fs';
import type { Command } from 'commander';
import { digestFiles } from '../check/index.js';
import { summarize } from '../check/summary.js';
import { formatCheckReport } from '../check/table.js';
import type { ModelReport } from '../check/types.js';
import { checkJson, type CheckJson } from '../reports/json.js';
import { junitXml } from '../reports/junit.js';
import { commandLine, mergeStamps, runIdentity, stampOf, type RunStamp } from '../reports/identity.js';
import type { SetExit } from './commands.js';
import { UsageError } from '../errors.js';
import { writeFileAtomic } from './output.js';
import { formatPrecision } from '../numbers.js';
import { toCamelKeys, toSnakeKeys } from '../jsonKeys.js';

/** The shard set is not complete or not disjoint: exit 1, not a usage error. */
export class MergeRefused extends Error {}

function readReport(file: string): CheckJson {
  let data: unknown;
  try {
    data = JSON.parse(readFileSync(file, 'utf8'));
  } catch (e) {
    throw new UsageError(`${file}: not a readable JSON file (${(e as Error).message.split('\n')[0]})`);
  }
  // Keys are snake_case on disk (older reports: camelCase, read as they are).
  const r = toCamelKeys(data) as CheckJson;
  if (!r || r.format !== 'crossbound-check/1' || !Array.isArray(r.models)) {
    throw new UsageError(`${file}: not a check report of format crossbound-check/1`);
  }
  const shardOk = r.shard && Number.isInteger(r.shard.index) && Number.isInteger(r.shard.count);
  if (!shardOk || !r.corpus || typeof r.corpus.digest !== 'string' || !Array.isArray(r.files)) {
    throw new UsageError(`${file}: the report carries no shard, corpus or file list (written by an older crossbound?)`);
  }
  return r;
}

export interface Merged {
  readonly precision: number;
  readonly models: ModelReport[];
  readonly corpus: CheckJson['corpus'];
  /** Every model file of the corpus, sorted. */
  readonly all: string[];
  /** The shards' run identities merged (absent when a report carries none: written by an older crossbound). */
  readonly stamp?: RunStamp;
}

export function mergeReports(files: readonly string[], mergeCommand = 'crossbound merge'): Merged {
  const reports = files.map((f) => ({ f, r: readReport(f) }));
  const first = reports[0]!;
  const count = first.r.shard.count;
  const byShard = new Map<number, string>();
  const seen = new Map<string, string>();
  const models: ModelReport[] = [];
  for (const { f, r } of reports) {
    if (r.precision !== first.r.precision) {
      throw new UsageError(`${f}: precision ${formatPrecision(r.precision)} differs from ${formatPrecision(first.r.precision)} of ${first.f}`);
    }
    if (r.corpus.digest !== first.r.corpus.digest) throw new MergeRefused(`${f} checked another corpus than ${first.f} (file lists differ)`);
    if (r.shard.count !== count) throw new MergeRefused(`${f} is shard ${r.shard.index}/${r.shard.count}, ${first.f} is of ${count} shards`);
    const other = byShard.get(r.shard.index);
    if (other) throw new MergeRefused(`overlapping shards: ${f} and ${other} are both shard ${r.shard.index}/${count}`);
    byShard.set(r.shard.index, f);
    for (const file of r.files) {
      const o = seen.get(file);
      if (o) throw new MergeRefused(`overlapping shards: model file ${file} is in ${f} and in ${o}`);
      seen.set(file, f);
    }
    models.push(...r.models.map(({ verdict: _v, ...m }) => m as ModelReport));
  }
  const missing = Array.from({ length: count }, (_, i) => i + 1).filter((i) => !byShard.has(i));
  if (missing.length > 0) {
    throw new MergeRefused(`incomplete shard set: missing shard(s) ${missing.map((i) => `${i}/${count}`).join(', ')}`);
  }
  const all = [...seen.keys()].sort();
  if (all.length !== first.r.corpus.files || digestFiles(all) !== first.r.corpus.digest) {
    throw new MergeRefused(`incomplete shard set: the reports list ${all.length} model file(s), the corpus ${first.r.corpus.files}`);
  }
  const reported = new Set(models.map((m) => m.file));
  const unreported = all.filter((f) => !reported.has(f));
  if (unreported.length > 0) {
    throw new MergeRefused(`incomplete reports: no result for ${unreported.length} model file(s), e.g. ${unreported[0]}`);
  }
  models.sort((a, b) => (a.file < b.file ? -1 : a.file > b.file ? 1 : 0));
  let stamp: RunStamp | undefined;
  const stamps = reports.flatMap(({ f, r }) => (r.identity ? [{ file: f, stamp: stampOf(r.identity) }] : []));
  if (stamps.length === reports.length) {
    const merged = mergeStamps(stamps, mergeCommand);
    if (typeof merged === 'string') throw new MergeRefused(`the shards ran different builds or solvers: ${merged}`);
    stamp = merged;
  }
  return { precision: first.r.precision, models, corpus: first.r.corpus, all, ...(stamp ? { stamp } : {}) };
}

export function registerMerge(program: Command, setExit: SetExit): void {
  program
    .command('merge')
    .description('merge the --json reports of all shards of one check into one verdict (refuses an incomplete or overlapping set)')
    .argument('<reports...>', 'JSON reports written by check --json')
    .option('--json <file>', 'write the merged report as JSON')
    .option('--junit <file>', 'write the merged report as JUnit XML')
    .option('--allow-unchecked', 'unchecked models do not make the exit code 1', false)
    .action((files: string[], o: { json?: string; junit?: string; allowUnchecked: boolean }) => {
      let merged;
      try {
        merged = mergeReports(files, commandLine(process.argv.slice(2)));
      } catch (e) {
        if (!(e instanceof MergeRefused)) throw e;
        process.stderr.write(`crossbound: merge refused: ${e.message}\n`);
        return setExit(1);
      }
      const { precision, models, corpus, all, stamp } = merged;
      const allowUnchecked = o.allowUnchecked;
      process.stdout.write(`${formatCheckReport(models, { allowUnchecked })}\n`);
      const coverage = { shard: { index: 1, count: 1 }, corpusFiles: corpus.files, corpusDigest: corpus.digest, files: all };
      if (o.json) writeFileAtomic(o.json, `${JSON.stringify(toSnakeKeys(checkJson(models, precision, coverage, allowUnchecked, stamp)), null, 1)}
`);
      if (o.junit) writeFileAtomic(o.junit, junitXml(models, { allowUnchecked, ...(stamp ? { identity: runIdentity(stamp, models) } : {}) }));
      setExit(summarize(models, allowUnchecked).exitCode);
    });
}
