/**
 * Shared checks of the loaders: mappings with a fixed set of keys, names, rates and decimals, each
 * throwing a positioned `ModelError` through `fail`.
 */
import { got } from './errors.js';
import { readDecimal } from './numbers.js';
import type { RateInput } from './build.js';
import { fail } from './source.js';
import type { Parsed, Path } from './source.js';

export const NAME = /^[A-Za-z_][A-Za-z0-9_.-]*$/;
export const NAME_RULE = 'state and action names must match [A-Za-z_][A-Za-z0-9_.-]*';

export function isMapping(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/**
 * An empty mapping without a prototype, for mappings keyed by names from the input: a state called
 * `__proto__` stays an ordinary key, and V8 keeps such an object in dictionary mode instead of
 * making a hidden class per distinct first key (which costs time and memory per state name).
 */
export function record<T>(): Record<string, T> {
  return Object.create(null) as Record<string, T>;
}

/** The value at `path` must be a mapping (or null/absent when `nullable`, read as empty). */
export function mapping(p: Parsed, path: Path, v: unknown, what: string, nullable = false): Record<string, unknown> {
  if (nullable && (v === null || v === undefined)) return {};
  if (!isMapping(v)) fail(p, path, `${what} must be a mapping`, got(v));
  return v;
}

/** Every key of `m` must be in `allowed`. */
export function onlyKeys(p: Parsed, path: Path, m: Record<string, unknown>, allowed: readonly string[], where: string): void {
  for (const k in m) {
    if (!allowed.includes(k)) {
      fail(p, [...path, k], 'unknown key', `'${k}' in ${where} (allowed: ${allowed.join(', ')})`, 'key');
    }
  }
}

export function name(p: Parsed, path: Path, v: unknown, part: 'key' | 'value' = 'value'): string {
  if (typeof v !== 'string' || !NAME.test(v)) fail(p, path, NAME_RULE, got(v), part);
  return v;
}

export function str(p: Parsed, path: Path, v: unknown, what: string): string {
  if (typeof v !== 'string') fail(p, path, `${what} must be a string`, got(v));
  return v;
}

/** A rate: a finite number ≥ 0 or a decimal string; returned as given (number or string). */
export function rate(p: Parsed, path: Path, v: unknown): RateInput {
  if (typeof v === 'number' && v >= 0 && v < Infinity) return v;
  const r = readDecimal(v);
  if (!r.ok) {
    if (r.reason === 'underflow') fail(p, path, 'rate must be a finite number ≥ 0', `${got(v)}; it underflows to 0 in double precision`);
    fail(p, path, 'rate must be a finite number ≥ 0', `or a decimal string ${got(v)}`);
  }
  if (r.value < 0) {
    fail(p, path, 'rate must be a finite number ≥ 0', got(v));
  }
  return v as RateInput;
}

/** A finite decimal (number or decimal string) satisfying `ok`, else the error `rule`. */
export function decimal(p: Parsed, path: Path, v: unknown, rule: string, ok: (x: number) => boolean): RateInput {
  const r = readDecimal(v);
  if (!r.ok) fail(p, path, rule, r.reason === 'underflow' ? `${got(v)}; it underflows to 0 in double precision` : got(v));
  if (!ok(r.value)) fail(p, path, rule, got(v));
  return v as RateInput;
}

export function oneOf<T extends string>(p: Parsed, path: Path, v: unknown, options: readonly T[], rule: string): T {
  if (typeof v !== 'string' || !options.includes(v as T)) fail(p, path, rule, got(v));
  return v as T;
}
