/**
 * Compilation of a validated `Model` into a compressed sparse row (CSR) form with typed arrays,
 * built once per model and shared by every fast solver.
 *
 * Layout (S states, A actions in all, N transitions in all):
 *   actionStart: Int32Array(S+1)  actions of state s are actionStart[s] .. actionStart[s+1]-1
 *   rowStart:    Int32Array(A+1)  transitions of action a are rowStart[a] .. rowStart[a+1]-1
 *   col:         Int32Array(N)    successor index
 *   rate:        Float64Array(N)  rate R(s, a, s') > 0
 *   exitRate:    Float64Array(A)  E(s, a) = Σ_{s'≠s} R(s, a, s')
 *   owner:       Int8Array(S)     +1 max, −1 min, 0 no choice (fewer than two actions)
 *   goal:        Uint8Array(S)    1 on goal states
 *
 * Self-loops and zero rates are dropped here: a rate from s to s has no effect on the dynamics
 * (the Bellman right-hand side multiplies it by v_s − v_s = 0), and a zero rate neither.
 * λ = max exit rate over all actions (0 when nothing moves).
 */
import type { GoalMode, Model } from './types.js';

export interface CompiledModel {
  readonly name: string;
  readonly stateNames: readonly string[];
  readonly nStates: number;
  readonly nActions: number;
  readonly nTransitions: number;
  readonly actionStart: Int32Array;
  readonly actionNames: readonly string[];
  readonly rowStart: Int32Array;
  readonly col: Int32Array;
  readonly rate: Float64Array;
  readonly exitRate: Float64Array;
  readonly owner: Int8Array;
  readonly goal: Uint8Array;
  readonly lambda: number;
  readonly timeBound: number;
  readonly goalMode: GoalMode;
  /** −1 when the model names no initial state. */
  readonly initial: number;
}

export function compile(model: Model): CompiledModel {
  const S = model.states.length;
  let A = 0;
  let N = 0;
  for (const s of model.states) {
    A += s.actions.length;
    for (const a of s.actions) N += a.successors.length;
  }
  const actionStart = new Int32Array(S + 1);
  const rowStart = new Int32Array(A + 1);
  const colTmp = new Int32Array(N);
  const rateTmp = new Float64Array(N);
  const exitRate = new Float64Array(A);
  const owner = new Int8Array(S);
  const goal = new Uint8Array(S);
  const actionNames: string[] = new Array(A);
  for (const g of model.goal) goal[g] = 1;

  let a = 0;
  let k = 0;
  let lambda = 0;
  for (let s = 0; s < S; s++) {
    const st = model.states[s]!;
    actionStart[s] = a;
    if (st.actions.length >= 2) owner[s] = st.owner === 'min' ? -1 : 1;
    for (const act of st.actions) {
      actionNames[a] = act.name;
      rowStart[a] = k;
      let e = 0;
      for (const t of act.successors) {
        if (t.target === s || t.rate === 0) continue;
        colTmp[k] = t.target;
        rateTmp[k] = t.rate;
        e += t.rate;
        k++;
      }
      exitRate[a] = e;
      if (e > lambda) lambda = e;
      a++;
    }
  }
  actionStart[S] = a;
  rowStart[A] = k;
  return {
    name: model.name,
    stateNames: model.states.map((s) => s.name),
    nStates: S,
    nActions: A,
    nTransitions: k,
    actionStart,
    actionNames,
    rowStart,
    col: k === N ? colTmp : colTmp.slice(0, k),
    rate: k === N ? rateTmp : rateTmp.slice(0, k),
    exitRate,
    owner,
    goal,
    lambda,
    timeBound: model.timeBound,
    goalMode: model.goalMode,
    initial: model.initial ?? -1,
  };
}
