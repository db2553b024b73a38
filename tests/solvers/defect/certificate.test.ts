/**
 * The certificate on dense solutions that are wrong on purpose: Taylor polynomials of a fixed, poor
 * positional scheduler (the last action everywhere), some with noise added at every step's start.
 * Their error against the optimal value (the optimal-control oracle, decimal arithmetic) is large, so
 * a certificate that under-counts the defect (say, a range taken at the step's ends only) is caught:
 * the bound must cover the actual error and bracket the reference on both sides, and stay within a
 * modest factor of it (the comparison principle is sharp up to the max over states).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile, type CompiledModel } from '../../../corpus/format/compile.js';
import { arbModelObject } from '../../../corpus/generators/random.js';
import { solveOracle } from '../../../oracles/index.js';
import { certify, type DenseStep } from '../../../solvers/defect/certificate.js';

/** Taylor steps of y′ = Q_d y for the scheduler "last action", N equal steps, degree K (plain doubles). */
function poorDense(m: CompiledModel, N: number, K: number, noise: number, seed: number): DenseStep[] {
  const S = m.nStates;
  let st = seed >>> 0;
  const rnd = (): number => ((st = (Math.imul(st, 1664525) + 1013904223) >>> 0) / 2 ** 32) - 0.5;
  const frozen = (s: number): boolean => m.actionStart[s + 1] === m.actionStart[s] || (m.goalMode === 'within' && m.goal[s] === 1);
  let x = Float64Array.from(m.goal);
  const h = m.timeBound / N;
  const steps: DenseStep[] = [];
  for (let i = 0; i < N; i++) {
    const coef = new Float64Array((K + 1) * S);
    for (let s = 0; s < S; s++) coef[s] = frozen(s) ? x[s]! : x[s]! + noise * rnd();
    for (let j = 0; j < K; j++) {
      for (let s = 0; s < S; s++) {
        if (frozen(s)) continue;
        const a = m.actionStart[s + 1]! - 1;
        let acc = -m.exitRate[a]! * coef[j * S + s]!;
        for (let t = m.rowStart[a]!; t < m.rowStart[a + 1]!; t++) acc += m.rate[t]! * coef[j * S + m.col[t]!]!;
        coef[(j + 1) * S + s] = acc / (j + 1);
      }
    }
    steps.push({ h, coef });
    x = new Float64Array(S);
    for (let s = 0; s < S; s++) {
      let v = 0;
      for (let j = K; j >= 0; j--) v = v * h + coef[j * S + s]!;
      x[s] = v;
    }
  }
  return steps;
}

describe('the certificate of a deliberately poor dense solution', () => {
  it('covers and brackets the optimal value, and is not loose by more than 50× where the error is large', () => {
    let compared = 0;
    let large = 0;
    fc.assert(
      fc.property(arbModelObject({ kind: 'any', maxStates: 5, maxTime: 2, decades: 1 }), fc.integer({ min: 0, max: 2 }), (obj, variant) => {
        const model = buildModel(obj);
        const m = compile(model);
        const ref = solveOracle(model, { digits: 20 });
        if (ref.kind !== 'solved') return;
        const noise = [0, 1e-9, 1e-6][variant]!;
        const cert = certify(m, poorDense(m, 40, 6, noise, 11 + variant), 6);
        let actual = 0;
        for (let s = 0; s < m.nStates; s++) {
          const f = cert.values[s]!;
          const v = ref.values[s]!;
          actual = Math.max(actual, Math.abs(f - v));
          expect(f - v).toBeLessThanOrEqual(cert.lowerDev + ref.errorBound);
          expect(v - f).toBeLessThanOrEqual(cert.upperDev + ref.errorBound);
        }
        compared++;
        if (actual > 1e-4) {
          large++;
          expect(cert.errorBound).toBeLessThanOrEqual(50 * actual);
        }
      }),
      { numRuns: 60, seed: 5 },
    );
    expect(compared).toBeGreaterThan(40);
    expect(large).toBeGreaterThan(5);
  });
});
