/**
 * Named property checks beyond pairwise agreement, each judged through the one comparator:
 *  - monotone in T (goal mode `within`): v(T/2) ≤ v(T) + both bounds, per method;
 *  - metamorphic relations: each transformation of transform.ts, solved by the same method, gives the
 *    original's values within both bounds (run for `kstep:3` and every external solver);
 *  - dominance (CTMDPs): a returned scheduler, evaluated by uniformization at 1e-10, may not beat the
 *    claimed optimum beyond the bounds (max: w ≤ v + bounds; min: w ≥ v − bounds). A scheduler's
 *    value is a certified bound on the optimum, so this catches an optimum claimed too low (max) or too
 *    high (min) even where no other solver applies;
 *  - bound audit: |v − oracle| beyond the oracle's bound, divided by the method's own bound (> 1 is a
 *    broken bound; far below 1 a loose one).
 */
import { compile } from '../../corpus/format/compile.js';
import type { Scheduler } from '../../corpus/format/scheduler.js';
import type { Model } from '../../corpus/format/types.js';
import { modelKind } from '../../corpus/format/types.js';
import { solveUniformization } from '../../solvers/uniformization/index.js';
import { compareAnswers } from '../compare/index.js';
import { addUnreachable, duplicateAction, gameOfCtmc, renameStates, scaleRates, type Transformed } from './transform.js';
import type { CheckResult, MethodResult } from './types.js';

export type Solve = (label: string, model: Model) => Promise<MethodResult>;

const describeDiff = (names: readonly string[], c: ReturnType<typeof compareAnswers>, what: string): string =>
  `${c.agree ? 'holds' : 'broken'} (${what}): worst state ${names[c.worstState] ?? '-'}, |difference| ${c.difference.toExponential(2)} vs allowed ${c.allowed.toExponential(2)}`;

export async function monotoneInT(model: Model, base: MethodResult, solve: Solve): Promise<CheckResult | undefined> {
  if (model.goalMode !== 'within' || base.status !== 'solved') return undefined;
  const half = { ...model, timeBound: model.timeBound / 2, timeBoundText: String(model.timeBound / 2), expect: undefined };
  const r = await solve(base.label, half);
  if (r.status !== 'solved') return { name: `monotone-in-T ${base.label}`, passed: r.status !== 'fault', detail: `T/2 not solved: ${r.reason ?? r.fault}` };
  const names = model.states.map((s) => s.name);
  let worst = -1;
  let excess = -Infinity;
  const allowed = base.errorBound! + r.errorBound! + 1e-15;
  r.values!.forEach((v, s) => {
    const e = v - base.values![s]!;
    if (e > excess) [excess, worst] = [e, s];
  });
  const passed = excess <= allowed;
  return {
    name: `monotone-in-T ${base.label}`,
    passed,
    ratio: Math.max(0, excess) / allowed,
    detail: passed
      ? `v(T/2) ≤ v(T) + bounds in every state`
      : `state ${names[worst]}: v(T/2) = ${r.values![worst]} exceeds v(T) = ${base.values![worst]} by ${excess.toExponential(3)} > ${allowed.toExponential(3)}`,
  };
}

export function transformations(model: Model): Transformed[] {
  const list = [scaleRates(model, 4), renameStates(model), addUnreachable(model), duplicateAction(model)];
  if (modelKind(model) === 'CTMC') list.push(gameOfCtmc(model));
  return list;
}

export async function metamorphic(model: Model, base: MethodResult, solve: Solve): Promise<CheckResult[]> {
  if (base.status !== 'solved' || model.states.length === 0) return [];
  const names = model.states.map((s) => s.name);
  const out: CheckResult[] = [];
  for (const t of transformations(model)) {
    const r = await solve(base.label, t.model);
    const name = `metamorphic ${t.name} ${base.label}`;
    if (r.status !== 'solved') {
      out.push({ name, passed: r.status !== 'fault', detail: `transformed copy not solved: ${r.reason ?? r.fault}` });
      continue;
    }
    const mapped = t.map.map((i) => r.values![i]!);
    const c = compareAnswers({ label: base.label, values: base.values!, bound: base.errorBound! }, { label: name, values: mapped, bound: r.errorBound! });
    out.push({ name, passed: c.agree, ratio: c.ratio, detail: describeDiff(names, c, t.name) });
  }
  return out;
}

/** Evaluating a scheduler costs a uniformization per segment; beyond this many it is not evaluated. */
export const MAX_DOMINANCE_SEGMENTS = 20_000;

/** The returned scheduler's own value by uniformization at 1e-10, or a check result saying why not. */
function schedulerValue(model: Model, m: MethodResult, name: string): { values: Float64Array; bound: number; names: readonly string[] } | CheckResult {
  for (const [state, segs] of Object.entries(m.scheduler!.choices)) {
    const st = model.states.find((s) => s.name === state);
    const bad = !st || !Array.isArray(segs) || segs.some((g) => !st.actions.some((a) => a.name === g.action) || !Number.isFinite(g.from));
    if (bad) return { name, passed: false, detail: `the returned scheduler names an unknown state or action (${state})` };
  }
  const segments = Object.values(m.scheduler!.choices).reduce((n, segs) => n + segs.length, 0);
  if (segments > MAX_DOMINANCE_SEGMENTS) return { name, passed: true, detail: `scheduler not evaluated: ${segments} segments (more than ${MAX_DOMINANCE_SEGMENTS})` };
  const compiled = compile(model);
  const w = solveUniformization(compiled, { precision: 1e-10, scheduler: m.scheduler as Scheduler });
  if (w.kind !== 'solved') return { name, passed: true, detail: `scheduler not evaluated: ${w.reason}` };
  return { values: w.values, bound: w.errorBound, names: compiled.stateNames };
}

export function dominance(model: Model, m: MethodResult): CheckResult | undefined {
  if (modelKind(model) !== 'CTMDP' || m.status !== 'solved' || !m.scheduler) return undefined;
  const name = `dominance ${m.label}`;
  const isMax = model.states.some((s) => s.actions.length >= 2 && s.owner === 'max');
  const w = schedulerValue(model, m, name);
  if (!('values' in w)) return w;
  const allowed = m.errorBound! + w.bound + 1e-15;
  let worst = 0;
  let excess = -Infinity;
  for (let s = 0; s < w.values.length; s++) {
    const e = isMax ? w.values[s]! - m.values![s]! : m.values![s]! - w.values[s]!;
    if (e > excess) [excess, worst] = [e, s];
  }
  const passed = excess <= allowed;
  return {
    name,
    passed,
    ratio: Math.max(0, excess) / allowed,
    detail: passed
      ? `the returned scheduler does not beat the claimed optimum (${isMax ? 'max' : 'min'})`
      : `state ${w.names[worst]}: the returned scheduler achieves ${w.values[worst]}, beyond the claimed optimum ${m.values![worst]} by ${excess.toExponential(3)} > ${allowed.toExponential(3)}`,
  };
}

/**
 * Own k-step runs only: the scheduler they return (both players' strategies) is evaluated and must
 * achieve the reported value within both bounds — its switches sit at the level-k breakpoints, so the
 * strategy is as good as the values (other solvers' schedulers need not be; dominance covers them).
 */
export function strategyValue(model: Model, m: MethodResult): CheckResult | undefined {
  if (modelKind(model) === 'CTMC' || m.status !== 'solved' || !m.scheduler || !m.label.startsWith('kstep')) return undefined;
  const name = `strategy-value ${m.label}`;
  const w = schedulerValue(model, m, name);
  if (!('values' in w)) return w;
  const c = compareAnswers({ label: m.label, values: m.values!, bound: m.errorBound! }, { label: 'its scheduler', values: w.values, bound: w.bound });
  return { name, passed: c.agree, ratio: c.ratio, detail: describeDiff(w.names, c, 'the returned scheduler achieves the reported value') };
}

export interface AuditRow {
  readonly method: string;
  /** max_s max(0, |v_s − oracle_s| − oracle bound) / method bound. */
  readonly ratio: number;
}

export function audit(methods: readonly MethodResult[]): AuditRow[] {
  const oracle = methods.find((m) => m.label === 'oracle' && m.status === 'solved');
  if (!oracle) return [];
  return methods
    .filter((m) => m !== oracle && m.status === 'solved' && m.errorBound! > 0)
    .map((m) => {
      let worst = 0;
      m.values!.forEach((v, s) => (worst = Math.max(worst, Math.abs(v - oracle.values![s]!) - oracle.errorBound!)));
      return { method: m.label, ratio: worst / m.errorBound! };
    });
}
