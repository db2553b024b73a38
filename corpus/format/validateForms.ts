/**
 * Validation of the two explicit forms of crossbound/1: the `states` mapping and the flat
 * `transitions` rows with their `owners`. Each returns the declared state names and the checked
 * object part; repeated flat rows for one (state, action, successor) are merged into one row whose
 * rate is their exact decimal sum.
 */
import type { ModelObject, RateInput } from './build.js';
import { buildFlat } from './flatBuild.js';
import type { FlatBuilt } from './flatBuild.js';
import { fail } from './source.js';
import type { Parsed } from './source.js';
import { mapping, name, oneOf, onlyKeys, rate, record } from './rules.js';

type States = NonNullable<ModelObject['states']>;
const OWNER_RULE = 'owner must be max or min';
const NEEDS_OWNER = 'a state with two or more actions needs an owner';

export interface FormResult {
  readonly declared: { has(name: string): boolean };
  readonly states?: States;
  /** The flat form, already built (see flatBuild.ts). */
  readonly prebuilt?: FlatBuilt;
}

/** The flat form: validated and built in one pass. */
export function validateFlat(p: Parsed, v: unknown, ownersRaw: unknown): FormResult {
  const prebuilt = buildFlat(p, v, ownersRaw);
  return { declared: prebuilt.index, prebuilt };
}

export function validateStates(p: Parsed, v: unknown, warnings: string[]): FormResult {
  const raw = mapping(p, ['states'], v, 'states');
  const declared = new Set<string>();
  for (const s in raw) declared.add(name(p, ['states', s], s, 'key'));
  if (declared.size === 0) fail(p, ['states'], 'a model needs at least one state');
  const states: States = record();
  for (const s in raw) {
    const sp = ['states', s];
    const st = mapping(p, sp, raw[s], `state '${s}'`, true);
    onlyKeys(p, sp, st, ['owner', 'actions'], `state '${s}'`);
    const owner = st.owner === undefined ? undefined : oneOf(p, [...sp, 'owner'], st.owner, ['max', 'min'] as const, OWNER_RULE);
    const acts = mapping(p, [...sp, 'actions'], st.actions, `actions of '${s}'`, true);
    const actions: Record<string, Record<string, RateInput>> = record();
    let count = 0;
    for (const a in acts) {
      const ap = [...sp, 'actions', a];
      name(p, ap, a, 'key');
      const succ = mapping(p, ap, acts[a], `action '${s}.${a}'`, true);
      const out: Record<string, RateInput> = record();
      for (const t in succ) {
        if (!declared.has(t)) {
          fail(p, [...ap, t], 'successor must name a declared state', `('${t}' in ${s}.${a})`, 'key');
        }
        out[t] = rate(p, [...ap, t], succ[t]);
      }
      if (Object.keys(out).length === 0) warn(p, warnings, ap, `action '${s}.${a}' has no successors (it leaves the state unchanged)`);
      actions[a] = out;
      if (++count === 2 && owner === undefined) fail(p, ap, NEEDS_OWNER, `('${s}' has no owner: give owner: max or owner: min)`, 'key');
    }
    states[s] = owner === undefined ? { actions } : { owner, actions };
  }
  return { declared, states };
}

/** Warnings listed with their position; the rest are summed up in one line. */
export const MAX_WARNINGS = 20;

/**
 * Add a warning at `path`. Locating a path costs up to one pass over the text, so only the first
 * MAX_WARNINGS are located and listed (a model with 10^5 empty actions would otherwise take hours);
 * one more line says that further warnings are not shown. (The empty-goal warning, one at most, is
 * always listed: it is pushed directly.)
 */
export function warn(p: Parsed, warnings: string[], path: readonly (string | number)[], text: string): void {
  if (warnings.length < MAX_WARNINGS) warnings.push(warnAt(p, path, text));
  else if (warnings.length === MAX_WARNINGS) {
    warnings.push(`${p.file}: warning: further warnings not shown (only the first ${MAX_WARNINGS} are listed)`);
  }
}

export function warnAt(p: Parsed, path: readonly (string | number)[], text: string): string {
  const pos = p.locate(path, 'key');
  return `${p.file}:${pos.line}:${pos.column}: warning: ${text}`;
}
