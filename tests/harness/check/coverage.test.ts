/** Per-solver coverage: refusals counted and grouped by reason, faults apart, own methods ignored. */
import { describe, expect, it } from 'vitest';
import { coverageLine, reasonGroup, solverCoverage } from '../../../harness/check/coverage.js';
import type { MethodResult, ModelReport } from '../../../harness/check/types.js';

const ext = (status: 'solved' | 'refused' | 'fault', reason = ''): MethodResult => {
  const id = { label: 'solver:my.py#1', family: 'solver#1' as const, seconds: 0.1, reported: { method: 'mysolver' } };
  if (status === 'refused') return { ...id, status, code: 'unspecified', reason };
  if (status === 'fault') return { ...id, status, fault: 'timeout', reason };
  return { ...id, status, values: [0.5], errorBound: 1e-6, requestedPrecision: 1e-6, precision: 1e-6 };
};
const model = (m: MethodResult): ModelReport => ({
  file: 'x.yaml', model: 'x', kind: 'CTMG', states: 1, transitions: 0, lambdaT: 1, goalMode: 'within', timeBound: 1, stateNames: ['s'], initial: 0,
  methods: [{ label: 'kstep:3', family: 'kstep', status: 'refused', code: 'work-cap', reason: 'own method, not counted', seconds: 0 }, m],
  checks: [], audit: [], warnings: [],
});

describe('solver coverage', () => {
  it('masks the numbers of a reason, so that reasons differing only in numbers group', () => {
    expect(reasonGroup('12250001 Euler steps over 11 states exceed 3e7')).toBe('N Euler steps over N states exceed N');
    expect(reasonGroup('two-player games are not supported')).toBe('two-player games are not supported');
  });
  it('answered, refused by grouped reason (most frequent first), faulted; own methods are not counted', () => {
    const reports = [
      ext('solved'), ext('refused', 'two-player games are not supported'), ext('refused', 'two-player games are not supported'),
      ext('refused', '120 steps exceed the cap'), ext('fault', 'no answer'),
    ].map(model);
    const [c] = solverCoverage(reports);
    expect(c).toMatchObject({ label: 'solver:my.py#1', models: 5, answered: 1, refused: 3, faulted: 1 });
    expect(coverageLine(c!)).toBe('solver:my.py#1 (mysolver): answered 1 of 5, refused 3: two-player games are not supported (2); N steps exceed the cap (1), faulted 1');
  });
  it('shows four reasons and counts the rest', () => {
    const reasons = ['a', 'b', 'c', 'd', 'e', 'f'].map((x) => `reason ${x}`);
    const line = coverageLine(solverCoverage(reasons.map((r) => model(ext('refused', r))))[0]!);
    expect(line).toBe('solver:my.py#1 (mysolver): answered 0 of 6, refused 6: reason a (1); reason b (1); reason c (1); reason d (1); 2 other reason(s) (2)');
  });
  it('no external solver: no coverage', () => {
    expect(solverCoverage([])).toEqual([]);
  });
});
