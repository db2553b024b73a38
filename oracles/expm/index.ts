/**
 * Oracle `expm`: values of a CTMC, or of a model under a fixed scheduler, to a requested number of
 * decimal places: exp(Q·T) applied to the terminal vector, exactly up to a rigorous bound.
 *
 * Method: Taylor steps of the matrix exponential applied to the vector (C. Moler and C. Van Loan,
 * "Nineteen dubious ways to compute the exponential of a matrix, twenty-five years later", SIAM
 * Review 45(1), 2003, section 3), one piece of constant decisions after the other, in exact
 * fixed-point arithmetic over the sparse generator (../fixed/: rates, step lengths and 1/k are exact
 * rationals, one truncation below 2^−P per entry and term). The bound (../fixed/taylorSteps.ts) is
 * rigorous: Taylor tail by a geometric majorant of Σ θ^k/k!, rounding by a recursion over the terms,
 * errors of the steps added because each exact step is a stochastic matrix. A small stiff piece
 * (where s·n³ is cheaper than work linear in λL) is done by scaling and squaring in the same exact
 * fixed point instead (../fixed/squaring.ts, with its own rigorous row-norm recursion).
 * The dense decimal scaling-and-squaring path (taylor.ts, propagate.ts) is kept as an independent
 * check for small models (tests compare the two).
 *
 * Confirmation: the whole computation runs at two working precisions P1 bits (digits + 3 places plus
 * guard bits for the number of terms and the e^θ growth within a step) and P2 = P1 + 34. The rigorous
 * bound of the P2 run and the disagreement between the runs must both be below half a unit of the last
 * confirmed place; digits confirmed = min(requested, that). If the disagreement exceeds the sum of the
 * two bounds the analysis is contradicted, and the oracle refuses.
 *
 * Special cases first: bad digits, a model with choices and no scheduler, pieces of length 0 and
 * states that do not move (identity).
 * Refuses: models whose estimated work exceeds EXPM_BUDGET BigInt multiply-adds (cost ≈ 2·maxExit·T
 * / θ steps of ~60–90 sparse products each, or s·n³ for squaring: 1,000 states with λT = 100 are well
 * inside, and so are a few dozen states with λT = 10^7), and answers
 * with fewer than 10 confirmed digits (or fewer than requested, when fewer than 10 were requested).
 */
import { compile } from '../../corpus/format/compile.js';
import type { Outcome, RefusalCode } from '../../corpus/format/result.js';
import { schedulerPieces, type Scheduler } from '../../corpus/format/scheduler.js';
import { isCtmc, type Model } from '../../corpus/format/types.js';
import { decimalAt, decModel, parseExact, type Dec } from '../common/decModel.js';
import { badDigits, confirmedDigits, errorBoundFor, MIN_DIGITS, toDigits } from '../common/digits.js';
import { bitsForDigits, fixedDiff, fixedToDec } from '../fixed/numbers.js';
import { pieceGuardBits, propagateFixed, propagateFixedCost } from '../fixed/propagate.js';
import type { LeftPiece } from './propagate.js';

export interface ExpmOptions {
  readonly digits: number;
  readonly scheduler?: Scheduler;
}

/** Budget of estimated BigInt multiply-adds (both precisions), ~0.2–0.5 µs each on this machine. */
export const EXPM_BUDGET = 1.2e8;

const refuse = (reason: string, code: RefusalCode): Outcome => ({ kind: 'refused', method: 'oracle', reason, code });

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
  /** Rigorous bound of the more precise run. */
  readonly bound: number;
  /** Disagreement between the two working precisions. */
  readonly diff: number;
  /** Working precision of the more precise run, in decimal digits (and in bits). */
  readonly precision: number;
  readonly bits: number;
  readonly steps: number;
  readonly squarings: number;
  readonly terms: number;
}

/** The value of the pieces at two working precisions, or the reason for refusing. */
export function valueOfPieces(model: Model, pieces: readonly LeftPiece[], digits: number): PiecesValue | { code: RefusalCode; reason: string } {
  const n = model.states.length;
  const probe = decModel(model, decimalAt(20));
  let nnz = 0;
  for (const acts of probe.actions) for (const a of acts) nnz += a.target.length;
  const lengths = pieces.map((p) => Number(p.length));
  // Guard bits: rounding errors grow with the number of terms and steps (or squarings) of each piece.
  const P0 = bitsForDigits(digits + 3);
  let growth = 0;
  for (const len of lengths) growth += 2 ** pieceGuardBits(n, probe.maxExit, len, P0 + 64);
  const P1 = P0 + Math.ceil(Math.log2(growth + 1)) + 8;
  const P2 = P1 + 34;
  const cost = propagateFixedCost(n, nnz, probe.maxExit, lengths, P1) +
    propagateFixedCost(n, nnz, probe.maxExit, lengths, P2);
  if (cost > EXPM_BUDGET) {
    return { code: 'work-cap', reason: `too large for the exact exponential: ${n} states, ${nnz} transitions, ` +
      `‖Q‖T ≈ ${(2 * probe.maxExit * model.timeBound).toPrecision(3)}, ${pieces.length} piece(s), ` +
      `about ${cost.toPrecision(2)} fixed-point operations (budget ${EXPM_BUDGET})` };
  }
  // The rates are read exactly whatever the precision of the constructor (it only rounds exit sums,
  // which the fixed-point path recomputes exactly).
  const r1 = propagateFixed(probe, pieces, P1);
  const r2 = propagateFixed(probe, pieces, P2);
  let diff = 0;
  for (let s = 0; s < n; s++) diff = Math.max(diff, fixedDiff(r1.X[s]!, P1, r2.X[s]!, P2));
  if (diff > r1.bound + r2.bound) {
    return { code: 'internal', reason: `the two working precisions (${P1}, ${P2} bits) disagree by ${diff.toExponential(2)}, ` +
      `more than their rigorous bounds ${r1.bound.toExponential(2)} + ${r2.bound.toExponential(2)}` };
  }
  const D = decimalAt(Math.ceil(P2 * Math.log10(2)) + 10);
  const values = r2.X.map((x) => fixedToDec(D, x, P2));
  const precision = Math.floor(P2 * Math.log10(2));
  const { steps, squarings, maxTerms: terms } = r2;
  return { values, bound: r2.bound, diff, precision, bits: P2, steps, squarings, terms };
}

export function solveExpm(model: Model, opts: ExpmOptions): Outcome {
  const started = performance.now();
  const bad = badDigits(opts.digits);
  if (bad) return refuse(bad, 'invalid-input');
  if (!opts.scheduler && !isCtmc(model)) {
    return refuse('the model has choices: give a scheduler, or use the optimal oracle', 'out-of-scope');
  }
  const digits = opts.digits;
  const pieces = leftPieces(model, opts.scheduler);
  const r = valueOfPieces(model, pieces, digits);
  if ('code' in r) return refuse(r.reason, r.code);
  const confirmed = confirmedDigits(r.bound, r.diff, digits);
  if (confirmed < Math.min(MIN_DIGITS, digits)) return refuse(`asked for ${digits} digits, can confirm ${confirmed}`, 'precision-floor');

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
      workingBits: r.bits,
      steps: r.steps,
      squarings: r.squarings,
      taylorTerms: r.terms,
      switches: 0,
      seconds: (performance.now() - started) / 1000,
    },
  };
}
