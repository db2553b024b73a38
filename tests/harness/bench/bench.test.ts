import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import { formatBenchTable, runBench } from '../../../harness/bench/index.js';
import { solveKstep } from '../../../solvers/kstep/index.js';

// Two-state chain, closed form p(t) = a/(a+b)(1 − e^{−(a+b)t}) (textbook formula).
const a = 1.2;
const b = 0.8;
const T = 3;
const chain = compile(buildModel({ name: 'two-state', time_bound: T, goal: ['on'], goal_mode: 'at', states: {
  off: { actions: { up: { on: a } } }, on: { actions: { down: { off: b } } } } }));
const ref = Float64Array.of((a / (a + b)) * (1 - Math.exp(-(a + b) * T)), (a + b * Math.exp(-(a + b) * T)) / (a + b));
const game = compile(buildModel({ name: 'tiny-game', time_bound: 1, goal: ['g'], states: {
  s: { owner: 'max', actions: { A: { g: 1 }, B: { m: 4 } } }, m: { actions: { go: { g: 4 } } }, g: {} } }));

describe('runBench', () => {
  it('one row per model × k × precision with steps, bound and actual error (kstep alone)', () => {
    const rows = runBench([{ name: 'two-state', compiled: chain, reference: ref, referenceBound: 1e-15 }], { methods: ['kstep'], ks: [2, 3], precisions: [1e-4, 1e-7] }, {
      kstep: (m, p, k) => solveKstep(m, { precision: p, k }),
    });
    expect(rows).toHaveLength(4);
    for (const r of rows) {
      expect(r.refused).toBeUndefined();
      expect(r.errorBound!).toBeLessThanOrEqual(r.precision);
      expect(r.actualError!).toBeLessThanOrEqual(r.errorBound! + r.referenceBound!);
      expect(r.steps!).toBeGreaterThan(0);
    }
    // More precision, more intervals; higher k, fewer.
    const steps = (k: number, p: number) => rows.find((r) => r.k === k && r.precision === p)!.steps!;
    expect(steps(2, 1e-7)).toBeGreaterThan(steps(2, 1e-4));
    expect(steps(3, 1e-7)).toBeLessThan(steps(2, 1e-7));
  });

  it('the real method table: euler and uniformization rows, refusals kept as rows', () => {
    const rows = runBench([{ name: 'two-state', compiled: chain, reference: ref }, { name: 'tiny-game', compiled: game }], {
      methods: ['kstep', 'euler', 'uniformization'], ks: [3], precisions: [1e-4] });
    expect(rows).toHaveLength(6);
    for (const r of rows.filter((r) => r.model === 'two-state' && !r.refused)) expect(r.actualError!).toBeLessThanOrEqual(r.errorBound! + 1e-15);
    expect(rows.filter((r) => r.model === 'two-state' && r.refused)).toHaveLength(0);
    const text = formatBenchTable(rows);
    expect(text.split('\n')).toHaveLength(8);
    expect(text).toMatch(/^model\s+method\s+k\s+precision/);
  });

  it('a crashing method becomes a refused row with the message', () => {
    const rows = runBench([{ name: 'two-state', compiled: chain }], { methods: ['euler'], ks: [], precisions: [1e-3] }, {
      euler: () => { throw new Error('boom'); },
    });
    expect(rows[0]!.refused).toBe('crashed: boom');
    expect(formatBenchTable(rows)).toContain('(crashed: boom)');
  });
});
