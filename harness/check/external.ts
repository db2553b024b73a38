/**
 * An external solver as one more method of `check`: the model is handed over as crossbound/1 JSON,
 * the answer comes back as a result (or a fault), never as an exception.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import { exportJson } from '../../corpus/format/export.js';
import type { Model } from '../../corpus/format/types.js';
import { runExternal } from '../external/run.js';
import { plainChoices } from './methods.js';
import type { MethodResult } from './types.js';

export function solverLabel(template: string, index: number): string {
  const first = template.trim().split(/\s+/)[0] ?? 'solver';
  const base = first.replace(/^['"]|['"]$/g, '').split('/').pop() || 'solver';
  return `solver:${base}#${index + 1}`;
}

export async function runExternalMethod(
  template: string,
  index: number,
  model: Model,
  compiled: CompiledModel,
  opts: { precision: number; timeoutMs?: number },
): Promise<MethodResult> {
  const label = solverLabel(template, index);
  const out = await runExternal(template, exportJson(model), compiled.stateNames, {
    precision: opts.precision,
    timeBound: model.timeBound,
    timeoutMs: opts.timeoutMs ?? 60_000,
  });
  if (out.kind === 'fault') {
    return { label, status: 'fault', fault: out.fault, reason: out.detail, seconds: out.seconds };
  }
  const s = out.solved;
  return {
    label,
    status: 'solved',
    values: [...s.values],
    ...(s.valuesDecimal ? { valuesDecimal: [...s.valuesDecimal] } : {}),
    errorBound: s.errorBound,
    precision: opts.precision,
    seconds: out.seconds,
    stats: { ...s.stats },
    ...(s.scheduler ? { scheduler: { choices: plainChoices(s.scheduler.choices) } } : {}),
  };
}
