/**
 * Certifying trajectories (cubic Hermite through the values, slopes from the Bellman equations): one
 * made by the k-step scheme at 40 times left, certified and compared with the optimal-control oracle
 * (decimal arithmetic); the same with one value corrupted by 1e-3, whose certified bound must grow to
 * cover the harm; and malformed trajectories refused.
 */
import { describe, expect, it } from 'vitest';
import { compile, type CompiledModel } from '../../../corpus/format/compile.js';
import { loadModelFile } from '../../../corpus/format/load.js';
import { solveOracle } from '../../../oracles/index.js';
import { certifyTrajectory, type Trajectory } from '../../../solvers/defect/trajectory.js';
import { solveKstep } from '../../../solvers/kstep/index.js';

function kstepTrajectory(m: CompiledModel, n: number): Trajectory {
  const timeLeft: number[] = [];
  const values: Float64Array[] = [];
  for (let i = 0; i <= n; i++) {
    const t = (m.timeBound * i) / n;
    timeLeft.push(i === n ? m.timeBound : t);
    if (i === 0) {
      values.push(Float64Array.from(m.goal));
      continue;
    }
    const o = solveKstep({ ...m, timeBound: t }, { precision: 1e-10, k: 4 });
    if (o.kind !== 'solved') throw new Error(o.reason);
    values.push(o.values);
  }
  return { timeLeft, values };
}

describe('certified trajectories', () => {
  for (const file of ['corpus/models/ferry-crossing.yaml', 'corpus/oracle-cases/opposite-switches.yaml', 'corpus/models/kettle-scale.yaml']) {
    it(`${file}: a k-step trajectory of 40 steps is certified, and a corrupted one gets a bound that covers the harm`, () => {
      const model = loadModelFile(file);
      const m = compile(model);
      const ref = solveOracle(model, { digits: 25 });
      if (ref.kind !== 'solved') throw new Error(ref.reason);
      const tr = kstepTrajectory(m, 40);
      const cert = certifyTrajectory(m, tr);
      if ('refused' in cert) throw new Error(cert.refused);
      for (let s = 0; s < m.nStates; s++) {
        expect(cert.values[s]! - ref.values[s]!).toBeLessThanOrEqual(cert.lowerDev + ref.errorBound);
        expect(ref.values[s]! - cert.values[s]!).toBeLessThanOrEqual(cert.upperDev + ref.errorBound);
      }
      // A cubic Hermite on 40 steps: a bound below 1e-3 (measured 1e-5 … 4e-4; 2e-6 … 6e-6 with 400 steps).
      expect(cert.errorBound).toBeLessThan(1e-3);
      const bad = { timeLeft: tr.timeLeft, values: tr.values.map((v, i) => (i === 20 ? Float64Array.from(v, (x) => Math.min(1, x + 1e-3)) : v)) };
      const c2 = certifyTrajectory(m, bad);
      if ('refused' in c2) throw new Error(c2.refused);
      expect(c2.errorBound).toBeGreaterThan(cert.errorBound);
      for (let s = 0; s < m.nStates; s++) expect(Math.abs(c2.values[s]! - ref.values[s]!)).toBeLessThanOrEqual(c2.errorBound + ref.errorBound);
    });
  }

  it('refuses times that do not run from 0 to T, missing and non-finite values', () => {
    const m = compile(loadModelFile('corpus/models/kettle-scale.yaml'));
    const v = [Float64Array.from(m.goal), Float64Array.from(m.goal)];
    expect('refused' in certifyTrajectory(m, { timeLeft: [0, m.timeBound / 2], values: v })).toBe(true);
    expect('refused' in certifyTrajectory(m, { timeLeft: [0, m.timeBound], values: [v[0]!, Float64Array.of(0.5)] })).toBe(true);
    expect('refused' in certifyTrajectory(m, { timeLeft: [0, m.timeBound], values: [v[0]!, Float64Array.of(NaN, 0)] })).toBe(true);
  });
});
