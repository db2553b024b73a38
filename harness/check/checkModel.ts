/**
 * Check one model: solve it with every applicable method and external solver, then judge the
 * answers by named checks, each through the one comparator (harness/compare).
 */
import { compile } from '../../corpus/format/compile.js';
import type { Model } from '../../corpus/format/types.js';
import { modelKind } from '../../corpus/format/types.js';
import { compareAnswers, withinTolerance } from '../compare/index.js';
import { runExternalMethod } from './external.js';
import { CHECK_EULER_MAX_WORK, CHECK_KSTEP_MAX_INTERVALS, CHECK_KSTEP_WORK, INTERNAL_METHODS, runInternal } from './methods.js';
import { audit, dominance, metamorphic, monotoneInT, strategyValue, type Solve } from './properties.js';
import type { CheckResult, MethodResult, ModelReport } from './types.js';

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
}

export function shellQuote(s: string): string {
  return /^[A-Za-z0-9_./:=,+-]+$/.test(s) ? s : `'${s.replace(/'/g, `'\\''`)}'`;
}

function reproduce(file: string, labels: readonly string[], opts: CheckOptions): string {
  const parts = ['crossbound', 'check', shellQuote(file), '--precision', opts.precision.toExponential()];
  const own = labels.filter((l) => !l.startsWith('solver:'));
  if (own.length > 0) parts.push('--methods', own.join(','));
  else parts.push('--methods', 'none');
  for (const l of labels) {
    if (!l.startsWith('solver:')) continue;
    const i = Number(l.split('#')[1] ?? 1) - 1;
    const t = opts.solvers?.[i];
    if (t !== undefined) parts.push('--solver', shellQuote(t));
  }
  return parts.join(' ');
}

export async function checkModel(file: string, model: Model, warnings: string[], opts: CheckOptions): Promise<ModelReport> {
  const compiled = compile(model);
  const ctx = {
    model,
    compiled,
    precision: opts.precision,
    oracleDigits: opts.oracleDigits ?? 20,
    eulerMaxWork: CHECK_EULER_MAX_WORK,
    kstepMaxIntervals: Math.max(CHECK_KSTEP_MAX_INTERVALS, Math.floor(CHECK_KSTEP_WORK / (compiled.nStates + compiled.nTransitions))),
  };
  const methods: MethodResult[] = [];
  const precisionOf = (label: string): number => opts.methodPrecision?.[label] ?? opts.precision;
  for (const label of opts.methods ?? INTERNAL_METHODS) methods.push(runInternal(label, { ...ctx, precision: precisionOf(label) }));
  for (const [i, template] of (opts.solvers ?? []).entries()) {
    methods.push(await runExternalMethod(template, i, model, compiled, opts));
  }
  const checks = judge(file, model, methods, opts);
  const solve: Solve = async (label, m) => {
    if (!label.startsWith('solver:')) return runInternal(label, { ...ctx, precision: precisionOf(label), model: m, compiled: compile(m) });
    const i = Number(label.split('#')[1]) - 1;
    return runExternalMethod(opts.solvers![i]!, i, m, compile(m), opts);
  };
  for (const m of methods) {
    if (m.status !== 'solved' || m.label === 'oracle') continue;
    const labels = [m.label];
    const mono = await monotoneInT(model, m, solve);
    if (mono) checks.push(withRepro(mono, file, labels, opts));
    const dom = dominance(model, m);
    if (dom) checks.push(withRepro(dom, file, labels, opts));
    const strat = strategyValue(model, m);
    if (strat) checks.push(withRepro(strat, file, labels, opts));
    if (m.label === METAMORPHIC_METHOD || m.label.startsWith('solver:')) {
      for (const c of await metamorphic(model, m, solve)) checks.push(withRepro(c, file, labels, opts));
    }
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

function withRepro(c: CheckResult, file: string, labels: readonly string[], opts: CheckOptions): CheckResult {
  return c.passed ? c : { ...c, reproduce: reproduce(file, labels, opts) };
}

function judge(file: string, model: Model, methods: MethodResult[], opts: CheckOptions): CheckResult[] {
  const checks: CheckResult[] = [];
  const names = model.states.map((s) => s.name);
  const solved = methods.filter((m) => m.status === 'solved');
  for (const m of methods) {
    if (m.status === 'fault') {
      checks.push({ name: `fault ${m.label}`, passed: false, detail: `${m.fault}: ${m.reason ?? ''}`.trim(), reproduce: reproduce(file, [m.label], opts) });
    }
  }
  for (const m of solved) {
    const b = m.errorBound!;
    const bad = m.values!.findIndex((v) => !(v >= -b - 1e-15 && v <= 1 + b + 1e-15));
    checks.push({
      name: `range ${m.label}`,
      passed: bad < 0,
      detail: bad < 0 ? 'every value in [0, 1] up to its bound' : `state ${names[bad]}: value ${m.values![bad]} outside [0, 1] by more than its bound ${b}`,
      ...(bad < 0 ? {} : { reproduce: reproduce(file, [m.label], opts) }),
    });
  }
  for (let i = 0; i < solved.length; i++) {
    for (let j = i + 1; j < solved.length; j++) {
      const a = solved[i]!;
      const b = solved[j]!;
      const c = compareAnswers({ label: a.label, values: a.values!, bound: a.errorBound! }, { label: b.label, values: b.values!, bound: b.errorBound! });
      const s = names[c.worstState] ?? '-';
      checks.push({
        name: `agree ${a.label} ~ ${b.label}`,
        passed: c.agree,
        ratio: c.ratio,
        detail: c.agree
          ? `worst state ${s}: |difference| ${c.difference.toExponential(2)} ≤ allowed ${c.allowed.toExponential(2)}`
          : `state ${s}: ${a.label} = ${a.values![c.worstState]}, ${b.label} = ${b.values![c.worstState]}, |difference| ${c.difference.toExponential(3)} > allowed ${c.allowed.toExponential(3)} (bounds ${a.errorBound!.toExponential(2)} + ${b.errorBound!.toExponential(2)})`,
        ...(c.agree ? {} : { reproduce: reproduce(file, [a.label, b.label], opts) }),
      });
    }
  }
  if (model.expect) {
    const exp = model.expect;
    for (const m of solved) {
      let worst = '';
      let worstRatio = 0;
      let passed = true;
      for (const [state, text] of Object.entries(exp.values)) {
        const s = names.indexOf(state);
        const ref = Number(text);
        const allowed = exp.tolerance + m.errorBound!;
        const d = Math.abs(m.values![s]! - ref);
        const r = d / (allowed + 1e-15);
        if (!withinTolerance(m.values![s]!, ref, allowed)) {
          passed = false;
          worst = `state ${state}: ${m.values![s]} vs expected ${text}, |difference| ${d.toExponential(3)} > ${allowed.toExponential(3)}`;
        }
        if (r > worstRatio) worstRatio = r;
      }
      checks.push({
        name: `expect ${m.label}`,
        passed,
        ratio: worstRatio,
        detail: passed ? `matches ${Object.keys(exp.values).length} expected value(s) (${exp.source})` : worst,
        ...(passed ? {} : { reproduce: reproduce(file, [m.label], opts) }),
      });
    }
  }
  return checks;
}
