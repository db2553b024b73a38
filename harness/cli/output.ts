/** Writing report files: to a temporary name beside the target, then renamed, so nothing is half-written. */
import { renameSync, writeFileSync } from 'node:fs';
import { UsageError } from '../errors.js';

export function writeFileAtomic(path: string, text: string): void {
  const tmp = `${path}.${process.pid}.tmp`;
  try {
    writeFileSync(tmp, text);
    renameSync(tmp, path);
  } catch (e) {
    throw new UsageError(`${path}: cannot write (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
}

export function parsePrecision(text: string, option = '--precision'): number {
  const p = Number(text);
  if (!(Number.isFinite(p) && p > 0 && p < 1)) throw new UsageError(`${option} must be a number in (0, 1) (got '${text}')`);
  return p;
}

export function parsePositiveInt(text: string, option: string, max = 1e9): number {
  const n = Number(text);
  if (!(Number.isInteger(n) && n >= 1 && n <= max)) throw new UsageError(`${option} must be a whole number from 1 to ${max} (got '${text}')`);
  return n;
}
