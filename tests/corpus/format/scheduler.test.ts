import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { compile } from '../../../corpus/format/compile.js';
import { schedulerPieces } from '../../../corpus/format/scheduler.js';

describe('schedulerPieces', () => {
  const m = compile(buildModel({
    time_bound: 10,
    goal: ['g'],
    states: {
      a: { owner: 'max', actions: { x: { g: 1 }, y: { b: 1 } } },
      b: { owner: 'min', actions: { u: { g: 1 }, w: { a: 1 } } },
      g: {},
    },
  }));
  it('cuts [0, T] at every segment start and keeps each decision until the next one', () => {
    const pieces = schedulerPieces(
      { choices: { a: [{ from: 0, action: 'y' }, { from: 4, action: 'x' }], b: [{ from: 0, action: 'u' }, { from: 2.5, action: 'w' }, { from: 7, action: 'u' }] } },
      10, m.stateNames, m.actionStart, m.actionNames,
    );
    expect(pieces.map((p) => [p.start, p.end])).toEqual([[0, 2.5], [2.5, 4], [4, 7], [7, 10]]);
    const names = pieces.map((p) => [...p.action].map((a) => (a < 0 ? '-' : m.actionNames[a])));
    expect(names).toEqual([['y', 'u', '-'], ['y', 'w', '-'], ['x', 'w', '-'], ['x', 'u', '-']]);
  });
  it('ignores segments at or beyond T and takes the first action of a state that is not listed', () => {
    const pieces = schedulerPieces({ choices: { a: [{ from: 0, action: 'y' }, { from: 10, action: 'x' }] } }, 10, m.stateNames, m.actionStart, m.actionNames);
    expect(pieces.length).toBe(1);
    expect([...pieces[0]!.action].map((a) => (a < 0 ? '-' : m.actionNames[a]))).toEqual(['y', 'u', '-']);
  });
});
