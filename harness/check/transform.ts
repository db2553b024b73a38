/**
 * Metamorphic transformations of a model: each returns a copy whose values are known in terms of
 * the original's, with `map[s]` = the index in the copy of original state s.
 *  - scale:      every rate × c and T / c: the values are unchanged (time is rescaled).
 *  - rename:     states reversed in order and renamed: the values follow the states.
 *  - unreachable: two fresh states that nothing reaches (one with a choice): the old values are unchanged.
 *  - duplicate:  every state's first action appears twice (a choice between equals): unchanged.
 *  - game-of-ctmc: a CTMC turned into a one-player game by duplicating each action (for CTMCs only).
 * (Common practice in testing numerical solvers, no source.)
 */
import type { ActionDecl, Model, StateDecl } from '../../corpus/format/types.js';

export interface Transformed {
  readonly name: string;
  readonly model: Model;
  readonly map: readonly number[];
}

const identity = (n: number): number[] => Array.from({ length: n }, (_, i) => i);

export function scaleRates(model: Model, c: number): Transformed {
  const states = model.states.map((s) => ({
    ...s,
    actions: s.actions.map((a) => ({ ...a, successors: a.successors.map((t) => ({ ...t, rate: t.rate * c, rateText: String(t.rate * c) })) })),
  }));
  const T = model.timeBound / c;
  return { name: `scale x${c}`, model: { ...model, states, timeBound: T, timeBoundText: String(T) }, map: identity(model.states.length) };
}

export function renameStates(model: Model): Transformed {
  const n = model.states.length;
  const map = identity(n).map((s) => n - 1 - s);
  const states: StateDecl[] = new Array(n);
  model.states.forEach((s, i) => {
    states[map[i]!] = {
      ...s,
      name: `r_${n - 1 - i}_${s.name}`,
      actions: s.actions.map((a) => ({ ...a, successors: a.successors.map((t) => ({ ...t, target: map[t.target]! })) })),
    };
  });
  const goal = model.goal.map((g) => map[g]!).sort((x, y) => x - y);
  return {
    name: 'rename',
    model: { ...model, states, goal, ...(model.initial !== undefined ? { initial: map[model.initial]! } : {}), expect: undefined },
    map,
  };
}

export function addUnreachable(model: Model): Transformed {
  const n = model.states.length;
  // Rates in units of 1/T, so that the copy's λT stays that of the model at any scale of its rates.
  const to = (target: number, r: number): ActionDecl['successors'][number] => {
    const rate = r / model.timeBound;
    return { target, rate, rateText: String(rate) };
  };
  const extra: StateDecl[] = [
    { name: 'zz_unreachable_a', owner: 'max', actions: [{ name: 'x', successors: [to(0, 2.5), to(n + 1, 1)] }, { name: 'y', successors: [to(n - 1, 0.5)] }] },
    { name: 'zz_unreachable_b', actions: [{ name: 'z', successors: [to(n, 3)] }] },
  ];
  return { name: 'unreachable states', model: { ...model, states: [...model.states, ...extra] }, map: identity(n) };
}

export function duplicateAction(model: Model): Transformed {
  const states = model.states.map((s): StateDecl => {
    if (s.actions.length === 0) return s;
    const first = s.actions[0]!;
    const copy = { ...first, name: `${first.name}_twin` };
    return { ...s, owner: s.owner ?? 'max', actions: [...s.actions, copy] };
  });
  return { name: 'duplicated action', model: { ...model, states }, map: identity(model.states.length) };
}

/** A CTMC as a game: each state's single action duplicated, owners alternating max and min. */
export function gameOfCtmc(model: Model): Transformed {
  const states = model.states.map((s, i): StateDecl => {
    if (s.actions.length !== 1) return s;
    const a = s.actions[0]!;
    return { ...s, owner: i % 2 === 0 ? 'max' : 'min', actions: [a, { ...a, name: `${a.name}_other` }] };
  });
  return { name: 'one-action game vs CTMC', model: { ...model, states }, map: identity(model.states.length) };
}
