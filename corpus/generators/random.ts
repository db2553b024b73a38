/**
 * Random small models as fast-check arbitraries (plain crossbound/1 objects), for property tests and
 * for `fuzz`. Shrinking is fast-check's: fewer states, fewer actions, fewer successors, rates and the
 * time bound towards simple values.
 *
 * Rates are log-uniform over `decades` decades centred on 1 (e.g. 4 decades: 1e-2 … 1e2).
 */
import fc from 'fast-check';
import type { ModelObject } from '../format/build.js';
import type { GoalMode, Owner } from '../format/types.js';

export interface RandomModelOptions {
  readonly maxStates?: number;
  readonly maxActions?: number;
  readonly maxSuccessors?: number;
  readonly decades?: number;
  /** 'ctmc': at most one action per state; 'ctmdp': one owner for all choices; 'ctmg': both. */
  readonly kind?: 'ctmc' | 'ctmdp' | 'ctmg' | 'any';
  readonly goalMode?: GoalMode | 'any';
  readonly selfLoops?: boolean;
  /** Upper end of λT, roughly: the time bound is drawn from [0.05, maxTime]. */
  readonly maxTime?: number;
}

interface RawAction {
  succ: { to: number; exp: number }[];
}
interface RawState {
  actions: RawAction[];
  ownerMin: boolean;
  goal: boolean;
}

const rateFrom = (exp: number, decades: number): number => Number((10 ** ((exp - 0.5) * decades)).toPrecision(6));

export function arbModelObject(opts: RandomModelOptions = {}): fc.Arbitrary<ModelObject> {
  const maxStates = opts.maxStates ?? 6;
  const kind = opts.kind ?? 'any';
  const maxActions = kind === 'ctmc' ? 1 : (opts.maxActions ?? 3);
  const maxSucc = opts.maxSuccessors ?? 3;
  const decades = opts.decades ?? 4;
  const maxTime = opts.maxTime ?? 5;
  return fc.integer({ min: 1, max: maxStates }).chain((n) => {
    const action = fc.record({
      succ: fc.array(fc.record({ to: fc.integer({ min: 0, max: n - 1 }), exp: fc.double({ min: 0, max: 1, noNaN: true }) }), {
        minLength: 0,
        maxLength: maxSucc,
      }),
    });
    const state = fc.record({
      actions: fc.array(action, { minLength: 0, maxLength: maxActions }),
      ownerMin: fc.boolean(),
      goal: fc.boolean(),
    });
    return fc.record({
      states: fc.array(state, { minLength: n, maxLength: n }),
      time: fc.double({ min: 0.05, max: maxTime, noNaN: true }),
      mode: opts.goalMode && opts.goalMode !== 'any' ? fc.constant(opts.goalMode) : fc.constantFrom<GoalMode>('within', 'at'),
      globalMin: fc.boolean(),
    }).map(({ states, time, mode, globalMin }) => toObject(states, time, mode, globalMin, kind, decades, opts.selfLoops ?? true));
  });
}

function toObject(
  raw: RawState[],
  time: number,
  mode: GoalMode,
  globalMin: boolean,
  kind: RandomModelOptions['kind'],
  decades: number,
  selfLoops: boolean,
): ModelObject {
  const name = (i: number): string => `s${i}`;
  const states: NonNullable<ModelObject['states']> = {};
  raw.forEach((st, i) => {
    const actions: Record<string, Record<string, number>> = {};
    st.actions.forEach((a, j) => {
      const succ: Record<string, number> = {};
      for (const { to, exp } of a.succ) {
        if (!selfLoops && to === i) continue;
        succ[name(to)] = rateFrom(exp, decades);
      }
      actions[`a${j}`] = succ;
    });
    const owner: Owner | undefined =
      st.actions.length < 2 ? undefined : kind === 'ctmdp' ? (globalMin ? 'min' : 'max') : kind === 'ctmg' || kind === 'any' ? (st.ownerMin ? 'min' : 'max') : 'max';
    states[name(i)] = owner ? { owner, actions } : { actions };
  });
  const goal = raw.flatMap((s, i) => (s.goal ? [name(i)] : []));
  return {
    format: 'crossbound/1',
    name: 'random',
    time_bound: Number(time.toPrecision(4)),
    goal: goal.length > 0 ? goal : [name(raw.length - 1)],
    goal_mode: mode,
    initial: name(0),
    states,
  };
}
