/**
 * `check PATH...`: load every model first (any bad file stops the run with exit code 2 before
 * anything is solved), then check each, and return the reports with the exit code.
 */
import { loadModelFileWithWarnings } from '../../corpus/format/load.js';
import type { Model } from '../../corpus/format/types.js';
import Tinypool from 'tinypool';
import { UsageError } from '../cli/errors.js';
import { checkModel, type CheckOptions } from './checkModel.js';
import { collectModelFiles } from './collect.js';
import type { ModelReport } from './types.js';
import { modelPassed } from './types.js';

export interface RunCheckOptions extends CheckOptions {
  /** 1-based shard index and count: this run checks the files whose position p has p mod N = I − 1. */
  readonly shard?: { index: number; count: number };
  /** Called after each model is checked, with the number done so far. */
  readonly onProgress?: (done: number, total: number, model: string) => void;
  /** Worker threads (1: check in this thread). */
  readonly jobs?: number;
}

export function parseShard(text: string): { index: number; count: number } {
  const m = /^(\d+)\/(\d+)$/.exec(text);
  const index = m ? Number(m[1]) : NaN;
  const count = m ? Number(m[2]) : NaN;
  if (!m || !(count >= 1) || !(index >= 1 && index <= count)) throw new UsageError(`--shard must be I/N with 1 ≤ I ≤ N (got '${text}')`);
  return { index, count };
}

export function loadAll(paths: readonly string[]): { file: string; model: Model; warnings: string[] }[] {
  return collectModelFiles(paths).map((file) => {
    const { model, warnings } = loadModelFileWithWarnings(file);
    return { file, model, warnings };
  });
}

export async function runCheck(paths: readonly string[], opts: RunCheckOptions): Promise<{ reports: ModelReport[]; exitCode: 0 | 1 }> {
  let loaded = loadAll(paths);
  if (opts.shard) {
    const { index, count } = opts.shard;
    loaded = loaded.filter((_, p) => p % count === index - 1);
  }
  const jobs = Math.min(opts.jobs ?? 1, loaded.length);
  const { onProgress, shard: _shard, jobs: _jobs, ...checkOpts } = opts;
  let reports: ModelReport[];
  if (jobs <= 1) {
    reports = [];
    for (const [i, { file, model, warnings }] of loaded.entries()) {
      reports.push(await checkModel(file, model, warnings, checkOpts));
      onProgress?.(i + 1, loaded.length, model.name);
    }
  } else {
    const pool = new Tinypool({ filename: new URL('./worker.js', import.meta.url).href, minThreads: jobs, maxThreads: jobs });
    let done = 0;
    try {
      reports = await Promise.all(
        loaded.map(async ({ file, model }) => {
          const r = (await pool.run({ file, opts: checkOpts })) as ModelReport;
          onProgress?.(++done, loaded.length, model.name);
          return r;
        }),
      );
    } finally {
      await pool.destroy();
    }
  }
  return { reports, exitCode: reports.every(modelPassed) ? 0 : 1 };
}
