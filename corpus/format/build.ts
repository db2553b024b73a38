/**
 * Build a `Model` from the plain object structure of format crossbound/1 (the `states` or the
 * flat `transitions` form), as parsed from JSON or YAML.
 *
 * This is the trusted half of loading: the loader checks every rule with positions first and then
 * calls `buildModel`. Tests and generators may call it directly on objects they made; it still
 * throws a plain Error on a broken reference, so that a bad object never becomes a bad model.
 */
import { exactSum, readDecimal } from './numbers.js';
import type { ActionDecl, Expectation, GoalMode, Model, Owner, StateDecl, Transition } from './types.js';

export type RateInput = number | string;

export interface ModelObject {
  format?: string;
  name?: string;
  description?: string;
  time_bound: RateInput;
  goal: string[];
  goal_mode?: GoalMode;
  initial?: string;
  states?: Record<string, { owner?: Owner; actions?: Record<string, Record<string, RateInput>> }>;
  transitions?: [string, string, string, RateInput][];
  owners?: Record<string, Owner>;
  expect?: { values: Record<string, string | number>; tolerance: number | string; source: string };
  generate?: Record<string, unknown>;
}

/** A rate read by the one number grammar (numbers.ts): its nearest double and its exact text. */
function rateOf(r: RateInput): { rate: number; rateText: string } {
  const x = readDecimal(r);
  if (!x.ok || x.value < 0) throw new Error(`rate ${String(r)} is not a finite number ≥ 0`);
  return { rate: x.value, rateText: x.text };
}

export function buildModel(obj: ModelObject, fallbackName = 'model'): Model {
  const names: string[] = [];
  const index = new Map<string, number>();
  const declare = (n: string): number => {
    let i = index.get(n);
    if (i === undefined) {
      i = names.length;
      index.set(n, i);
      names.push(n);
    }
    return i;
  };
  type Draft = { owner?: Owner; actions: Map<string, Map<number, { rate: number; rateText: string }>> };
  const drafts: Draft[] = [];
  const draftOf = (i: number): Draft => (drafts[i] ??= { actions: new Map() });

  if (obj.states) {
    for (const name of Object.keys(obj.states)) draftOf(declare(name));
    for (const [name, st] of Object.entries(obj.states)) {
      const d = draftOf(index.get(name)!);
      if (st?.owner) d.owner = st.owner;
      for (const [an, succ] of Object.entries(st?.actions ?? {})) {
        const m = new Map<number, { rate: number; rateText: string }>();
        for (const [t, r] of Object.entries(succ ?? {})) {
          const ti = index.get(t);
          if (ti === undefined) throw new Error(`successor '${t}' of ${name}.${an} is not a declared state`);
          m.set(ti, rateOf(r));
        }
        d.actions.set(an, m);
      }
    }
  } else if (obj.transitions) {
    for (const [s, a, t, r] of obj.transitions) {
      const si = declare(s);
      const ti = declare(t);
      draftOf(ti);
      const d = draftOf(si);
      let m = d.actions.get(a);
      if (!m) d.actions.set(a, (m = new Map()));
      const prev = m.get(ti);
      const add = rateOf(r);
      // Repeated rows for the same (state, action, successor) add up; the text is the exact decimal sum.
      const sum = prev ? exactSum(prev.rateText, add.rateText) : undefined;
      if (sum && !sum.ok) throw new Error(`repeated rows ${s} ${a} ${t} sum to more than the largest double`);
      m.set(ti, sum ? { rate: sum.value, rateText: sum.text } : add);
    }
    for (const [s, o] of Object.entries(obj.owners ?? {})) {
      const si = index.get(s);
      if (si === undefined) throw new Error(`owner given for '${s}', which appears in no row`);
      draftOf(si).owner = o;
    }
  } else {
    throw new Error('the model has neither `states` nor `transitions`');
  }

  const states: StateDecl[] = names.map((name, i) => {
    const d = drafts[i] ?? { actions: new Map() };
    const actions: ActionDecl[] = [...d.actions].map(([an, m]) => ({
      name: an,
      successors: [...m].map(([target, r]): Transition => ({ target, rate: r.rate, rateText: r.rateText })),
    }));
    if (actions.length >= 2 && !d.owner) throw new Error(`state '${name}' has ${actions.length} actions and no owner`);
    return d.owner ? { name, owner: d.owner, actions } : { name, actions };
  });

  const goal = [...new Set(obj.goal.map((g) => {
    const gi = index.get(g);
    if (gi === undefined) throw new Error(`goal '${g}' is not a declared state`);
    return gi;
  }))].sort((x, y) => x - y);
  let initial: number | undefined;
  if (obj.initial !== undefined) {
    initial = index.get(obj.initial);
    if (initial === undefined) throw new Error(`initial '${obj.initial}' is not a declared state`);
  }
  const tb = rateOf(obj.time_bound);
  if (!(tb.rate > 0)) throw new Error('time_bound must be > 0');
  let expect: Expectation | undefined;
  if (obj.expect) {
    expect = {
      values: Object.fromEntries(Object.entries(obj.expect.values).map(([k, v]) => [k, String(v)])),
      tolerance: Number(obj.expect.tolerance),
      source: obj.expect.source,
    };
  }
  return {
    name: obj.name ?? fallbackName,
    ...(obj.description !== undefined ? { description: obj.description } : {}),
    timeBound: tb.rate,
    timeBoundText: tb.rateText,
    goalMode: obj.goal_mode ?? 'within',
    goal,
    ...(initial !== undefined ? { initial } : {}),
    states,
    ...(expect ? { expect } : {}),
    ...(obj.generate ? { generated: obj.generate } : {}),
  };
}
