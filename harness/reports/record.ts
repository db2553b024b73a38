/**
 * The qualification-record sections of the HTML report: what was tested and by what (identity), each
 * external solver's coverage, its evidence per model (its value at the headline state beside the best
 * independent reference, the difference, its bound, the ratio, and its checks), and the failed checks
 * grouped by the method they implicate. Every number goes through harness/numbers.ts, every
 * comparison through harness/compare.
 */
import { loadModelFileWithWarnings } from '../../corpus/format/load.js';
import type { Model } from '../../corpus/format/types.js';
import { compareAnswers, type Comparison } from '../compare/index.js';
import { coverageLine, solverCoverage } from '../check/coverage.js';
import { shownLabel, type CheckResult, type MethodResult, type ModelReport } from '../check/types.js';
import { formatError, formatPrecision, formatRatio, formatSeconds, formatValue } from '../numbers.js';
import { esc, htmlTable, type Span } from './htmlParts.js';
import type { RunIdentity } from './identity.js';

const code = (s: string): string => `<code>${esc(s)}</code>`;

/** What was tested, by what, when and where. */
export function identitySection(id: RunIdentity): string {
  const e = id.environment;
  const rows: [string, string][] = [
    ['crossbound', `${esc(id.crossbound_version)}, commit ${code(id.commit)} <small>(of the checkout it ran from; local changes are not detected)</small>`],
    ['date', esc(`${id.date} (UTC)`)],
    ['working directory', code(id.working_directory)],
    ['duration', esc(`${formatSeconds(id.duration_seconds)}${id.shard_commands ? ` (sum over ${id.shard_commands.length} shards)` : ''}`)],
    ['environment', esc(`Node ${e.node}, ${e.platform} ${e.arch}, ${e.cpus} × ${e.cpu_model}`)],
    ...(id.other_environments ?? []).map((o): [string, string] => ['other shard environment', esc(`Node ${o.node}, ${o.platform} ${o.arch}, ${o.cpus} × ${o.cpu_model}`)]),
    ['precision asked', esc(formatPrecision(id.precision))],
    ['precision each method ran at', ranAtText(id)],
  ];
  const solvers = id.solver_identity.length === 0
    ? '<p>No external solver: only crossbound\'s own methods were compared.</p>'
    : htmlTable(['solver', 'template (exactly as given)', 'method reported', 'version reported', 'params reported'],
      id.solver_identity.map((s) => [
        esc(s.id), `<code class="template">${esc(s.template)}</code>`,
        esc(s.methods.join(', ') || '-'), esc(s.versions.join(', ') || 'none reported'),
        esc(Object.entries(s.params).map(([k, v]) => `${k} = ${v}`).join(', ') || '-'),
      ]), 'identity');
  return `<section id="identity"><h2>What was tested</h2>${htmlTable([], rows.map(([k, v]) => [esc(k), v]), 'identity')}
<h3>Solvers under test</h3>${solvers}</section>`;
}

/** 'kstep:3 at 1e-6 (35 models); euler at 1e-6 (30), euler@1e-4 (3)': work-capped runs named name@precision. */
function ranAtText(id: RunIdentity): string {
  return id.precision_ran.map((r) => esc(r.ran_at.map((a) => {
    if (r.method === 'oracle') return `oracle at ${Math.round(-Math.log10(a.precision))} digits (${a.models})`;
    const name = a.precision === id.precision ? r.method : `${r.method}@${formatPrecision(a.precision)}`;
    return `${name} (${a.models})`;
  }).join(', '))).join('; ') + ' <small>(models per precision; name@precision: ran coarser than asked, a work cap; the oracle runs at the digits asked of it)</small>';
}

/** One line per external solver: answered, refused (grouped reasons), faulted. */
export function solverCoverageSection(reports: readonly ModelReport[]): string {
  const list = solverCoverage(reports);
  if (list.length === 0) return '';
  return `<section id="solver-coverage"><h2>Coverage of the solvers under test</h2>
<p>A refusal is not a fault: the model is still checked by the other families. It is counted here, so that no solver looks checked on models it did not answer.</p>
<ul>${list.map((c) => `<li class="coverage">${esc(coverageLine(c))}</li>`).join('')}</ul></section>`;
}

export interface Reference {
  /** As shown: a method's label (with @precision when it ran coarser), or 'expect'. */
  label: string;
  value: number;
  bound: number;
  /** The reference method's run time (none for an `expect` value). */
  seconds?: number;
}

/** The model's `expect` value at a state, when its file has one (read again from the file; undefined if not). */
function expectAt(file: string, state: string, cache: Map<string, Model | null>): Reference | undefined {
  if (!cache.has(file)) {
    try {
      cache.set(file, loadModelFileWithWarnings(file).model);
    } catch {
      cache.set(file, null);
    }
  }
  const exp = cache.get(file)?.expect;
  const text = exp?.values[state];
  return exp && text !== undefined ? { label: 'expect', value: Number(text), bound: exp.tolerance } : undefined;
}

/**
 * The best reference for method m at state s: the answer with the smallest bound among the other
 * families (the oracle, another own method, another solver) and the file's `expect` value.
 */
export function bestReference(r: ModelReport, m: MethodResult, s: number, cache: Map<string, Model | null>): Reference | undefined {
  let best: Reference | undefined;
  for (const x of r.methods) {
    if (x.status !== 'solved' || x.family === m.family || x.family.startsWith('variant:')) continue;
    if (!best || x.errorBound < best.bound) best = { label: shownLabel(x), value: x.values[s]!, bound: x.errorBound, seconds: x.seconds };
  }
  const exp = expectAt(r.file, r.stateNames[s] ?? '', cache);
  if (exp && (!best || exp.bound < best.bound)) best = exp;
  return best;
}

function checkCounts(checks: readonly CheckResult[], label: string): string {
  const mine = checks.filter((c) => c.methods.includes(label));
  const n = (st: CheckResult['status']): number => mine.filter((c) => c.status === st).length;
  return `${n('passed')} / ${n('failed')} / ${n('skipped')}`;
}

/** The evidence of one solver on one model: at the headline state, against the best reference. */
export interface EvidenceRow {
  model: string;
  /** The headline state: its name and index. */
  state: string;
  index: number;
  method: MethodResult;
  reference?: Reference;
  comparison?: Comparison;
  checks: string;
}

export function evidenceRows(reports: readonly ModelReport[], solverId: string, cache = new Map<string, Model | null>()): EvidenceRow[] {
  const rows: EvidenceRow[] = [];
  for (const r of reports) {
    const m = r.methods.find((x) => x.label === solverId);
    if (!m) continue;
    const s = r.initial >= 0 ? r.initial : 0;
    const row: EvidenceRow = { model: r.model, state: r.stateNames[s] ?? '-', index: s, method: m, checks: checkCounts(r.checks, solverId) };
    if (m.status === 'solved' && r.states > 0) {
      const ref = bestReference(r, m, s, cache);
      if (ref) {
        const comparison = compareAnswers({ label: m.label, values: [m.values[s]!], bound: m.errorBound }, { label: ref.label, values: [ref.value], bound: ref.bound });
        rows.push({ ...row, reference: ref, comparison });
        continue;
      }
    }
    rows.push(row);
  }
  return rows;
}

function evidenceCells(e: EvidenceRow): (string | Span)[] {
  const m = e.method;
  const head = [esc(e.model), esc(e.state)];
  const tail = [esc(e.checks), esc(formatSeconds(m.seconds))];
  if (m.status === 'refused') return [...head, { html: `<span class="why"><i>refused</i>: ${esc(m.reason)}</span>`, span: 6 }, ...tail];
  if (m.status === 'fault') return [...head, { html: `<span class="why"><b>fault (${esc(m.fault)})</b>: ${esc(m.reason)}</span>`, span: 6 }, ...tail];
  const value = esc(formatValue(m.values[e.index] ?? NaN));
  const bound = `${esc(formatError(m.errorBound))}${m.boundAssumed ? ' <span class="assumed">assumed</span>' : ''}`;
  const ref = e.reference ? `${esc(formatValue(e.reference.value))} <small>(${esc(e.reference.label)}, ± ${esc(formatError(e.reference.bound))})</small>` : 'no independent reference';
  const c = e.comparison;
  const ratio = c ? `<span class="${c.agree ? 'ok' : 'bad'}">${esc(formatRatio(c.ratio))}</span>` : '-';
  return [...head, value, ref, c ? esc(formatError(c.difference)) : '-', bound, c ? esc(formatError(c.allowed)) : '-', ratio, ...tail];
}

/** Per solver under test, a table of its evidence per model. */
export function evidenceSection(reports: readonly ModelReport[], id: RunIdentity, cache = new Map<string, Model | null>()): string {
  if (id.solver_identity.length === 0) return '';
  const header = ['model', 'state', 'solver value', 'best reference', '|Δ|', 'solver bound', 'allowed', '|Δ| / allowed', 'checks passed / failed / skipped', 'solver time'];
  const parts = id.solver_identity.map((s) => {
    const rows = evidenceRows(reports, s.id, cache);
    return `<section class="evidence" data-solver="${esc(s.id)}"><h3>${esc(s.id)}</h3><p>Template: <code class="template">${esc(s.template)}</code></p>` +
      htmlTable(header.map(esc), rows.map(evidenceCells), 'evidence') + '</section>';
  });
  return `<section id="evidence"><h2>Evidence per solver under test</h2>
<p>At each model's headline state (its <code>initial</code> state, else the first): the solver's value beside the best independent reference (the answer of another family with the smallest bound, or the model file's <code>expect</code> value), |Δ| between them, the solver's bound, and the allowed difference (the two bounds + 1e-15); a ratio over 1 is a disagreement. A bound marked <span class="assumed">assumed</span> is the user's <code>--default-bound</code>, not a claim of the solver. The checks are all the checks that involve the solver on that model, over every state.</p>
${parts.join('\n')}</section>`;
}

/**
 * Failed checks grouped under what they implicate: when answers of two or more families all miss a
 * model file's `expect` values, those values ('expect values of MODEL'); otherwise, of the methods a
 * failed check involves, the one involved in the most failed checks of the run (ties: the first named).
 */
export function failuresByMethod(reports: readonly ModelReport[]): { method: string; failures: { r: ModelReport; c: CheckResult }[] }[] {
  const failures = reports.flatMap((r) => r.checks.filter((c) => c.status === 'failed').map((c) => ({ r, c })));
  const count = new Map<string, number>();
  for (const { c } of failures) for (const m of c.methods) count.set(m, (count.get(m) ?? 0) + 1);
  const familyOf = (r: ModelReport, label: string): string => r.methods.find((m) => m.label === label)?.family ?? label;
  const expectMissedBy = (r: ModelReport): number =>
    new Set(r.checks.filter((c) => c.kind === 'expect' && c.status === 'failed').flatMap((c) => c.methods.map((l) => familyOf(r, l)))).size;
  const groups = new Map<string, { r: ModelReport; c: CheckResult }[]>();
  for (const f of failures) {
    const byCount = f.c.methods.reduce((a, b) => ((count.get(b) ?? 0) > (count.get(a) ?? 0) ? b : a), f.c.methods[0] ?? '-');
    const blamed = f.c.kind === 'expect' && expectMissedBy(f.r) >= 2 ? `expect values of ${f.r.model}` : byCount;
    groups.set(blamed, [...(groups.get(blamed) ?? []), f]);
  }
  return [...groups].map(([method, fs]) => ({ method, failures: fs })).sort((a, b) => b.failures.length - a.failures.length);
}
