/**
 * Named property checks beyond pairwise agreement, each judged through the one comparator. None of
 * them compares two independent families, so none alone makes a model `pass`:
 *  - monotone in T (goal mode `within`): v(T/2) ≤ v(T) + both bounds, per method;
 *  - metamorphic relations: each transformation of transform.ts, solved by the same method, gives the
 *    original's values within both bounds (run for `kstep:3` and every external solver);
 *  - dominance (CTMDPs): a returned scheduler, evaluated by uniformization at 1e-10, may not beat the
 *    claimed optimum beyond the bounds (max: w ≤ v + bounds; min: w ≥ v − bounds). A scheduler's
 *    value is a certified bound on the optimum, so this catches an optimum claimed too low (max) or too
 *    high (min) even where no other solver applies;
 *  - bound audit: |v − oracle| beyond the oracle's bound, divided by the method's own bound (> 1 is a
 *    broken bound; far below 1 a loose one); beside it the a-posteriori certified bound of the method's
 *    dense solution, when there is one (the check `certified`, ./certified.ts).
 * A check that cannot run (the transformed model refused, a scheduler too long to evaluate) is skipped
 * with its reason, never passed.
 */
import { compile } from '../../corpus/format/compile.js';
import type { Scheduler } from '../../corpus/format/scheduler.js';
import type { Model } from '../../corpus/format/types.js';
import { modelKind } from '../../corpus/format/types.js';
import { solveUniformization } from '../../solvers/uniformization/index.js';
import { compareAnswers, compareAtMost, type Comparison } from '../compare/index.js';
import { certifiedBound } from './certified.js';
import { failed, ran, skipped, type CheckHead } from './make.js';
import { addUnreachable, duplicateAction, gameOfCtmc, renameStates, scaleRates, type Transformed } from './transform.js';
import { shownLabel, type CheckResult, type MethodResult, type SolvedMethod } from './types.js';
import { formatError, formatRatio, formatValue } from '../numbers.js';

export type Solve = (label: string, model: Model) => Promise<MethodResult>;

const answer = (m: SolvedMethod) => ({ label: m.label, values: m.values, bound: m.errorBound });

const describeDiff = (names: readonly string[], c: Comparison, what: string): string =>
  `${c.agree ? 'holds' : 'broken'} (${what}): worst state ${names[c.worstState] ?? '-'}, ` +
  `difference ${formatError(c.difference)} vs allowed ${formatError(c.allowed)} (ratio ${formatRatio(c.ratio)})`;

const notSolved = (r: MethodResult): string => (r.status === 'refused' ? `refused (${r.code}): ${r.reason}` : r.status === 'fault' ? `${r.fault}: ${r.reason}` : '');

export async function monotoneInT(model: Model, base: SolvedMethod, solve: Solve): Promise<CheckResult | undefined> {
  if (model.goalMode !== 'within') return undefined;
  const head: CheckHead = { kind: 'monotone-in-T', name: `monotone-in-T ${shownLabel(base)}`, methods: [base.label], independent: false };
  const half = { ...model, timeBound: model.timeBound / 2, timeBoundText: String(model.timeBound / 2), expect: undefined };
  const r = await solve(base.label, half);
  if (r.status === 'fault') return failed(head, `T/2 not solved: ${notSolved(r)}`);
  if (r.status === 'refused') return skipped(head, `T/2 not solved: ${notSolved(r)}`);
  const names = model.states.map((s) => s.name);
  const c = compareAtMost({ label: `${base.label} at T/2`, values: r.values, bound: r.errorBound }, answer(base));
  return ran(head, c, c.agree
    ? `v(T/2) ≤ v(T) + bounds in every state (ratio ${formatRatio(c.ratio)})`
    : `state ${names[c.worstState]}: v(T/2) = ${r.values[c.worstState]} exceeds v(T) = ${base.values[c.worstState]} by ` +
      `${formatError(c.difference)} > ${formatError(c.allowed)}`);
}

export function transformations(model: Model): Transformed[] {
  const list = [scaleRates(model, 4), renameStates(model), addUnreachable(model), duplicateAction(model)];
  if (modelKind(model) === 'CTMC') list.push(gameOfCtmc(model));
  return list;
}

export async function metamorphic(model: Model, base: SolvedMethod, solve: Solve): Promise<CheckResult[]> {
  if (model.states.length === 0) return [];
  const names = model.states.map((s) => s.name);
  const out: CheckResult[] = [];
  for (const t of transformations(model)) {
    const r = await solve(base.label, t.model);
    const head: CheckHead = { kind: 'metamorphic', name: `metamorphic ${t.name} ${shownLabel(base)}`, methods: [base.label], independent: false };
    if (r.status !== 'solved') {
      out.push((r.status === 'fault' ? failed : skipped)(head, `transformed copy not solved: ${notSolved(r)}`));
      continue;
    }
    const mapped = t.map.map((i) => r.values[i]!);
    const c = compareAnswers(answer(base), { label: head.name, values: mapped, bound: r.errorBound });
    out.push(ran(head, c, describeDiff(names, c, t.name)));
  }
  return out;
}

/** Evaluating a scheduler costs a uniformization per segment; beyond this many it is not evaluated. */
export const MAX_DOMINANCE_SEGMENTS = 20_000;

type SchedulerValue = { values: Float64Array; bound: number; names: readonly string[] };

/** The returned scheduler's own value by uniformization at 1e-10, or the check result saying why not. */
function schedulerValue(model: Model, m: SolvedMethod, head: CheckHead): SchedulerValue | CheckResult {
  const choices = m.scheduler!.choices;
  for (const [state, segs] of Object.entries(choices)) {
    const st = model.states.find((s) => s.name === state);
    const bad = !st || !Array.isArray(segs) || segs.some((g) => !st.actions.some((a) => a.name === g.action) || !Number.isFinite(g.from));
    if (bad) return failed(head, `the returned scheduler names an unknown state or action (${state})`);
  }
  const segments = Object.values(choices).reduce((n, segs) => n + segs.length, 0);
  if (segments > MAX_DOMINANCE_SEGMENTS) return skipped(head, `scheduler not evaluated: ${segments} segments (more than ${MAX_DOMINANCE_SEGMENTS})`);
  const compiled = compile(model);
  const w = solveUniformization(compiled, { precision: 1e-10, scheduler: m.scheduler as Scheduler });
  if (w.kind !== 'solved') return skipped(head, `scheduler not evaluated: uniformization refused (${w.code ?? 'unspecified'}): ${w.reason}`);
  return { values: w.values, bound: w.errorBound, names: compiled.stateNames };
}

export function dominance(model: Model, m: SolvedMethod): CheckResult | undefined {
  if (modelKind(model) !== 'CTMDP' || !m.scheduler) return undefined;
  const head: CheckHead = { kind: 'dominance', name: `dominance ${shownLabel(m)}`, methods: [m.label], independent: false };
  const isMax = model.states.some((s) => s.actions.length >= 2 && s.owner === 'max');
  const w = schedulerValue(model, m, head);
  if (!('values' in w)) return w;
  const sched = { label: 'its scheduler', values: w.values, bound: w.bound };
  const c = isMax ? compareAtMost(sched, answer(m)) : compareAtMost(answer(m), sched);
  const s = c.worstState;
  return ran(head, c, c.agree
    ? `the returned scheduler does not beat the claimed optimum (${isMax ? 'max' : 'min'}; ratio ${formatRatio(c.ratio)})`
    : `state ${w.names[s]}: the returned scheduler achieves ${formatValue(w.values[s]!)}, beyond the claimed optimum ${formatValue(m.values[s]!)} by ` +
      `${formatError(c.difference)} > ${formatError(c.allowed)}`);
}

/**
 * Own k-step runs only: the scheduler they return (both players' strategies) is evaluated and must
 * achieve the reported value within both bounds — its switches sit at the level-k breakpoints, so the
 * strategy is as good as the values (other solvers' schedulers need not be; dominance covers them).
 */
export function strategyValue(model: Model, m: SolvedMethod): CheckResult | undefined {
  if (modelKind(model) === 'CTMC' || !m.scheduler || m.family !== 'kstep') return undefined;
  const head: CheckHead = { kind: 'strategy-value', name: `strategy-value ${shownLabel(m)}`, methods: [m.label], independent: false };
  const w = schedulerValue(model, m, head);
  if (!('values' in w)) return w;
  const c = compareAnswers(answer(m), { label: 'its scheduler', values: w.values, bound: w.bound });
  return ran(head, c, describeDiff(w.names, c, 'the returned scheduler achieves the reported value'));
}

export interface AuditRow {
  readonly method: string;
  /** max_s max(0, |v_s − oracle_s| − oracle bound) / method bound. */
  readonly ratio: number;
  /** The method's own (a-priori or claimed) bound. */
  readonly bound?: number;
  /** The a-posteriori certified bound X on |value − true| of its dense solution, when one was certified (./certified.ts). */
  readonly certified?: number;
}

export function audit(methods: readonly MethodResult[]): AuditRow[] {
  const oracle = methods.find((m): m is SolvedMethod => m.family === 'oracle' && m.status === 'solved');
  if (!oracle) return [];
  return methods
    .filter((m): m is SolvedMethod => m !== oracle && m.status === 'solved' && m.errorBound > 0)
    .map((m) => {
      let worst = 0;
      m.values.forEach((v, s) => (worst = Math.max(worst, Math.abs(v - oracle.values[s]!) - oracle.errorBound)));
      const cert = m.certificate?.status === 'certified' ? { certified: certifiedBound(m.values, m.certificate).bound } : {};
      return { method: m.label, ratio: worst / m.errorBound, bound: m.errorBound, ...cert };
    });
}
