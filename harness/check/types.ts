/**
 * What `check` finds, as plain serialisable data (it crosses worker threads and is merged across
 * shards). A check is one named verdict; a model passes when every check passes.
 */

export interface MethodResult {
  /** e.g. 'uniformization', 'euler', 'kstep:3', 'oracle', 'solver:mysolver'. */
  readonly label: string;
  readonly status: 'solved' | 'refused' | 'fault';
  readonly values?: number[];
  readonly valuesDecimal?: string[];
  readonly errorBound?: number;
  readonly precision?: number;
  /** Why a method was refused, or which fault an external solver showed. */
  readonly reason?: string;
  readonly fault?: string;
  readonly seconds: number;
  readonly stats?: Record<string, number>;
  /** The strategy the method returned, if any (elapsed-time segments per owned state). */
  readonly scheduler?: { choices: Record<string, { from: number; action: string }[]> };
}

export interface CheckResult {
  /** e.g. 'agree kstep:3 ~ oracle', 'range euler', 'expect oracle', 'fault solver:x'. */
  readonly name: string;
  readonly passed: boolean;
  readonly detail: string;
  /** The largest |difference| / allowed difference seen by this check (agreement checks). */
  readonly ratio?: number;
  /** One command that reproduces a failure. */
  readonly reproduce?: string;
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
  /** Per method: actual error against the oracle (beyond its bound) / the method's bound. */
  readonly audit: { method: string; ratio: number }[];
  readonly warnings: string[];
  /** Set when the file could not be loaded: the model is then a failure with this message. */
  readonly error?: string;
}

export function modelPassed(r: ModelReport): boolean {
  return r.error === undefined && r.checks.every((c) => c.passed);
}
