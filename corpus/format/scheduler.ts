/**
 * Fixed schedulers, format crossbound-scheduler/1. Times are elapsed time from the start (0 … T);
 * each owned state lists segments `{ from, action }` sorted by `from`, the first at from = 0.
 * A state not listed takes its first action (fixed schedulers need a choice in every owned state,
 * so the loader rejects a scheduler that omits an owned state).
 */
export interface Segment {
  readonly from: number;
  readonly action: string;
}

export interface Scheduler {
  readonly model?: string;
  /** State name → segments, sorted by `from`, first from = 0. */
  readonly choices: Readonly<Record<string, readonly Segment[]>>;
}

/**
 * The scheduler as a list of pieces of constant decisions over elapsed time:
 * piece i covers [start_i, end_i) and picks, for every state index, a global action index
 * (an index into CompiledModel's action arrays), or −1 for a state without actions.
 */
export interface SchedulerPiece {
  readonly start: number;
  readonly end: number;
  readonly action: Int32Array;
}

/**
 * Cut [0, T] into pieces where every state's decision is constant. `resolve(state, actionName)`
 * returns the global action index, or −1 when the state has no such action (the caller has
 * validated the scheduler, so that means a state without actions).
 */
export function schedulerPieces(
  sched: Scheduler,
  T: number,
  stateNames: readonly string[],
  actionStart: Int32Array,
  actionNames: readonly string[],
): SchedulerPiece[] {
  const S = stateNames.length;
  const cuts = new Set<number>([0, T]);
  for (const segs of Object.values(sched.choices)) for (const g of segs) if (g.from > 0 && g.from < T) cuts.add(g.from);
  const times = [...cuts].sort((x, y) => x - y);
  const byName = new Map(stateNames.map((n, i) => [n, i] as const));
  // Each state's segments are sorted by `from`; one cursor per state walks them once (linear time).
  const listed: { s: number; segs: readonly Segment[]; next: number; action: number }[] = [];
  for (const [name, segs] of Object.entries(sched.choices)) {
    const s = byName.get(name);
    if (s !== undefined) listed.push({ s, segs, next: 0, action: -2 });
  }
  const resolve = (s: number, name: string): number => {
    for (let a = actionStart[s]!; a < actionStart[s + 1]!; a++) if (actionNames[a] === name) return a;
    return -2;
  };
  const current = new Int32Array(S);
  for (let s = 0; s < S; s++) current[s] = actionStart[s + 1]! > actionStart[s]! ? actionStart[s]! : -1;
  const pieces: SchedulerPiece[] = [];
  for (let p = 0; p + 1 < times.length; p++) {
    const start = times[p]!;
    const end = times[p + 1]!;
    for (const l of listed) {
      while (l.next < l.segs.length && l.segs[l.next]!.from <= start) {
        const a = resolve(l.s, l.segs[l.next]!.action);
        if (a !== -2) current[l.s] = a;
        l.next++;
      }
    }
    pieces.push({ start, end, action: Int32Array.from(current) });
  }
  return pieces;
}
