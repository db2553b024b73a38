/**
 * What `check` finds, as plain serialisable data (it crosses worker threads and is merged across
 * shards). A method's answer is a tagged union (solved | refused with a code | fault with a kind); a
 * check is passed, failed or skipped (it could not run), and names the methods it involves by id.
 */
import type { RefusalCode } from '../../corpus/format/result.js';
import { formatPrecision } from '../numbers.js';

/**
 * Method families: answers of one family share code, so their agreement is no independent evidence.
 * kstep of every order is one family; each external solver is a family of its own ('solver#I'); each
 * planted broken variant too ('variant:NAME').
 */
export type Family = 'uniformization' | 'euler' | 'kstep' | 'defect' | 'oracle' | `solver#${number}` | `variant:${string}`;

/** What went wrong when a method faulted: an external solver's misbehaviour, an exception, a failed self-check. */
export type FaultKind =
  | 'not-json' | 'bad-format' | 'missing-state' | 'bad-value' | 'no-bound'
  | 'timeout' | 'crash' | 'exit-code' | 'output-too-large' | 'spawn-failed'
  | 'exception' | 'self-check';

interface MethodBase {
  /** The method's id, e.g. 'uniformization', 'euler', 'kstep:3', 'oracle', 'solver:mysolver#1'. */
  readonly label: string;
  readonly family: Family;
  readonly seconds: number;
  /** An external solver's account of itself: the `method`, `version` and `params` its answer reported. */
  readonly reported?: ReportedBy;
}

export interface ReportedBy {
  readonly method: string;
  readonly version?: string;
  readonly params?: Readonly<Record<string, number | string>>;
}

export interface SolvedMethod extends MethodBase {
  readonly status: 'solved';
  readonly values: number[];
  readonly valuesDecimal?: string[];
  readonly errorBound: number;
  /** The precision asked of the run of check. */
  readonly requestedPrecision: number;
  /** The precision the method ran at: coarser than requested when it was retried after a work cap. */
  readonly precision: number;
  readonly stats?: Record<string, number>;
  /** The strategy the method returned, if any (elapsed-time segments per owned state). */
  readonly scheduler?: { choices: Record<string, { from: number; action: string }[]> };
  /** The solver gave no error_bound: `errorBound` is the user's --default-bound, not the solver's claim. */
  readonly boundAssumed?: true;
  /** What the a-posteriori certificate of the method's dense solution gave, when it had one (./certified.ts). */
  readonly certificate?: Certification;
}

/**
 * The a-posteriori certificate of a dense solution (the method's own steps, the k-step scheme's
 * pieces, an external solver's `trajectory`): an enclosure of v(T) in every state, or why no
 * certificate was made (a work cap, a bound that is not finite).
 */
export type Certification =
  | {
      readonly status: 'certified';
      readonly source: 'steps' | 'pieces' | 'trajectory';
      readonly steps: number;
      /** f(T), the dense solution's end, per state; f_s − below ≤ v_s(T) ≤ f_s + above. */
      readonly center: number[];
      readonly below: number;
      readonly above: number;
    }
  | { readonly status: 'not-certified'; readonly source: 'steps' | 'pieces' | 'trajectory'; readonly reason: string };

export interface RefusedMethod extends MethodBase {
  readonly status: 'refused';
  /** 'unspecified' when the refusal carried no code. */
  readonly code: RefusalCode | 'unspecified';
  readonly reason: string;
}

export interface FaultMethod extends MethodBase {
  readonly status: 'fault';
  readonly fault: FaultKind;
  readonly reason: string;
}

export type MethodResult = SolvedMethod | RefusedMethod | FaultMethod;

export type CheckKind =
  | 'agree' | 'range' | 'expect' | 'fault' | 'monotone-in-T' | 'dominance' | 'strategy-value' | 'metamorphic' | 'certified';

export interface CheckResult {
  /** e.g. 'agree kstep:3 ~ oracle', 'range euler@1e-4', 'expect oracle', 'fault solver:x#1' (for people). */
  readonly name: string;
  readonly kind: CheckKind;
  /** Ids (labels) of the methods the check involves (for programs; never parse `name`). */
  readonly methods: readonly string[];
  /**
   * `skipped` also stands for a check that ran and gave no evidence either way: a `certified` check
   * whose certificate is looser than the claim ("not confirmed"); it is never counted as passed.
   */
  readonly status: 'passed' | 'failed' | 'skipped';
  /**
   * The check compared answers of two independent families, or an answer with a reference (an
   * `expect` value). Only such checks, when they ran, make a model's verdict `pass`.
   */
  readonly independent: boolean;
  /** What was found, or (skipped) why the check could not run. */
  readonly detail: string;
  /** The largest |difference| / allowed difference seen by this check. */
  readonly ratio?: number;
  /** One command that reproduces a failure. */
  readonly reproduce?: string;
  /** `certified` checks: the certified bound X on |value − true|, the method's claim, and the outcome. */
  readonly certified?: { readonly bound: number; readonly claim: number; readonly outcome: 'confirmed' | 'not-confirmed' | 'refuted' };
}

export interface ModelReport {
  readonly file: string;
  readonly model: string;
  readonly kind: 'CTMC' | 'CTMDP' | 'CTMG';
  readonly states: number;
  readonly transitions: number;
  readonly lambdaT: number;
  readonly goalMode: 'within' | 'at';
  readonly timeBound: number;
  readonly stateNames: string[];
  readonly initial: number;
  readonly methods: MethodResult[];
  readonly checks: CheckResult[];
  /**
   * Per method: actual error against the oracle (beyond its bound) / the method's bound; the bound, and
   * the a-posteriori certified bound of its dense solution when there is one.
   */
  readonly audit: { method: string; ratio: number; bound?: number; certified?: number }[];
  readonly warnings: string[];
  /** Set when the file could not be loaded: the model is then a failure with this message. */
  readonly error?: string;
}

/**
 * pass: every check that ran passed, and at least one independent check ran; fail: some check failed
 * (or the model could not be loaded); unchecked: nothing independent was compared.
 */
export type Verdict = 'pass' | 'fail' | 'unchecked';

export function modelVerdict(r: ModelReport): Verdict {
  if (r.error !== undefined || r.checks.some((c) => c.status === 'failed')) return 'fail';
  return r.checks.some((c) => c.independent && c.status === 'passed') ? 'pass' : 'unchecked';
}

/** Why a model is unchecked, in one line. */
export function uncheckedReason(r: ModelReport): string {
  const solved = r.methods.filter((m) => m.status === 'solved');
  const families = [...new Set(solved.map((m) => m.family))];
  if (solved.length === 0) return `no method answered (${r.methods.length} tried)`;
  if (families.length === 1) return `only the ${families[0]} family answered, and no reference value`;
  return 'no comparison of two independent families ran';
}

/**
 * A method's label as shown: with '@precision' when it ran coarser than requested, and '[bound assumed]'
 * when its bound is the user's --default-bound.
 */
export function shownLabel(m: MethodResult): string {
  if (m.status !== 'solved') return m.label;
  const at = m.precision !== m.requestedPrecision ? `@${formatPrecision(m.precision)}` : '';
  return `${m.label}${at}${m.boundAssumed ? '[bound assumed]' : ''}`;
}

