/** How check runs a method: retries decided by the refusal's code, faults by kind (planted outcomes). */
import { describe, expect, it } from 'vitest';
import type { Outcome, RefusalCode } from '../../../corpus/format/result.js';
import { RETRY_LIMIT, runWith } from '../../../harness/check/methods.js';
import { shownLabel } from '../../../harness/check/types.js';

const ctx = { precision: 1e-6, oracleDigits: 20 };
const solvedAt = (precision: number): Outcome => ({
  kind: 'solved', method: 'euler', params: { precision }, values: Float64Array.of(0.5), errorBound: precision / 2, stats: {},
});
const refused = (code?: RefusalCode): Outcome => ({ kind: 'refused', method: 'euler', reason: 'planted', ...(code ? { code } : {}) });

/** A method that refuses with `code` below `works` and solves at `works` or coarser; records the precisions asked. */
function planted(code: RefusalCode | undefined, works: number) {
  const asked: number[] = [];
  const solve = (p: number): Outcome => {
    asked.push(p);
    return p >= works ? solvedAt(p) : refused(code);
  };
  return { asked, solve };
}

describe('retries at a coarser precision are decided by the refusal code', () => {
  it.each(['work-cap', 'precision-floor'] as const)('%s: retried at 10×, 100×, …; the precision it ran at travels with the answer', (code) => {
    const { asked, solve } = planted(code, 1e-4);
    const r = runWith({ label: 'euler', family: 'euler' }, ctx, solve);
    expect(asked).toEqual([1e-6, 1e-5, 1e-4]);
    expect(r.status).toBe('solved');
    if (r.status !== 'solved') return;
    expect(r.precision).toBe(1e-4);
    expect(r.requestedPrecision).toBe(1e-6);
    expect(shownLabel(r)).toBe('euler@1e-4');
  });
  it.each(['out-of-scope', 'invalid-input', undefined] as const)('%s: not retried, a refusal with its code', (code) => {
    const { asked, solve } = planted(code, 1e-4);
    const r = runWith({ label: 'euler', family: 'euler' }, ctx, solve);
    expect(asked).toEqual([1e-6]);
    expect(r).toMatchObject({ status: 'refused', code: code ?? 'unspecified' });
  });
  it(`retries stop at ${RETRY_LIMIT}`, () => {
    const { asked, solve } = planted('work-cap', 0.5);
    const r = runWith({ label: 'kstep:1', family: 'kstep' }, ctx, solve);
    expect(asked[asked.length - 1]).toBe(RETRY_LIMIT);
    expect(r).toMatchObject({ status: 'refused', code: 'work-cap' });
  });
  it('uniformization and the oracle are never retried', () => {
    for (const family of ['uniformization', 'oracle'] as const) {
      const { asked, solve } = planted('work-cap', 1e-4);
      runWith({ label: family, family }, ctx, solve);
      expect(asked).toEqual([1e-6]);
    }
  });
  it('an answer at the requested precision is shown without @', () => {
    const r = runWith({ label: 'euler', family: 'euler' }, ctx, solvedAt);
    expect(shownLabel(r)).toBe('euler');
  });
});

describe('faults', () => {
  it("a failed self-check (code 'internal') is a fault of kind self-check, not a refusal", () => {
    const r = runWith({ label: 'oracle', family: 'oracle' }, ctx, () => ({ kind: 'refused', method: 'oracle', reason: 'Bellman violation', code: 'internal' }));
    expect(r).toMatchObject({ status: 'fault', fault: 'self-check', reason: 'Bellman violation' });
  });
  it('an exception is a fault of kind exception', () => {
    const r = runWith({ label: 'euler', family: 'euler' }, ctx, () => {
      throw new Error('planted');
    });
    expect(r).toMatchObject({ status: 'fault', fault: 'exception', reason: 'planted' });
  });
});
