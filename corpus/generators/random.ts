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

/**
 * Uniform on [0, 1] in steps of 1e-6. Not fc.double: it is uniform over the representable doubles,
 * so almost all its draws in [0, 1] are tiny and every rate would sit at the bottom of its range.
 * No bias towards the ends either; shrinking still goes towards 0.
 */
const UNIT = fc.noBias(fc.integer({ min: 0, max: 1_000_000 })).map((i) => i / 1_000_000);

const rateFrom = (exp: number, decades: number): number => Number((10 ** ((exp - 0.5) * decades)).toPrecision(6));

export function arbModelObject(opts: RandomModelOptions = {}): fc.Arbitrary<ModelObject> {
  const maxStates = opts.maxStates ?? 6;
  const kind = opts.kind ?? 'any';
  const maxActions = kind === 'ctmc' ? 1 : (opts.maxActions ?? 3);
  const maxSucc = opts.maxSuccessors ?? 3;
  const decades = opts.decades ?? 4;
  const maxTime = opts.maxTime ?? 5;
  // No chain on the number of states (fast-check shrinks a chain's outer value poorly): the states
  // are an array, and successor indices are drawn below maxStates and taken modulo its length, so
  // shrinking can drop states one by one.
  const action = fc.record({
    succ: fc.array(fc.record({ to: fc.integer({ min: 0, max: maxStates - 1 }), exp: UNIT }), {
      minLength: 0,
      maxLength: maxSucc,
    }),
  });
  const state = fc.record({
    actions: fc.array(action, { minLength: 0, maxLength: maxActions }),
    ownerMin: fc.boolean(),
    goal: fc.boolean(),
  });
  return fc
    .record({
      states: fc.array(state, { minLength: 1, maxLength: maxStates }),
      time: fc.noBias(fc.double({ min: 0.05, max: maxTime, noNaN: true })),
      mode: opts.goalMode && opts.goalMode !== 'any' ? fc.constant(opts.goalMode) : fc.constantFrom<GoalMode>('within', 'at'),
      globalMin: fc.boolean(),
    })
    .map(({ states, time, mode, globalMin }) => {
      const n = states.length;
      const wrapped = states.map((st) => ({ ...st, actions: st.actions.map((a) => ({ succ: a.succ.map((t) => ({ ...t, to: t.to % n })) })) }));
      return toObject(wrapped, time, mode, globalMin, kind, decades, opts.selfLoops ?? true);
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

/**
 * Random models whose optimal decisions switch in time: a chain of "race" gadgets. In gadget i the
 * owner chooses between a direct race (rate r to the next gadget against rate q to a trap) and a
 * slow sure detour (rate d to a waypoint, then rate d on): near the deadline the race is better, with
 * time to spare the detour (for max; the reverse for min), so the optimal scheduler switches. Random
 * owners, rates, a random goal mode and optional extra edges keep the structure varied.
 */
export function arbSwitchingModelObject(opts: { maxGadgets?: number; decades?: number } = {}): fc.Arbitrary<ModelObject> {
  // Rates within a factor of about 4 of each other keep λT moderate (below ~30 per gadget).
  const decades = opts.decades ?? 0.6;
  const unit = UNIT;
  const rate = unit.map((e) => rateFrom(e, decades));
  // The detour is at least as fast as the race and the trap comparable to it, so that the detour wins
  // with time to spare; the time bound is a few detour times of the slowest gadget.
  const gadget = fc
    .record({ race: rate, trapRatio: unit, detourRatio: unit, min: fc.boolean(), back: fc.option(rate, { nil: undefined }) })
    .map((g) => ({ ...g, trap: Number((g.race * (0.5 + 1.5 * g.trapRatio)).toPrecision(4)), detour: Number((g.race * (1 + 3 * g.detourRatio)).toPrecision(4)) }));
  return fc
    .record({
      gadgets: fc.array(gadget, { minLength: 1, maxLength: opts.maxGadgets ?? 3 }),
      time: fc.noBias(fc.double({ min: 0.5, max: 2, noNaN: true })),
      mode: fc.constantFrom<GoalMode>('within', 'at'),
    })
    .map(({ gadgets, time, mode }) => {
      const states: NonNullable<ModelObject['states']> = {};
      const n = gadgets.length;
      gadgets.forEach((g, i) => {
        const next = i + 1 < n ? `g${i + 1}` : 'goal';
        const race: Record<string, number> = { [next]: g.race, trap: g.trap };
        if (g.back !== undefined && i > 0) race[`g${i - 1}`] = g.back;
        states[`g${i}`] = { owner: g.min ? 'min' : 'max', actions: { race, detour: { [`w${i}`]: g.detour } } };
        states[`w${i}`] = { actions: { walk: { [next]: g.detour } } };
      });
      states.goal = mode === 'at' ? { actions: { leak: { trap: 0.1 } } } : {};
      states.trap = {};
      const slowest = Math.min(...gadgets.map((g) => g.detour));
      return { format: 'crossbound/1', name: 'switching', time_bound: Number(((time * n) / slowest).toPrecision(4)), goal: ['goal'], goal_mode: mode, initial: 'g0', states };
    });
}
