/**
 * Export of a `Model`: `exportJson` writes format crossbound/1 in the `states` form (a plain object,
 * ready for JSON.stringify; loading it gives back an equal model, generated provenance aside);
 * `exportTable` writes a readable text table of states, owners, actions, successors and rates.
 *
 * Rates and the time bound are written as numbers when their exact text is the number's shortest
 * form, and as decimal strings otherwise, so that the exact text the oracles read survives.
 */
import type { ModelObject, RateInput } from './build.js';
import type { Model } from './types.js';

function exact(value: number, text: string): RateInput {
  return String(value) === text ? value : text;
}

export function exportJson(model: Model): ModelObject & { format: string } {
  const names = model.states.map((s) => s.name);
  const states: NonNullable<ModelObject['states']> = {};
  for (const s of model.states) {
    const actions: Record<string, Record<string, RateInput>> = {};
    for (const a of s.actions) {
      const succ: Record<string, RateInput> = {};
      for (const t of a.successors) succ[names[t.target]!] = exact(t.rate, t.rateText);
      actions[a.name] = succ;
    }
    states[s.name] = s.owner ? { owner: s.owner, actions } : { actions };
  }
  const out: ModelObject & { format: string } = {
    format: 'crossbound/1',
    name: model.name,
    ...(model.description !== undefined ? { description: model.description } : {}),
    time_bound: exact(model.timeBound, model.timeBoundText),
    goal: model.goal.map((g) => names[g]!),
    goal_mode: model.goalMode,
    ...(model.initial !== undefined ? { initial: names[model.initial]! } : {}),
    states,
  };
  if (model.expect) {
    out.expect = { values: { ...model.expect.values }, tolerance: model.expect.tolerance, source: model.expect.source };
  }
  return out;
}

/** A text table: one line per (state, action, successor), with the model's header above it. */
export function exportTable(model: Model): string {
  const names = model.states.map((s) => s.name);
  const goal = new Set(model.goal);
  const rows: string[][] = [['state', 'owner', 'action', 'successor', 'rate']];
  model.states.forEach((s, i) => {
    const label = `${s.name}${goal.has(i) ? ' (goal)' : ''}${model.initial === i ? ' (initial)' : ''}`;
    const owner = s.owner ?? (s.actions.length >= 2 ? '?' : '-');
    if (s.actions.length === 0) rows.push([label, owner, '-', '(absorbing)', '']);
    for (const a of s.actions) {
      if (a.successors.length === 0) rows.push([label, owner, a.name, '(none)', '']);
      for (const t of a.successors) rows.push([label, owner, a.name, names[t.target]!, t.rateText]);
    }
  });
  const width = rows[0]!.map((_, c) => Math.max(...rows.map((r) => r[c]!.length)));
  const line = (r: string[]): string => r.map((x, c) => (c === 4 ? x : x.padEnd(width[c]!))).join('  ').trimEnd();
  const header = [
    `model ${model.name}: ${names.length} states, time bound ${model.timeBoundText}, goal mode ${model.goalMode}`,
    ...(model.description ? [model.description] : []),
    '',
    line(rows[0]!),
    width.map((w, c) => '-'.repeat(c === 4 ? Math.max(4, w) : w)).join('  '),
  ];
  return `${[...header, ...rows.slice(1).map(line)].join('\n')}\n`;
}
