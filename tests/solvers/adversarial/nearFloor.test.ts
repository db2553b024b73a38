/**
 * Rounding allowances at the edge: each solver is run at precisions within 100× of the smallest one it
 * accepts (its refusal floor, where the rounding allowance is a large part of the bound), and its bound
 * is checked against a 30-digit reference: the closed forms in the corpus files (kettle-scale: the
 * two-state chain, S. Ross, "Introduction to Probability Models"; one-switch: derived by hand in the
 * file) and the optimal-control oracle. Euler is not here: its work cap (steps ≈ (λT)²/precision)
 * refuses long before its rounding allowance matters.
 */
import { describe, expect, it } from 'vitest';
import { compile, type CompiledModel } from '../../../corpus/format/compile.js';
import { loadModelFile } from '../../../corpus/format/load.js';
import type { Outcome } from '../../../corpus/format/result.js';
import { solveOracle } from '../../../oracles/index.js';
import { solveKstep } from '../../../solvers/kstep/index.js';
import { solveUniformization } from '../../../solvers/uniformization/index.js';

/** Smallest precision 10^−n (n ≤ 16) that `solve` accepts, with its answers from the floor up to 100× it. */
function nearFloor(solve: (p: number) => Outcome): { floor: number; outs: Outcome[] } {
  let floor = NaN;
  for (let n = 4; n <= 16; n++) {
    if (solve(10 ** -n).kind === 'refused') break;
    floor = 10 ** -n;
  }
  return { floor, outs: [floor, 10 * floor, 100 * floor].map(solve) };
}

function check(m: CompiledModel, ref: ArrayLike<number>, refBound: number, solve: (p: number) => Outcome): number {
  const { floor, outs } = nearFloor(solve);
  expect(floor).toBeGreaterThan(0);
  for (const o of outs) {
    if (o.kind !== 'solved') throw new Error(`refused above its floor: ${o.reason}`);
    for (let s = 0; s < m.nStates; s++) expect(Math.abs(o.values[s]! - ref[s]!), `${o.method} ${JSON.stringify(o.params)}`).toBeLessThanOrEqual(o.errorBound + refBound);
  }
  return floor;
}

describe('bounds at precisions near the refusal floor', () => {
  it('kettle-scale (CTMC, closed form): uniformization and kstep k = 2..4', () => {
    const model = loadModelFile('corpus/models/kettle-scale.yaml');
    const m = compile(model);
    const ref = solveOracle(model, { digits: 30 });
    if (ref.kind !== 'solved') throw new Error(ref.reason);
    check(m, ref.values, ref.errorBound, (p) => solveUniformization(m, { precision: p }));
    for (const k of [3, 4]) check(m, ref.values, ref.errorBound, (p) => solveKstep(m, { precision: p, k }));
  });

  it('one-switch (a switching CTMDP, slow path at the switch): kstep k = 3, 4 against the optimal-control oracle', () => {
    const model = loadModelFile('corpus/oracle-cases/one-switch.yaml');
    const m = compile(model);
    const ref = solveOracle(model, { digits: 30 });
    if (ref.kind !== 'solved') throw new Error(ref.reason);
    for (const k of [3, 4]) check(m, ref.values, ref.errorBound, (p) => solveKstep(m, { precision: p, k }));
  });
});
