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
import { inTimeUnit, timeUnitExponent } from './common/timeUnit.js';

export { solveExpm } from './expm/index.js';
export { solveOptimal } from './optimal/index.js';

export interface OracleOptions {
  /** Decimal places asked for (values lie in [0, 1]). */
  readonly digits: number;
  readonly scheduler?: Scheduler;
  /** Progress of the optimal oracle: time done of the time bound, after each segment (display only). */
  readonly onProgress?: (timeDone: number, timeBound: number) => void;
}

/**
 * expm for a CTMC or under a fixed scheduler; the optimal oracle for a model with choices, in a time
 * unit where the rates are of order 1 (./common/timeUnit.ts; its switching times are scaled back).
 * A fixed scheduler's times are the user's doubles, so that case keeps the model's own unit.
 */
export function solveOracle(model: Model, opts: OracleOptions): Outcome {
  if (opts.scheduler) return solveExpm(model, opts);
  const k = timeUnitExponent(model);
  const scaled = inTimeUnit(model, k);
  if (isCtmc(model)) return solveExpm(scaled, opts);
  const out = solveOptimal(scaled, opts.onProgress ? { digits: opts.digits, onProgress: opts.onProgress } : { digits: opts.digits });
  if (k === 0 || out.kind !== 'solved' || !out.scheduler) return out;
  const unit = 10 ** -k; // a time t in the scaled model is t·10^−k in the model's own unit
  const choices = Object.fromEntries(Object.entries(out.scheduler.choices).map(([s, segs]) => [s, segs.map((g) => ({ ...g, from: g.from * unit }))]));
  return { ...out, scheduler: { ...out.scheduler, choices }, stats: { ...out.stats, timeUnitExponent: k } };
}
