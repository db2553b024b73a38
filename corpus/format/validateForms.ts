/**
 * Validation of the two explicit forms of crossbound/1: the `states` mapping and the flat
 * `transitions` rows with their `owners`. Each returns the declared state names and the checked
 * object part; repeated flat rows for one (state, action, successor) are merged into one row whose
 * rate is their exact decimal sum.
 */
import { Decimal } from 'decimal.js';
import type { ModelObject, RateInput } from './build.js';
import { got } from './errors.js';
import { fail } from './source.js';
import type { Parsed } from './source.js';
import { mapping, name, NAME, NAME_RULE, oneOf, onlyKeys, rate } from './rules.js';

type States = NonNullable<ModelObject['states']>;
type Row = [string, string, string, RateInput];
const OWNER_RULE = 'owner must be max or min';
const NEEDS_OWNER = 'a state with two or more actions needs an owner';
const Exact = Decimal.clone({ precision: 1e9 });

export interface FormResult {
  readonly declared: ReadonlySet<string>;
  readonly states?: States;
  readonly transitions?: Row[];
  readonly owners?: Record<string, 'max' | 'min'>;
}

export function validateStates(p: Parsed, v: unknown, warnings: string[]): FormResult {
  const raw = mapping(p, ['states'], v, 'states');
  const declared = new Set<string>();
  for (const s in raw) declared.add(name(p, ['states', s], s, 'key'));
  if (declared.size === 0) fail(p, ['states'], 'a model needs at least one state');
  const states: States = {};
  for (const s in raw) {
    const sp = ['states', s];
    const st = mapping(p, sp, raw[s], `state '${s}'`, true);
    onlyKeys(p, sp, st, ['owner', 'actions'], `state '${s}'`);
    const owner = st.owner === undefined ? undefined : oneOf(p, [...sp, 'owner'], st.owner, ['max', 'min'] as const, OWNER_RULE);
    const acts = mapping(p, [...sp, 'actions'], st.actions, `actions of '${s}'`, true);
    const actions: Record<string, Record<string, RateInput>> = {};
    let count = 0;
    for (const a in acts) {
      const ap = [...sp, 'actions', a];
      name(p, ap, a, 'key');
      const succ = mapping(p, ap, acts[a], `action '${s}.${a}'`, true);
      const out: Record<string, RateInput> = {};
      for (const t in succ) {
        if (!declared.has(t)) {
          fail(p, [...ap, t], 'successor must name a declared state', `('${t}' in ${s}.${a})`, 'key');
        }
        out[t] = rate(p, [...ap, t], succ[t]);
      }
      if (Object.keys(out).length === 0) warnings.push(warnAt(p, ap, `action '${s}.${a}' has no successors (it leaves the state unchanged)`));
      actions[a] = out;
      if (++count === 2 && owner === undefined) fail(p, ap, NEEDS_OWNER, `('${s}' has no owner: give owner: max or owner: min)`, 'key');
    }
    states[s] = owner === undefined ? { actions } : { owner, actions };
  }
  return { declared, states };
}

export function validateFlat(p: Parsed, v: unknown, ownersRaw: unknown): FormResult {
  if (!Array.isArray(v)) fail(p, ['transitions'], 'transitions must be a list of rows [state, action, successor, rate]', got(v));
  if (v.length === 0) fail(p, ['transitions'], 'a model needs at least one state', '(transitions is empty)');
  const names = new Set<string>();
  const checkName = (i: number, j: number, x: unknown): string => {
    if (typeof x === 'string' && names.has(x)) return x;
    if (typeof x !== 'string' || !NAME.test(x)) fail(p, ['transitions', i, j], NAME_RULE, got(x));
    names.add(x);
    return x;
  };
  // Per source state: its first action, and whether a second (distinct) action was seen.
  const firstAction = new Map<string, string>();
  const multi = new Map<string, number>();
  const seen = new Map<string, number>();
  const rows: Row[] = [];
  for (let i = 0; i < v.length; i++) {
    const row: unknown = v[i];
    if (!Array.isArray(row) || row.length !== 4) {
      fail(p, ['transitions', i], 'a row must be a list [state, action, successor, rate]', got(row));
    }
    const s = checkName(i, 0, row[0]);
    const a = checkName(i, 1, row[1]);
    const t = checkName(i, 2, row[2]);
    const r = rate(p, ['transitions', i, 3], row[3]);
    const fa = firstAction.get(s);
    if (fa === undefined) firstAction.set(s, a);
    else if (fa !== a && !multi.has(s)) multi.set(s, i);
    const key = `${s}\u0000${a}\u0000${t}`;
    const prev = seen.get(key);
    if (prev === undefined) {
      seen.set(key, rows.length);
      rows.push([s, a, t, r]);
    } else {
      const old = rows[prev]!;
      old[3] = new Exact(String(old[3])).plus(new Exact(String(r))).toString();
    }
  }
  const owners: Record<string, 'max' | 'min'> = {};
  const om = mapping(p, ['owners'], ownersRaw, 'owners', true);
  for (const s in om) {
    if (!names.has(s)) fail(p, ['owners', s], 'owners must name states that appear in the rows', got(s), 'key');
    owners[s] = oneOf(p, ['owners', s], om[s], ['max', 'min'] as const, OWNER_RULE);
  }
  for (const [s, i] of multi) {
    if (!(s in owners)) fail(p, ['transitions', i, 1], NEEDS_OWNER, `('${s}' is not in owners)`);
  }
  return { declared: names, transitions: rows, ...(ownersRaw !== undefined ? { owners } : {}) };
}

export function warnAt(p: Parsed, path: readonly (string | number)[], text: string): string {
  const pos = p.locate(path, 'key');
  return `${p.file}:${pos.line}:${pos.column}: warning: ${text}`;
}
