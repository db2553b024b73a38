/**
 * Family `grid-patrol`: a CTMG on a side × side grid (an invented pursuit–evasion game). An intruder
 * (the max player) starts in the corner (0, 0) and wants to reach the opposite corner; a patrol (the
 * min player) starts in the corner (side−1, 0) and wants to meet it first. The players move in
 * turns: in a state of the intruder's turn it chooses a move (n, s, e, w, or wait), which happens at
 * rate `intruder` and hands the turn to the patrol, who moves at rate `patrol`. `walls` cells, drawn
 * from the seed (never a start or the target), cannot be entered. Meeting leads to `caught`
 * (absorbing), reaching the target to `breach` (the goal). Size: about 2 · side^4 states.
 */
import type { ModelObject, RateInput } from '../format/build.js';
import { GeneratorError, Params, provenance } from './params.js';
import type { Spec } from './params.js';
import { Prng } from './prng.js';

const MOVES: readonly [string, number, number][] = [['n', 0, 1], ['s', 0, -1], ['e', 1, 0], ['w', -1, 0], ['wait', 0, 0]];

export function gridPatrol(spec: Spec): ModelObject {
  const p = new Params(spec);
  const side = p.int('side', 3, 2, 30);
  const vi = p.num('intruder', 1, 0, 1e12, true);
  const vp = p.num('patrol', 1, 0, 1e12, true);
  const nWalls = p.int('walls', 0, 0, side * side);
  const T = p.num('time_bound', 5, 0, 1e12, true);
  p.done('grid-patrol');
  const cell = (x: number, y: number): number => y * side + x;
  const target = cell(side - 1, side - 1);
  const startI = cell(0, 0);
  const startP = cell(side - 1, 0);
  const free = [...Array(side * side).keys()].filter((c) => c !== target && c !== startI && c !== startP);
  if (nWalls > free.length) throw new GeneratorError('walls', `walls must be at most ${free.length} for side ${side} (got ${nWalls})`);
  const rng = new Prng(p.seed);
  const wall = new Uint8Array(side * side);
  for (let i = 0; i < nWalls; i++) {
    const j = i + rng.int(free.length - i);
    [free[i], free[j]] = [free[j]!, free[i]!];
    wall[free[i]!] = 1;
  }
  const xy = (c: number): string => `${c % side}_${Math.floor(c / side)}`;
  const stateName = (i: number, q: number, turn: 'I' | 'P'): string =>
    i === q ? 'caught' : i === target ? 'breach' : `i${xy(i)}_p${xy(q)}_${turn}`;
  const states: NonNullable<ModelObject['states']> = {};
  for (const turn of ['I', 'P'] as const) {
    for (let i = 0; i < side * side; i++) {
      for (let q = 0; q < side * side; q++) {
        if (wall[i] || wall[q] || i === q || i === target) continue;
        const mover = turn === 'I' ? i : q;
        const actions: Record<string, Record<string, RateInput>> = {};
        for (const [m, dx, dy] of MOVES) {
          const x = (mover % side) + dx;
          const y = Math.floor(mover / side) + dy;
          if (x < 0 || y < 0 || x >= side || y >= side || wall[cell(x, y)]) continue;
          const to = cell(x, y);
          const next = turn === 'I' ? stateName(to, q, 'P') : stateName(i, to, 'I');
          actions[m] = { [next]: turn === 'I' ? vi : vp };
        }
        states[stateName(i, q, turn)] = { owner: turn === 'I' ? 'max' : 'min', actions };
      }
    }
  }
  states.caught = {};
  states.breach = {};
  return {
    format: 'crossbound/1',
    name: `grid-patrol-${side}`,
    description: provenance('grid-patrol', p.seed, { side, intruder: vi, patrol: vp, walls: nWalls, time_bound: T },
      'pursuit–evasion CTMG; the intruder (max) tries to reach the far corner before the patrol (min) meets it.'),
    time_bound: T,
    goal: ['breach'],
    initial: stateName(startI, startP, 'I'),
    states,
  };
}
