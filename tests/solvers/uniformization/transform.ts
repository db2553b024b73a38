/** Metamorphic transformations of plain model objects, for property tests. */
import type { ModelObject } from '../../../corpus/format/build.js';

/** Every rate times c and the time bound divided by c: the values must not change. */
export function scaleRates(obj: ModelObject, c: number): ModelObject {
  const states: NonNullable<ModelObject['states']> = {};
  for (const [name, st] of Object.entries(obj.states ?? {})) {
    const actions: Record<string, Record<string, number>> = {};
    for (const [an, succ] of Object.entries(st.actions ?? {})) {
      actions[an] = Object.fromEntries(Object.entries(succ).map(([t, r]) => [t, Number(r) * c]));
    }
    states[name] = st.owner ? { owner: st.owner, actions } : { actions };
  }
  return { ...obj, time_bound: Number(obj.time_bound) / c, states };
}

/** The same model with another time bound. */
export function withTimeBound(obj: ModelObject, T: number): ModelObject {
  return { ...obj, time_bound: T };
}
