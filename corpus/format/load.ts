/**
 * Loading models of format crossbound/1 from YAML 1.2 or JSON. Every rule of the format is checked
 * with positions (see validate.ts): a model that breaks one is refused with a `ModelError`
 * `file:line:column: rule`, and nothing is built. Warnings (an empty goal, an action without
 * successors) are returned by the `...WithWarnings` variants.
 *
 * Limits (limits.ts): files up to 256 MiB (JSON; YAML up to 8 MiB and 500,000 nodes), nesting up to 64 levels,
 * 1000 YAML alias expansions.
 */
import { basename } from 'node:path';
import { buildModel } from './build.js';
import type { ModelObject } from './build.js';
import { ModelError } from './errors.js';
import { fail, parseText, readLimited } from './source.js';
import type { Parsed } from './source.js';
import type { Model } from './types.js';
import { validateCommon, validateModel } from './validate.js';
import type { Validated } from './validate.js';
import { validateFlat, validateStates } from './validateForms.js';
import { GeneratorError, generateModel } from '../generators/index.js';
import { readDecimal } from './numbers.js';
import { isMapping } from './rules.js';
import type { FlatBuilt } from './flatBuild.js';

export { ModelError } from './errors.js';

export interface Loaded {
  readonly model: Model;
  readonly warnings: string[];
}

export function loadModelFile(path: string): Model {
  return loadModelFileWithWarnings(path).model;
}

export function loadModelText(text: string, file: string): Model {
  return loadModelTextWithWarnings(text, file).model;
}

export function loadModelFileWithWarnings(path: string): Loaded {
  return loadModelTextWithWarnings(readLimited(path), path);
}

export function loadModelTextWithWarnings(text: string, file: string): Loaded {
  const parsed = parseText(text, file);
  const v = validateModel(parsed, expandGenerate);
  return { model: build(v, file), warnings: v.warnings };
}

/** Validate the plain object form (as parsed, without positions): errors name the file only. */
export function validateModelObject(value: unknown, file = '(object)'): Loaded {
  const parsed: Parsed = { file, value, syntax: 'json', locate: () => ({ line: 0, column: 0 }) };
  try {
    const v = validateModel(parsed, expandGenerate);
    return { model: build(v, file), warnings: v.warnings };
  } catch (e) {
    if (e instanceof ModelError) throw new ModelError(file, undefined, undefined, e.rule, e.message.slice(e.message.indexOf(e.rule) + e.rule.length).trim());
    throw e;
  }
}

function build(v: Validated, file: string): Model {
  const fallback = basename(file).replace(/\.(ya?ml|json)$/i, '');
  try {
    if (v.prebuilt) return assemble(v.obj, v.prebuilt, fallback);
    return buildModel(v.obj, fallback);
  } catch (e) {
    // Every rule buildModel checks was checked above with a position; reaching here is a bug.
    throw new Error(`internal error: a validated model did not build: ${(e as Error).message}`);
  }
}

const GENERATE_TOP = ['format', 'name', 'description', 'time_bound', 'goal', 'goal_mode', 'initial', 'expect', 'generate'];

/**
 * The generated form: the family's object, with the file's own top-level keys taking precedence.
 * Errors in parameters point at the parameter; errors in the generated part point at `generate`.
 */
function expandGenerate(p: Parsed, top: Record<string, unknown>): Validated {
  for (const k of Object.keys(top)) {
    if (!GENERATE_TOP.includes(k)) fail(p, [k], 'unknown key', `'${k}' beside generate (allowed: ${GENERATE_TOP.join(', ')})`, 'key');
  }
  const spec = top.generate;
  if (!isMapping(spec)) fail(p, ['generate'], 'generate must be a mapping { family, seed, ...parameters }');
  let made: ModelObject;
  try {
    made = generateModel(spec);
  } catch (e) {
    if (!(e instanceof GeneratorError)) throw e;
    fail(p, e.param === undefined ? ['generate'] : ['generate', e.param], 'bad generate parameters:', e.message, e.param === undefined || e.onKey ? 'key' : 'value');
  }
  const merged: Record<string, unknown> = { ...made, generate: undefined };
  for (const k of GENERATE_TOP) if (k !== 'generate' && top[k] !== undefined) merged[k] = top[k];
  const own = new Set(Object.keys(top));
  const inner: Parsed = {
    file: p.file,
    value: merged,
    syntax: p.syntax,
    locate: (path, part) => (typeof path[0] === 'string' && own.has(path[0]) ? p.locate(path, part) : p.locate(['generate'], 'key')),
  };
  const warnings: string[] = [];
  const form = merged.states !== undefined ? validateStates(inner, merged.states, warnings) : validateFlat(inner, merged.transitions, merged.owners);
  const obj = validateCommon(inner, merged, form, warnings);
  obj.generate = spec;
  return form.prebuilt ? { obj, warnings, prebuilt: form.prebuilt } : { obj, warnings };
}

/** The `Model` of a validated object whose states were built by the flat fast path (as buildModel would). */
function assemble(obj: ModelObject, pre: FlatBuilt, fallbackName: string): Model {
  const T = readDecimal(obj.time_bound);
  if (!T.ok) throw new Error(`time_bound ${String(obj.time_bound)} is not a finite number`);
  const goal = [...new Set(obj.goal.map((g) => pre.index.get(g)!))].sort((x, y) => x - y);
  const initial = obj.initial === undefined ? undefined : pre.index.get(obj.initial);
  return {
    name: obj.name ?? fallbackName,
    ...(obj.description !== undefined ? { description: obj.description } : {}),
    timeBound: T.value,
    timeBoundText: T.text,
    goalMode: obj.goal_mode ?? 'within',
    goal,
    ...(initial !== undefined ? { initial } : {}),
    states: pre.states,
    ...(obj.expect
      ? { expect: { values: { ...obj.expect.values } as Record<string, string>, tolerance: Number(obj.expect.tolerance), source: obj.expect.source } }
      : {}),
    ...(obj.generate ? { generated: obj.generate } : {}),
  };
}
