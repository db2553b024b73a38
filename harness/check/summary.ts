/**
 * The verdict of a run from its models' verdicts: fail if any model fails; unchecked if some model is
 * unchecked (exit 1 unless unchecked models are allowed); pass if every model passes; empty when the
 * run held no model (an empty shard of a non-empty corpus: it claims nothing, and exits 0).
 */
import { modelVerdict, type ModelReport, type Verdict } from './types.js';

export type RunVerdict = Verdict | 'empty';

export interface RunSummary {
  readonly verdict: RunVerdict;
  readonly models: number;
  readonly pass: number;
  readonly fail: number;
  readonly unchecked: number;
  readonly exitCode: 0 | 1;
}

export function summarize(reports: readonly ModelReport[], allowUnchecked: boolean): RunSummary {
  const v = reports.map(modelVerdict);
  const count = (x: Verdict): number => v.filter((y) => y === x).length;
  const [pass, fail, unchecked] = [count('pass'), count('fail'), count('unchecked')];
  const verdict: RunVerdict = reports.length === 0 ? 'empty' : fail > 0 ? 'fail' : unchecked > 0 ? 'unchecked' : 'pass';
  const exitCode = fail > 0 || (unchecked > 0 && !allowUnchecked) ? 1 : 0;
  return { verdict, models: reports.length, pass, fail, unchecked, exitCode };
}

/** The method (by id) involved in every failed check, when there is one and more than one failure. */
export function commonFailingMethod(reports: readonly ModelReport[]): string | undefined {
  const failed = reports.flatMap((r) => r.checks.filter((c) => c.status === 'failed'));
  if (failed.length < 2) return undefined;
  const common = failed.slice(1).reduce<string[]>((acc, c) => acc.filter((m) => c.methods.includes(m)), [...failed[0]!.methods]);
  return common[0];
}
