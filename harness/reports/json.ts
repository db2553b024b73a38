/**
 * The JSON report of `check` (format crossbound-check/1): every result and every verdict, and what
 * the run covered (its shard I/N, the model files it checked, the size and digest of the whole
 * corpus), so that `merge` can refuse an incomplete or overlapping set of shard reports.
 */
import { solverCoverage } from '../check/coverage.js';
import type { RunCoverage } from '../check/index.js';
import { runIdentity, type RunIdentity, type RunStamp } from './identity.js';
import { summarize, type RunVerdict } from '../check/summary.js';
import { modelVerdict, type ModelReport, type Verdict } from '../check/types.js';

export interface CheckJson {
  format: 'crossbound-check/1';
  precision: number;
  shard: { index: number; count: number };
  corpus: { files: number; digest: string };
  /** The model files of this report (its shard). */
  files: string[];
  allowUnchecked: boolean;
  verdict: RunVerdict;
  counts: { models: number; pass: number; fail: number; unchecked: number };
  models: (ModelReport & { verdict: Verdict })[];
  /** What was tested, by what, when, where, at what precision, and the command (absent in reports of older versions). */
  identity?: RunIdentity;
  /** Per external solver: models answered, refused (reasons grouped, numbers as N) and faulted. */
  solver_coverage: { id: string; methods: string[]; models: number; answered: number; refused: number; faulted: number; refusals: { reason: string; count: number }[] }[];
}

export function checkJson(
  reports: readonly ModelReport[],
  precision: number,
  coverage: RunCoverage,
  allowUnchecked: boolean,
  stamp?: RunStamp,
): CheckJson {
  const s = summarize(reports, allowUnchecked);
  const solvers = solverCoverage(reports).map((c) => ({
    id: c.label, methods: c.reportedMethods, models: c.models, answered: c.answered, refused: c.refused, faulted: c.faulted, refusals: c.reasons,
  }));
  return {
    format: 'crossbound-check/1',
    precision,
    shard: { ...coverage.shard },
    corpus: { files: coverage.corpusFiles, digest: coverage.corpusDigest },
    files: [...coverage.files],
    allowUnchecked,
    verdict: s.verdict,
    counts: { models: s.models, pass: s.pass, fail: s.fail, unchecked: s.unchecked },
    models: reports.map((r) => ({ ...r, verdict: modelVerdict(r) })),
    ...(stamp ? { identity: runIdentity(stamp, reports) } : {}),
    solver_coverage: solvers,
  };
}
