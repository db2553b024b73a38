/**
 * The YAML 1.2 half of parsing (see source.ts): a node tree with ranges, then one walk over it that
 * refuses duplicate keys, keys that are not scalars, and numbers not written in decimal; then plain
 * values. YAML warnings (such as unknown tags) are errors.
 *
 * Cost: the parser's syntax tree and node tree take about 1 KB per node at their peak, so the input
 * is limited by bytes and by an estimate of its nodes (limits.ts) before it is parsed; parsing is
 * then linear in the text, and so is the walk. The parser's own duplicate-key check
 * (option `uniqueKeys`) compares every key with every earlier key of its mapping, quadratic in the
 * size of a mapping (a `states` mapping of 200,000 keys took over ten minutes); it is off, and the
 * walk checks each mapping with a set of its keys instead, under the same equality `toJS` uses to
 * build the plain object (the key's value as a string), so no key of a plain mapping is silently lost.
 */
import { isAlias, isMap, isPair, isScalar, isSeq, parseDocument, visit } from 'yaml';
import type { Alias, Document, Node as YamlNode } from 'yaml';
import { ModelError, posOf } from './errors.js';
import type { Pos } from './errors.js';
import { MAX_ALIAS_COUNT, MAX_DEPTH, MAX_YAML_BYTES, MAX_YAML_NODES, scanYaml } from './limits.js';
import { YAML_DECIMAL } from './numbers.js';
import type { Parsed, Path } from './source.js';

const MiB = 1024 * 1024;

interface Problem {
  readonly offset: number;
  readonly rule: string;
  readonly detail: string;
}

export function parsedYaml(text: string, file: string): Parsed {
  if (text.length > MAX_YAML_BYTES) {
    const rule = `YAML input is larger than the limit of ${MAX_YAML_BYTES / MiB} MiB`;
    throw new ModelError(file, 1, 1, rule, '(write large models as JSON)');
  }
  const scan = scanYaml(text, MAX_DEPTH);
  if (scan.deepAt >= 0) {
    const pos = posOf(text, scan.deepAt);
    throw new ModelError(file, pos.line, pos.column, 'nesting too deep', `(more than ${MAX_DEPTH} levels)`);
  }
  if (scan.nodes > MAX_YAML_NODES) {
    const detail = `(about ${scan.nodes} keys, values and items; write large models as JSON)`;
    throw new ModelError(file, 1, 1, `YAML input has more than the limit of ${MAX_YAML_NODES} nodes`, detail);
  }
  const doc = parseDocument(text, { uniqueKeys: false, prettyErrors: false, version: '1.2' });
  const syntax = doc.errors[0] ?? doc.warnings[0];
  if (syntax) {
    const msg = syntax.message.split('\n')[0]!.replace(/ at line \d+, column \d+:?$/, '');
    const pos = posOf(text, syntax.pos[0]);
    throw new ModelError(file, pos.line, pos.column, 'YAML syntax error', `: ${msg}`);
  }
  const problem = checkTree(doc);
  if (problem) {
    const pos = posOf(text, problem.offset);
    throw new ModelError(file, pos.line, pos.column, problem.rule, problem.detail);
  }
  let value: unknown;
  try {
    value = doc.toJS({ maxAliasCount: MAX_ALIAS_COUNT });
  } catch (e) {
    const detail = `(limit ${MAX_ALIAS_COUNT}): ${(e as Error).message}`;
    throw new ModelError(file, 1, 1, 'too many YAML alias expansions', detail);
  }
  const at = (offset: number): Pos => posOf(text, offset);
  return { file, value, syntax: 'yaml', locate: (path, part = 'value') => at(yamlLocate(doc, path, part)) };
}

const startOf = (n: unknown, fallback: number): number => (n as YamlNode | null)?.range?.[0] ?? fallback;

/** The first problem in document order: a repeated or non-scalar key, or a number not in decimal. */
function checkTree(doc: Document): Problem | undefined {
  let problem: Problem | undefined;
  visit(doc, {
    Map(_k, map) {
      const seen = new Set<string>();
      for (const pair of map.items) {
        const key = isAlias(pair.key) ? pair.key.resolve(doc) : pair.key;
        const offset = startOf(pair.key, startOf(map, 0));
        if (key !== null && !isScalar(key)) {
          problem = { offset, rule: 'mapping keys must be scalars', detail: '(a name or a string)' };
          return visit.BREAK;
        }
        // The key under which toJS stores the pair: '' for null, else the value as a string.
        const name = key === null || key.value === null ? '' : String(key.value);
        if (seen.has(name)) {
          const detail = `: key ${JSON.stringify(name)} appears twice in this mapping`;
          problem = { offset, rule: 'duplicate key', detail };
          return visit.BREAK;
        }
        seen.add(name);
      }
      return undefined;
    },
    Scalar(_k, node) {
      if (typeof node.value === 'number' && !YAML_DECIMAL.test(node.source ?? String(node.value))) {
        const detail = `(got ${node.source ?? String(node.value)})`;
        problem = { offset: startOf(node, 0), rule: 'numbers must be finite and written in decimal', detail };
        return visit.BREAK;
      }
      return undefined;
    },
  });
  return problem;
}

function yamlLocate(doc: Document, path: Path, part: 'key' | 'value'): number {
  let node: unknown = doc.contents;
  let keyAt = startOf(doc.contents, 0);
  let lastAt = keyAt;
  for (const seg of path) {
    const name = String(seg);
    for (let guard = 0; isAlias(node) && guard < MAX_DEPTH; guard++) node = (node as Alias).resolve(doc);
    let next: unknown;
    if (isMap(node)) {
      const pair = node.items.find((it) => isPair(it) && String(isScalar(it.key) ? it.key.value : it.key) === name);
      if (pair) {
        keyAt = startOf(pair.key, lastAt);
        next = pair.value ?? null;
        if (next === null) return keyAt;
      }
    } else if (isSeq(node) && typeof seg === 'number') {
      next = node.items[seg];
      keyAt = startOf(next, lastAt);
    }
    if (next === undefined) return lastAt;
    node = next;
    lastAt = startOf(node, lastAt);
  }
  return part === 'key' ? keyAt : lastAt;
}
