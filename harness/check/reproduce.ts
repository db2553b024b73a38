/** The one command that reproduces a failed check: the model file, the precision, and only the methods involved. */
import { solverLabel } from './external.js';
import { formatPrecision } from '../numbers.js';

/** A word quoted for a POSIX shell (single quotes; a quote inside as '\''), bare when that is safe. */
export function shellQuote(s: string): string {
  return /^[A-Za-z0-9_./:=,+@%-]+$/.test(s) ? s : `'${s.replace(/'/g, `'\\''`)}'`;
}

export function reproduceCommand(
  file: string,
  labels: readonly string[],
  opts: { precision: number; solvers?: readonly string[]; timeoutMs?: number; defaultBound?: 'precision' | number },
): string {
  const templates = (opts.solvers ?? []).map((t, i) => ({ id: solverLabel(t, i), template: t }));
  const external = templates.filter((t) => labels.includes(t.id));
  const own = labels.filter((l) => !templates.some((t) => t.id === l));
  const parts = ['crossbound', 'check', shellQuote(file), '--precision', formatPrecision(opts.precision), '--methods', own.join(',') || 'none'];
  for (const t of external) parts.push('--solver', shellQuote(t.template));
  if (external.length > 0 && opts.timeoutMs !== undefined && opts.timeoutMs !== 60_000) parts.push('--timeout', String(opts.timeoutMs / 1000));
  if (external.length > 0 && opts.defaultBound !== undefined) parts.push('--default-bound', String(opts.defaultBound));
  return parts.join(' ');
}
