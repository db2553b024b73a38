/**
 * The high-precision oracles behind method `oracle`: the exact matrix exponential for a CTMC or a
 * fixed scheduler (expm/), and the optimal-control oracle for models with choices (optimal/).
 * They import nothing from solvers/: an independent computation is their whole point.
 */
import type { Outcome } from '../corpus/format/result.js';
import type { Scheduler } from '../corpus/format/scheduler.js';
import { isCtmc, type Model } from '../corpus/format/types.js';
import { solveExpm } from './expm/index.js';
import { solveOptimal } from './optimal/index.js';

export { solveExpm } from './expm/index.js';
export { solveOptimal } from './optimal/index.js';

export interface OracleOptions {
  /** Decimal places asked for (values lie in [0, 1]). */
  readonly digits: number;
  readonly scheduler?: Scheduler;
}

/** expm for a CTMC or under a fixed scheduler; the optimal oracle for a model with choices. */
export function solveOracle(model: Model, opts: OracleOptions): Outcome {
  if (opts.scheduler || isCtmc(model)) return solveExpm(model, opts);
  return solveOptimal(model, { digits: opts.digits });
}
