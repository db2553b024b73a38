/**
 * Which files `check PATH...` reads: a file is taken as given; a directory is walked recursively
 * for *.yaml, *.yml and *.json, skipping the folders `format` and `generators` (the schema and the
 * generator code live there, not models) and `node_modules`. The list is sorted, so shards and
 * reports are deterministic.
 */
import { readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { UsageError } from '../errors.js';

const SKIP = new Set(['format', 'generators', 'node_modules']);
const MODEL_FILE = /\.(ya?ml|json)$/i;

export function collectModelFiles(paths: readonly string[]): string[] {
  const out: string[] = [];
  const walk = (dir: string): void => {
    for (const e of readdirSync(dir, { withFileTypes: true })) {
      const p = join(dir, e.name);
      if (e.isDirectory()) {
        if (!SKIP.has(e.name)) walk(p);
      } else if (e.isFile() && MODEL_FILE.test(e.name)) out.push(p);
    }
  };
  for (const p of paths) {
    let st;
    try {
      st = statSync(p);
    } catch {
      throw new UsageError(`${p}: no such file or directory`);
    }
    if (st.isDirectory()) walk(p);
    else out.push(p);
  }
  return [...new Set(out)].sort();
}
