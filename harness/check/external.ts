/**
 * An external solver as one more method of `check`: the model is handed over as crossbound/1 JSON,
 * the answer comes back as a result (or a fault), never as an exception.
 */
import { accessSync, constants, statSync } from 'node:fs';
import { delimiter, join } from 'node:path';
import type { CompiledModel } from '../../corpus/format/compile.js';
import { exportJson } from '../../corpus/format/export.js';
import type { Model } from '../../corpus/format/types.js';
import { runExternal } from '../external/run.js';
import { checkPlaceholders, splitTemplate, TemplateError } from '../external/template.js';
import { certifyExternalTrajectory } from './certified.js';
import { solvedResult } from './methods.js';
import type { MethodResult } from './types.js';

/** `--default-bound`: 'precision' holds a result without error_bound to the precision asked; a number B to B. */
export type DefaultBound = 'precision' | number;

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
  opts: { precision: number; timeoutMs?: number; defaultBound?: DefaultBound },
): Promise<MethodResult> {
  const id = { label: solverLabel(template, index), family: `solver#${index + 1}` as const };
  // The solver under test never sees the model's reference values.
  const { expect: _reference, ...given } = exportJson(model);
  const out = await runExternal(template, given, compiled.stateNames, {
    precision: opts.precision,
    timeBound: model.timeBound,
    timeoutMs: opts.timeoutMs ?? 60_000,
    ...(opts.defaultBound !== undefined ? { defaultBound: opts.defaultBound === 'precision' ? opts.precision : opts.defaultBound } : {}),
  });
  if (out.kind === 'refused') return { ...id, status: 'refused', code: out.code ?? 'unspecified', reason: out.reason, seconds: out.seconds, reported: out.reported };
  if (out.kind === 'fault') {
    const tail = out.stderrTail?.trim().split('\n').pop();
    const reason = tail ? `${out.detail} (stderr: ${tail.slice(0, 300)})` : out.detail;
    return { ...id, status: 'fault', fault: out.fault, reason, seconds: out.seconds };
  }
  const reported = { ...out.reported, ...(Object.keys(out.solved.params).length > 0 ? { params: { ...out.solved.params } } : {}) };
  const plain = { ...solvedResult(id, out.solved, { requested: opts.precision, precision: opts.precision }, out.seconds), reported };
  // A returned trajectory is certified here (./certified.ts); only the enclosure travels on.
  const tr = out.solved.trajectory;
  const solved = tr ? { ...plain, certificate: certifyExternalTrajectory(compiled, tr) } : plain;
  return out.boundAssumed ? { ...solved, boundAssumed: true } : solved;
}

/**
 * Before anything is solved: the template must split and name only known placeholders, and its
 * command must be startable (an executable file, given by path or found on PATH). Returns the
 * problem in one line, or undefined. The command is not run.
 */
export function solverProblem(template: string): string | undefined {
  let words: string[];
  try {
    words = splitTemplate(template);
    checkPlaceholders(words);
  } catch (e) {
    if (e instanceof TemplateError) return `--solver '${template}': ${e.message}`;
    throw e;
  }
  const cmd = words[0]!;
  if (/[{}]/.test(cmd)) return `--solver '${template}': the command itself may not be a placeholder`;
  const candidates = cmd.includes('/') ? [cmd] : (process.env.PATH ?? '').split(delimiter).filter(Boolean).map((d) => join(d, cmd));
  const runnable = candidates.some((p) => {
    try {
      accessSync(p, constants.X_OK);
      return statSync(p).isFile();
    } catch {
      return false;
    }
  });
  return runnable ? undefined : `--solver '${template}': cannot start '${cmd}': ${cmd.includes('/') ? 'no executable file there' : 'not found on PATH'}`;
}
