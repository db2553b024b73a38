/** The terminal table of `check`, and the list of failures with the command that reproduces each. */
import type { ModelReport } from './types.js';
import { modelPassed } from './types.js';

export function formatTable(header: readonly string[], rows: readonly (readonly string[])[]): string {
  const width = header.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  // Numbers are right-aligned, text left-aligned.
  const numeric = header.map((_, i) => rows.length > 0 && rows.every((r) => /^[-+]?[0-9.,/e+\-]*$|^-$/.test(r[i] ?? '')));
  const line = (r: readonly string[]): string => r.map((c, i) => (numeric[i] ? c.padStart(width[i]!) : c.padEnd(width[i]!))).join('  ').trimEnd();
  return [line(header), width.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}

/** The most trustworthy answer of a report: the solved method with the smallest bound. */
export function bestAnswer(r: ModelReport) {
  let best;
  for (const m of r.methods) if (m.status === 'solved' && (!best || m.errorBound! < best.errorBound!)) best = m;
  return best;
}

export function formatCheckReport(reports: readonly ModelReport[]): string {
  const rows = reports.map((r) => {
    const solved = r.methods.filter((m) => m.status === 'solved').length;
    const best = bestAnswer(r);
    const s = r.initial >= 0 ? r.initial : 0;
    const value = best && r.states > 0 ? `${r.stateNames[s]} = ${best.values![s]!.toPrecision(10)}` : '-';
    const ratios = r.checks.filter((c) => c.name.startsWith('agree')).map((c) => c.ratio ?? 0);
    const worst = ratios.length ? Math.max(...ratios) : NaN;
    return [
      r.model,
      r.kind,
      String(r.states),
      r.lambdaT.toPrecision(3),
      `${solved}/${r.methods.length}`,
      value,
      Number.isNaN(worst) ? '-' : worst.toExponential(1),
      r.error ? 'ERROR' : modelPassed(r) ? 'agree' : 'FAIL',
    ];
  });
  const out = [formatTable(['model', 'kind', 'states', 'λT', 'solved', 'initial value (tightest bound)', 'worst |Δ|/allowed', 'verdict'], rows)];
  const auditText = formatAudit(reports);
  if (auditText) out.push('', auditText);
  const failures = reports.flatMap((r) => r.checks.filter((c) => !c.passed).map((c) => ({ r, c })));
  if (failures.length > 0) {
    out.push('', `${failures.length} failed check(s):`);
    failures.forEach(({ r, c }, i) => {
      out.push(`  ${i + 1}. ${r.model} (${r.file}) — ${c.name}: ${c.detail}`);
      if (c.reproduce) out.push(`     reproduce: ${c.reproduce}`);
    });
  }
  const passed = reports.filter(modelPassed).length;
  out.push('', `${passed} of ${reports.length} model(s) pass every check.`);
  return out.join('\n');
}

/** Per method, over the models the oracle solved: the largest and the median actual-error/bound ratio. */
export function auditSummary(reports: readonly ModelReport[]): { method: string; models: number; max: number; median: number }[] {
  const by = new Map<string, number[]>();
  for (const r of reports) for (const a of r.audit ?? []) by.set(a.method, [...(by.get(a.method) ?? []), a.ratio]);
  return [...by].map(([method, rs]) => {
    const sorted = [...rs].sort((x, y) => x - y);
    const mid = sorted.length >> 1;
    const median = sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
    return { method, models: rs.length, max: sorted[sorted.length - 1]!, median };
  });
}

function formatAudit(reports: readonly ModelReport[]): string {
  const rows = auditSummary(reports);
  if (rows.length === 0) return '';
  return [
    'Bound audit against the oracle (actual error / stated bound; over 1 is a broken bound, far below 1 a loose one):',
    formatTable(['method', 'models', 'largest', 'median'], rows.map((r) => [r.method, String(r.models), r.max.toExponential(2), r.median.toExponential(2)])),
  ].join('\n');
}
