/**
 * Loading fixed schedulers, format crossbound-scheduler/1, for a given model. Same syntax and error
 * style as the model loader (`file:line:column: rule`). Rules: `choices` maps declared states to
 * lists of segments `{ from, action }`; the action exists in that state; `from` values are finite,
 * strictly increasing, the first is 0 and all lie within [0, T] (elapsed time); every owned state
 * (two or more actions) is given; `model`, if present, is the model's name.
 */
import { got } from './errors.js';
import { readDecimal } from './numbers.js';
import { mapping, oneOf, onlyKeys, str } from './rules.js';
import type { Scheduler, Segment } from './scheduler.js';
import { fail, parseText, readLimited } from './source.js';
import type { Model } from './types.js';

export const SCHEDULER_FORMAT = 'crossbound-scheduler/1';

export function loadSchedulerFile(path: string, model: Model): Scheduler {
  return loadSchedulerText(readLimited(path), path, model);
}

export function loadSchedulerText(text: string, file: string, model: Model): Scheduler {
  const p = parseText(text, file);
  const top = mapping(p, [], p.value, 'a scheduler');
  onlyKeys(p, [], top, ['format', 'model', 'choices'], 'the scheduler');
  if (top.format === undefined) fail(p, [], `format must be ${SCHEDULER_FORMAT}`, '(the key format is missing)');
  oneOf(p, ['format'], top.format, [SCHEDULER_FORMAT], `format must be ${SCHEDULER_FORMAT}`);
  if (top.model !== undefined && str(p, ['model'], top.model, 'model') !== model.name) {
    fail(p, ['model'], 'the scheduler names another model', `(it is for ${JSON.stringify(top.model)}, the model is ${JSON.stringify(model.name)})`);
  }
  if (top.choices === undefined) fail(p, [], 'choices is required', '(a mapping from owned states to segments)');
  const raw = mapping(p, ['choices'], top.choices, 'choices');
  const byName = new Map(model.states.map((s) => [s.name, s] as const));
  const T = model.timeBound;
  const choices: Record<string, Segment[]> = {};
  for (const s in raw) {
    const st = byName.get(s);
    if (!st) fail(p, ['choices', s], 'choices must name states of the model', got(s), 'key');
    const list = raw[s];
    if (!Array.isArray(list) || list.length === 0) fail(p, ['choices', s], 'the choices of a state must be a non-empty list of { from, action }', got(list));
    const segs: Segment[] = [];
    list.forEach((g: unknown, i: number) => {
      const gp = ['choices', s, i];
      const m = mapping(p, gp, g, 'a segment');
      onlyKeys(p, gp, m, ['from', 'action'], 'a segment');
      if (m.from === undefined || m.action === undefined) fail(p, gp, 'a segment needs from and action', got(g));
      const r = readDecimal(m.from);
      if (!r.ok) fail(p, [...gp, 'from'], 'from must be a finite number', got(m.from));
      const from = r.value;
      if (i === 0 && from !== 0) fail(p, [...gp, 'from'], 'the first segment must start at from = 0', got(m.from));
      if (i > 0 && !(from > segs[i - 1]!.from)) fail(p, [...gp, 'from'], 'from values must be strictly increasing', `(got ${from} after ${segs[i - 1]!.from})`);
      if (from > T) fail(p, [...gp, 'from'], `from must lie within [0, T] = [0, ${model.timeBoundText}]`, got(m.from));
      const action = str(p, [...gp, 'action'], m.action, 'action');
      if (!st.actions.some((a) => a.name === action)) {
        const known = st.actions.map((a) => a.name).join(', ') || 'none: the state is absorbing';
        fail(p, [...gp, 'action'], 'the action must exist in that state', `('${action}' in ${s}; its actions: ${known})`);
      }
      segs.push({ from, action });
    });
    choices[s] = segs;
  }
  for (const st of model.states) {
    if (st.actions.length >= 2 && !(st.name in choices)) {
      fail(p, ['choices'], 'every owned state must be given', `('${st.name}' has ${st.actions.length} actions and no segments)`, 'key');
    }
  }
  return { ...(typeof top.model === 'string' ? { model: top.model } : {}), choices };
}
