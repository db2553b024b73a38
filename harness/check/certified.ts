/**
 * The check `certified`: an a-posteriori certificate of a method's dense solution, held against the
 * method's own claim and against every other answer.
 *
 * The certificate (solvers/defect/certificate.ts; its derivation is in solvers/defect/index.ts) bounds
 * the Bellman defect r = f′ − B(f) of a piecewise polynomial f rigorously and, by the comparison
 * principle for quasi-monotone systems, gives f_s(T) − lowerDev ≤ v_s(T) ≤ f_s(T) + upperDev. It needs
 * nothing about how f was made, so it applies to every dense solution the harness can get: the
 * `defect` method's own steps, the k-step scheme's level-k pieces (../../solvers/shared/dense.ts), and
 * an external solver's `trajectory` (cubic Hermite interpolant with Bellman slopes,
 * solvers/defect/trajectory.ts). To the certificate of the compiled model the harness adds the input
 * allowance 3uλT (rates and T rounded from decimals, as every solver does) and the bound of rates
 * flushed by rescaling time.
 *
 * Outcomes, with value_s and eb the method's reported values and claimed error_bound, the enclosure
 * f_s(T) − below ≤ v_s(T) ≤ f_s(T) + above, and X = max_s max(value_s − f_s + below, f_s − value_s +
 * above), a rigorous bound on |value_s − v_s(T)|:
 *  - confirmed (`passed`): X ≤ eb, with no slack — every state's enclosure lies inside the claimed
 *    interval [value_s − eb, value_s + eb], so the claim is proven by an argument that does not use
 *    the method's own error analysis. Shown as "certified: |value − true| ≤ X in every state".
 *  - refuted (`failed`): the enclosure and the claimed interval of this method, or of any other answer,
 *    are disjoint in some state by more than the comparator's slack (harness/compare). Both are
 *    rigorous claims about the same v_s(T), so one of them is false: a genuine failure of the methods
 *    named (the other answer may be the wrong one; or the certificate's code). The slack goes to the
 *    claims, so rounding of the comparison never makes a failure up; looseness alone never fails.
 *  - not confirmed (`skipped`, detail "not confirmed: …"): X > eb and nothing disjoint. The
 *    certificate is looser than the claim: it neither proves nor refutes it. It gave no evidence, so it
 *    is not passed; nothing was shown false, so it is not failed.
 *  - no certificate (`skipped`): the dense solution was too long to certify within the work cap, or
 *    its bound was not finite. A method without a dense solution gets no `certified` check at all.
 *
 * Families and the verdict. The certificate is an independent argument, but it is not one of the
 * method families of the verdict rule (uniformization, euler, kstep, defect, oracle, each external
 * solver), and the enclosure is made from the same f as the value it judges: it is a proof about that
 * f, not a second computation of v. So a `certified` check is never `independent`: a confirmed claim
 * never makes a model `pass` by itself (its agreement checks must still compare two families), while a
 * refuted one makes the model `fail` like any failed check. For the `defect` method the certificate is
 * even the same code as the method's own bound (it re-derives the bound from the steps the solver
 * handed out, which checks the solver's bookkeeping, not the certificate). For the k-step scheme and
 * external solvers it is the defect family's code judging another family's f: that is why a
 * refutation against another family's answer is a failure, not why a confirmation would be a pass.
 *
 * Cost: the steps are kept (at most CHECK_CERTIFY_MAX_WORK numbers) and certified once the method has
 * answered; a longer solution (kstep:1 and kstep:2 at tight precisions, large models) is not certified
 * and says so. A planted variant is never certified (it has no sink), only its references are.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import { Certifier, type Certificate, type DenseStep } from '../../solvers/defect/certificate.js';
import { certifyTrajectory } from '../../solvers/defect/trajectory.js';
import type { DenseSink } from '../../solvers/shared/dense.js';
import { UNIT_ROUNDOFF } from '../../solvers/piecewise/poly.js';
import { scaleTime } from '../../solvers/shared/scale.js';
import { compareAtMost, type Answer } from '../compare/index.js';
import { formatError, formatRatio } from '../numbers.js';
import { failed, skipped, type CheckHead } from './make.js';
import { shownLabel, type Certification, type CheckResult, type SolvedMethod } from './types.js';

/**
 * Largest work, steps × ((K + 1)(states + transitions) + actions (K + 1)²), spent certifying one dense
 * solution (about a second on one core); a longer one is not certified (the check is skipped, saying so).
 */
export const CHECK_CERTIFY_MAX_WORK = 1e6;

type Source = 'steps' | 'pieces' | 'trajectory';

/** The enclosure of v(T) from a certificate of the compiled model `m` (in any time unit) and the flush bound. */
export function enclosureOf(m: CompiledModel, cert: Certificate, flushBound: number, source: Source, steps: number): Certification {
  const inputs = 3 * UNIT_ROUNDOFF * m.lambda * m.timeBound * (1 + 1e-12) + flushBound;
  // One sum of non-negative doubles (relative error ≤ u) and the product (≤ u): 1 + 4u covers both.
  const below = (cert.lowerDev + inputs) * (1 + 4 * UNIT_ROUNDOFF);
  const above = (cert.upperDev + inputs) * (1 + 4 * UNIT_ROUNDOFF);
  if (!Number.isFinite(below) || !Number.isFinite(above)) return { status: 'not-certified', source, reason: `the certified bound is not finite (${Math.max(below, above)})` };
  return { status: 'certified', source, steps, center: [...cert.values], below, above };
}

/**
 * A DenseSink that keeps the steps (at most CHECK_CERTIFY_MAX_WORK numbers, so memory stays bounded)
 * and certifies them when asked: a solution longer than the cap, or an attempt the method gave up
 * (it is retried at a coarser precision, which calls begin() again), costs no certification.
 */
export class CertifySink implements DenseSink {
  private m: CompiledModel | undefined;
  private degree = 0;
  private flush = 0;
  private work = 0;
  private perStep = 0;
  private steps: DenseStep[] = [];
  private over = false;

  constructor(private readonly source: Source, private readonly maxWork = CHECK_CERTIFY_MAX_WORK) {}

  begin(m: CompiledModel, degree: number, flushBound: number): void {
    this.m = m;
    this.degree = degree;
    this.flush = flushBound;
    this.work = 0;
    this.steps = [];
    this.over = false;
    this.perStep = (degree + 1) * (m.nStates + m.nTransitions) + m.nActions * (degree + 1) ** 2;
  }

  step(h: number, coef: Float64Array): void {
    if (this.over) return;
    this.work += this.perStep;
    if (this.work > this.maxWork) {
      this.over = true;
      this.steps = [];
      return;
    }
    this.steps.push({ h, coef: Float64Array.from(coef) });
  }

  /** The certification, or undefined when the method handed out no dense solution (nothing moves). */
  result(): Certification | undefined {
    if (!this.m) return undefined;
    if (this.over) return { status: 'not-certified', source: this.source, reason: `the dense solution is longer than the certificate's work cap ${this.maxWork}` };
    const c = new Certifier(this.m, this.degree);
    for (const st of this.steps) c.add(st);
    return enclosureOf(this.m, c.finish(), this.flush, this.source, this.steps.length);
  }
}

/** An external solver's trajectory (already validated), certified in time units of about 1/λ. */
export function certifyExternalTrajectory(compiled: CompiledModel, tr: { timeLeft: ArrayLike<number>; values: readonly ArrayLike<number>[] }): Certification {
  const source = 'trajectory';
  const n = tr.timeLeft.length;
  const S = compiled.nStates;
  const frozen = new Uint8Array(S);
  let lambda = 0;
  for (let s = 0; s < S; s++) {
    if (compiled.actionStart[s + 1] === compiled.actionStart[s] || (compiled.goalMode === 'within' && compiled.goal[s])) frozen[s] = 1;
    else for (let a = compiled.actionStart[s]!; a < compiled.actionStart[s + 1]!; a++) lambda = Math.max(lambda, compiled.exitRate[a]!);
  }
  const work = (n - 1) * (4 * (S + compiled.nTransitions) + 16 * compiled.nActions);
  if (work > CHECK_CERTIFY_MAX_WORK) return { status: 'not-certified', source, reason: `the trajectory is longer than the certificate's work cap ${CHECK_CERTIFY_MAX_WORK}` };
  const scaled = scaleTime(compiled, lambda, frozen);
  if ('refused' in scaled) return { status: 'not-certified', source, reason: scaled.refused };
  // The scaling is by a power of two: the times divide exactly (unless they leave the normal range).
  const timeLeft = Array.from(tr.timeLeft, (t, i) => (i === n - 1 ? scaled.m.timeBound : t / scaled.c));
  const cert = certifyTrajectory(scaled.m, { timeLeft, values: tr.values });
  if ('refused' in cert) return { status: 'not-certified', source, reason: cert.refused };
  return enclosureOf(scaled.m, cert, scaled.flushBound, source, n - 1);
}

export interface CertificateJudgement {
  readonly outcome: 'confirmed' | 'not-confirmed' | 'refuted';
  /** X (see certifiedBound): |value_s − v_s(T)| ≤ bound in every state. */
  readonly bound: number;
  /** The state where X is reached. */
  readonly worstState: number;
  /** For a refutation: the answer whose interval is disjoint from the enclosure, and where. */
  readonly conflict?: { readonly label: string; readonly state: number; readonly gap: number };
}

type Enclosure = Pick<Extract<Certification, { status: 'certified' }>, 'center' | 'below' | 'above'>;

/**
 * The certified bound X on |value − true|: max_s max(value_s − f_s + below, f_s − value_s + above),
 * rounded up (the difference, the sum and the product are each within u relative of the exact one,
 * standard model; 1 + 6u covers the three). v_s(T) ∈ [f_s − below, f_s + above].
 */
export function certifiedBound(values: ArrayLike<number>, enc: Enclosure): { bound: number; worstState: number } {
  let bound = 0;
  let worstState = -1;
  for (let s = 0; s < values.length; s++) {
    const d = values[s]! - enc.center[s]!;
    const x = Math.max(d + enc.below, -d + enc.above);
    if (!(x <= bound)) [bound, worstState] = [x, s];
  }
  return { bound: bound * (1 + 6 * UNIT_ROUNDOFF), worstState };
}

/**
 * The outcome for the answer `own` (its values and claimed bound) given the enclosure, and `others`
 * (every other answer, value ± bound). Disjointness goes through the one comparator: [f − below,
 * f + above] and [a − bound_a, a + bound_a] are disjoint when f_s − a_s > below + bound_a (+ slack)
 * or a_s − f_s > above + bound_a (+ slack).
 */
export function judgeCertificate(own: Answer, enc: Enclosure, others: readonly Answer[]): CertificateJudgement {
  const { bound, worstState } = certifiedBound(own.values, enc);
  const fromBelow: Answer = { label: 'certified', values: enc.center, bound: enc.below };
  const fromAbove: Answer = { label: 'certified', values: enc.center, bound: enc.above };
  for (const a of [own, ...others]) {
    for (const c of [compareAtMost(fromBelow, a), compareAtMost(a, fromAbove)]) {
      if (!c.agree) return { outcome: 'refuted', bound, worstState, conflict: { label: a.label, state: c.worstState, gap: c.difference - c.allowed } };
    }
  }
  return { outcome: bound <= own.bound ? 'confirmed' : 'not-confirmed', bound, worstState };
}

const SOURCE_SHOWN: Record<Source, string> = { steps: 'its steps', pieces: 'its level-k pieces', trajectory: 'its trajectory' };

/** The `certified` check of a solved method, or undefined when it handed out no dense solution. */
export function certifiedCheck(names: readonly string[], m: SolvedMethod, solved: readonly SolvedMethod[]): CheckResult | undefined {
  const cert = m.certificate;
  if (!cert) return undefined;
  const head: CheckHead = { kind: 'certified', name: `certified ${shownLabel(m)}`, methods: [m.label], independent: false };
  if (cert.status === 'not-certified') return skipped(head, `no certificate of ${SOURCE_SHOWN[cert.source]}: ${cert.reason}`);
  const answer = (x: SolvedMethod): Answer => ({ label: x.label, values: x.values, bound: x.errorBound });
  const j = judgeCertificate(answer(m), cert, solved.filter((x) => x !== m).map(answer));
  const e = formatError;
  const certified = { bound: j.bound, claim: m.errorBound, outcome: j.outcome } as const;
  const ratio = m.errorBound > 0 ? j.bound / m.errorBound : Infinity;
  const what = `certified from ${SOURCE_SHOWN[cert.source]} (${cert.steps} steps): |value − true| ≤ ${e(j.bound)} in every state`;
  if (j.outcome === 'refuted') {
    const c = j.conflict!;
    const whose = c.label === m.label ? 'its own claimed interval' : `the interval of ${c.label}`;
    const methods = c.label === m.label ? [m.label] : [m.label, c.label];
    return {
      ...failed({ ...head, methods }, `state ${names[c.state] ?? '-'}: the certified enclosure ${cert.center[c.state]} − ${e(cert.below)} … + ${e(cert.above)} ` +
        `and ${whose} are disjoint by ${e(c.gap)}: one of the two rigorous claims is false (${what})`),
      certified,
    };
  }
  if (j.outcome === 'confirmed') {
    return { ...head, status: 'passed', ratio, certified, detail: `confirmed: ${what} ≤ claim ${e(m.errorBound)} (ratio ${formatRatio(ratio)})` };
  }
  return {
    ...skipped(head, `not confirmed: ${what}, looser than the claim ${e(m.errorBound)} (ratio ${formatRatio(ratio)}; ` +
      `worst state ${names[j.worstState] ?? '-'}); the certificate neither proves nor refutes the claim`),
    ratio,
    certified,
  };
}
