/**
 * The check `certified`: its outcomes at their edges (confirmed exactly at the claim, not confirmed just
 * above it, refuted only when the certified enclosure and a claimed interval are disjoint by more than
 * the comparator's slack, skipped without a certificate), never independent evidence; and a real
 * certificate of the k-step scheme's pieces, of the defect method's steps and of an external solver's
 * trajectory on the two-state chain, against its closed form p_clean(T) = a/(a+b)(1 − e^{−(a+b)T})
 * (S. M. Ross, Introduction to Probability Models, the two-state continuous-time chain).
 */
import { describe, expect, it } from 'vitest';
import { compile } from '../../../corpus/format/compile.js';
import { loadModelFile } from '../../../corpus/format/load.js';
import { COMPARE_SLACK } from '../../../harness/compare/index.js';
import { certifiedBound, certifiedCheck, judgeCertificate } from '../../../harness/check/certified.js';
import { runExternalMethod } from '../../../harness/check/external.js';
import { runInternal } from '../../../harness/check/methods.js';
import { modelVerdict, type Certification, type ModelReport, type SolvedMethod } from '../../../harness/check/types.js';

const names = ['s0', 's1'];

function method(values: number[], errorBound: number, certificate?: Certification, label = 'kstep:3'): SolvedMethod {
  return {
    label, family: 'kstep', status: 'solved', values, errorBound, requestedPrecision: 1e-6, precision: 1e-6, seconds: 0,
    ...(certificate ? { certificate } : {}),
  };
}
const enc = (center: number[], below: number, above: number): Extract<Certification, { status: 'certified' }> => ({ status: 'certified', source: 'pieces', steps: 10, center, below, above });

describe('certified: outcomes at their edges (common practice, no source: interval arithmetic of two claims)', () => {
  it('confirmed when the certified bound X equals the claim (no slack), not confirmed one ulp of X above it', () => {
    const e = enc([0.5, 0.25], 1e-7, 1e-7);
    const X = certifiedBound([0.5, 0.25], e).bound;
    expect(X).toBeGreaterThanOrEqual(1e-7);
    expect(X).toBeLessThan(1e-7 * (1 + 1e-14));
    const at = certifiedCheck(names, method([0.5, 0.25], X, e), []);
    expect(at?.status).toBe('passed');
    expect(at?.certified?.outcome).toBe('confirmed');
    const below = certifiedCheck(names, method([0.5, 0.25], X * (1 - 2 ** -52), e), []);
    expect(below?.status).toBe('skipped');
    expect(below?.certified?.outcome).toBe('not-confirmed');
    expect(below?.detail).toMatch(/^not confirmed: .*neither proves nor refutes/);
  });

  it('X counts the distance of the value from the certified centre, one side at a time', () => {
    // value 1e-7 above f: v ≥ f − 2e-7 gives value − v ≤ 3e-7; v ≤ f + 5e-8 gives v − value ≤ −5e-8.
    const X = certifiedBound([0.5 + 1e-7], enc([0.5], 2e-7, 5e-8)).bound;
    expect(Math.abs(X / 3e-7 - 1)).toBeLessThan(1e-9);
    expect(judgeCertificate({ label: 'm', values: [0.5 + 1e-7], bound: 2.9e-7 }, enc([0.5], 2e-7, 5e-8), []).outcome).toBe('not-confirmed');
    expect(judgeCertificate({ label: 'm', values: [0.5 + 1e-7], bound: 3.01e-7 }, enc([0.5], 2e-7, 5e-8), []).outcome).toBe('confirmed');
  });

  it('refuted when its own claimed interval and the enclosure are disjoint by more than the slack, and only then', () => {
    // Enclosure [0.5 − 1e-9, 0.5 + 1e-9]; claim 0.5 + 2e-9 + g ± 1e-9: the gap is g.
    const e = enc([0.5], 1e-9, 1e-9);
    const touching = judgeCertificate({ label: 'm', values: [0.5 + 2e-9 + COMPARE_SLACK / 2], bound: 1e-9 }, e, []);
    expect(touching.outcome).toBe('not-confirmed');
    const apart = judgeCertificate({ label: 'm', values: [0.5 + 2e-9 + 1e-12], bound: 1e-9 }, e, []);
    expect(apart.outcome).toBe('refuted');
    expect(apart.conflict?.label).toBe('m');
    // The same on the lower side.
    expect(judgeCertificate({ label: 'm', values: [0.5 - 2e-9 - 1e-12], bound: 1e-9 }, e, []).outcome).toBe('refuted');
  });

  it('refuted by another answer whose interval misses the enclosure, naming both methods; a failure, never independent', () => {
    const m = method([0.5, 0.25], 1e-6, enc([0.5, 0.25], 1e-9, 1e-9));
    const other = { ...method([0.5, 0.25 + 3e-6], 1e-6), label: 'euler', family: 'euler' as const };
    const c = certifiedCheck(names, m, [m, other])!;
    expect(c.status).toBe('failed');
    expect(c.methods).toEqual(['kstep:3', 'euler']);
    expect(c.independent).toBe(false);
    expect(c.detail).toMatch(/state s1: .*the interval of euler are disjoint/);
    // An answer that overlaps the enclosure refutes nothing.
    const near = { ...other, values: [0.5, 0.25 + 0.9e-6] };
    expect(certifiedCheck(names, m, [m, near])!.status).toBe('passed');
  });

  it('no dense solution: no check; a solution not certified: skipped with its reason; a confirmed check alone does not make a model pass', () => {
    expect(certifiedCheck(names, method([0.5, 0.25], 1e-6), [])).toBeUndefined();
    const nc = certifiedCheck(names, method([0.5, 0.25], 1e-6, { status: 'not-certified', source: 'pieces', reason: 'too long' }), [])!;
    expect(nc.status).toBe('skipped');
    expect(nc.detail).toMatch(/too long/);
    const m = method([0.5, 0.25], 1e-6, enc([0.5, 0.25], 1e-9, 1e-9));
    const only = certifiedCheck(names, m, [m])!;
    expect(only.status).toBe('passed');
    const report = { checks: [only], methods: [m] } as unknown as ModelReport;
    expect(modelVerdict(report)).toBe('unchecked');
  });
});

describe('certified: real certificates on the two-state chain (closed form, Ross)', () => {
  const model = loadModelFile('corpus/models/kettle-scale.yaml');
  const compiled = compile(model);
  const a = 0.4;
  const b = 1.1;
  const T = 3;
  // Closed forms (goal mode `at`, goal = scaled): p_clean(t) = a/(a+b)(1 − e^{−(a+b)t}), p_scaled(t) = (a + b e^{−(a+b)t})/(a+b).
  const pClean = (t: number): number => (a / (a + b)) * -Math.expm1(-(a + b) * t);
  const pScaled = (t: number): number => (a + b * Math.exp(-(a + b) * t)) / (a + b);
  const exact = [pClean(T), pScaled(T)];
  const ctx = { model, compiled, precision: 1e-8, oracleDigits: 20, certify: true };

  for (const label of ['kstep:3', 'defect']) {
    it(`${label}: the enclosure of its dense solution holds the closed form and confirms its claim`, () => {
      const r = runInternal(label, ctx);
      if (r.status !== 'solved' || r.certificate?.status !== 'certified') throw new Error(`not certified: ${JSON.stringify(r).slice(0, 300)}`);
      const c = r.certificate;
      exact.forEach((v, s) => {
        // 1e-15: the closed form evaluated in doubles (a few ulps).
        expect(v).toBeGreaterThanOrEqual(c.center[s]! - c.below - 1e-15);
        expect(v).toBeLessThanOrEqual(c.center[s]! + c.above + 1e-15);
      });
      const check = certifiedCheck(compiled.stateNames, r, [r])!;
      expect(check.status).toBe('passed');
      expect(check.certified!.bound).toBeLessThanOrEqual(r.errorBound);
    });
  }

  // An external solver that prints the closed form and a trajectory of it; MODE corrupts one thing.
  const q = (w: string): string => `'${w.replace(/'/g, `'\\''`)}'`;
  const script = (mode: string): string => `
    const a = 0.4, b = 1.1, T = 3, n = 300, mode = ${JSON.stringify(mode)};
    const pc = (t) => a / (a + b) * -Math.expm1(-(a + b) * t), ps = (t) => (a + b * Math.exp(-(a + b) * t)) / (a + b);
    const times = Array.from({ length: n + 1 }, (_, i) => (i === n ? T : (T * i) / n));
    if (mode === 'decreasing') [times[5], times[6]] = [times[6], times[5]];
    const clean = times.map(pc), scaled = times.map(ps);
    if (mode === 'bump') clean[150] += 1e-3;
    if (mode === 'short') scaled.pop();
    const values = { clean: pc(T) + (mode === 'wrong-value' ? 1e-4 : 0), scaled: ps(T) };
    const trajectory = { time_left: times, values: { clean, scaled } };
    console.log(JSON.stringify({ format: 'crossbound-result/1', method: 'closed-form', values, error_bound: 1e-6, trajectory }));`;
  const run = (mode: string) =>
    runExternalMethod(`${q(process.execPath)} -e ${q(script(mode))} {model}`, 0, model, compiled, { precision: 1e-6, timeoutMs: 20_000 });

  it('an honest trajectory: certified, X far below the claim 1e-6, and the check passes', async () => {
    const r = await run('honest');
    if (r.status !== 'solved') throw new Error(r.reason);
    const c = certifiedCheck(compiled.stateNames, r, [r])!;
    expect(c.status).toBe('passed');
    expect(c.certified!.bound).toBeLessThan(1e-7);
    expect(c.name).toBe(`certified ${r.label}`);
  });

  it('a trajectory with one value bumped by 1e-3: the certificate grows past the claim (not confirmed, not passed)', async () => {
    const r = await run('bump');
    if (r.status !== 'solved') throw new Error(r.reason);
    const c = certifiedCheck(compiled.stateNames, r, [r])!;
    expect(c.status).toBe('skipped');
    expect(c.certified!.outcome).toBe('not-confirmed');
    expect(c.certified!.bound).toBeGreaterThan(1e-5);
  });

  it('a wrong value (off by 1e-4, claim 1e-6) is refuted by its own honest trajectory', async () => {
    const r = await run('wrong-value');
    if (r.status !== 'solved') throw new Error(r.reason);
    const c = certifiedCheck(compiled.stateNames, r, [r])!;
    expect(c.status).toBe('failed');
    expect(c.detail).toMatch(/state clean: .*its own claimed interval are disjoint/);
  });

  it('a malformed trajectory is a fault of the solver, with the rule it breaks', async () => {
    const dec = await run('decreasing');
    expect(dec.status === 'fault' && dec.fault).toBe('bad-format');
    expect(dec.status === 'fault' && dec.reason).toMatch(/trajectory.time_left. must increase strictly \(index 6/);
    const short = await run('short');
    expect(short.status === 'fault' && short.reason).toMatch(/trajectory.values.scaled. has 300 values for 301 times/);
  });
});
