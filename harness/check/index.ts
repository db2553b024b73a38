/**
 * `check PATH...`: find the model files (none is a usage error), load every model and check every
 * external solver template first (any bad file or template stops the run with exit code 2 before
 * anything is solved), then check each model, and return the reports with what the run covered.
 */
import { createHash } from 'node:crypto';
import { loadModelFileWithWarnings } from '../../corpus/format/load.js';
import type { Model } from '../../corpus/format/types.js';
import Tinypool from 'tinypool';
import { UsageError } from '../errors.js';
import { checkModel, type CheckOptions } from './checkModel.js';
import { collectModelFiles } from './collect.js';
import { solverProblem } from './external.js';
import { summarize, type RunSummary } from './summary.js';
import type { ModelReport } from './types.js';

export interface Shard {
  readonly index: number;
  readonly count: number;
}

export interface RunCheckOptions extends CheckOptions {
  /** 1-based shard index and count: this run checks the files whose position p has p mod N = I − 1. */
  readonly shard?: Shard;
  /** Called after each model is checked, with the number done so far and the model's position. */
  readonly onProgress?: (done: number, total: number, model: string, index: number) => void;
  /** Called when a model's check starts (with --jobs N, up to N are in flight). */
  readonly onStart?: (index: number, total: number, model: string) => void;
  /** Worker threads (1: check in this thread). */
  readonly jobs?: number;
  /** Unchecked models do not make the exit code 1. */
  readonly allowUnchecked?: boolean;
}

/** What a run covered, so that shard reports can be merged and checked for completeness. */
export interface RunCoverage {
  readonly shard: Shard;
  /** The model files of the whole (unsharded) run, and a digest of their sorted list. */
  readonly corpusFiles: number;
  readonly corpusDigest: string;
  /** The model files this shard checked. */
  readonly files: string[];
}

export function parseShard(text: string): Shard {
  const m = /^(\d+)\/(\d+)$/.exec(text);
  const index = m ? Number(m[1]) : NaN;
  const count = m ? Number(m[2]) : NaN;
  if (!m || !(count >= 1) || !(index >= 1 && index <= count)) throw new UsageError(`--shard must be I/N with 1 ≤ I ≤ N (got '${text}')`);
  return { index, count };
}

/** sha256 of the sorted file list, one path a line. */
export function digestFiles(files: readonly string[]): string {
  return createHash('sha256').update([...files].sort().join('\n')).digest('hex');
}

export function loadAll(paths: readonly string[]): { file: string; model: Model; warnings: string[] }[] {
  const files = collectModelFiles(paths);
  if (files.length === 0) throw new UsageError(`no model file (*.yaml, *.yml, *.json) found in ${paths.join(', ')}`);
  return files.map((file) => {
    const { model, warnings } = loadModelFileWithWarnings(file);
    return { file, model, warnings };
  });
}

export async function runCheck(
  paths: readonly string[],
  opts: RunCheckOptions,
): Promise<{ reports: ModelReport[]; exitCode: 0 | 1; summary: RunSummary; coverage: RunCoverage }> {
  const all = loadAll(paths);
  for (const t of opts.solvers ?? []) {
    const problem = solverProblem(t);
    if (problem) throw new UsageError(problem);
  }
  const shard = opts.shard ?? { index: 1, count: 1 };
  const loaded = all.filter((_, p) => p % shard.count === shard.index - 1);
  const coverage: RunCoverage = { shard, corpusFiles: all.length, corpusDigest: digestFiles(all.map((l) => l.file)), files: loaded.map((l) => l.file) };
  const jobs = Math.min(opts.jobs ?? 1, loaded.length);
  const { onProgress, onStart, shard: _shard, jobs: _jobs, allowUnchecked, ...checkOpts } = opts;
  let reports: ModelReport[];
  if (jobs <= 1) {
    reports = [];
    for (const [i, { file, model, warnings }] of loaded.entries()) {
      onStart?.(i, loaded.length, model.name);
      reports.push(await checkModel(file, model, warnings, checkOpts));
      onProgress?.(i + 1, loaded.length, model.name, i);
    }
  } else {
    const pool = new Tinypool({ filename: new URL('./worker.js', import.meta.url).href, minThreads: jobs, maxThreads: jobs });
    // At most `jobs` tasks are handed to the pool at a time, so that a model starts when onStart says so.
    const out: ModelReport[] = new Array<ModelReport>(loaded.length);
    let next = 0;
    let done = 0;
    const runner = async (): Promise<void> => {
      while (next < loaded.length) {
        const i = next++;
        const { file, model } = loaded[i]!;
        onStart?.(i, loaded.length, model.name);
        out[i] = (await pool.run({ file, opts: checkOpts })) as ModelReport;
        onProgress?.(++done, loaded.length, model.name, i);
      }
    };
    try {
      await Promise.all(Array.from({ length: jobs }, runner));
      reports = out;
    } finally {
      await pool.destroy();
    }
  }
  const summary = summarize(reports, allowUnchecked ?? false);
  return { reports, exitCode: summary.exitCode, summary, coverage };
}
