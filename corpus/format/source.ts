/**
 * Parsing of a model or scheduler text, YAML 1.2 or JSON, into plain values plus a `locate`
 * function that maps a path in those values back to a line and column of the text.
 *
 * JSON (a text whose first character is '{' and which the JSON scanner accepts) takes the fast
 * path: scanned for syntax, duplicate keys and depth, then parsed by `JSON.parse`; positions are
 * recovered only when an error must be located. Anything else is parsed as YAML (yamlSource.ts)
 * with node ranges, unique keys and an alias budget; YAML warnings (such as unknown tags) are
 * errors, and every number must be written in decimal (YAML's hexadecimal, octal, .inf and .nan
 * are refused).
 */
import { readFileSync, statSync } from 'node:fs';
import { ModelError, posOf } from './errors.js';
import type { Pos } from './errors.js';
import { jsonLocate, scanJson } from './jsonScan.js';
import { MAX_DEPTH, MAX_FILE_BYTES, MAX_JSON_ENTRIES, MAX_JSON_VALUES, MAX_YAML_BYTES } from './limits.js';
import { parsedYaml } from './yamlSource.js';

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
    const scan = scanJson(text, MAX_DEPTH, { values: MAX_JSON_VALUES, entries: MAX_JSON_ENTRIES });
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
