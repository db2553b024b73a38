/**
 * The flat `transitions` form, validated and built in one pass over typed arrays (the fast path for
 * models of 10^6 rows and more). The result equals what `buildModel` makes of the same rows: states
 * in order of first appearance (source, then successor, row by row), actions in order of first
 * appearance per state, successors in order of first appearance per action. Repeated rows for one
 * (state, action, successor) are merged into one transition whose rate text is the exact decimal
 * sum and whose rate is that sum correctly rounded.
 */
import { got } from './errors.js';
import { exactSum } from './numbers.js';
import { mapping, NAME, NAME_RULE, oneOf, rate } from './rules.js';
import { fail } from './source.js';
import type { Parsed } from './source.js';
import type { ActionDecl, Owner, StateDecl, Transition } from './types.js';

/** Distinct action names are numbered below this bound, so that (state, action) fits one number key. */
const ACTION_CAP = 2 ** 21;

export interface FlatBuilt {
  readonly index: ReadonlyMap<string, number>;
  readonly states: StateDecl[];
}

class Growable {
  data = new Int32Array(1024);
  length = 0;
  push(x: number): void {
    if (this.length === this.data.length) {
      const d = new Int32Array(this.data.length * 2);
      d.set(this.data);
      this.data = d;
    }
    this.data[this.length++] = x;
  }
}

export function buildFlat(p: Parsed, v: unknown, ownersRaw: unknown): FlatBuilt {
  if (!Array.isArray(v)) fail(p, ['transitions'], 'transitions must be a list of rows [state, action, successor, rate]', got(v));
  const n = v.length;
  if (n === 0) fail(p, ['transitions'], 'a model needs at least one state', '(transitions is empty)');
  const index = new Map<string, number>();
  const names: string[] = [];
  const actIndex = new Map<string, number>();
  const actNames: string[] = [];
  const groupOf = new Map<number, number>();
  const groupState = new Growable();
  const groupAct = new Growable();
  const groupFirstRow = new Growable();
  const rowGroup = new Int32Array(n);
  const rowTarget = new Int32Array(n);
  const rowRate = new Float64Array(n);
  const rowRaw: unknown[] = new Array(n);
  const stateOf = (i: number, j: number, x: unknown): number => {
    const k = typeof x === 'string' ? index.get(x) : undefined;
    if (k !== undefined) return k;
    if (typeof x !== 'string' || !NAME.test(x)) fail(p, ['transitions', i, j], NAME_RULE, got(x));
    index.set(x, names.length);
    names.push(x);
    return names.length - 1;
  };
  for (let i = 0; i < n; i++) {
    const row: unknown = v[i];
    if (!Array.isArray(row) || row.length !== 4) fail(p, ['transitions', i], 'a row must be a list [state, action, successor, rate]', got(row));
    const s = stateOf(i, 0, row[0]);
    const an: unknown = row[1];
    let a = typeof an === 'string' ? actIndex.get(an) : undefined;
    if (a === undefined) {
      if (typeof an !== 'string' || !NAME.test(an)) fail(p, ['transitions', i, 1], NAME_RULE, got(an));
      if (actNames.length >= ACTION_CAP) fail(p, ['transitions', i, 1], `too many distinct action names (limit ${ACTION_CAP})`);
      a = actNames.length;
      actIndex.set(an, a);
      actNames.push(an);
    }
    rowTarget[i] = stateOf(i, 2, row[2]);
    const r: unknown = row[3];
    if (typeof r === 'number' && r >= 0 && r < Infinity) rowRate[i] = r;
    else rowRate[i] = Number(rate(p, ['transitions', i, 3], r));
    rowRaw[i] = r;
    const key = s * ACTION_CAP + a;
    let g = groupOf.get(key);
    if (g === undefined) {
      g = groupState.length;
      groupOf.set(key, g);
      groupState.push(s);
      groupAct.push(a);
      groupFirstRow.push(i);
    }
    rowGroup[i] = g;
  }
  const S = names.length;
  const G = groupState.length;
  // Owners, and the owner rule for states with two or more actions.
  const owner: (Owner | undefined)[] = new Array(S);
  const om = mapping(p, ['owners'], ownersRaw, 'owners', true);
  for (const s in om) {
    const k = index.get(s);
    if (k === undefined) fail(p, ['owners', s], 'owners must name states that appear in the rows', got(s), 'key');
    owner[k] = oneOf(p, ['owners', s], om[s], ['max', 'min'] as const, 'owner must be max or min');
  }
  const actionCount = new Int32Array(S + 1);
  for (let g = 0; g < G; g++) {
    const s = groupState.data[g]!;
    if (++actionCount[s + 1]! === 2 && owner[s] === undefined) {
      fail(p, ['transitions', groupFirstRow.data[g]!, 1], 'a state with two or more actions needs an owner', `('${names[s]}' is not in owners)`);
    }
  }
  // Rows by group (stable counting sort), groups by state.
  const groupStart = new Int32Array(G + 1);
  for (let i = 0; i < n; i++) groupStart[rowGroup[i]! + 1]!++;
  for (let g = 0; g < G; g++) groupStart[g + 1]! += groupStart[g]!;
  const order = new Int32Array(n);
  const fillAt = groupStart.slice(0, G);
  for (let i = 0; i < n; i++) order[fillAt[rowGroup[i]!]!++] = i;
  const actions: ActionDecl[][] = Array.from({ length: S }, () => []);
  const slot = new Int32Array(S).fill(-1);
  for (let g = 0; g < G; g++) {
    const succ: Transition[] = [];
    for (let k = groupStart[g]!; k < groupStart[g + 1]!; k++) {
      const i = order[k]!;
      const t = rowTarget[i]!;
      const raw = rowRaw[i];
      const text = typeof raw === 'number' ? String(raw) : (raw as string);
      const at = slot[t]!;
      if (at >= 0 && at < succ.length && succ[at]!.target === t) {
        const sum = exactSum(succ[at]!.rateText, text);
        const over = '(the repeated rows of this transition sum to more than the largest double)';
        if (!sum.ok) fail(p, ['transitions', i, 3], 'rate must be a finite number ≥ 0', over);
        succ[at] = { target: t, rate: sum.value, rateText: sum.text };
      } else {
        slot[t] = succ.length;
        succ.push({ target: t, rate: rowRate[i]!, rateText: text });
      }
    }
    actions[groupState.data[g]!]!.push({ name: actNames[groupAct.data[g]!]!, successors: succ });
  }
  const states: StateDecl[] = names.map((name, s) => {
    const o = owner[s];
    return o ? { name, owner: o, actions: actions[s]! } : { name, actions: actions[s]! };
  });
  return { index, states };
}
