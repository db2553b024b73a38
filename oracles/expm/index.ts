/**
 * Oracle `expm`: values of a CTMC, or of a model under a fixed scheduler, to a requested number of
 * decimal places, by the exact matrix exponential in decimal arithmetic (decimal.js).
 *
 * Method: scaling and squaring with a Taylor series (C. Moler and C. Van Loan, "Nineteen dubious
 * ways to compute the exponential of a matrix, twenty-five years later", SIAM Review 45(1), 2003),
 * one exponential per piece of constant decisions; see taylor.ts for the truncation bound and its
 * propagation through the squarings, and propagate.ts for the pieces.
 *
 * Confirmation: the whole computation runs at two working precisions p1 = digits + guard and
 * p2 = p1 + 10, each with its own Decimal constructor. The a priori bound of the p2 run (truncation
 * and rounding) and the disagreement between the runs must both be below half a unit of the last
 * confirmed place; digits confirmed = min(requested, that). If the disagreement exceeds the sum of
 * the two a priori bounds the analysis is contradicted, and the oracle refuses.
 *
 * Special cases first: bad digits, a model with choices and no scheduler, T = 0 pieces (identity).
 * Refuses: models whose estimated work exceeds ~25 s of decimal arithmetic (dense n³ per squaring;
 * about 100 states at 30 digits when ‖Q‖T is moderate), and answers with fewer than 10 confirmed
 * digits (or fewer than requested, when fewer than 10 were requested).
 */
import { compile } from '../../corpus/format/compile.js';
import type { Outcome } from '../../corpus/format/result.js';
import { schedulerPieces, type Scheduler } from '../../corpus/format/scheduler.js';
import { isCtmc, type Model } from '../../corpus/format/types.js';
import { decimalAt, decModel, parseExact, type Dec } from '../common/decModel.js';
import { badDigits, confirmedDigits, errorBoundFor, maxAbsDiff, MIN_DIGITS, toDigits } from '../common/digits.js';
import { propagate, propagateCost, type LeftPiece } from './propagate.js';

export interface ExpmOptions {
  readonly digits: number;
  readonly scheduler?: Scheduler;
}

/** Budget of estimated decimal multiply-adds (both precisions), ~2 µs each at 50 digits. */
export const EXPM_BUDGET = 1.2e7;

const refuse = (reason: string): Outcome => ({ kind: 'refused', method: 'oracle', reason });

/** Pieces of constant decisions in order of time left, with exact decimal lengths. */
export function leftPieces(model: Model, scheduler?: Scheduler): LeftPiece[] {
  const n = model.states.length;
  if (!scheduler) {
    const choice = Int32Array.from(model.states, (s) => (s.actions.length > 0 ? 0 : -1));
    return [{ length: model.timeBoundText, choice }];
  }
  const c = compile(model);
  const pieces = schedulerPieces(scheduler, model.timeBound, c.stateNames, c.actionStart, c.actionNames);
  // Elapsed times are doubles, read by their shortest decimal text (as written in a scheduler file);
  // the end of the last piece is T itself, read exactly.
  const D = decimalAt(60);
  const T = parseExact(D, model.timeBoundText);
  const out: LeftPiece[] = [];
  for (const p of pieces) {
    const start = new D(p.start);
    const end = p.end === model.timeBound ? T : new D(p.end);
    const choice = new Int32Array(n);
    for (let s = 0; s < n; s++) choice[s] = p.action[s]! < 0 ? -1 : p.action[s]! - c.actionStart[s]!;
    out.push({ length: end.minus(start).toFixed(), choice });
  }
  return out.reverse();
}

export interface PiecesValue {
  readonly values: Dec[];
  /** A priori bound of the more precise run. */
  readonly bound: number;
  /** Disagreement between the two working precisions. */
  readonly diff: number;
  readonly precision: number;
  readonly squarings: number;
  readonly terms: number;
}

/** The value of the pieces at two working precisions, or the reason for refusing. */
export function valueOfPieces(model: Model, pieces: readonly LeftPiece[], digits: number): PiecesValue | string {
  const n = model.states.length;
  const probe = decModel(model, decimalAt(20));
  let nnz = 0;
  for (const acts of probe.actions) for (const a of acts) nnz += a.target.length + 1;
  const guard = 10 + Math.ceil(Math.log10(n + 1)) + Math.ceil(Math.log10(1 + 2 * probe.maxExit * model.timeBound)) +
    Math.ceil(Math.log10(pieces.length + 1));
  const p1 = digits + guard;
  const p2 = p1 + 10;
  const lengths = pieces.map((p) => Number(p.length));
  const cost = propagateCost(n, nnz, probe.maxExit, lengths, p1) + propagateCost(n, nnz, probe.maxExit, lengths, p2);
  if (cost > EXPM_BUDGET) {
    return `too large for the exact exponential: ${n} states, ‖Q‖T ≈ ${(2 * probe.maxExit * model.timeBound).toPrecision(3)}, ` +
      `${pieces.length} piece(s), about ${cost.toPrecision(2)} decimal operations (budget ${EXPM_BUDGET})`;
  }
  const r1 = propagate(decModel(model, decimalAt(p1)), pieces);
  const r2 = propagate(decModel(model, decimalAt(p2)), pieces);
  const diff = maxAbsDiff(r1.values, r2.values);
  if (diff > (r1.bound + r2.bound) * 1.5 + 10 ** -(p1 + 2)) {
    return `the two working precisions (${p1}, ${p2} digits) disagree by ${diff.toExponential(2)}, ` +
      `more than their a priori bounds ${r1.bound.toExponential(2)} + ${r2.bound.toExponential(2)}`;
  }
  return { values: r2.values, bound: r2.bound, diff, precision: p2, squarings: r2.squarings, terms: r2.terms };
}

export function solveExpm(model: Model, opts: ExpmOptions): Outcome {
  const started = performance.now();
  const bad = badDigits(opts.digits);
  if (bad) return refuse(bad);
  if (!opts.scheduler && !isCtmc(model)) return refuse('the model has choices: give a scheduler, or use the optimal oracle');
  const digits = opts.digits;
  const pieces = leftPieces(model, opts.scheduler);
  const r = valueOfPieces(model, pieces, digits);
  if (typeof r === 'string') return refuse(r);
  const confirmed = confirmedDigits(r.bound, r.diff, digits);
  if (confirmed < Math.min(MIN_DIGITS, digits)) return refuse(`asked for ${digits} digits, can confirm ${confirmed}`);

  const values = Float64Array.from(r.values, (v) => v.toNumber());
  return {
    kind: 'solved',
    method: 'oracle',
    params: { digits, oracle: 'expm' },
    values,
    valuesDecimal: r.values.map((v) => toDigits(v, confirmed)),
    errorBound: errorBoundFor(confirmed, values),
    ...(opts.scheduler ? { scheduler: opts.scheduler } : {}),
    stats: {
      digitsRequested: digits,
      digitsConfirmed: confirmed,
      workingPrecision: r.precision,
      aPrioriBound: r.bound,
      precisionDisagreement: r.diff,
      pieces: pieces.length,
      squarings: r.squarings,
      taylorTerms: r.terms,
      switches: 0,
      seconds: (performance.now() - started) / 1000,
    },
  };
}
