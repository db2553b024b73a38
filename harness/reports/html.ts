/**
 * The self-contained HTML qualification report of `check --report`: verdict first, then the caution,
 * what was tested (identity, environment, precisions: record.ts), each solver under test's coverage
 * and evidence, corpus coverage, the bound audit, every failed check with its model grouped by the
 * method it implicates, the plots (inline SVG), and the command that re-runs it.
 * Nothing is loaded from the network when it is opened.
 */
import { readFileSync } from 'node:fs';
import { loadModelFileWithWarnings } from '../../corpus/format/load.js';
import { auditSummary } from '../check/table.js';
import { summarize } from '../check/summary.js';
import { assumedBoundNotes, coarserText } from '../check/table.js';
import { modelVerdict, uncheckedReason, type ModelReport, type SolvedMethod } from '../check/types.js';
import { errorPlot, logLogSlope, measureConvergence, measureValueCurve, svgOf, timePlot, valuePlot } from './plots.js';
import { formatPrecision, formatRatio, formatScalar } from '../numbers.js';
import { esc, table } from './htmlParts.js';
import type { RunIdentity } from './identity.js';
import { evidenceSection, failuresByMethod, identitySection, solverCoverageSection } from './record.js';
import { solverPlots } from './solverPlots.js';
import type { Model } from '../../corpus/format/types.js';

export const CAUTION =
  'Agreement between independent solvers is evidence, not proof. A passing report shows that these solvers, ' +
  'on these models, agree within their stated bounds; it does not show that a tool is correct on other models. ' +
  'Qualifying a tool for safety-related work follows the applicable standards and needs qualified, independent review.';


const solvedOracle = (r: ModelReport): SolvedMethod | undefined =>
  r.methods.find((m): m is SolvedMethod => m.family === 'oracle' && m.status === 'solved');

function switchCount(r: ModelReport): string {
  const fromOracle = solvedOracle(r)?.stats?.switches;
  if (fromOracle !== undefined) return String(fromOracle);
  const k = r.methods.find((m): m is SolvedMethod => m.family === 'kstep' && m.status === 'solved' && m.scheduler !== undefined);
  if (!k?.scheduler) return '-';
  return String(Object.values(k.scheduler.choices).reduce((n, segs) => n + Math.max(0, segs.length - 1), 0));
}

async function plotsSection(reports: readonly ModelReport[]): Promise<string> {
  const pick = reports.find((r) => r.kind !== 'CTMC' && solvedOracle(r)) ?? reports.find((r) => solvedOracle(r));
  const oracle = pick && solvedOracle(pick);
  if (!pick || !oracle) return '<p>No model with an oracle value: no plots.</p>';
  const { model } = loadModelFileWithWarnings(pick.file);
  const { points, times } = measureConvergence(model, oracle.values, oracle.errorBound);
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

function modelFileText(file: string): string {
  try {
    return readFileSync(file, 'utf8').slice(0, 20_000);
  } catch {
    return '(model file not readable)';
  }
}

function failuresSection(reports: readonly ModelReport[]): string {
  const groups = failuresByMethod(reports);
  if (groups.length === 0) return '<p>None: every check that ran held.</p>';
  const lead = '<p>Grouped under the method each failure implicates: of the methods a failed check involves, the one involved in the most failed checks.</p>';
  return lead + groups.map(({ method, failures }) => `<section class="fail-group" data-method="${esc(method)}"><h3>${esc(method)}: ${failures.length} failed check(s)</h3>` +
    failures.map(({ r, c }) => {
      const repro = c.reproduce ? `<p>Reproduce: <code>${esc(c.reproduce)}</code></p>` : '';
      const model = `<details><summary>model ${esc(r.file)}</summary><pre>${esc(modelFileText(r.file))}</pre></details>`;
      return `<section class="fail"><h4>${esc(r.model)}: ${esc(c.name)}</h4><p>${esc(c.detail)}</p>${repro}${model}</section>`;
    }).join('\n') + '</section>').join('\n');
}

function uncheckedSection(reports: readonly ModelReport[]): string {
  const list = reports.filter((r) => modelVerdict(r) === 'unchecked');
  if (list.length === 0) return '<p>None: every model had answers of two independent families compared, or an answer compared with a reference.</p>';
  return table(['model', 'file', 'why unchecked'], list.map((r) => [r.model, r.file, uncheckedReason(r)]));
}

function skippedSection(reports: readonly ModelReport[]): string {
  const list = reports.flatMap((r) => r.checks.filter((c) => c.status === 'skipped').map((c) => [r.model, c.name, c.detail]));
  if (list.length === 0) return '<p>None.</p>';
  return `<p>These checks could not run; they count neither as passed nor as failed.</p>${table(['model', 'check', 'reason'], list)}`;
}

const VERDICT_HTML = { pass: 'PASS', fail: 'FAIL', unchecked: 'UNCHECKED', empty: 'EMPTY' } as const;

export async function htmlReport(reports: readonly ModelReport[], meta: { identity: RunIdentity; allowUnchecked: boolean }): Promise<string> {
  const id = meta.identity;
  const cache = new Map<string, Model | null>();
  const solverSvgs = await solverPlots(reports, id.solver_identity.map((x) => x.id), cache);
  const sum = summarize(reports, meta.allowUnchecked);
  const verdict = VERDICT_HTML[sum.verdict];
  const failed = reports.reduce((n, r) => n + r.checks.filter((c) => c.status === 'failed').length, 0);
  const coverage = table(
    ['model', 'kind', 'states', 'transitions', 'λT', 'goal mode', 'switches', 'methods solved', 'ran coarser', 'verdict'],
    reports.map((r) => [
      r.model, r.kind, String(r.states), String(r.transitions), formatScalar(r.lambdaT), r.goalMode, switchCount(r),
      `${r.methods.filter((m) => m.status === 'solved').length}/${r.methods.length}`, coarserText(r), modelVerdict(r),
    ]),
  );
  const kinds = ['CTMC', 'CTMDP', 'CTMG'].map((k) => `${reports.filter((r) => r.kind === k).length} ${k}`).join(', ');
  const audit = auditSummary(reports);
  const auditHtml = audit.length
    ? table(['method', 'models', 'largest actual error / bound', 'median', 'certified', 'median certified / stated bound'],
      audit.map((a) => [a.method, String(a.models), formatRatio(a.max), formatRatio(a.median), String(a.certified), a.certifiedMedian === undefined ? '-' : formatRatio(a.certifiedMedian)]))
    : '<p>No oracle values: no audit.</p>';
  const headline = `${sum.pass} of ${sum.models} models pass; ${sum.fail} fail; ${sum.unchecked} unchecked; ${failed} failed check(s). ` +
    `Requested precision ${formatPrecision(id.precision)}; a method shown as name@precision ran at that coarser precision (a work cap).`;
  return `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><title>crossbound qualification report</title>
<style>
body{font-family:system-ui,sans-serif;margin:2em auto;max-width:1100px;color:#222}
h1{margin-bottom:.2em} .verdict{font-size:1.6em;font-weight:bold;padding:.4em .8em;display:inline-block;border-radius:6px}
.PASS{background:#d8f5d0;color:#174d0c}.FAIL{background:#fadad7;color:#7a120b}.UNCHECKED,.EMPTY{background:#eee;color:#444}
.caution{border-left:4px solid #c90;background:#fff8e6;padding:.6em 1em}
table{border-collapse:collapse;margin:.5em 0}td,th{border:1px solid #ccc;padding:.2em .6em;text-align:right}td:first-child,th:first-child{text-align:left}
.plots{display:flex;flex-wrap:wrap;gap:1em}.assumed{background:#fde8b0;padding:0 .3em;border-radius:3px;font-size:.85em}
.ok{color:#174d0c}.bad{color:#b00;font-weight:bold}table.identity td,table.identity th{text-align:left}td small{color:#666}
table.evidence{font-size:.88em}table.evidence td{white-space:nowrap}.why{white-space:normal;display:block;text-align:left}figure{margin:0}code,pre{background:#f4f4f4}pre{padding:.5em;overflow:auto;max-height:20em}
</style></head><body>
<h1>crossbound qualification report</h1>
<p><span class="verdict ${verdict}">${verdict}</span> &nbsp; ${esc(headline)}</p>
<p class="caution">${esc(CAUTION)}</p>
${identitySection(id)}
${solverCoverageSection(reports)}
${evidenceSection(reports, id, cache)}
<h2>Corpus coverage</h2><p>${esc(kinds)}; goal modes: ${reports.filter((r) => r.goalMode === 'within').length} within, ${reports.filter((r) => r.goalMode === 'at').length} at.</p>${coverage}
${assumedBoundNotes(reports).map((n) => `<p class="caution">Assumed bound: ${esc(n)}</p>`).join('')}
<h2>Bound audit</h2><p>Per method, its actual error against the high-precision oracle (beyond the oracle's own bound) divided by the bound it reported: over 1 is a broken bound, far below 1 a loose one. Certified: on how many models the method's dense solution was certified a posteriori (the check <code>certified</code>), and the median of that certified bound over the bound the method stated.</p>${auditHtml}
<h2>Disagreements and failed checks</h2>${failuresSection(reports)}
<h2>Unchecked models</h2>${uncheckedSection(reports)}
<h2>Skipped checks</h2>${skippedSection(reports)}
<h2>Plots</h2>${solverSvgs.length ? `<h3>Solvers under test</h3><div class="plots">${solverSvgs.map((x) => `<figure>${x}</figure>`).join('')}</div><h3>crossbound's own methods</h3>` : ''}${await plotsSection(reports)}
<section id="rerun"><h2>Re-run</h2><p>The command of this run, quoted for a POSIX shell, from the working directory <code>${esc(id.working_directory)}</code>:</p><pre class="command">${esc(id.command)}</pre>
${id.shard_commands ? `<p>The shard runs:</p><pre>${esc(id.shard_commands.join('\n'))}</pre>` : ''}</section>
</body></html>
`;
}
