/**
 * Outcomes of a solver or oracle, as a tagged union, and the result format crossbound-result/1.
 *
 * `errorBound` is a claim: |reported − true| ≤ errorBound in every state, rounding included.
 */
import type { GoalMode } from './types.js';
import type { Scheduler } from './scheduler.js';

export type Method = 'uniformization' | 'euler' | 'kstep' | 'oracle' | (string & {});

export interface Solved {
  readonly kind: 'solved';
  readonly method: Method;
  readonly params: Readonly<Record<string, number | string>>;
  /** v_s(T) per state index. */
  readonly values: Float64Array;
  /** Optional high-precision values per state index (oracles). */
  readonly valuesDecimal?: readonly string[];
  readonly errorBound: number;
  /** Optional one-sided bounds per state index: valuesLower ≤ v(T) ≤ valuesUpper (a claim too). */
  readonly valuesLower?: Float64Array;
  readonly valuesUpper?: Float64Array;
  /** The strategy the solver found, if any. */
  readonly scheduler?: Scheduler;
  readonly stats: Readonly<Record<string, number>>;
  /** Optional values over time (an external result's `trajectory`): values[i][s] at time left timeLeft[i], from 0 to T. */
  readonly trajectory?: { readonly timeLeft: Float64Array; readonly values: readonly Float64Array[] };
}

/**
 * Why a method refused, for the harness to act on without reading the prose:
 *  - invalid-input:   a parameter out of range (k, precision, digits, time bound);
 *  - out-of-scope:    the method does not apply to this model (choices without a scheduler, too many states);
 *  - work-cap:        the request needs more work than the method's cap (a coarser precision needs less);
 *  - precision-floor: the request is too close to what rounding or the confirmable digits allow;
 *  - internal:        the method's own self-check failed (a fault of the method, not a refusal to judge).
 */
export type RefusalCode = 'invalid-input' | 'out-of-scope' | 'work-cap' | 'precision-floor' | 'internal';

/** The method does not apply, or cannot meet the request honestly. */
export interface Refused {
  readonly kind: 'refused';
  readonly method: Method;
  readonly reason: string;
  /** Absent: not classified (treated like out-of-scope: no retry). */
  readonly code?: RefusalCode;
}

export type Outcome = Solved | Refused;

/** The JSON object of format crossbound-result/1 (what `solve --json` prints). */
export interface ResultJson {
  format: 'crossbound-result/1';
  model: string;
  method: string;
  params: Record<string, number | string>;
  time_bound: number;
  goal_mode: GoalMode;
  values: Record<string, number>;
  values_decimal?: Record<string, string>;
  values_lower?: Record<string, number>;
  values_upper?: Record<string, number>;
  error_bound: number;
  scheduler?: { format: 'crossbound-scheduler/1'; model?: string; choices: Record<string, { from: number; action: string }[]> };
  stats: Record<string, number>;
  [extra: string]: unknown;
}

export function toResultJson(
  solved: Solved,
  model: { name: string; timeBound: number; goalMode: GoalMode; stateNames: readonly string[] },
): ResultJson {
  const values: Record<string, number> = {};
  model.stateNames.forEach((n, i) => (values[n] = solved.values[i]!));
  const out: ResultJson = {
    format: 'crossbound-result/1',
    model: model.name,
    method: solved.method,
    params: { ...solved.params },
    time_bound: model.timeBound,
    goal_mode: model.goalMode,
    values,
    error_bound: solved.errorBound,
    stats: { ...solved.stats },
  };
  if (solved.valuesDecimal) {
    const dec: Record<string, string> = {};
    model.stateNames.forEach((n, i) => (dec[n] = solved.valuesDecimal![i]!));
    out.values_decimal = dec;
  }
  if (solved.valuesLower && solved.valuesUpper) {
    const lo: Record<string, number> = {};
    const hi: Record<string, number> = {};
    model.stateNames.forEach((n, i) => {
      lo[n] = solved.valuesLower![i]!;
      hi[n] = solved.valuesUpper![i]!;
    });
    out.values_lower = lo;
    out.values_upper = hi;
  }
  if (solved.scheduler) {
    const choices: Record<string, { from: number; action: string }[]> = {};
    for (const [s, segs] of Object.entries(solved.scheduler.choices)) choices[s] = segs.map((g) => ({ from: g.from, action: g.action }));
    out.scheduler = { format: 'crossbound-scheduler/1', model: model.name, choices };
  }
  return out;
}
