/** Refusals and the dispatch of solveOracle. */
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../corpus/format/build.js';
import { solveExpm } from '../../oracles/expm/index.js';
import { solveOracle } from '../../oracles/index.js';
import { solveOptimal } from '../../oracles/optimal/index.js';
import { randomStructure } from '../../bench/oracleStructures.js';

const game = buildModel({
  time_bound: '1', goal: ['g'],
  states: { s: { owner: 'max', actions: { a: { g: '1' }, b: { g: '2' } } }, g: {} },
});

describe('oracle refusals', () => {
  it('refuses bad digit requests', () => {
    for (const d of [0, 2.5, 301]) expect(solveExpm(game, { digits: d, scheduler: { choices: { s: [{ from: 0, action: 'a' }] } } }).kind).toBe('refused');
    expect(solveOptimal(game, { digits: -1 }).kind).toBe('refused');
  });
  it('expm refuses a model with choices and no scheduler', () => {
    const out = solveExpm(game, { digits: 20 });
    expect(out.kind === 'refused' && out.reason).toMatch(/choices/);
  });
  it('optimal refuses more than 200 states', () => {
    const out = solveOptimal(buildModel(randomStructure(201, 2, 2, '1', 1)), { digits: 20 });
    expect(out.kind === 'refused' && out.reason).toMatch(/at most 200 states/);
  });
  it('expm refuses a CTMC beyond its budget (λT in the tens of thousands)', () => {
    const out = solveExpm(buildModel(randomStructure(150, 1, 3, '5000', 5)), { digits: 30 });
    expect(out.kind === 'refused' && out.reason).toMatch(/too large/);
  });
  it('optimal refuses a model too stiff for its grid', () => {
    const m = buildModel({ time_bound: '100', goal: ['g'], states: { s: { owner: 'max', actions: { a: { g: '1000' }, b: { t: '900' } } }, t: { actions: { go: { g: '1' } } }, g: {} } });
    const out = solveOptimal(m, { digits: 20 });
    expect(out.kind === 'refused' && out.reason).toMatch(/too stiff/);
  });
});

describe('solveOracle', () => {
  it('uses the optimal oracle for choices, expm for a scheduler', () => {
    const opt = solveOracle(game, { digits: 20 });
    const fixed = solveOracle(game, { digits: 20, scheduler: { choices: { s: [{ from: 0, action: 'a' }] } } });
    expect(opt.kind === 'solved' && opt.params['oracle']).toBe('optimal');
    expect(fixed.kind === 'solved' && fixed.params['oracle']).toBe('expm');
    // max picks b (rate 2): 1 − e^{−2}; a gives 1 − e^{−1} (closed form, common practice).
    if (opt.kind === 'solved') expect(Math.abs(opt.values[0]! - (1 - Math.exp(-2)))).toBeLessThan(1e-15);
    if (fixed.kind === 'solved') expect(Math.abs(fixed.values[0]! - (1 - Math.exp(-1)))).toBeLessThan(1e-15);
  });
});
