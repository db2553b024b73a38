/**
 * The progress callbacks of Euler and of the optimal-control oracle (used by `solve` on a terminal)
 * report how far the run got and change nothing in the result.
 */
import { describe, expect, test } from 'vitest';
import { compile } from '../../../corpus/format/compile.js';
import { loadModelFile } from '../../../corpus/format/load.js';
import { solveOracle } from '../../../oracles/index.js';
import { solveEuler } from '../../../solvers/euler/index.js';

describe('progress callbacks', () => {
  test('Euler: called every 4096 steps with (steps done, steps); values and bound identical', () => {
    const m = compile(loadModelFile('corpus/models/thermostat-duel.yaml'));
    const calls: [number, number][] = [];
    const plain = solveEuler(m, { precision: 1e-4 });
    const watched = solveEuler(m, { precision: 1e-4, onProgress: (d, t) => void calls.push([d, t]) });
    expect(plain.kind).toBe('solved');
    if (plain.kind !== 'solved' || watched.kind !== 'solved') return;
    expect([...watched.values]).toEqual([...plain.values]);
    expect(watched.errorBound).toBe(plain.errorBound);
    const steps = plain.stats.steps!;
    // Calls at the full steps 0, 4096, 8192, …; the last, shorter step (if any) calls nothing.
    expect(steps).toBeGreaterThan(3 * 4096);
    expect([Math.ceil(steps / 4096), Math.ceil((steps - 1) / 4096)]).toContain(calls.length);
    calls.forEach(([d, t], i) => {
      expect(d).toBe(i * 4096);
      expect(t).toBe(steps);
    });
  });
  test('optimal oracle: called after each segment, ending at the time bound; values identical', () => {
    const model = loadModelFile('corpus/oracle-cases/one-switch.yaml');
    const calls: [number, number][] = [];
    const plain = solveOracle(model, { digits: 20 });
    const watched = solveOracle(model, { digits: 20, onProgress: (d, t) => void calls.push([d, t]) });
    if (plain.kind !== 'solved' || watched.kind !== 'solved') throw new Error('the oracle refused');
    expect(watched.valuesDecimal).toEqual(plain.valuesDecimal);
    expect(calls.length).toBeGreaterThanOrEqual(2); // one switch: two segments
    expect(calls.at(-1)![0]).toBe(calls.at(-1)![1]);
    for (let i = 1; i < calls.length; i++) expect(calls[i]![0]).toBeGreaterThan(calls[i - 1]![0]);
  });
});
