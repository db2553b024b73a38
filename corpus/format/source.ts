/**
 * Parsing of a model or scheduler text, YAML 1.2 or JSON, into plain values plus a `locate`
 * function that maps a path in those values back to a line and column of the text.
 *
 * JSON (a text whose first character is '{' and which the JSON scanner accepts) takes the fast
 * path: scanned for syntax, duplicate keys and depth, then parsed by `JSON.parse`; positions are
 * recovered only when an error must be located. Anything else is parsed as YAML with node ranges,
 * unique keys and an alias budget; YAML warnings (such as unknown tags) are errors, and every
 * number must be written in decimal (YAML's hexadecimal, octal, .inf and .nan are refused).
 */
import { readFileSync, statSync } from 'node:fs';
import { Alias, isAlias, isMap, isPair, isScalar, isSeq, LineCounter, parseDocument, visit } from 'yaml';
import type { Document, Node as YamlNode } from 'yaml';
import { ModelError, posOf } from './errors.js';
import type { Pos } from './errors.js';
import { jsonLocate, scanJson } from './jsonScan.js';
import { YAML_DECIMAL } from './numbers.js';
import { MAX_ALIAS_COUNT, MAX_DEPTH, MAX_FILE_BYTES, MAX_YAML_BYTES, yamlDepthExceeded } from './limits.js';

export type Path = readonly (string | number)[];

export interface Parsed {
  readonly file: string;
  readonly value: unknown;
  readonly syntax: 'json' | 'yaml';
  /** Position of the key or the value at `path` (the nearest existing node when the path is missing). */
  locate(path: Path, part?: 'key' | 'value'): Pos;
}

/** Throw the error for `rule` at `path` of a parsed input. */
export function fail(p: Parsed, path: Path, rule: string, detail?: string, part: 'key' | 'value' = 'value'): never {
  const pos = p.locate(path, part);
  throw new ModelError(p.file, pos.line, pos.column, rule, detail);
}

const MiB = 1024 * 1024;

/** Read a file after checking its size against the limit (before reading it). */
export function readLimited(path: string): string {
  let size: number;
  try {
    const st = statSync(path);
    if (!st.isFile()) throw new ModelError(path, undefined, undefined, 'not a regular file');
    size = st.size;
  } catch (e) {
    if (e instanceof ModelError) throw e;
    throw new ModelError(path, undefined, undefined, 'cannot read the file', `(${(e as NodeJS.ErrnoException).code ?? String(e)})`);
  }
  if (size > MAX_FILE_BYTES) {
    throw new ModelError(path, undefined, undefined, `file is larger than the limit of ${MAX_FILE_BYTES / MiB} MiB`, `(${size} bytes)`);
  }
  return readFileSync(path, 'utf8');
}

export function parseText(text: string, file: string): Parsed {
  if (text.length > MAX_FILE_BYTES) {
    throw new ModelError(file, undefined, undefined, `input is larger than the limit of ${MAX_FILE_BYTES / MiB} MiB`);
  }
  if (text.charCodeAt(0) === 0xfeff) text = ` ${text.slice(1)}`;
  if (text.trim() === '') throw new ModelError(file, 1, 1, 'file is empty');
  const first = text.search(/\S/);
  if (text.charCodeAt(first) === 0x7b) {
    const scan = scanJson(text, MAX_DEPTH);
    if (scan.ok) return parsedJson(text, file);
    // Not JSON: it may still be a YAML flow mapping. A .json file reports the JSON error.
    if (/\.json$/i.test(file) || scan.rule !== 'JSON syntax error' || text.length > MAX_YAML_BYTES) {
      const pos = posOf(text, scan.offset);
      throw new ModelError(file, pos.line, pos.column, scan.rule, `: ${scan.message}`);
    }
  }
  return parsedYaml(text, file);
}

function parsedJson(text: string, file: string): Parsed {
  const value: unknown = JSON.parse(text);
  return { file, value, syntax: 'json', locate: (path, part = 'value') => posOf(text, jsonLocate(text, path, part)) };
}

function parsedYaml(text: string, file: string): Parsed {
  if (text.length > MAX_YAML_BYTES) {
    throw new ModelError(file, 1, 1, `YAML input is larger than the limit of ${MAX_YAML_BYTES / MiB} MiB`, '(write large models as JSON)');
  }
  const deep = yamlDepthExceeded(text, MAX_DEPTH);
  if (deep >= 0) {
    const pos = posOf(text, deep);
    throw new ModelError(file, pos.line, pos.column, 'nesting too deep', `(more than ${MAX_DEPTH} levels)`);
  }
  const lc = new LineCounter();
  const doc = parseDocument(text, { lineCounter: lc, uniqueKeys: true, prettyErrors: false, version: '1.2' });
  const problem = doc.errors[0] ?? doc.warnings[0];
  if (problem) {
    const offset = problem.pos[0];
    const pos = posOf(text, offset);
    const rule = problem.code === 'DUPLICATE_KEY' ? 'duplicate key' : 'YAML syntax error';
    const msg = problem.message.split('\n')[0]!.replace(/ at line \d+, column \d+:?$/, '');
    throw new ModelError(file, pos.line, pos.column, rule, `: ${msg}`);
  }
  const at = (offset: number): Pos => posOf(text, offset);
  let badNumber: { offset: number; source: string } | undefined;
  visit(doc, {
    Scalar(_k, node) {
      if (typeof node.value === 'number' && !YAML_DECIMAL.test(node.source ?? String(node.value))) {
        badNumber = { offset: node.range?.[0] ?? 0, source: node.source ?? String(node.value) };
        return visit.BREAK;
      }
      return undefined;
    },
  });
  if (badNumber) {
    const pos = at(badNumber.offset);
    throw new ModelError(file, pos.line, pos.column, 'numbers must be finite and written in decimal', `(got ${badNumber.source})`);
  }
  let value: unknown;
  try {
    value = doc.toJS({ maxAliasCount: MAX_ALIAS_COUNT });
  } catch (e) {
    throw new ModelError(file, 1, 1, 'too many YAML alias expansions', `(limit ${MAX_ALIAS_COUNT}): ${(e as Error).message}`);
  }
  return { file, value, syntax: 'yaml', locate: (path, part = 'value') => at(yamlLocate(doc, path, part)) };
}

function yamlLocate(doc: Document, path: Path, part: 'key' | 'value'): number {
  let node: unknown = doc.contents;
  let keyAt = (doc.contents as YamlNode | null)?.range?.[0] ?? 0;
  let lastAt = keyAt;
  for (const seg of path) {
    for (let guard = 0; isAlias(node) && guard < MAX_DEPTH; guard++) node = (node as Alias).resolve(doc);
    let next: unknown;
    if (isMap(node)) {
      const pair = node.items.find((it) => isPair(it) && String(isScalar(it.key) ? it.key.value : it.key) === String(seg));
      if (pair) {
        keyAt = (pair.key as YamlNode | null)?.range?.[0] ?? lastAt;
        next = pair.value ?? null;
        if (next === null) return keyAt;
      }
    } else if (isSeq(node) && typeof seg === 'number') {
      next = node.items[seg];
      keyAt = (next as YamlNode | undefined)?.range?.[0] ?? lastAt;
    }
    if (next === undefined) return lastAt;
    node = next;
    lastAt = (node as YamlNode).range?.[0] ?? lastAt;
  }
  return part === 'key' ? keyAt : lastAt;
}
