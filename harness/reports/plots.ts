/**
 * Measurements behind the report's plots, and the plots themselves as inline SVG (vega-lite
 * compiled to vega, rendered headless in Node: no DOM, no network).
 *  - error against intervals for each k of the k-step scheme, with the fitted log–log slope;
 *  - run time against precision per method;
 *  - value against time (the time bound) for the chosen model's initial state.
 */
import * as vega from 'vega';
import { compile as compileVl, type TopLevelSpec } from 'vega-lite';
import { compile } from '../../corpus/format/compile.js';
import type { Model } from '../../corpus/format/types.js';
import { CHECK_EULER_MAX_WORK, solveWith } from '../check/methods.js';

export interface ErrorPoint { k: number; intervals: number; error: number; precision: number }
export interface TimePoint { method: string; precision: number; seconds: number }
export interface ValuePoint { time: number; value: number }

/** Least-squares slope of log10(y) against log10(x). */
export function logLogSlope(points: readonly { x: number; y: number }[]): number {
  const p = points.filter((q) => q.x > 0 && q.y > 0).map((q) => ({ x: Math.log10(q.x), y: Math.log10(q.y) }));
  if (p.length < 2) return NaN;
  const mx = p.reduce((s, q) => s + q.x, 0) / p.length;
  const my = p.reduce((s, q) => s + q.y, 0) / p.length;
  const sxy = p.reduce((s, q) => s + (q.x - mx) * (q.y - my), 0);
  const sxx = p.reduce((s, q) => s + (q.x - mx) ** 2, 0);
  return sxx > 0 ? sxy / sxx : NaN;
}

export function measureConvergence(model: Model, reference: readonly number[], referenceBound: number): { points: ErrorPoint[]; times: TimePoint[] } {
  const compiled = compile(model);
  const ctx = { model, compiled, precision: 1e-6, oracleDigits: 20, eulerMaxWork: CHECK_EULER_MAX_WORK, kstepMaxIntervals: 1e6 };
  const points: ErrorPoint[] = [];
  const times: TimePoint[] = [];
  const precisions = [1e-2, 1e-3, 1e-4, 1e-5, 1e-6, 1e-7, 1e-8];
  for (const label of ['kstep:1', 'kstep:2', 'kstep:3', 'kstep:4', 'euler']) {
    for (const p of precisions) {
      const t0 = performance.now();
      const out = solveWith(label, ctx, p);
      const seconds = (performance.now() - t0) / 1000;
      if (out.kind !== 'solved') continue;
      times.push({ method: label, precision: p, seconds });
      if (!label.startsWith('kstep')) continue;
      let err = 0;
      out.values.forEach((v, s) => (err = Math.max(err, Math.abs(v - reference[s]!))));
      // Errors at the level of the reference's own bound are not measurable.
      if (err > 10 * referenceBound) points.push({ k: Number(label.slice(6)), intervals: out.stats.intervals ?? 0, error: err, precision: p });
    }
  }
  return { points, times };
}

export function measureValueCurve(model: Model, state: number, steps = 16): ValuePoint[] {
  // At time bound 0 the value is the goal indicator.
  const out: ValuePoint[] = [{ time: 0, value: model.goal.includes(state) ? 1 : 0 }];
  for (let i = 1; i <= steps; i++) {
    const T = (model.timeBound * i) / steps;
    const m = { ...model, timeBound: T, timeBoundText: String(T) };
    const r = solveWith('kstep:4', { model: m, compiled: compile(m), precision: 1e-8, oracleDigits: 20 }, 1e-8);
    if (r.kind === 'solved') out.push({ time: T, value: r.values[state]! });
  }
  return out;
}

export async function svgOf(spec: TopLevelSpec): Promise<string> {
  const view = new vega.View(vega.parse(compileVl(spec).spec), { renderer: 'none' });
  const svg = await view.toSVG();
  view.finalize();
  return svg;
}

const base = { width: 420, height: 260, background: 'white' } as const;

export function errorPlot(points: readonly ErrorPoint[], slopes: Record<number, number>): TopLevelSpec {
  const values = points.map((p) => ({ ...p, order: `k = ${p.k} (slope ${slopes[p.k]?.toFixed(2) ?? '-'})` }));
  return {
    ...base,
    title: 'k-step scheme: actual error against intervals',
    data: { values },
    mark: { type: 'line', point: true },
    encoding: {
      x: { field: 'intervals', type: 'quantitative', scale: { type: 'log' }, title: 'intervals' },
      y: { field: 'error', type: 'quantitative', scale: { type: 'log' }, title: 'max |value − oracle|' },
      color: { field: 'order', type: 'nominal', title: null },
    },
  };
}

export function timePlot(times: readonly TimePoint[]): TopLevelSpec {
  return {
    ...base,
    title: 'run time against requested precision',
    data: { values: times.map((t) => ({ ...t, ms: Math.max(t.seconds * 1000, 1e-3) })) },
    mark: { type: 'line', point: true },
    encoding: {
      x: { field: 'precision', type: 'quantitative', scale: { type: 'log', reverse: true }, title: 'requested precision' },
      y: { field: 'ms', type: 'quantitative', scale: { type: 'log' }, title: 'milliseconds' },
      color: { field: 'method', type: 'nominal' },
    },
  };
}

export function valuePlot(points: readonly ValuePoint[], label: string): TopLevelSpec {
  return {
    ...base,
    title: `value against time bound: ${label}`,
    data: { values: [...points] },
    mark: { type: 'line', point: true },
    encoding: {
      x: { field: 'time', type: 'quantitative', title: 'time bound' },
      y: { field: 'value', type: 'quantitative', title: 'optimal value', scale: { zero: true } },
    },
  };
}
