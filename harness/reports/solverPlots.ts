/**
 * Plots of the solvers under test, per model (vega-lite, rendered to inline SVG like plots.ts):
 *  - at the headline state, |Δ| against the best independent reference beside the allowed difference
 *    (the two bounds + 1e-15): a point above its allowance is a disagreement;
 *  - its run time per model beside that of the reference's method.
 * Log scales cannot show 0: an exact agreement is drawn at FLOOR and said so in the legend.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { Model } from '../../corpus/format/types.js';
import type { ModelReport } from '../check/types.js';
import { evidenceRows } from './record.js';
import { svgOf } from './plots.js';

const FLOOR = 1e-18;
const base = { width: 900, height: 240, background: 'white' } as const;

export function solverErrorPlot(points: readonly { model: string; series: string; value: number }[], solver: string): TopLevelSpec {
  return {
    ...base,
    title: `${solver}: |Δ| against the best reference, and the allowed difference, per model`,
    data: { values: points.map((p) => ({ ...p, value: Math.max(p.value, FLOOR) })) },
    mark: { type: 'point', filled: true, size: 60 },
    encoding: {
      x: { field: 'model', type: 'nominal', sort: null, title: null, axis: { labelAngle: -50 } },
      y: { field: 'value', type: 'quantitative', scale: { type: 'log' }, title: `at the headline state (0 drawn at ${FLOOR})` },
      color: { field: 'series', type: 'nominal', title: null, legend: { labelLimit: 400, orient: 'top' } },
      shape: { field: 'series', type: 'nominal', title: null },
    },
  };
}

export function solverTimePlot(points: readonly { model: string; series: string; seconds: number }[], solver: string): TopLevelSpec {
  return {
    ...base,
    title: `${solver}: run time per model, beside the reference's method`,
    data: { values: points.map((p) => ({ ...p, ms: Math.max(p.seconds * 1000, 1e-3) })) },
    mark: { type: 'point', filled: true, size: 60 },
    encoding: {
      x: { field: 'model', type: 'nominal', sort: null, title: null, axis: { labelAngle: -50 } },
      y: { field: 'ms', type: 'quantitative', scale: { type: 'log' }, title: 'milliseconds' },
      color: { field: 'series', type: 'nominal', title: null, legend: { labelLimit: 400, orient: 'top' } },
      shape: { field: 'series', type: 'nominal', title: null },
    },
  };
}

/** Two SVG plots per solver under test, or none when no solver answered anything with a reference. */
export async function solverPlots(reports: readonly ModelReport[], solverIds: readonly string[], cache = new Map<string, Model | null>()): Promise<string[]> {
  const out: string[] = [];
  for (const id of solverIds) {
    const rows = evidenceRows(reports, id, cache).filter((e) => e.comparison && e.reference);
    if (rows.length === 0) continue;
    const errors = rows.flatMap((e) => [
      { model: e.model, series: '|Δ| solver − reference', value: e.comparison!.difference },
      { model: e.model, series: 'allowed (bounds + 1e-15)', value: e.comparison!.allowed },
    ]);
    const times = rows.flatMap((e) => {
      const ref = e.reference!.seconds;
      return [{ model: e.model, series: id, seconds: e.method.seconds }, ...(ref !== undefined ? [{ model: e.model, series: 'reference method', seconds: ref }] : [])];
    });
    out.push(await svgOf(solverErrorPlot(errors, id)), await svgOf(solverTimePlot(times, id)));
  }
  return out;
}
