/**
 * Validation of the text an external solver prints: it must be one JSON object of format
 * crossbound-result/1, with a value for every state of the model and an error bound.
 *
 * Faults, checked in this order (the first one found is reported):
 *   'not-json'      the text is not JSON (empty output included);
 *   'bad-format'    JSON, but not a result: not an object, `format` is not crossbound-result/1, or a
 *                   known key has the wrong type (`method` not a string, `values` not an object,
 *                   `params`, `stats`, `values_decimal`, `scheduler` malformed, `time_bound` or
 *                   `goal_mode` different from the model's when the caller gives them), or a
 *                   `trajectory` that breaks its rules (see parseTrajectory);
 *   'missing-state' a state of the model has no entry in `values`;
 *   'bad-value'     a value is not a finite number (JSON has no NaN: a serialiser writes null for
 *                   it), or lies outside [0, 1] by more than VALUE_SLACK;
 *   'no-bound'      `error_bound` is missing, null, negative or not finite (1e999 reads as Infinity);
 *                   a missing or null one is replaced by `defaultBound` when the caller gives it (the
 *                   user's assumption, marked `boundAssumed`, never the solver's claim).
 * A refusal ({ format, method, refused: "why" } without `values`) is not a fault: it is returned as such.
 * Extra keys are allowed, and so are values for states the model does not have (ignored).
 * The values are kept as reported (not clamped): the comparison judges them against the bound.
 */
import type { Solved } from '../../corpus/format/result.js';
import type { Scheduler, Segment } from '../../corpus/format/scheduler.js';
import type { GoalMode } from '../../corpus/format/types.js';
import { DECIMAL_TEXT } from '../../corpus/format/numbers.js';

/** Refusal codes an external solver may give (as `solve --json` does); 'internal' is the harness's own fault kind. */
export const EXTERNAL_REFUSAL_CODES = ['invalid-input', 'out-of-scope', 'work-cap', 'precision-floor'] as const;
export type ExternalRefusalCode = (typeof EXTERNAL_REFUSAL_CODES)[number];

export type ParseFault = 'not-json' | 'bad-format' | 'missing-state' | 'bad-value' | 'no-bound';

/**
 * What the solver says it is, for the qualification record: its `method`, and its `version` when it
 * gives one (a string or a number; anything else is ignored, as other extra keys are).
 */
export interface ReportedIdentity {
  readonly method: string;
  readonly version?: string;
}

export type ParseOutcome =
  | { ok: true; solved: Solved; boundAssumed?: true; reported: ReportedIdentity }
  | { ok: false; fault: ParseFault; detail: string }
  | { ok: 'refused'; reason: string; code?: ExternalRefusalCode; reported: ReportedIdentity };

/**
 * Slack on [0, 1]. A value is a probability, but it is computed in floating point: a convex
 * combination of values in [0, 1] can round a few ulps past 1 (0.1 + 0.2 + 0.7 gives
 * 1.0000000000000002), and a solver need not clamp. 1e-12 is about 4500 ulps at 1, more than the
 * rounding of any honest computation of these sizes leaves after clamping each step, and far below
 * any precision a user asks for, so a value beyond it is an error and not rounding.
 */
export const VALUE_SLACK = 1e-12;

/** The method name an external solver's result gets, so it is never mistaken for a built-in one. */
export const EXTERNAL_PREFIX = 'external:';


function isPlainObject(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

function fail(fault: ParseFault, detail: string): ParseOutcome {
  return { ok: false, fault, detail };
}

function parseScheduler(x: unknown): Scheduler | string {
  if (!isPlainObject(x)) return '`scheduler` is not an object';
  if (x.format !== undefined && x.format !== 'crossbound-scheduler/1') return '`scheduler.format` is not crossbound-scheduler/1';
  if (!isPlainObject(x.choices)) return '`scheduler.choices` is not an object';
  const choices: Record<string, Segment[]> = {};
  for (const [s, segs] of Object.entries(x.choices)) {
    if (!Array.isArray(segs)) return `\`scheduler.choices.${s}\` is not a list`;
    const out: Segment[] = [];
    for (const g of segs) {
      if (!isPlainObject(g) || typeof g.from !== 'number' || !Number.isFinite(g.from) || typeof g.action !== 'string') {
        return `\`scheduler.choices.${s}\` has a segment that is not { from: number, action: string }`;
      }
      out.push({ from: g.from, action: g.action });
    }
    choices[s] = out;
  }
  return typeof x.model === 'string' ? { model: x.model, choices } : { choices };
}

/** A trajectory may hold at most this many times, and at most MAX_TRAJECTORY_NUMBERS values in all. */
export const MAX_TRAJECTORY_TIMES = 100_000;
export const MAX_TRAJECTORY_NUMBERS = 10_000_000;

/**
 * `trajectory`: { time_left: [0, t1, …, T], values: { s: [v_s(0), …, v_s(T)] } }. Rules: time_left is
 * a list of at least two finite numbers, the first exactly 0, strictly increasing, the last equal to
 * the time bound (relative 1e-12); values holds, for every state of the model, a list of finite
 * numbers as long as time_left; at most MAX_TRAJECTORY_TIMES times and MAX_TRAJECTORY_NUMBERS values.
 * Returns the trajectory in state order, or what is wrong, in one line.
 */
export function parseTrajectory(x: unknown, stateNames: readonly string[], timeBound: number | undefined): NonNullable<Solved['trajectory']> | string {
  if (!isPlainObject(x)) return '`trajectory` is not an object';
  const t = x.time_left;
  if (!Array.isArray(t) || t.length < 2) return '`trajectory.time_left` is not a list of at least two times';
  const n = t.length;
  if (n > MAX_TRAJECTORY_TIMES) return `\`trajectory.time_left\` has ${n} times, more than the limit ${MAX_TRAJECTORY_TIMES}`;
  if (n * stateNames.length > MAX_TRAJECTORY_NUMBERS) return `\`trajectory\` has ${n} times × ${stateNames.length} states, more than the limit of ${MAX_TRAJECTORY_NUMBERS} values`;
  const timeLeft = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const v = t[i];
    if (typeof v !== 'number' || !Number.isFinite(v)) return `\`trajectory.time_left[${i}]\` is ${JSON.stringify(v) ?? String(v)}, not a finite number`;
    if (i === 0 && v !== 0) return `\`trajectory.time_left\` must start at 0 (it starts at ${v})`;
    if (i > 0 && !(v > timeLeft[i - 1]!)) return `\`trajectory.time_left\` must increase strictly (index ${i}: ${v} after ${timeLeft[i - 1]})`;
    timeLeft[i] = v;
  }
  if (timeBound === undefined) return '`trajectory` cannot be checked without the time bound';
  if (Math.abs(timeLeft[n - 1]! - timeBound) > 1e-12 * timeBound) return `\`trajectory.time_left\` must end at the time bound ${timeBound} (it ends at ${timeLeft[n - 1]})`;
  if (!isPlainObject(x.values)) return '`trajectory.values` is not an object';
  const byTime = Array.from({ length: n }, () => new Float64Array(stateNames.length));
  for (let s = 0; s < stateNames.length; s++) {
    const name = stateNames[s]!;
    const list = Object.hasOwn(x.values, name) ? x.values[name] : undefined;
    if (!Array.isArray(list)) return `\`trajectory.values\` has no list for state ${name}`;
    if (list.length !== n) return `\`trajectory.values.${name}\` has ${list.length} values for ${n} times`;
    for (let i = 0; i < n; i++) {
      const v = list[i];
      if (typeof v !== 'number' || !Number.isFinite(v)) return `\`trajectory.values.${name}[${i}]\` is ${v === null ? 'null' : JSON.stringify(v) ?? String(v)}, not a finite number`;
      byTime[i]![s] = v;
    }
  }
  return { timeLeft, values: byTime };
}

export interface ParseExpect {
  /** When given, a result for another time bound is 'bad-format'. */
  readonly timeBound?: number;
  /** When given, a result for the other goal mode is 'bad-format'. */
  readonly goalMode?: GoalMode;
  /** When given, the bound of a result without `error_bound` (assumed by the user). */
  readonly defaultBound?: number;
}

export function parseResult(text: string, stateNames: readonly string[], expect: ParseExpect = {}): ParseOutcome {
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (e) {
    const head = text.trim().slice(0, 60).replace(/\s+/g, ' ');
    return fail('not-json', text.trim() === '' ? 'the solver printed nothing on stdout' : `stdout is not JSON (${(e as Error).message}); it begins "${head}"`);
  }
  if (!isPlainObject(doc)) return fail('bad-format', `the result is ${Array.isArray(doc) ? 'a list' : `a ${doc === null ? 'null' : typeof doc}`}, not an object`);
  if (doc.format !== 'crossbound-result/1') return fail('bad-format', `\`format\` is ${JSON.stringify(doc.format) ?? 'missing'}, not "crossbound-result/1"`);
  if (typeof doc.method !== 'string' || doc.method === '') return fail('bad-format', '`method` is missing or not a non-empty string');
  if (doc.model !== undefined && typeof doc.model !== 'string') return fail('bad-format', '`model` is not a string');
  const version = typeof doc.version === 'string' || typeof doc.version === 'number' ? { version: String(doc.version) } : {};
  const reported: ReportedIdentity = { method: doc.method, ...version };
  if (doc.refused !== undefined && doc.values === undefined) {
    if (typeof doc.refused !== 'string' || doc.refused.trim() === '') return fail('bad-format', '`refused` is not a non-empty string');
    // An optional `code` says what kind of refusal it is; other values are the solver's own key, ignored.
    const code = typeof doc.code === 'string' && (EXTERNAL_REFUSAL_CODES as readonly string[]).includes(doc.code) ? { code: doc.code as ExternalRefusalCode } : {};
    return { ok: 'refused', reason: doc.refused, ...code, reported };
  }
  if (!isPlainObject(doc.values)) return fail('bad-format', '`values` is missing or not an object');

  const params: Record<string, number | string> = {};
  if (doc.params !== undefined) {
    if (!isPlainObject(doc.params)) return fail('bad-format', '`params` is not an object');
    for (const [k, v] of Object.entries(doc.params)) {
      if (typeof v !== 'number' && typeof v !== 'string') return fail('bad-format', `\`params.${k}\` is neither a number nor a string`);
      params[k] = v;
    }
  }
  const stats: Record<string, number> = {};
  if (doc.stats !== undefined) {
    if (!isPlainObject(doc.stats)) return fail('bad-format', '`stats` is not an object');
    for (const [k, v] of Object.entries(doc.stats)) {
      if (typeof v !== 'number') return fail('bad-format', `\`stats.${k}\` is not a number`);
      stats[k] = v;
    }
  }
  if (doc.time_bound !== undefined) {
    if (typeof doc.time_bound !== 'number') return fail('bad-format', '`time_bound` is not a number');
    if (expect.timeBound !== undefined && doc.time_bound !== expect.timeBound) {
      return fail('bad-format', `the result is for time bound ${doc.time_bound}, the model's is ${expect.timeBound}`);
    }
  }
  if (doc.goal_mode !== undefined) {
    if (doc.goal_mode !== 'within' && doc.goal_mode !== 'at') return fail('bad-format', '`goal_mode` is neither "within" nor "at"');
    if (expect.goalMode !== undefined && doc.goal_mode !== expect.goalMode) {
      return fail('bad-format', `the result is for goal mode ${doc.goal_mode}, the model's is ${expect.goalMode}`);
    }
  }
  let decimals: Record<string, unknown> | undefined;
  if (doc.values_decimal !== undefined) {
    if (!isPlainObject(doc.values_decimal)) return fail('bad-format', '`values_decimal` is not an object');
    for (const [k, v] of Object.entries(doc.values_decimal)) {
      if (typeof v !== 'string' || !DECIMAL_TEXT.test(v)) return fail('bad-format', `\`values_decimal.${k}\` is not a decimal string`);
    }
    decimals = doc.values_decimal;
  }
  let scheduler: Scheduler | undefined;
  if (doc.scheduler !== undefined) {
    const s = parseScheduler(doc.scheduler);
    if (typeof s === 'string') return fail('bad-format', s);
    scheduler = s;
  }

  let trajectory: Solved['trajectory'];
  if (doc.trajectory !== undefined) {
    const tb = expect.timeBound ?? (typeof doc.time_bound === 'number' ? doc.time_bound : undefined);
    const tr = parseTrajectory(doc.trajectory, stateNames, tb);
    if (typeof tr === 'string') return fail('bad-format', tr);
    trajectory = tr;
  }

  // --- values, in state order ---
  const values = new Float64Array(stateNames.length);
  const missing = stateNames.filter((n) => !Object.hasOwn(doc.values as object, n));
  if (missing.length > 0) {
    const shown = missing.slice(0, 5).join(', ') + (missing.length > 5 ? ` and ${missing.length - 5} more` : '');
    return fail('missing-state', `no value for ${missing.length} of ${stateNames.length} states: ${shown}`);
  }
  for (let i = 0; i < stateNames.length; i++) {
    const name = stateNames[i]!;
    const v = doc.values[name];
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      return fail('bad-value', `the value of ${name} is ${v === null ? 'null (NaN or a missing number, once serialised)' : JSON.stringify(v) ?? String(v)}, not a finite number`);
    }
    if (v < -VALUE_SLACK || v > 1 + VALUE_SLACK) return fail('bad-value', `the value of ${name} is ${v}, outside [0, 1] (slack ${VALUE_SLACK})`);
    values[i] = v;
  }

  // --- the bound ---
  const assumed = (doc.error_bound === undefined || doc.error_bound === null) && expect.defaultBound !== undefined;
  const eb = assumed ? expect.defaultBound : doc.error_bound;
  if (eb === undefined || eb === null) return fail('no-bound', '`error_bound` is missing: a value without a bound cannot be checked (--default-bound precision or --default-bound B assumes one)');
  if (typeof eb !== 'number') return fail('no-bound', `\`error_bound\` is ${JSON.stringify(eb)}, not a number`);
  if (!Number.isFinite(eb) || eb < 0) return fail('no-bound', `\`error_bound\` is ${eb}: it must be a finite number ≥ 0`);

  let valuesDecimal: string[] | undefined;
  // Solved keeps decimals per state index, so only a complete set is carried over.
  if (decimals && stateNames.every((n) => typeof decimals![n] === 'string')) valuesDecimal = stateNames.map((n) => (decimals![n] as string).trim());

  const solved: Solved = {
    kind: 'solved',
    method: EXTERNAL_PREFIX + doc.method,
    params,
    values,
    ...(valuesDecimal ? { valuesDecimal } : {}),
    errorBound: eb,
    ...(scheduler ? { scheduler } : {}),
    stats,
    ...(trajectory ? { trajectory } : {}),
  };
  return assumed ? { ok: true, solved, boundAssumed: true, reported } : { ok: true, solved, reported };
}
