/**
 * The self-contained HTML qualification report of `check --report`: verdict first, then the caution,
 * corpus coverage, the bound audit, every failed check with its model, and the plots (inline SVG).
 * Nothing is loaded from the network when it is opened.
 */
import { readFileSync } from 'node:fs';
import { loadModelFileWithWarnings } from '../../corpus/format/load.js';
import { auditSummary } from '../check/table.js';
import type { ModelReport } from '../check/types.js';
import { modelPassed } from '../check/types.js';
import { errorPlot, logLogSlope, measureConvergence, measureValueCurve, svgOf, timePlot, valuePlot } from './plots.js';

export const CAUTION =
  'Agreement between independent solvers is evidence, not proof. A passing report shows that these solvers, ' +
  'on these models, agree within their stated bounds; it does not show that a tool is correct on other models. ' +
  'Qualifying a tool for safety-related work follows the applicable standards and needs qualified, independent review.';

const esc = (s: string): string => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

function table(header: string[], rows: string[][]): string {
  return `<table><thead><tr>${header.map((h) => `<th>${esc(h)}</th>`).join('')}</tr></thead><tbody>${rows
    .map((r) => `<tr>${r.map((c) => `<td>${esc(c)}</td>`).join('')}</tr>`)
    .join('')}</tbody></table>`;
}

function switchCount(r: ModelReport): string {
  const oracle = r.methods.find((m) => m.label === 'oracle' && m.status === 'solved');
  const fromOracle = oracle?.stats?.switches;
  if (fromOracle !== undefined) return String(fromOracle);
  const k = r.methods.find((m) => m.label.startsWith('kstep') && m.scheduler);
  if (!k?.scheduler) return '-';
  return String(Object.values(k.scheduler.choices).reduce((n, segs) => n + Math.max(0, segs.length - 1), 0));
}

async function plotsSection(reports: readonly ModelReport[]): Promise<string> {
  const pick = reports.find((r) => r.kind !== 'CTMC' && r.methods.some((m) => m.label === 'oracle' && m.status === 'solved')) ??
    reports.find((r) => r.methods.some((m) => m.label === 'oracle' && m.status === 'solved'));
  if (!pick) return '<p>No model with an oracle value: no plots.</p>';
  const oracle = pick.methods.find((m) => m.label === 'oracle')!;
  const { model } = loadModelFileWithWarnings(pick.file);
  const { points, times } = measureConvergence(model, oracle.values!, oracle.errorBound!);
  const slopes: Record<number, number> = {};
  for (const k of [1, 2, 3, 4]) slopes[k] = logLogSlope(points.filter((p) => p.k === k).map((p) => ({ x: p.intervals, y: p.error })));
  const state = pick.initial >= 0 ? pick.initial : 0;
  const curve = measureValueCurve(model, state);
  const svgs = await Promise.all([
    svgOf(errorPlot(points, slopes)),
    svgOf(timePlot(times)),
    svgOf(valuePlot(curve, `${pick.model}, state ${pick.stateNames[state]}`)),
  ]);
  const slopeText = [1, 2, 3, 4].map((k) => `k = ${k}: ${Number.isNaN(slopes[k]!) ? '-' : slopes[k]!.toFixed(2)}`).join('; ');
  return `<p>Measured on <b>${esc(pick.model)}</b> against the oracle. Fitted slopes of log error against log intervals (the method's order predicts −k): ${esc(slopeText)}.</p>
<div class="plots">${svgs.map((s) => `<figure>${s}</figure>`).join('')}</div>`;
}

export async function htmlReport(reports: readonly ModelReport[], meta: { precision: number; command: string }): Promise<string> {
  const passed = reports.filter(modelPassed).length;
  const failures = reports.flatMap((r) => r.checks.filter((c) => !c.passed).map((c) => ({ r, c })));
  const verdict = failures.length === 0 ? 'PASS' : 'FAIL';
  const coverage = table(
    ['model', 'kind', 'states', 'transitions', 'λT', 'goal mode', 'switches', 'methods solved', 'verdict'],
    reports.map((r) => [
      r.model, r.kind, String(r.states), String(r.transitions), r.lambdaT.toPrecision(3), r.goalMode, switchCount(r),
      `${r.methods.filter((m) => m.status === 'solved').length}/${r.methods.length}`, modelPassed(r) ? 'pass' : 'FAIL',
    ]),
  );
  const kinds = ['CTMC', 'CTMDP', 'CTMG'].map((k) => `${reports.filter((r) => r.kind === k).length} ${k}`).join(', ');
  const audit = auditSummary(reports);
  const auditHtml = audit.length
    ? table(['method', 'models', 'largest actual error / bound', 'median'], audit.map((a) => [a.method, String(a.models), a.max.toExponential(2), a.median.toExponential(2)]))
    : '<p>No oracle values: no audit.</p>';
  const failHtml = failures.length
    ? failures.map(({ r, c }) => {
        let text = '';
        try {
          text = readFileSync(r.file, 'utf8').slice(0, 20_000);
        } catch {
          text = '(model file not readable)';
        }
        return `<section class="fail"><h3>${esc(r.model)}: ${esc(c.name)}</h3><p>${esc(c.detail)}</p>${c.reproduce ? `<p>Reproduce: <code>${esc(c.reproduce)}</code></p>` : ''}<details><summary>model ${esc(r.file)}</summary><pre>${esc(text)}</pre></details></section>`;
      }).join('\n')
    : '<p>None: every pair of answers agreed within the sum of their stated bounds, and every property check held.</p>';
  return `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><title>crossbound qualification report</title>
<style>
body{font-family:system-ui,sans-serif;margin:2em auto;max-width:1100px;color:#222}
h1{margin-bottom:.2em} .verdict{font-size:1.6em;font-weight:bold;padding:.4em .8em;display:inline-block;border-radius:6px}
.PASS{background:#d8f5d0;color:#174d0c}.FAIL{background:#fadad7;color:#7a120b}
.caution{border-left:4px solid #c90;background:#fff8e6;padding:.6em 1em}
table{border-collapse:collapse;margin:.5em 0}td,th{border:1px solid #ccc;padding:.2em .6em;text-align:right}td:first-child,th:first-child{text-align:left}
.plots{display:flex;flex-wrap:wrap;gap:1em}figure{margin:0}code,pre{background:#f4f4f4}pre{padding:.5em;overflow:auto;max-height:20em}
</style></head><body>
<h1>crossbound qualification report</h1>
<p><span class="verdict ${verdict}">${verdict}</span> &nbsp; ${passed} of ${reports.length} models pass every check; ${failures.length} failed check(s). Requested precision ${meta.precision.toExponential()}.</p>
<p class="caution">${esc(CAUTION)}</p>
<h2>Corpus coverage</h2><p>${esc(kinds)}; goal modes: ${reports.filter((r) => r.goalMode === 'within').length} within, ${reports.filter((r) => r.goalMode === 'at').length} at.</p>${coverage}
<h2>Bound audit</h2><p>Per method, its actual error against the high-precision oracle (beyond the oracle's own bound) divided by the bound it reported: over 1 is a broken bound, far below 1 a loose one.</p>${auditHtml}
<h2>Disagreements and failed checks</h2>${failHtml}
<h2>Plots</h2>${await plotsSection(reports)}
<p><small>Command: <code>${esc(meta.command)}</code></small></p>
</body></html>
`;
}
