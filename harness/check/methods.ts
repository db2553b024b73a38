/**
 * The project's own methods as the harness runs them, by label: 'uniformization', 'euler',
 * 'kstep:K', 'defect', 'oracle'. Each returns a MethodResult (plain data) and never throws for a numerical
 * reason: an exception inside a solver is reported as a fault, so one bad model cannot stop a run.
 *
 * A method that refuses at the requested precision with code work-cap or precision-floor (Euler on a
 * stiff model, say) is retried at 10×, 100×, … the precision, up to 1e-2; the precision actually used
 * is recorded, shown beside the method wherever its answer is, and the comparisons use the bound it
 * reported, so a looser answer is still a sound cross-check.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import type { Outcome, RefusalCode, Solved } from '../../corpus/format/result.js';
import type { Scheduler } from '../../corpus/format/scheduler.js';
import type { Model } from '../../corpus/format/types.js';
import { solveOracle } from '../../oracles/index.js';
import { solveDefect } from '../../solvers/defect/index.js';
import { solveEuler } from '../../solvers/euler/index.js';
import { solveKstep } from '../../solvers/kstep/index.js';
import { solveUniformization } from '../../solvers/uniformization/index.js';
import type { DenseSink } from '../../solvers/shared/dense.js';
import { CertifySink } from './certified.js';
import { plantedByName, plantedNames } from './planted.js';
import type { Family, MethodResult, SolvedMethod } from './types.js';

export const INTERNAL_METHODS = ['uniformization', 'euler', 'kstep:1', 'kstep:2', 'kstep:3', 'kstep:4', 'defect', 'oracle'] as const;

export interface MethodContext {
  readonly model: Model;
  readonly compiled: CompiledModel;
  readonly precision: number;
  readonly oracleDigits: number;
  readonly scheduler?: Scheduler;
  /**
   * Work caps for the run of `check` (so one slow method cannot dominate a corpus run): Euler's
   * steps × (states + transitions), and the k-step scheme's intervals. A method over its cap is retried
   * at a coarser precision (see runInternal).
   */
  readonly eulerMaxWork?: number;
  readonly kstepMaxIntervals?: number;
  /** The defect method's work: step attempts × (degree + 1) × (states + transitions). */
  readonly defectMaxWork?: number;
  /** Progress of a long run (Euler: steps; the optimal oracle: time done), for `solve` on a terminal; no effect on results. */
  readonly onProgress?: (done: number, total: number) => void;
  /** Certify the dense solution of `kstep` and `defect` (./certified.ts); `check` asks it for the model itself only. */
  readonly certify?: boolean;
}

export const CHECK_EULER_MAX_WORK = 3e7;
/** At least this many intervals, and up to CHECK_KSTEP_WORK / (states + transitions). */
export const CHECK_KSTEP_MAX_INTERVALS = 2e4;
export const CHECK_KSTEP_WORK = 1e7;
export const CHECK_DEFECT_MAX_WORK = 2e8;

/** Parse a method label; throws on an unknown one (the CLI turns that into a usage error). */
export function parseMethodLabel(label: string): { method: 'uniformization' | 'euler' | 'kstep' | 'defect' | 'oracle' | 'variant'; k?: number } {
  if (label.startsWith('variant:')) {
    if (!plantedByName(label.slice(8))) throw new Error(`unknown broken variant '${label.slice(8)}' (known: ${plantedNames().join(', ') || 'none loaded'})`);
    return { method: 'variant' };
  }
  const m = /^kstep(?::(\d+))?$/.exec(label);
  if (m) {
    const k = m[1] === undefined ? 3 : Number(m[1]);
    if (!(k >= 1 && k <= 8)) throw new Error(`kstep order must be between 1 and 8 (got ${m[1]})`);
    return { method: 'kstep', k };
  }
  if (label === 'uniformization' || label === 'euler' || label === 'defect' || label === 'oracle') return { method: label };
  throw new Error(`unknown method '${label}' (known: uniformization, euler, kstep:K, defect, oracle)`);
}

export function solveWith(label: string, ctx: MethodContext, precision: number, dense?: DenseSink): Outcome {
  const { method, k } = parseMethodLabel(label);
  const sink = dense ? { dense } : {};
  switch (method) {
    case 'uniformization':
      return solveUniformization(ctx.compiled, ctx.scheduler ? { precision, scheduler: ctx.scheduler } : { precision });
    case 'euler':
      return solveEuler(ctx.compiled, {
        precision,
        ...(ctx.eulerMaxWork ? { maxWork: ctx.eulerMaxWork } : {}),
        ...(ctx.onProgress ? { onProgress: ctx.onProgress } : {}),
      });
    case 'kstep':
      return solveKstep(ctx.compiled, { precision, k: k!, ...(ctx.kstepMaxIntervals ? { maxIntervals: ctx.kstepMaxIntervals } : {}), ...sink });
    case 'defect':
      return solveDefect(ctx.compiled, { precision, ...(ctx.defectMaxWork ? { maxWork: ctx.defectMaxWork } : {}), ...sink });
    case 'variant':
      return plantedByName(label.slice(8))!.solve(ctx.model, ctx.compiled, precision);
    case 'oracle':
      return solveOracle(ctx.model, {
        digits: ctx.oracleDigits,
        ...(ctx.scheduler ? { scheduler: ctx.scheduler } : {}),
        ...(ctx.onProgress ? { onProgress: ctx.onProgress } : {}),
      });
  }
}

export function plainChoices(c: Scheduler['choices']): Record<string, { from: number; action: string }[]> {
  return Object.fromEntries(Object.entries(c).map(([s, segs]) => [s, segs.map((g) => ({ from: g.from, action: g.action }))]));
}

/** A solved outcome as the plain data of a report; `precision` is what the method ran at. */
export function solvedResult(
  id: { label: string; family: Family },
  out: Solved,
  run: { requested: number; precision: number },
  seconds: number,
): SolvedMethod {
  return {
    ...id,
    status: 'solved',
    values: [...out.values],
    ...(out.valuesDecimal ? { valuesDecimal: [...out.valuesDecimal] } : {}),
    errorBound: out.errorBound,
    requestedPrecision: run.requested,
    precision: run.precision,
    seconds,
    stats: { ...out.stats },
    ...(out.scheduler ? { scheduler: { choices: plainChoices(out.scheduler.choices) } } : {}),
  };
}

/** Refusals after which a coarser precision may succeed. */
const RETRY_CODES: ReadonlySet<RefusalCode | undefined> = new Set(['work-cap', 'precision-floor']);
/** The coarsest precision a retry goes to. */
export const RETRY_LIMIT = 1e-2;

export function familyOfInternal(label: string): Family {
  const { method } = parseMethodLabel(label);
  return method === 'variant' ? (label as Family) : method;
}

/**
 * Run an own method. Euler, the k-step scheme and planted variants refused with code work-cap or
 * precision-floor are retried at 10×, 100×, … the precision up to RETRY_LIMIT; the precision they ran
 * at travels with the answer. An oracle whose self-check failed (code internal) is a fault, as is an
 * exception from any method.
 */
export function runInternal(label: string, ctx: MethodContext): MethodResult {
  const family = familyOfInternal(label);
  const sink = ctx.certify && (family === 'kstep' || family === 'defect') ? new CertifySink(family === 'kstep' ? 'pieces' : 'steps') : undefined;
  const r = runWith({ label, family }, ctx, (precision) => solveWith(label, ctx, precision, sink));
  const certificate = r.status === 'solved' ? sink?.result() : undefined;
  return certificate && r.status === 'solved' ? { ...r, certificate } : r;
}

/** runInternal with the solving step given (so the rules for retries and faults can be tested on planted outcomes). */
export function runWith(
  id: { label: string; family: Family },
  ctx: { precision: number; oracleDigits: number },
  solveAt: (precision: number) => Outcome,
): MethodResult {
  const t0 = performance.now();
  const retries = id.family !== 'oracle' && id.family !== 'uniformization';
  let precision = ctx.precision;
  try {
    for (;;) {
      const out = solveAt(precision);
      const seconds = (performance.now() - t0) / 1000;
      if (out.kind === 'solved') {
        const ran = id.family === 'oracle' ? 10 ** -ctx.oracleDigits : precision;
        return solvedResult(id, out, { requested: id.family === 'oracle' ? ran : ctx.precision, precision: ran }, seconds);
      }
      if (out.code === 'internal') return { ...id, status: 'fault', fault: 'self-check', reason: out.reason, seconds };
      const next = Number((precision * 10).toPrecision(12));
      if (!retries || !RETRY_CODES.has(out.code) || next > RETRY_LIMIT) {
        return { ...id, status: 'refused', code: out.code ?? 'unspecified', reason: out.reason, seconds };
      }
      precision = next;
    }
  } catch (e) {
    return { ...id, status: 'fault', fault: 'exception', reason: (e as Error).message, seconds: (performance.now() - t0) / 1000 };
  }
}
