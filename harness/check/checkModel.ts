/**
 * Check one model: solve it with every applicable method and external solver, then judge the
 * answers by named checks, each through the one comparator (harness/compare). A check between two
 * answers of one family (kstep:2 against kstep:4) is run but is not independent evidence.
 */
import { compile } from '../../corpus/format/compile.js';
import type { Model } from '../../corpus/format/types.js';
import { modelKind } from '../../corpus/format/types.js';
import { compareAnswers, compareRange, compareWithReference } from '../compare/index.js';
import { certifiedCheck } from './certified.js';
import { runExternalMethod, solverLabel, type DefaultBound } from './external.js';
import { failed, ran } from './make.js';
import { CHECK_DEFECT_MAX_WORK, CHECK_EULER_MAX_WORK, CHECK_KSTEP_MAX_INTERVALS, CHECK_KSTEP_WORK, INTERNAL_METHODS, runInternal } from './methods.js';
import { audit, dominance, metamorphic, monotoneInT, strategyValue, type Solve } from './properties.js';
import { reproduceCommand } from './reproduce.js';
import { shownLabel, type CheckResult, type MethodResult, type ModelReport, type SolvedMethod } from './types.js';
import { formatError, formatRatio, formatValue } from '../numbers.js';

/** The own method that also runs the metamorphic relations (fast and order 3). */
export const METAMORPHIC_METHOD = 'kstep:3';

export interface CheckOptions {
  readonly precision: number;
  /** Method labels to run; default: all internal methods. */
  readonly methods?: readonly string[];
  /** External solver command templates. */
  readonly solvers?: readonly string[];
  readonly timeoutMs?: number;
  readonly oracleDigits?: number;
  /** Per-method precision overriding `precision` (fuzz runs its reference tighter). */
  readonly methodPrecision?: Readonly<Record<string, number>>;
  /** The bound of an external result without error_bound (--default-bound). */
  readonly defaultBound?: DefaultBound;
}

export { shellQuote } from './reproduce.js';

export async function checkModel(file: string, model: Model, warnings: string[], opts: CheckOptions): Promise<ModelReport> {
  const compiled = compile(model);
  const ctx = {
    model,
    compiled,
    precision: opts.precision,
    oracleDigits: opts.oracleDigits ?? 20,
    eulerMaxWork: CHECK_EULER_MAX_WORK,
    kstepMaxIntervals: Math.max(CHECK_KSTEP_MAX_INTERVALS, Math.floor(CHECK_KSTEP_WORK / (compiled.nStates + compiled.nTransitions))),
    defectMaxWork: CHECK_DEFECT_MAX_WORK,
  };
  const methods: MethodResult[] = [];
  const precisionOf = (label: string): number => opts.methodPrecision?.[label] ?? opts.precision;
  for (const label of opts.methods ?? INTERNAL_METHODS) methods.push(runInternal(label, { ...ctx, precision: precisionOf(label), certify: true }));
  for (const [i, template] of (opts.solvers ?? []).entries()) {
    methods.push(await runExternalMethod(template, i, model, compiled, opts));
  }
  const repro = (labels: readonly string[]): string => reproduceCommand(file, labels, opts);
  const checks = judge(model, methods, repro);
  const external = new Map((opts.solvers ?? []).map((template, index) => [solverLabel(template, index), { template, index }]));
  const solve: Solve = async (label, m) => {
    const ext = external.get(label);
    if (ext) return runExternalMethod(ext.template, ext.index, m, compile(m), opts);
    return runInternal(label, { ...ctx, precision: precisionOf(label), model: m, compiled: compile(m) });
  };
  for (const m of methods) {
    if (m.status !== 'solved' || m.family === 'oracle') continue;
    const own: CheckResult[] = [];
    const mono = await monotoneInT(model, m, solve);
    if (mono) own.push(mono);
    const dom = dominance(model, m);
    if (dom) own.push(dom);
    const strat = strategyValue(model, m);
    if (strat) own.push(strat);
    if (m.label === METAMORPHIC_METHOD || m.family.startsWith('solver#')) own.push(...(await metamorphic(model, m, solve)));
    for (const c of own) checks.push(c.status === 'failed' ? { ...c, reproduce: repro(c.methods) } : c);
  }
  return {
    file,
    model: model.name,
    kind: modelKind(model),
    states: compiled.nStates,
    transitions: compiled.nTransitions,
    lambdaT: compiled.lambda * compiled.timeBound,
    goalMode: model.goalMode,
    timeBound: model.timeBound,
    stateNames: [...compiled.stateNames],
    initial: compiled.initial,
    methods,
    checks,
    audit: audit(methods),
    warnings,
  };
}

const answer = (m: SolvedMethod) => ({ label: m.label, values: m.values, bound: m.errorBound });

type Repro = (labels: readonly string[]) => string;

function judge(model: Model, methods: readonly MethodResult[], repro: Repro): CheckResult[] {
  const withRepro = (c: CheckResult): CheckResult => (c.status === 'failed' ? { ...c, reproduce: repro(c.methods) } : c);
  const names = model.states.map((s) => s.name);
  const solved = methods.filter((m): m is SolvedMethod => m.status === 'solved');
  const checks: CheckResult[] = [];
  for (const m of methods) {
    if (m.status !== 'fault') continue;
    const head = { kind: 'fault' as const, name: `fault ${m.label}`, methods: [m.label], independent: false };
    checks.push(failed(head, `${m.fault}: ${m.reason}`));
  }
  for (const m of solved) checks.push(rangeCheck(names, m));
  for (const m of solved) {
    const c = certifiedCheck(names, m, solved);
    if (c) checks.push(c);
  }
  for (let i = 0; i < solved.length; i++) for (let j = i + 1; j < solved.length; j++) checks.push(agreeCheck(names, solved[i]!, solved[j]!));
  if (model.expect) for (const m of solved) checks.push(expectCheck(names, model.expect, m));
  return checks.map(withRepro);
}

function rangeCheck(names: readonly string[], m: SolvedMethod): CheckResult {
  const c = compareRange(answer(m));
  const s = c.worstState;
  const head = { kind: 'range' as const, name: `range ${shownLabel(m)}`, methods: [m.label], independent: false };
  return ran(head, c, c.agree
    ? 'every value in [0, 1] up to its bound'
    : `state ${names[s]}: value ${formatValue(m.values[s]!)} outside [0, 1] by more than its bound ${formatError(m.errorBound)}`);
}

/** Two answers within the sum of their bounds; independent evidence only across families. */
function agreeCheck(names: readonly string[], a: SolvedMethod, b: SolvedMethod): CheckResult {
  const c = compareAnswers(answer(a), answer(b));
  const s = c.worstState;
  const independent = a.family !== b.family;
  const head = { kind: 'agree' as const, name: `agree ${shownLabel(a)} ~ ${shownLabel(b)}`, methods: [a.label, b.label], independent };
  if (c.agree) {
    const family = independent ? '' : `; both of family ${a.family}, not independent`;
    return ran(head, c, `worst state ${names[s] ?? '-'}: |difference| ${formatError(c.difference)} ≤ allowed ${formatError(c.allowed)} ` +
      `(ratio ${formatRatio(c.ratio)})${family}`);
  }
  return ran(head, c, `state ${names[s] ?? '-'}: ${a.label} = ${formatValue(a.values[s]!)}, ${b.label} = ${formatValue(b.values[s]!)}, ` +
    `|difference| ${formatError(c.difference)} > allowed ${formatError(c.allowed)} (bounds ${formatError(a.errorBound)} + ${formatError(b.errorBound)})`);
}

/** An answer against the file's reference values (a reference: independent evidence). */
function expectCheck(names: readonly string[], exp: NonNullable<Model['expect']>, m: SolvedMethod): CheckResult {
  const entries = Object.entries(exp.values);
  const ref = { label: 'expect', states: entries.map(([st]) => names.indexOf(st)), values: entries.map(([, t]) => Number(t)), tolerance: exp.tolerance };
  const c = compareWithReference(answer(m), ref);
  const s = c.worstState;
  const head = { kind: 'expect' as const, name: `expect ${shownLabel(m)}`, methods: [m.label], independent: true };
  return ran(head, c, c.agree
    ? `matches ${entries.length} expected value(s) (${exp.source}; ratio ${formatRatio(c.ratio)})`
    : `state ${names[s]}: ${formatValue(m.values[s]!)} vs expected ${exp.values[names[s]!]}, ` +
      `|difference| ${formatError(c.difference)} > ${formatError(c.allowed)}`);
}
