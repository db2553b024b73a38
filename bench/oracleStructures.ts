/** Seeded pseudo-random model structures invented for the oracle tests (a linear congruential generator). */
import type { ModelObject } from '../corpus/format/build.js';

function lcg(seed: number): () => number {
  let x = seed >>> 0;
  return () => ((x = (Math.imul(x, 1664525) + 1013904223) >>> 0) / 2 ** 32);
}

/** n states, `acts` actions each with `succ` successors, rates in [0.2, 3], goal the last state. */
export function randomStructure(n: number, acts: number, succ: number, T: string, seed: number, game = false): ModelObject {
  const r = lcg(seed);
  const states: NonNullable<ModelObject['states']> = {};
  for (let i = 0; i < n - 1; i++) {
    const actions: Record<string, Record<string, string>> = {};
    for (let a = 0; a < acts; a++) {
      const s: Record<string, string> = {};
      for (let k = 0; k < succ; k++) s[`q${Math.floor(r() * n)}`] = (0.2 + 2.8 * r()).toFixed(3);
      actions[`a${a}`] = s;
    }
    states[`q${i}`] = acts > 1 ? { owner: game && i % 2 === 1 ? 'min' : 'max', actions } : { actions };
  }
  states[`q${n - 1}`] = {};
  return { time_bound: T, goal: [`q${n - 1}`], states };
}


/** A ring of n states: rate a to the next state, b to the previous one; goal state q0, goal mode `at`. */
export function ring(n: number, a: string, b: string, T: string): ModelObject {
  const states: NonNullable<ModelObject['states']> = {};
  for (let i = 0; i < n; i++) {
    const succ: Record<string, string> = { [`q${(i + 1) % n}`]: a };
    if (b !== '0') succ[`q${(i + n - 1) % n}`] = b;
    states[`q${i}`] = { actions: { go: succ } };
  }
  return { time_bound: T, goal: ['q0'], goal_mode: 'at', states };
}
