/**
 * Oracle `optimal`: optimal values of CTMDPs and CTMGs (up to a few hundred states and transitions)
 * in high precision, with the optimal scheduler and a certificate.
 *
 * Method (finite optimal control: B. L. Miller, SIAM J. Control 6(2), 1968, for CTMDPs; M. N. Rabe
 * and S. Schewe, Acta Informatica 48, 2011, for games; both from memory): go forward in time left
 * from 0 to T. At a segment start the decisions follow from the lexicographic comparison of
 * derivatives (decide.ts, decimal arithmetic at p digits); on the segment the values solve the linear
 * ODE v' = Q_d v, stepped by Taylor series on a grid in exact fixed-point arithmetic with P bits
 * (segment.ts: sparse integer products, one truncation per entry and term, rigorous tail and rounding
 * bound); the next switch is the first point where an advantage exceeds the tie tolerance, certified
 * exactly in integers for most cells and otherwise found by a certified bisection that cannot skip a
 * positive excursion (advantage.ts).
 *
 * Bound. The values reported are those of the emitted scheduler, recomputed by the exact
 * exponential (oracles/expm: fixed-point Taylor steps, two working precisions) with its rigorous
 * bound. The scheduler is optimal up to the tie tolerance: on every cell each advantage of the stepped
 * values is certified ≤ tol·ν; the stepped values are within stepBound of the scheduler's own value,
 * which moves an advantage by at most 2·stepBound·ν (‖q_a‖∞ ≤ ν/2·2 for each of the two rows); so
 * the scheduler's value satisfies the Bellman equations with a residual ≤ ν·(tol + 2·stepBound + 100u)
 * (100u for the decimal tie tests), and since the Bellman flow is non-expansive in the sup norm its
 * value is within T times that of the optimum; plus the `lost` terms for uncertified cells and for
 * switching up to 1.25·wMin late. Digits confirmed require
 * that this bound AND the disagreement between the Taylor stepping and the exponential are below
 * half a unit of the last place.
 *
 * Certificate (stats): certificateDisagreement (stepping vs exponential), bellmanViolation (largest
 * opt_a g_a − g_chosen, sign-adjusted, on the cell starts and midpoints of every segment).
 *
 * Refuses: more than 200 states, more than 1000 segments, more than 20000 grid cells in all (stiff
 * models with large ν·T; the cells bound the work: each costs K ≈ 30–60 sparse products), fewer than
 * 10 confirmed digits, and any internal inconsistency.
 */
import type { Outcome, RefusalCode } from '../../corpus/format/result.js';
import type { Scheduler, Segment } from '../../corpus/format/scheduler.js';
import type { Model } from '../../corpus/format/types.js';
import { decimalAt, decModel, parseExact, type Dec } from '../common/decModel.js';
import { commonExponent, intRows } from '../fixed/generator.js';
import { bitsForDigits, fixedToDec } from '../fixed/numbers.js';
import { badDigits, confirmedDigits, errorBoundFor, maxAbsDiff, MIN_DIGITS, toDigits } from '../common/digits.js';
import { valueOfPieces } from '../expm/index.js';
import type { LeftPiece } from '../expm/propagate.js';
import { decide } from './decide.js';
import { Inconsistent, runSegment, TooManyCells } from './segment.js';

export const OPTIMAL_MAX_STATES = 200;
export const OPTIMAL_MAX_SEGMENTS = 1000;
export const OPTIMAL_MAX_CELLS = 20_000;

const refuse = (reason: string, code: RefusalCode): Outcome => ({ kind: 'refused', method: 'oracle', reason, code });

interface Piece {
  readonly start: Dec;
  readonly choice: Int32Array;
}

/** `onProgress(timeDone, T)` is called after each segment of constant decisions (for a progress display only). */
export function solveOptimal(model: Model, opts: { digits: number; onProgress?: (timeDone: number, timeBound: number) => void }): Outcome {
  const started = performance.now();
  const bad = badDigits(opts.digits);
  if (bad) return refuse(bad, 'invalid-input');
  const n = model.states.length;
  if (n > OPTIMAL_MAX_STATES) return refuse(`the optimal oracle handles at most ${OPTIMAL_MAX_STATES} states, the model has ${n}`, 'out-of-scope');
  const digits = opts.digits;
  const probe = decModel(model, decimalAt(20));
  const nu = 2 * probe.maxExit;
  const p = digits + 14 + Math.ceil(Math.log10(1 + nu * model.timeBound)) + Math.ceil(Math.log10(n + 1));
  const D = decimalAt(p);
  const dm = decModel(model, D);
  // Fixed point: P bits (8 guard bits for the e^θ growth within a cell, θ ≤ 4); times in DT, exactly.
  const P = bitsForDigits(p) + 8;
  const DT = decimalAt(3 * P + 100);
  const T = parseExact(DT, model.timeBoundText);
  const E = commonExponent(dm);
  const rows = intRows(dm, E);
  const tolNum = 10 ** -(p - 8);
  const tol = new D(10).pow(-(p - 8));
  // Normalisation of advantages (any positive number; 2·max exit rate, or 1 when nothing moves).
  const nuN = nu > 0 ? nu : 1;
  const seg = { nu: nuN, tol: tolNum, wMin: 10 ** -(p - 6), P, E, rows, DT };

  const pieces: Piece[] = [];
  const one = 1n << BigInt(P);
  let x: bigint[] = dm.terminal.map((v) => (v.isZero() ? 0n : one));
  let t0 = new DT(0);
  let prev: Int32Array = Int32Array.from(dm.actions, (a) => (a.length > 0 ? 0 : -1));
  let switches = 0;
  let cells = 0;
  let stepBound = 0;
  let lost = 0;
  let violation = 0;
  let order = 0;
  while (t0.lt(T)) {
    const dec = decide(dm, x.map((v) => fixedToDec(D, v, P)), prev, nu, tol);
    order = Math.max(order, dec.order);
    if (pieces.length > 0) {
      let changed = 0;
      for (let s = 0; s < n; s++) if (dec.choice[s] !== prev[s]) changed++;
      if (changed === 0) return refuse(`internal: a switch was located at time left ${t0.toSignificantDigits(12)} but no decision changes`, 'internal');
      switches += changed;
    }
    if (pieces.length >= OPTIMAL_MAX_SEGMENTS) return refuse(`more than ${OPTIMAL_MAX_SEGMENTS} segments of constant decisions`, 'work-cap');
    pieces.push({ start: t0, choice: dec.choice });
    let r;
    try {
      r = runSegment(dm, x, dec.choice, t0, T, { ...seg, maxCells: OPTIMAL_MAX_CELLS - cells }, stepBound);
    } catch (e) {
      if (e instanceof TooManyCells) return refuse(`too stiff for the optimal oracle: ${e.message} (limit ${OPTIMAL_MAX_CELLS} in all)`, 'work-cap');
      if (e instanceof Inconsistent) return refuse(e.message, 'internal');
      throw e;
    }
    cells += r.cells;
    stepBound += r.bound;
    lost += r.lost;
    violation = Math.max(violation, r.violation);
    x = r.x;
    t0 = r.tEnd;
    prev = dec.choice;
    opts.onProgress?.(t0.toNumber(), T.toNumber());
  }
  if (violation > tolNum * 1.01) return refuse(`internal: Bellman violation ${violation.toExponential(2)} above the tolerance`, 'internal');

  // Certificate: the scheduler's own value by the exact exponential.
  const left: LeftPiece[] = pieces.map((pc, i) => ({
    length: (i + 1 < pieces.length ? pieces[i + 1]!.start : T).minus(pc.start).toFixed(),
    choice: pc.choice,
  }));
  const certStarted = performance.now();
  const cert = valueOfPieces(model, left, digits);
  const certSeconds = (performance.now() - certStarted) / 1000;
  if ('code' in cert) return refuse(`certificate: ${cert.reason}`, cert.code);
  const diff = maxAbsDiff(x.map((v) => fixedToDec(D, v, P)), cert.values);
  // Advantages were certified on the stepped values, within stepBound of the scheduler's own value in
  // every state (an advantage moves by at most 2·stepBound in units of ν); the decimal conversion of
  // the coefficients searched by firstExceed adds a few units of 10^−p (100·u covers it).
  const subopt = nuN * (tolNum + 2 * stepBound + 100 * dm.u) * model.timeBound + lost;
  if (diff > stepBound + cert.bound) {
    return refuse(`internal: the stepped value and the exponential of the scheduler disagree by ${diff.toExponential(2)}`, 'internal');
  }
  const confirmed = confirmedDigits(cert.bound + subopt, diff, digits);
  if (confirmed < Math.min(MIN_DIGITS, digits)) return refuse(`asked for ${digits} digits, can confirm ${confirmed}`, 'precision-floor');

  const values = Float64Array.from(cert.values, (v) => v.toNumber());
  return {
    kind: 'solved',
    method: 'oracle',
    params: { digits, oracle: 'optimal' },
    values,
    valuesDecimal: cert.values.map((v) => toDigits(v, confirmed)),
    errorBound: errorBoundFor(confirmed, values),
    scheduler: toScheduler(model, pieces, T),
    stats: {
      digitsRequested: digits,
      digitsConfirmed: confirmed,
      workingPrecision: p,
      workingBits: P,
      switches,
      segments: pieces.length,
      cells,
      decisionOrder: order,
      bellmanViolation: violation * nu,
      certificateDisagreement: diff,
      suboptimalityBound: subopt,
      aPrioriBound: cert.bound,
      secondsCertificate: certSeconds,
      seconds: (performance.now() - started) / 1000,
    },
  };
}

/** The pieces (in time left) as a scheduler over elapsed time: piece i covers elapsed (T − end_i, T − start_i]. */
function toScheduler(model: Model, pieces: readonly Piece[], T: Dec): Scheduler {
  const choices: Record<string, Segment[]> = {};
  model.states.forEach((st, s) => {
    if (st.actions.length < 2) return;
    const segs: Segment[] = [];
    for (let i = pieces.length - 1; i >= 0; i--) {
      const a = pieces[i]!.choice[s]!;
      const name = st.actions[a < 0 ? 0 : a]!.name;
      if (segs.length > 0 && segs[segs.length - 1]!.action === name) continue;
      const end = i + 1 < pieces.length ? pieces[i + 1]!.start : T;
      segs.push({ from: segs.length === 0 ? 0 : T.minus(end).toNumber(), action: name });
    }
    choices[st.name] = segs;
  });
  return { model: model.name, choices };
}
