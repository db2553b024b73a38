/** The refusal codes the harness acts on, from the real solvers and oracles (the retry rule depends on them). */
import { describe, expect, it } from 'vitest';
import { buildModel, type ModelObject } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import { loadModelFile } from '../../../corpus/format/load.js';
import { solveOracle } from '../../../oracles/index.js';
import { solveEuler } from '../../../solvers/euler/index.js';
import { solveKstep } from '../../../solvers/kstep/index.js';
import { solveUniformization } from '../../../solvers/uniformization/index.js';

const ferry = loadModelFile('corpus/models/ferry-crossing.yaml');
// A game above the optimal oracle's size limit (200 states): a choice, then a chain of 250 states.
const big = buildModel({
  format: 'crossbound/1', name: 'long-chain-game', time_bound: 1, goal: ['c249'],
  states: Object.fromEntries([
    ['c0', { owner: 'max', actions: { a: { c1: 1 }, b: { c1: 2 } } }],
    ...Array.from({ length: 248 }, (_, i) => [`c${i + 1}`, { actions: { go: { [`c${i + 2}`]: 1 } } }]),
    ['c249', {}],
  ]),
} as ModelObject);
const code = (o: { kind: string; code?: string }): string | undefined => (o.kind === 'refused' ? o.code : 'solved');

describe('refusal codes', () => {
  it('work-cap: Euler and the k-step scheme over their caps', () => {
    expect(code(solveEuler(compile(ferry), { precision: 1e-6, maxWork: 100 }))).toBe('work-cap');
    expect(code(solveKstep(compile(ferry), { precision: 1e-6, k: 1, maxIntervals: 10 }))).toBe('work-cap');
  });
  it('out-of-scope: uniformization on a model with choices, the optimal oracle above its size', () => {
    expect(code(solveUniformization(compile(ferry), { precision: 1e-6 }))).toBe('out-of-scope');
    expect(code(solveOracle(big, { digits: 20 }))).toBe('out-of-scope');
  });
  it('invalid-input: a precision out of range', () => {
    expect(code(solveEuler(compile(ferry), { precision: 0 }))).toBe('invalid-input');
    expect(code(solveKstep(compile(ferry), { precision: 1e-6, k: 9 }))).toBe('invalid-input');
  });
});
