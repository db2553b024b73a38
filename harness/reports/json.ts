/** The JSON report of `check` (format crossbound-check/1): every result and every verdict, mergeable across shards. */
import type { ModelReport } from '../check/types.js';
import { modelPassed } from '../check/types.js';

export interface CheckJson {
  format: 'crossbound-check/1';
  precision: number;
  shard?: string;
  verdict: 'pass' | 'fail';
  models: ModelReport[];
}

export function checkJson(reports: readonly ModelReport[], precision: number, shard?: string): CheckJson {
  return {
    format: 'crossbound-check/1',
    precision,
    ...(shard ? { shard } : {}),
    verdict: reports.every(modelPassed) ? 'pass' : 'fail',
    models: [...reports],
  };
}
