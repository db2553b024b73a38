/**
 * The rules of format crossbound/1 on a parsed input: every violation is a positioned
 * `ModelError`; what passes is a `ModelObject` that `buildModel` turns into a `Model`, and a list of
 * warnings (an empty goal, an action without successors, a goal named twice).
 */
import type { ModelObject } from './build.js';
import { got } from './errors.js';
import { isDecimalString, readDecimal } from './numbers.js';
import { decimal, mapping, oneOf, onlyKeys, record, str } from './rules.js';
import { fail } from './source.js';
import type { Parsed } from './source.js';
import { validateFlat, validateStates, warn, warnAt } from './validateForms.js';
import type { FormResult } from './validateForms.js';
import type { FlatBuilt } from './flatBuild.js';

export const FORMAT = 'crossbound/1';
const TOP_KEYS = ['format', 'name', 'description', 'time_bound', 'goal', 'goal_mode', 'initial', 'states', 'transitions', 'owners', 'expect', 'generate'] as const;
const FORMS = ['states', 'transitions', 'generate'] as const;

export interface Validated {
  readonly obj: ModelObject;
  readonly warnings: string[];
  /** The flat form's states, already built; `obj` then carries no `transitions`. */
  readonly prebuilt?: FlatBuilt;
}

/** Check the top level; `expand` resolves a `generate` form into an explicit one (see load.ts). */
export function validateModel(p: Parsed, expand: (p: Parsed, top: Record<string, unknown>) => Validated): Validated {
  const top = mapping(p, [], p.value, 'a model');
  onlyKeys(p, [], top, TOP_KEYS, 'the model');
  if (top.format === undefined) fail(p, [], `format must be ${FORMAT}`, '(the key format is missing)');
  if (top.format !== FORMAT) fail(p, ['format'], `format must be ${FORMAT}`, got(top.format));
  const forms = FORMS.filter((f) => top[f] !== undefined);
  if (forms.length !== 1) {
    fail(p, forms.length ? [forms[1]!] : [], 'exactly one of states, transitions, generate must be given', `(found ${forms.length ? forms.join(', ') : 'none'})`, 'key');
  }
  if (top.owners !== undefined && forms[0] !== 'transitions') fail(p, ['owners'], 'owners belongs to the transitions form', '', 'key');
  if (forms[0] === 'generate') return expand(p, top);
  const warnings: string[] = [];
  const form = forms[0] === 'states' ? validateStates(p, top.states, warnings) : validateFlat(p, top.transitions, top.owners);
  const obj = validateCommon(p, top, form, warnings);
  return form.prebuilt ? { obj, warnings, prebuilt: form.prebuilt } : { obj, warnings };
}

/** The keys shared by every form; `form` holds the checked states or rows. */
export function validateCommon(p: Parsed, top: Record<string, unknown>, form: FormResult, warnings: string[]): ModelObject {
  if (top.name !== undefined) str(p, ['name'], top.name, 'name');
  if (top.description !== undefined) str(p, ['description'], top.description, 'description');
  if (top.time_bound === undefined) fail(p, [], 'time_bound is required', '(a finite number > 0)');
  const T = decimal(p, ['time_bound'], top.time_bound, 'time_bound must be a finite number > 0', (x) => x > 0);
  if (top.goal === undefined) fail(p, [], 'goal is required', '(a list of state names; [] for none)');
  if (!Array.isArray(top.goal)) fail(p, ['goal'], 'goal must be a list of state names', got(top.goal));
  const goal: string[] = [];
  const inGoal = new Set<string>();
  top.goal.forEach((g: unknown, i: number) => {
    if (typeof g !== 'string' || !form.declared.has(g)) fail(p, ['goal', i], 'goal must name declared states', got(g));
    if (inGoal.has(g)) warn(p, warnings, ['goal', i], `goal state '${g}' is listed twice`);
    inGoal.add(g);
    goal.push(g);
  });
  if (goal.length === 0) warnings.push(warnAt(p, ['goal'], 'the goal is empty (every value is 0)'));
  const goalMode = top.goal_mode === undefined ? undefined : oneOf(p, ['goal_mode'], top.goal_mode, ['within', 'at'] as const, 'goal_mode must be within or at');
  if (top.initial !== undefined && (typeof top.initial !== 'string' || !form.declared.has(top.initial))) {
    fail(p, ['initial'], 'initial must name a declared state', got(top.initial));
  }
  const obj: ModelObject = { format: FORMAT, time_bound: T, goal };
  if (top.name !== undefined) obj.name = top.name as string;
  if (top.description !== undefined) obj.description = top.description as string;
  if (goalMode) obj.goal_mode = goalMode;
  if (top.initial !== undefined) obj.initial = top.initial as string;
  if (form.states) obj.states = form.states;
  if (top.expect !== undefined) obj.expect = validateExpect(p, top.expect, form.declared);
  return obj;
}

function validateExpect(p: Parsed, v: unknown, declared: FormResult['declared']): NonNullable<ModelObject['expect']> {
  const e = mapping(p, ['expect'], v, 'expect');
  onlyKeys(p, ['expect'], e, ['values', 'tolerance', 'source'], 'expect');
  for (const k of ['values', 'tolerance', 'source']) if (e[k] === undefined) fail(p, ['expect'], `expect needs values, tolerance and source`, `(${k} is missing)`, 'key');
  const vals = mapping(p, ['expect', 'values'], e.values, 'expect.values');
  const values: Record<string, string> = record();
  for (const s in vals) {
    if (!declared.has(s)) fail(p, ['expect', 'values', s], 'expect.values must name declared states', got(s), 'key');
    const x = vals[s];
    if (!isDecimalString(x)) fail(p, ['expect', 'values', s], 'expected values must be decimal strings (quoted)', got(x));
    const r = readDecimal(x);
    if (!r.ok || r.value < 0 || r.value > 1) fail(p, ['expect', 'values', s], 'expected values must be probabilities in [0, 1]', got(x));
    values[s] = x;
  }
  const tolerance = decimal(p, ['expect', 'tolerance'], e.tolerance, 'tolerance must be a finite number ≥ 0', (x) => x >= 0);
  const source = str(p, ['expect', 'source'], e.source, 'source');
  if (source.trim() === '') fail(p, ['expect', 'source'], 'source must name where the expected values come from', '(it is empty)');
  return { values, tolerance, source };
}
