/**
 * The oracles in their own time unit: a model with every rate × 10^e and the time bound × 10^−e has the
 * same values (they depend on rates and time only through R·t; common practice, no source), for e
 * from −200 to 200, and the optimal oracle's switching times scale by 10^−e. The shrunk fuzz model
 * corpus/regressions/fuzz-seed1-fault-oracle.json (rates near 1e−24) once failed the optimal oracle's
 * own self-check; its value is 1 − e^{−1.0001e−24·2e22} (the exponential distribution function).
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { buildModel, type ModelObject } from '../../corpus/format/build.js';
import { loadModelFile } from '../../corpus/format/load.js';
import { timeUnitExponent } from '../../oracles/common/timeUnit.js';
import { solveOracle } from '../../oracles/index.js';

const game = (e: number): ModelObject => ({
  format: 'crossbound/1', name: 'switching', time_bound: `2e${-e}`, goal: ['door'], initial: 's',
  states: {
    s: { owner: 'max', actions: { direct: { door: `1e${e}` }, via: { van: `3e${e}` } } },
    van: { actions: { drive: { door: `2e${e}` } } },
    door: {},
  },
}) as ModelObject;

describe('oracles in their own time unit', () => {
  it('a switching CTMDP scaled by 10^±200: the same 25 digits, switching times scaled back', () => {
    const base = solveOracle(buildModel(game(0)), { digits: 25 });
    if (base.kind !== 'solved') throw new Error(base.reason);
    const switchAt = base.scheduler!.choices.s!.map((g) => g.from);
    expect(switchAt.length).toBe(2);
    for (const e of [-200, -24, 24, 200]) {
      const o = solveOracle(buildModel(game(e)), { digits: 25 });
      if (o.kind !== 'solved') throw new Error(`10^${e}: ${o.reason}`);
      expect(o.valuesDecimal).toEqual(base.valuesDecimal);
      const at = o.scheduler!.choices.s!.map((g) => g.from);
      at.forEach((t, i) => expect(Math.abs(t * 10 ** e - switchAt[i]!)).toBeLessThanOrEqual(1e-12 * (1 + switchAt[i]!)));
    }
  });

  it('fuzz-seed1-fault-oracle: solved, and equal to 1 − e^{−0.020002} to 25 digits', () => {
    const o = solveOracle(loadModelFile('corpus/regressions/fuzz-seed1-fault-oracle.json'), { digits: 25 });
    if (o.kind !== 'solved') throw new Error(o.reason);
    const D = Decimal.clone({ precision: 40 });
    const exact = new D(1).minus(new D('-0.020002').exp());
    expect(new D(o.valuesDecimal![0]!).minus(exact).abs().toNumber()).toBeLessThan(1e-25);
  });
});

describe('the time unit ignores frozen goal states', () => {
  it('a goal with a rate of 1e12 out of it (mode within) does not set the unit; the values stay those of the unscaled model', () => {
    const frozen = (e: number): ModelObject => {
      const m = game(e) as { states: Record<string, unknown> };
      return { ...game(e), states: { ...m.states, door: { actions: { boom: { z: '1e12' } } }, z: {} } } as ModelObject;
    };
    expect(timeUnitExponent(buildModel(frozen(-6)))).toBe(-6);
    const base = solveOracle(buildModel(game(0)), { digits: 25 });
    const o = solveOracle(buildModel(frozen(-6)), { digits: 25 });
    if (base.kind !== 'solved' || o.kind !== 'solved') throw new Error('refused');
    expect(o.valuesDecimal!.slice(0, 3)).toEqual(base.valuesDecimal);
  });
});
