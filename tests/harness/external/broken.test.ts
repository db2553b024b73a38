// Every broken fixture solver, run through runExternal on its demo model, is caught against the
// reference fixture (correct.mjs): a disagreement beyond both bounds, a broken bound against a
// much finer reference, or the fault it is listed with.
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { runExternal, type ExternalOutcome } from '../../../harness/external/run.js';
import { brokenSolvers, correctSolver, solverTemplate, type FixtureSolver } from '../../fixtures/solvers/index.js';

async function runOn(file: string, b: FixtureSolver, precision: number, timeoutMs = 20_000): Promise<ExternalOutcome> {
  const model = buildModel(b.demo);
  return runExternal(solverTemplate(file), b.demo, model.states.map((s) => s.name), { precision, timeBound: model.timeBound, timeoutMs });
}

/** Largest |a − b| − (bound_a + bound_b + 1e-15) over the states; > 0 is a flagged disagreement. */
function excess(a: ExternalOutcome, b: ExternalOutcome): number {
  if (a.kind !== 'solved' || b.kind !== 'solved') {
    const why = (o: ExternalOutcome): string => (o.kind === 'fault' ? `${o.fault} (${o.detail}; ${o.stderrTail ?? ''})` : o.kind);
    throw new Error(`expected two results, got ${why(a)} and ${why(b)}`);
  }
  let worst = -Infinity;
  for (let i = 0; i < a.solved.values.length; i++) {
    worst = Math.max(worst, Math.abs(a.solved.values[i]! - b.solved.values[i]!) - (a.solved.errorBound + b.solved.errorBound + 1e-15));
  }
  return worst;
}

describe('broken fixture solvers are caught', () => {
  it('the list covers every bug of the brief, each with an existing demo model', () => {
    expect(brokenSolvers.map((b) => b.file).sort()).toEqual(
      ['at-absorbing', 'bound-third', 'crash', 'garbage', 'hang', 'min-as-max', 'nan', 'selfloop-exit', 'short-tail', 'skip-last'].map((f) => `${f}.mjs`),
    );
    for (const b of brokenSolvers) expect(() => buildModel(b.demo)).not.toThrow();
  });

  for (const b of brokenSolvers) {
    it(`${b.file} (${b.bug}) → ${b.expectedVerdict}`, async () => {
      if (b.expectedVerdict === 'disagreement') {
        const [bad, good] = await Promise.all([runOn(b.file, b, b.demoPrecision), runOn(correctSolver.file, b, b.demoPrecision)]);
        expect(excess(bad, good)).toBeGreaterThan(0);
      } else if (b.expectedVerdict === 'broken-bound') {
        // Against a reference 1000 times finer: the actual error exceeds the stated bound.
        const [bad, ref] = await Promise.all([runOn(b.file, b, b.demoPrecision), runOn(correctSolver.file, b, b.demoPrecision / 1000)]);
        expect(excess(bad, ref)).toBeGreaterThan(0);
      } else {
        const out = await runOn(b.file, b, b.demoPrecision, b.expectedVerdict === 'timeout' ? 1500 : 20_000);
        expect(out.kind === 'fault' ? out.fault : 'solved').toBe(b.expectedVerdict);
      }
    });
  }

  it('the reference agrees with itself across precisions on every demo model (the catches are not noise)', async () => {
    const demos = brokenSolvers.filter((b) => b.expectedVerdict === 'disagreement' || b.expectedVerdict === 'broken-bound');
    for (const b of demos) {
      const [coarse, fine] = await Promise.all([runOn(correctSolver.file, b, b.demoPrecision), runOn(correctSolver.file, b, b.demoPrecision / 100)]);
      expect(excess(coarse, fine)).toBeLessThanOrEqual(0);
    }
  });
});
