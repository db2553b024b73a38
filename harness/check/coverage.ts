/**
 * What each external solver covered: on how many models it answered, refused (its reasons grouped,
 * with counts) and faulted. A refusal is not a fault (the run goes on and other families still check
 * the model), but it is counted, so that a solver that answers few models never looks as if it had
 * been checked on all of them. Only the answer on each model as given counts here, not the answers on
 * the transformed copies of the metamorphic checks.
 */
import type { ModelReport, MethodResult } from './types.js';

export interface SolverCoverage {
  /** The solver's id, e.g. 'solver:euler_adapter.py#1'. */
  readonly label: string;
  /** The `method` names its results reported (usually one). */
  readonly reportedMethods: string[];
  readonly models: number;
  readonly answered: number;
  readonly refused: number;
  readonly faulted: number;
  /** Refusal reasons, numbers masked as N so that "120 steps" and "4000 steps" group together; most frequent first. */
  readonly reasons: { reason: string; count: number }[];
}

/** A refusal reason with every number in it written N (the grouping key). */
export function reasonGroup(reason: string): string {
  return reason.trim().replace(/[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?/g, 'N');
}

const isExternal = (m: MethodResult): boolean => m.family.startsWith('solver#');

export function solverCoverage(reports: readonly ModelReport[]): SolverCoverage[] {
  const by = new Map<string, { methods: Set<string>; models: number; answered: number; refused: number; faulted: number; reasons: Map<string, number> }>();
  for (const r of reports) {
    for (const m of r.methods) {
      if (!isExternal(m)) continue;
      const c = by.get(m.label) ?? { methods: new Set(), models: 0, answered: 0, refused: 0, faulted: 0, reasons: new Map() };
      by.set(m.label, c);
      c.models++;
      if (m.reported) c.methods.add(m.reported.method);
      if (m.status === 'solved') c.answered++;
      else if (m.status === 'fault') c.faulted++;
      else {
        c.refused++;
        const key = reasonGroup(m.reason);
        c.reasons.set(key, (c.reasons.get(key) ?? 0) + 1);
      }
    }
  }
  return [...by].map(([label, c]) => ({
    label,
    reportedMethods: [...c.methods],
    models: c.models,
    answered: c.answered,
    refused: c.refused,
    faulted: c.faulted,
    reasons: [...c.reasons].map(([reason, count]) => ({ reason, count })).sort((a, b) => b.count - a.count || (a.reason < b.reason ? -1 : 1)),
  }));
}

/** Reasons shown in one line; the rest are counted. */
const MAX_REASONS = 4;

/**
 * One line: 'solver:my.py#1 (mysolver): answered 25 of 33, refused 8: two-player games are not
 * supported (8)', with ', faulted K' when some answers were faults.
 */
export function coverageLine(c: SolverCoverage): string {
  const who = c.reportedMethods.length > 0 ? `${c.label} (${c.reportedMethods.join(', ')})` : c.label;
  let line = `${who}: answered ${c.answered} of ${c.models}`;
  if (c.refused > 0) {
    const shown = c.reasons.slice(0, MAX_REASONS).map((g) => `${g.reason} (${g.count})`);
    const rest = c.reasons.slice(MAX_REASONS);
    if (rest.length > 0) shown.push(`${rest.length} other reason(s) (${rest.reduce((n, g) => n + g.count, 0)})`);
    line += `, refused ${c.refused}: ${shown.join('; ')}`;
  }
  if (c.faulted > 0) line += `, faulted ${c.faulted}`;
  return line;
}

/** The terminal block: a heading and one line per external solver, or nothing without one. */
export function coverageBlock(reports: readonly ModelReport[]): string[] {
  const list = solverCoverage(reports);
  if (list.length === 0) return [];
  return ['Coverage of the external solvers (a refusal is not a fault; it is counted here):', ...list.map((c) => `  ${coverageLine(c)}`)];
}
