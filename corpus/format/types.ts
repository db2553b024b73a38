/**
 * The in-memory model of format crossbound/1 (the semantics are those of the Bellman equations
 * for time-bounded reachability: see the README, section "Semantics").
 *
 * A `Model` is what the loader returns after every rule has been checked; every index in it is
 * valid, every rate finite and ≥ 0. Solvers never read a `Model` directly in hot loops: they use the
 * compressed sparse row form of `compile.ts`.
 */

export type Owner = 'max' | 'min';
export type GoalMode = 'within' | 'at';

/** One rate R(s, a, s') ≥ 0. `rateText` is the exact decimal text (read exactly by the oracles). */
export interface Transition {
  readonly target: number;
  readonly rate: number;
  readonly rateText: string;
}

export interface ActionDecl {
  readonly name: string;
  readonly successors: readonly Transition[];
}

export interface StateDecl {
  readonly name: string;
  /** Required when the state has two or more actions; may be given for fewer. */
  readonly owner?: Owner;
  readonly actions: readonly ActionDecl[];
}

/** Reference values carried by a corpus file, used by the harness as external checks. */
export interface Expectation {
  /** State name → decimal string. */
  readonly values: Readonly<Record<string, string>>;
  readonly tolerance: number;
  readonly source: string;
}

export interface Model {
  readonly name: string;
  readonly description?: string;
  readonly timeBound: number;
  /** Exact decimal text of the time bound. */
  readonly timeBoundText: string;
  readonly goalMode: GoalMode;
  /** Indices of goal states, ascending, without repetition. */
  readonly goal: readonly number[];
  /** Index of the headline state, or undefined. */
  readonly initial?: number;
  readonly states: readonly StateDecl[];
  readonly expect?: Expectation;
  /** Provenance of a generated model (the `generate` mapping), if any. */
  readonly generated?: Readonly<Record<string, unknown>>;
}

/** Index of the state called `name`, or -1. Linear; for hot paths build a map once. */
export function stateIndex(model: Model, name: string): number {
  return model.states.findIndex((s) => s.name === name);
}

/** True when every state has at most one action (the model is a CTMC). */
export function isCtmc(model: Model): boolean {
  return model.states.every((s) => s.actions.length <= 1);
}

/** 'CTMC', 'CTMDP' (one player owns every choice) or 'CTMG' (both players own choices). */
export function modelKind(model: Model): 'CTMC' | 'CTMDP' | 'CTMG' {
  let max = false;
  let min = false;
  for (const s of model.states) {
    if (s.actions.length < 2) continue;
    if (s.owner === 'max') max = true;
    if (s.owner === 'min') min = true;
  }
  if (max && min) return 'CTMG';
  return max || min ? 'CTMDP' : 'CTMC';
}
