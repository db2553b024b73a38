/**
 * JSON keys in one style: snake_case, as in the result format crossbound-result/1 (`error_bound`,
 * `values_decimal`, `time_bound`). The harness works with camelCase fields inside; every JSON file it
 * writes (`check --json`, `merge --json`, `bench --json`) goes through toSnakeKeys, and `merge` reads
 * reports back through toCamelKeys (which leaves the keys of older, camelCase reports as they are).
 *
 * Keys that are names from a model (the states of a scheduler's `choices`) are data, not field names:
 * they are copied unchanged, in both directions.
 */

/** Fields whose value is a mapping keyed by names from the model or from a solver (its own `params`). */
const NAME_KEYED: ReadonlySet<string> = new Set(['choices', 'params']);
/** Fields written in snake_case already and copied whole (the run's identity, with solvers' own names inside). */
const VERBATIM: ReadonlySet<string> = new Set(['identity']);

/** `errorBound` → `error_bound`, `lambdaT` → `lambda_t`, `aPrioriBound` → `a_priori_bound`. */
export function snakeKey(key: string): string {
  return key.replace(/(?<=.)[A-Z]/g, (c) => `_${c.toLowerCase()}`);
}

/** `error_bound` → `errorBound` (the inverse of snakeKey on its results; a camelCase key is unchanged). */
export function camelKey(key: string): string {
  return key.replace(/(?<=[A-Za-z0-9])_([a-z])/g, (_, c: string) => c.toUpperCase());
}

function mapKeys(value: unknown, rename: (key: string) => string): unknown {
  if (Array.isArray(value)) return value.map((v) => mapKeys(v, rename));
  if (value === null || typeof value !== 'object') return value;
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(value)) {
    out[rename(k)] = VERBATIM.has(k) ? v : NAME_KEYED.has(k) ? copyNames(v, rename) : mapKeys(v, rename);
  }
  return out;
}

/** A name-keyed mapping: its keys stay, its values are converted. */
function copyNames(value: unknown, rename: (key: string) => string): unknown {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) return mapKeys(value, rename);
  return Object.fromEntries(Object.entries(value).map(([name, v]) => [name, mapKeys(v, rename)]));
}

export function toSnakeKeys(value: unknown): unknown {
  return mapKeys(value, snakeKey);
}

export function toCamelKeys(value: unknown): unknown {
  return mapKeys(value, camelKey);
}
