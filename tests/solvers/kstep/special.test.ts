import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import { solveKstep } from '../../../solvers/kstep/index.js';
import { expmValues } from './reference.js';

const hand = (T: number) =>
  compile(buildModel({ time_bound: T, goal: ['g'], states: { s: { owner: 'max', actions: { A: { g: 1 }, B: { m: 4 } } }, m: { actions: { go: { g: 4 } } }, g: {} } }));

describe('kstep special cases and refusals', () => {
  it('refuses k outside 1..8, a bad precision, and a choice without an owner', () => {
    const m = hand(1);
    for (const k of [0, 9, 2.5]) expect(solveKstep(m, { precision: 1e-6, k }).kind).toBe('refused');
    for (const precision of [0, -1, NaN, Infinity]) expect(solveKstep(m, { precision, k: 2 }).kind).toBe('refused');
    const noOwner = { ...m, owner: new Int8Array(m.nStates) };
    const o = solveKstep(noOwner, { precision: 1e-6, k: 2 });
    expect(o.kind === 'refused' && o.reason).toMatch(/no owner/);
  });

  it('refuses a precision that would need too many intervals, naming the count', () => {
    const o = solveKstep(hand(50), { precision: 1e-12, k: 1 });
    expect(o.kind === 'refused' && o.reason).toMatch(/needs \d+ intervals/);
  });

  it('nothing moves (λ = 0): the start vector exactly, bound 0', () => {
    const m = compile(buildModel({ time_bound: 5, goal: ['b'], goal_mode: 'at', states: { a: { actions: { stay: {} } }, b: {} } }));
    const o = solveKstep(m, { precision: 1e-6, k: 3 });
    expect(o.kind).toBe('solved');
    if (o.kind === 'solved') {
      expect([...o.values]).toEqual([0, 1]);
      expect(o.errorBound).toBe(0);
    }
  });

  it('goal mode `within` keeps goal states at 1 even when they have actions; `at` lets them leave', () => {
    const obj = (mode: 'within' | 'at') =>
      buildModel({ time_bound: 2, goal: ['g'], goal_mode: mode, states: { a: { actions: { x: { g: 1 } } }, g: { actions: { y: { a: 3 } } } } });
    const w = solveKstep(compile(obj('within')), { precision: 1e-8, k: 3 });
    const at = solveKstep(compile(obj('at')), { precision: 1e-8, k: 3 });
    if (w.kind !== 'solved' || at.kind !== 'solved') throw new Error('refused');
    expect(w.values[1]).toBe(1);
    expect(Math.abs(w.values[0]! - (1 - Math.exp(-2)))).toBeLessThanOrEqual(w.errorBound); // exponential CDF
    const ref = expmValues(compile(obj('at')));
    for (let s = 0; s < 2; s++) expect(Math.abs(at.values[s]! - ref[s]!)).toBeLessThanOrEqual(at.errorBound + 1e-12);
    expect(at.values[1]!).toBeLessThan(0.5);
  });

  it('a piece cap that halving cannot meet is refused; one switch gives up to k pieces', () => {
    // The breakpoint of level j − 1 stays in f^j through the state's own term −E·f^{j−1}_s, and the
    // envelope of level j adds its own: with k = 3 one switch gives 3 pieces, however short ε is.
    const tight = solveKstep(hand(0.8), { precision: 1e-6, k: 3, pieceCap: 2 });
    expect(tight.kind === 'refused' && tight.reason).toMatch(/more than 2 pieces/);
    const ok = solveKstep(hand(0.8), { precision: 1e-6, k: 3, pieceCap: 3 });
    expect(ok.kind === 'solved' && ok.stats.maxPieces).toBe(3);
  });

  it('k = 7 and 8 still honour the bound on the near-worst-case chain (how far beyond k = 4 it holds)', () => {
    const m = compile(buildModel({ time_bound: 1.5, goal: ['b'], goal_mode: 'at', states: { a: { actions: { x: { b: 2 } } }, b: { actions: { y: { a: 2 } } } } }));
    const exact = 0.5 * (1 - Math.exp(-4 * 1.5));
    for (const k of [7, 8]) {
      for (const n of [1, 3, 10]) {
        const o = solveKstep(m, { precision: 1e6, k, intervals: n });
        if (o.kind !== 'solved') throw new Error(o.reason);
        expect(Math.abs(o.values[0]! - exact)).toBeLessThanOrEqual(o.errorBound);
      }
      const p = solveKstep(m, { precision: 1e-10, k });
      if (p.kind !== 'solved') throw new Error(p.reason);
      expect(Math.abs(p.values[0]! - exact)).toBeLessThanOrEqual(p.errorBound);
    }
  });

  it('the scheduler is in elapsed time: segments sorted, the first from 0, consecutive actions differ', () => {
    const o = solveKstep(hand(2), { precision: 1e-6, k: 4 });
    if (o.kind !== 'solved') throw new Error(o.reason);
    const segs = o.scheduler!.choices.s!;
    expect(segs[0]!.from).toBe(0);
    for (let i = 1; i < segs.length; i++) {
      expect(segs[i]!.from).toBeGreaterThan(segs[i - 1]!.from);
      expect(segs[i]!.action).not.toBe(segs[i - 1]!.action);
    }
    expect(segs[segs.length - 1]!.from).toBeLessThan(2);
  });
});
