/**
 * The decisions of a step-by-step solver as a scheduler (format crossbound-scheduler/1): time left
 * runs up from 0 while elapsed time T − t runs down, so segments are collected backwards and reversed.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import type { Scheduler, Segment } from '../../corpus/format/scheduler.js';

export class DecisionTrace {
  private readonly cur: Int32Array;
  private readonly segs = new Map<number, Segment[]>();
  private readonly owned: number[] = [];
  switches = 0;

  /** T and the times given to record() in scaled units; elapsed time = (T − t)·unit. */
  constructor(private readonly m: CompiledModel, private readonly T: number, private readonly unit: number) {
    this.cur = new Int32Array(m.nStates).fill(-1);
    for (let s = 0; s < m.nStates; s++) if (m.owner[s] !== 0) this.owned.push(s);
  }

  /** From time left t on, every owned state s takes the global action dec[s] (−1: none). */
  record(dec: Int32Array, t: number): void {
    for (const s of this.owned) {
      const d = dec[s]!;
      const c = this.cur[s]!;
      if (d < 0 || d === c) continue;
      if (c >= 0) {
        let list = this.segs.get(s);
        if (!list) this.segs.set(s, (list = []));
        list.push({ from: (this.T - t) * this.unit, action: this.m.actionNames[c]! });
        this.switches++;
      }
      this.cur[s] = d;
    }
  }

  finish(): Scheduler {
    const choices: Record<string, Segment[]> = {};
    for (const s of this.owned) {
      const c = this.cur[s]! >= 0 ? this.cur[s]! : this.m.actionStart[s]!;
      const list = this.segs.get(s) ?? [];
      list.push({ from: 0, action: this.m.actionNames[c]! });
      choices[this.m.stateNames[s]!] = list.reverse();
    }
    return { choices };
  }
}
