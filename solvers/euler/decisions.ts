/**
 * The decisions Euler takes, step by step, turned into a scheduler in elapsed time.
 *
 * The decision of the step starting at time left t_i applies on time left [t_i, t_{i+1}], that is
 * on elapsed time [T − t_{i+1}, T − t_i]. Segments are therefore emitted from the last step back
 * to the first. Near ties the decisions may chatter; beyond MAX_SWITCHES changes the log gives up
 * and no scheduler is returned (the values are unaffected).
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import type { Scheduler, Segment } from '../../corpus/format/scheduler.js';

export const MAX_SWITCHES = 10_000;

export class DecisionLog {
  switches = 0;
  private dropped = false;
  private readonly prev: Int32Array;
  private readonly changes: { tLeft: number; action: number }[][];

  private constructor(
    private readonly m: CompiledModel,
    private readonly owned: Int32Array,
    private readonly frozenOwned: readonly number[],
  ) {
    this.prev = new Int32Array(owned.length).fill(-1);
    this.changes = Array.from({ length: owned.length }, () => []);
  }

  /** A log for the owned states, or undefined when the model has no choices. */
  static forModel(m: CompiledModel, active: readonly number[]): DecisionLog | undefined {
    const isActive = new Uint8Array(m.nStates);
    for (const s of active) isActive[s] = 1;
    const owned: number[] = [];
    const frozenOwned: number[] = [];
    for (let s = 0; s < m.nStates; s++) {
      if (m.owner[s] === 0) continue;
      (isActive[s] ? owned : frozenOwned).push(s);
    }
    if (owned.length === 0 && frozenOwned.length === 0) return undefined;
    return new DecisionLog(m, Int32Array.from(owned), frozenOwned);
  }

  record(choice: Int32Array, tLeft: number): void {
    const { owned, prev } = this;
    for (let k = 0; k < owned.length; k++) {
      const a = choice[owned[k]!]!;
      if (a === prev[k]) continue;
      if (prev[k] !== -1) this.switches++;
      prev[k] = a;
      if (this.dropped) continue;
      this.changes[k]!.push({ tLeft, action: a });
      if (this.switches > MAX_SWITCHES) {
        this.dropped = true;
        for (const c of this.changes) c.length = 0;
      }
    }
  }

  scheduler(T: number): Scheduler | undefined {
    if (this.dropped) return undefined;
    const { m } = this;
    const choices: Record<string, Segment[]> = {};
    for (const s of this.frozenOwned) choices[m.stateNames[s]!] = [{ from: 0, action: m.actionNames[m.actionStart[s]!]! }];
    this.owned.forEach((s, k) => {
      const ch = this.changes[k]!;
      const segs: Segment[] = [];
      for (let j = ch.length - 1; j >= 0; j--) {
        segs.push({ from: j === ch.length - 1 ? 0 : T - ch[j + 1]!.tLeft, action: m.actionNames[ch[j]!.action]! });
      }
      choices[m.stateNames[s]!] = segs;
    });
    return { choices };
  }
}
