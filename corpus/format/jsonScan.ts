/**
 * A JSON syntax scanner (RFC 8259) that checks, without building values, what `JSON.parse` does not
 * report or reports without a line: syntax errors with their offset, duplicate keys in an object,
 * and nesting deeper than a limit. It is iterative (no recursion), so no input can overflow the
 * stack. A text it accepts is then parsed by `JSON.parse`, the fast path for large models.
 *
 * `jsonLocate` finds the offset of the key or value at a path in a text the scanner accepted; it
 * is only run when an error must be located.
 */

export type JsonScan = { ok: true } | { ok: false; offset: number; message: string; rule: string };

const enum Want {
  Value,
  ValueOrClose, // after '['
  KeyOrClose, // after '{'
  Key, // after ',' in an object
  Colon,
  CommaOrClose,
}

function isWs(c: number): boolean {
  return c === 0x20 || c === 0x0a || c === 0x0d || c === 0x09;
}

/** Offset just past the string that starts at `i` (a '"'), or −(offset of the fault) − 1. */
function endOfString(t: string, i: number): number {
  for (let j = i + 1; j < t.length; j++) {
    const c = t.charCodeAt(j);
    if (c === 0x22) return j + 1;
    if (c < 0x20) return -j - 1;
    if (c === 0x5c) {
      const e = t.charCodeAt(j + 1);
      if (e === 0x75) {
        if (!/^[0-9a-fA-F]{4}$/.test(t.slice(j + 2, j + 6))) return -j - 1;
        j += 5;
      } else if (e === 0x22 || e === 0x5c || e === 0x2f || e === 0x62 || e === 0x66 || e === 0x6e || e === 0x72 || e === 0x74) {
        j++;
      } else return -j - 1;
    }
  }
  return -t.length - 1;
}

const NUMBER = /-?(?:0|[1-9][0-9]*)(?:\.[0-9]+)?(?:[eE][-+]?[0-9]+)?/y;

/** Offset just past the scalar (number or literal) at `i`, or −1. */
function endOfScalar(t: string, i: number): number {
  const c = t.charCodeAt(i);
  if (c === 0x74) return t.startsWith('true', i) ? i + 4 : -1;
  if (c === 0x66) return t.startsWith('false', i) ? i + 5 : -1;
  if (c === 0x6e) return t.startsWith('null', i) ? i + 4 : -1;
  if (c === 0x2d || (c >= 0x30 && c <= 0x39)) {
    NUMBER.lastIndex = i;
    return NUMBER.test(t) ? NUMBER.lastIndex : -1;
  }
  return -1;
}

function keyText(t: string, from: number, to: number): string {
  const raw = t.slice(from + 1, to - 1);
  return raw.includes('\\') ? (JSON.parse(t.slice(from, to)) as string) : raw;
}

/** Budgets on what `JSON.parse` will build: values (scalars, lists and mappings) and mapping entries. */
export interface JsonBudget {
  readonly values: number;
  readonly entries: number;
}

export function scanJson(t: string, maxDepth: number, budget: JsonBudget = { values: Infinity, entries: Infinity }): JsonScan {
  const syntax = (offset: number, message: string): JsonScan => ({ ok: false, offset, message, rule: 'JSON syntax error' });
  const tooLarge = (offset: number, what: string, limit: number): JsonScan =>
    ({ ok: false, offset, message: `more than ${limit.toLocaleString('en-US')} ${what} (a memory limit; see the README's limits)`, rule: 'model too large' });
  let values = 0;
  let entries = 0;
  // Stack of open containers: null for an array, the set of keys seen for an object.
  const stack: (Set<string> | null)[] = [];
  let want = Want.Value;
  let i = 0;
  const n = t.length;
  for (;;) {
    while (i < n && isWs(t.charCodeAt(i))) i++;
    if (i >= n) {
      if (stack.length === 0 && want === Want.CommaOrClose) return { ok: true };
      return syntax(n, stack.length ? 'unexpected end of input: a list or mapping is not closed' : 'unexpected end of input');
    }
    const c = t.charCodeAt(i);
    const top = stack.length ? stack[stack.length - 1] : undefined;
    switch (want) {
      case Want.Value:
      case Want.ValueOrClose:
        if (c === 0x5d && want === Want.ValueOrClose) {
          stack.pop();
          i++;
          want = Want.CommaOrClose;
          break;
        }
        if (++values > budget.values) return tooLarge(i, 'JSON values', budget.values);
        if (c === 0x5b || c === 0x7b) {
          if (stack.length >= maxDepth) return { ok: false, offset: i, message: `nesting is deeper than ${maxDepth} levels`, rule: 'nesting too deep' };
          stack.push(c === 0x5b ? null : new Set());
          i++;
          want = c === 0x5b ? Want.ValueOrClose : Want.KeyOrClose;
        } else if (c === 0x22) {
          const e = endOfString(t, i);
          if (e < 0) return syntax(-e - 1, 'bad character or escape in a string');
          i = e;
          want = Want.CommaOrClose;
        } else {
          const e = endOfScalar(t, i);
          if (e < 0) return syntax(i, `unexpected character ${JSON.stringify(t[i])}, expected a value`);
          i = e;
          want = Want.CommaOrClose;
        }
        break;
      case Want.KeyOrClose:
      case Want.Key:
        if (c === 0x7d && want === Want.KeyOrClose) {
          stack.pop();
          i++;
          want = Want.CommaOrClose;
        } else if (c === 0x22) {
          const e = endOfString(t, i);
          if (e < 0) return syntax(-e - 1, 'bad character or escape in a string');
          const k = keyText(t, i, e);
          if (++entries > budget.entries) return tooLarge(i, 'mapping entries', budget.entries);
          if (top!.has(k)) return { ok: false, offset: i, message: `key ${JSON.stringify(k)} appears twice in this mapping`, rule: 'duplicate key' };
          top!.add(k);
          i = e;
          want = Want.Colon;
        } else return syntax(i, `expected a double-quoted key${want === Want.Key ? ' (no trailing comma allowed)' : " or '}'"}`);
        break;
      case Want.Colon:
        if (c !== 0x3a) return syntax(i, "expected ':' after a key");
        i++;
        want = Want.Value;
        break;
      case Want.CommaOrClose:
        if (top === undefined) return syntax(i, 'unexpected text after the end of the document');
        if (c === 0x2c) {
          i++;
          want = top === null ? Want.Value : Want.Key;
        } else if ((c === 0x5d && top === null) || (c === 0x7d && top !== null)) {
          stack.pop();
          i++;
        } else return syntax(i, top === null ? "expected ',' or ']' after a list item" : "expected ',' or '}' after a value");
        break;
    }
  }
}

/** Offset just past the value starting at `i` in an accepted text (brackets counted, strings skipped). */
function skipValue(t: string, i: number): number {
  let depth = 0;
  for (;;) {
    const c = t.charCodeAt(i);
    if (c === 0x22) i = endOfString(t, i);
    else if (c === 0x5b || c === 0x7b) {
      depth++;
      i++;
    } else if (c === 0x5d || c === 0x7d) {
      depth--;
      i++;
    } else if (depth === 0) return endOfScalar(t, i);
    else i++;
    if (depth === 0) return i;
  }
}

function skipWs(t: string, i: number): number {
  while (i < t.length && isWs(t.charCodeAt(i))) i++;
  return i;
}

/**
 * Offset of the key (part 'key') or value (part 'value') at `path` in an accepted JSON text. When the
 * path leaves the document (a missing key), the offset of the deepest container found is returned.
 */
export function jsonLocate(t: string, path: readonly (string | number)[], part: 'key' | 'value'): number {
  let at = skipWs(t, 0);
  let keyAt = at;
  for (const seg of path) {
    const c = t.charCodeAt(at);
    let found = -1;
    if (c === 0x7b && typeof seg === 'string') {
      let i = skipWs(t, at + 1);
      while (t.charCodeAt(i) === 0x22) {
        const e = endOfString(t, i);
        const k = keyText(t, i, e);
        const v = skipWs(t, skipWs(t, e) + 1);
        if (k === seg) {
          keyAt = i;
          found = v;
          break;
        }
        i = skipWs(t, skipValue(t, v));
        if (t.charCodeAt(i) === 0x2c) i = skipWs(t, i + 1);
      }
    } else if (c === 0x5b && typeof seg === 'number') {
      let i = skipWs(t, at + 1);
      for (let k = 0; t.charCodeAt(i) !== 0x5d && i < t.length; k++) {
        if (k === seg) {
          found = i;
          keyAt = i;
          break;
        }
        i = skipWs(t, skipValue(t, i));
        if (t.charCodeAt(i) === 0x2c) i = skipWs(t, i + 1);
      }
    }
    if (found < 0) return at;
    at = found;
  }
  return part === 'key' ? keyAt : at;
}
