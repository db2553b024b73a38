/**
 * The contract every solver honours, written once and run against each of them:
 *  - it solves (or refuses with a reason) — it never throws;
 *  - every value lies in [0, 1] (up to its own bound);
 *  - its stated bound holds against a more precise reference: |v − ref| ≤ bound + refBound + 1e-15;
 *  - the same model gives the same answer twice (determinism).
 */
import fc from 'fast-check';
import { expect, it } from 'vitest';
import { buildModel } from '../../corpus/format/build.js';
import { compile, type CompiledModel } from '../../corpus/format/compile.js';
import type { Outcome } from '../../corpus/format/result.js';
import { arbModelObject, type RandomModelOptions } from '../../corpus/generators/random.js';

export interface Reference {
  values: Float64Array;
  bound: number;
}

export interface ContractOptions {
  readonly name: string;
  readonly solve: (m: CompiledModel, precision: number) => Outcome;
  /** A more precise answer, or undefined when none applies to this model. */
  readonly reference: (m: CompiledModel) => Reference | undefined;
  readonly models?: RandomModelOptions;
  readonly precision?: number;
  readonly runs?: number;
}

export function solverContract(opts: ContractOptions): void {
  const precision = opts.precision ?? 1e-5;
  const arb = arbModelObject(opts.models ?? { maxStates: 5 });
  it(`${opts.name}: values in [0, 1], bound honoured against the reference, deterministic`, () => {
    fc.assert(
      fc.property(arb, (obj) => {
        const m = compile(buildModel(obj));
        const out = opts.solve(m, precision);
        if (out.kind === 'refused') {
          expect(out.reason.length).toBeGreaterThan(0);
          return;
        }
        expect(out.errorBound).toBeGreaterThanOrEqual(0);
        expect(out.errorBound).toBeLessThanOrEqual(precision);
        expect(out.values.length).toBe(m.nStates);
        for (const v of out.values) {
          expect(v).toBeGreaterThanOrEqual(-out.errorBound);
          expect(v).toBeLessThanOrEqual(1 + out.errorBound);
        }
        const ref = opts.reference(m);
        if (ref) {
          for (let s = 0; s < m.nStates; s++) {
            expect(Math.abs(out.values[s]! - ref.values[s]!)).toBeLessThanOrEqual(out.errorBound + ref.bound + 1e-15);
          }
        }
        const again = opts.solve(m, precision);
        expect(again.kind).toBe('solved');
        if (again.kind === 'solved') expect([...again.values]).toEqual([...out.values]);
      }),
      { numRuns: opts.runs ?? 40, seed: 20261201 },
    );
  });
}
