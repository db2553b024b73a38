/** The terminal table of `check`, and the list of failures with the command that reproduces each. */
import { coverageBlock } from './coverage.js';
import { commonFailingMethod, summarize } from './summary.js';
import { modelVerdict, shownLabel, uncheckedReason, type ModelReport, type SolvedMethod } from './types.js';
import { formatRatio, formatScalar, formatValue } from '../numbers.js';

export function formatTable(header: readonly string[], rows: readonly (readonly string[])[]): string {
  const width = header.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  // Numbers are right-aligned, text left-aligned.
  const numeric = header.map((_, i) => rows.length > 0 && rows.every((r) => /^[-+]?[0-9.,/e+\-]*$|^-$/.test(r[i] ?? '')));
  const line = (r: readonly string[]): string => r.map((c, i) => (numeric[i] ? c.padStart(width[i]!) : c.padEnd(width[i]!))).join('  ').trimEnd();
  return [line(header), width.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}

/** The most trustworthy answer of a report: the solved method with the smallest bound. */
export function bestAnswer(r: ModelReport): SolvedMethod | undefined {
  let best: SolvedMethod | undefined;
  for (const m of r.methods) if (m.status === 'solved' && (!best || m.errorBound < best.errorBound)) best = m;
  return best;
}

/** The methods that ran coarser than asked, as shown: 'euler@1e-4, kstep:1@1e-3', or '-'. */
export function coarserText(r: ModelReport): string {
  const list = r.methods.filter((m) => m.status === 'solved' && m.precision !== m.requestedPrecision && m.family !== 'oracle');
  return list.length ? list.map(shownLabel).join(', ') : '-';
}

/** One line per method whose bound the user assumed (--default-bound), or none. */
export function assumedBoundNotes(reports: readonly ModelReport[]): string[] {
  const by = new Map<string, number>();
  for (const r of reports) for (const m of r.methods) if (m.status === 'solved' && m.boundAssumed) by.set(m.label, (by.get(m.label) ?? 0) + 1);
  return [...by].map(([label, n]) => `${label}: no error_bound; the bound used on ${n} model(s) is the user's --default-bound, not a claim of the solver`);
}

const VERDICT_SHOWN = { pass: 'pass', fail: 'FAIL', unchecked: 'UNCHECKED' } as const;

export interface TableOptions {
  readonly allowUnchecked: boolean;
  /** An empty run of a shard: said instead of the table. */
  readonly emptyShard?: { index: number; count: number; corpusFiles: number };
}

export function formatCheckReport(reports: readonly ModelReport[], opts: TableOptions): string {
  if (reports.length === 0 && opts.emptyShard) {
    const s = opts.emptyShard;
    return `shard ${s.index}/${s.count} holds no model (${s.corpusFiles} model file(s) in all): nothing checked, nothing claimed.`;
  }
  const rows = reports.map((r) => {
    const best = bestAnswer(r);
    const s = r.initial >= 0 ? r.initial : 0;
    const value = best && r.states > 0 ? `${r.stateNames[s]} = ${formatValue(best.values[s]!)}` : '-';
    const ratios = r.checks.filter((c) => c.kind === 'agree' && c.status !== 'skipped').map((c) => c.ratio ?? 0);
    const solved = r.methods.filter((m) => m.status === 'solved').length;
    return [
      r.model, r.kind, String(r.states), formatScalar(r.lambdaT), `${solved}/${r.methods.length}`, coarserText(r), value,
      ratios.length ? formatRatio(Math.max(...ratios)) : '-',
      r.error ? 'ERROR' : VERDICT_SHOWN[modelVerdict(r)],
    ];
  });
  const header = ['model', 'kind', 'states', 'λT', 'solved', 'ran coarser', 'initial value (tightest bound)', 'worst |Δ|/allowed', 'verdict'];
  const out = [formatTable(header, rows)];
  const notes = assumedBoundNotes(reports);
  if (notes.length > 0) out.push('', 'Bounds assumed by the user (marked [bound assumed]):', ...notes.map((n) => `  ${n}`));
  const solverLines = coverageBlock(reports);
  if (solverLines.length > 0) out.push('', ...solverLines);
  const auditText = formatAudit(reports);
  if (auditText) out.push('', auditText);
  const unchecked = reports.filter((r) => modelVerdict(r) === 'unchecked');
  if (unchecked.length > 0) {
    out.push('', `${unchecked.length} unchecked model(s): nothing independent was compared${opts.allowUnchecked ? ' (allowed by --allow-unchecked)' : ''}:`);
    for (const r of unchecked) out.push(`  ${r.model} (${r.file}): ${uncheckedReason(r)}`);
  }
  const all = reports.flatMap((r) => r.checks.filter((c) => c.status === 'skipped').map((c) => ({ r, c })));
  if (all.length > 0) {
    // Certificates not made for length alone are many and alike: one line for all of them.
    const capped = all.filter(({ c }) => c.kind === 'certified' && / work cap /.test(c.detail));
    const skipped = all.filter((x) => !capped.includes(x));
    out.push('', `${all.length} check(s) skipped (could not run, or gave no evidence either way; not counted as passed):`);
    for (const { r, c } of skipped.slice(0, 20)) out.push(`  ${r.model} — ${c.name}: ${c.detail}`);
    if (skipped.length > 20) out.push(`  … and ${skipped.length - 20} more (see --json)`);
    if (capped.length > 0) {
      const by = new Map<string, number>();
      for (const { c } of capped) by.set(c.methods[0]!, (by.get(c.methods[0]!) ?? 0) + 1);
      out.push(`  ${capped.length} certified check(s): the dense solution is longer than the certificate's work cap ` +
        `(${[...by].map(([m, n]) => `${m} on ${n} model(s)`).join(', ')})`);
    }
  }
  const failures = reports.flatMap((r) => r.checks.filter((c) => c.status === 'failed').map((c) => ({ r, c })));
  if (failures.length > 0) {
    const common = commonFailingMethod(reports);
    out.push('');
    if (common) out.push(`Every failed check involves method ${common}.`);
    out.push(`${failures.length} failed check(s):`);
    failures.forEach(({ r, c }, i) => {
      out.push(`  ${i + 1}. ${r.model} (${r.file}) — ${c.name}: ${c.detail}`);
      if (c.reproduce) out.push(`     reproduce: ${c.reproduce}`);
    });
  }
  const s = summarize(reports, opts.allowUnchecked);
  out.push('', `${s.pass} of ${s.models} model(s) pass every check (with an independent comparison); ${s.fail} fail; ${s.unchecked} unchecked.`);
  return out.join('\n');
}

const medianOf = (xs: readonly number[]): number => {
  const sorted = [...xs].sort((x, y) => x - y);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
};

/**
 * Per method, over the models the oracle solved: the largest and the median actual-error/bound ratio,
 * and over the models where its dense solution was certified, the median of certified bound / own bound
 * (below 1: the a-posteriori certificate is tighter than the method's bound).
 */
export function auditSummary(reports: readonly ModelReport[]): { method: string; models: number; max: number; median: number; certified: number; certifiedMedian?: number }[] {
  const by = new Map<string, number[]>();
  const cert = new Map<string, number[]>();
  for (const r of reports) {
    for (const a of r.audit ?? []) {
      by.set(a.method, [...(by.get(a.method) ?? []), a.ratio]);
      if (a.certified !== undefined && a.bound) cert.set(a.method, [...(cert.get(a.method) ?? []), a.certified / a.bound]);
    }
  }
  return [...by].map(([method, rs]) => {
    const cs = cert.get(method) ?? [];
    return { method, models: rs.length, max: Math.max(...rs), median: medianOf(rs), certified: cs.length, ...(cs.length ? { certifiedMedian: medianOf(cs) } : {}) };
  });
}

function formatAudit(reports: readonly ModelReport[]): string {
  const rows = auditSummary(reports);
  if (rows.length === 0) return '';
  return [
    'Bound audit against the oracle (actual error / stated bound; over 1 is a broken bound, far below 1 a loose one;',
    'certified: models whose dense solution was certified, and the median certified bound / stated bound):',
    formatTable(
      ['method', 'models', 'largest', 'median', 'certified', 'certified/stated'],
      rows.map((r) => [r.method, String(r.models), formatRatio(r.max), formatRatio(r.median), String(r.certified), r.certifiedMedian === undefined ? '-' : formatRatio(r.certifiedMedian)]),
    ),
  ].join('\n');
}
