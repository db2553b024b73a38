/**
 * An external solver as one more method of `check`: the model is handed over as crossbound/1 JSON,
 * the answer comes back as a result (or a fault), never as an exception.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import { exportJson } from '../../corpus/format/export.js';
import type { Model } from '../../corpus/format/types.js';
import { runExternal } from '../external/run.js';
import { splitTemplate } from '../external/template.js';
import { solvedResult } from './methods.js';
import type { MethodResult } from './types.js';

/** 'solver:NAME#I': NAME is the last path part of the last word before {model} that looks like a file (the script), else of the command. */
export function solverLabel(template: string, index: number): string {
  let words: string[];
  try {
    words = splitTemplate(template);
  } catch {
    words = [template];
  }
  const upTo = words.findIndex((w) => w.includes('{model}'));
  const before = upTo > 0 ? words.slice(0, upTo) : words.slice(0, 1);
  const word = [...before].reverse().find((w) => /[/.]/.test(w)) ?? before[0] ?? 'solver';
  const base = (word.split('/').pop() || 'solver').replace(/[^A-Za-z0-9_.-]/g, '_');
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
    const tail = out.stderrTail?.trim().split('\n').pop();
    return { label, status: 'fault', fault: out.fault, reason: tail ? `${out.detail} (stderr: ${tail.slice(0, 300)})` : out.detail, seconds: out.seconds };
  }
  return solvedResult(label, out.solved, opts.precision, out.seconds);
}
