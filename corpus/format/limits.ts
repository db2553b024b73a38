/**
 * Resource limits of the loaders. They protect the harness from inputs that would exhaust memory or
 * time; each is checked before the expensive step it guards.
 *
 * - MAX_FILE_BYTES: 256 MiB. A flat JSON model of 10^6 transitions takes about 40 MB, so the limit
 *   admits models several times larger than the solvers' benchmark targets.
 * - MAX_YAML_BYTES, MAX_YAML_NODES: 8 MiB and 500,000 nodes. The YAML parser builds a syntax tree
 *   and then a node tree with positions, about 1 KB of memory per node at its peak (measured with
 *   bench/yaml-load.ts and a dense list `[0,0,...]`: 0.5 GB for 500,000 nodes), so the node budget
 *   is what bounds memory and time; write larger models as JSON. Nodes are estimated before parsing
 *   by counting lines and structural indicators (an upper bound for the shapes a model uses).
 * - MAX_JSON_VALUES, MAX_JSON_ENTRIES: 12,000,000 values and 3,000,000 mapping entries, counted by the
 *   JSON scanner before `JSON.parse` builds anything. Measured (`validate` under /usr/bin/time, one run
 *   each on a shared 2-core machine): a flat model of 2.3·10^6 rows (11.7·10^6 values, 82 MB) peaked at
 *   1.02 GB; a `states`-form model of 1.95·10^6 transitions (2.9·10^6 entries, 47 MB) at 1.20 GB, since
 *   a mapping entry costs several times a list item once parsed. So no accepted JSON model holds much
 *   more than about 1.2 GB while it loads, far below the 256 MiB file limit's cost (near 10 GB).
 * - MAX_DEPTH: 64 levels of nesting. A model needs at most 6; the bound keeps the recursive parts of
 *   parsing far from the stack limit.
 * - MAX_ALIAS_COUNT: 1000 YAML alias expansions (an "alias bomb" doubles its size per level).
 */
export const MAX_FILE_BYTES = 256 * 1024 * 1024;
export const MAX_YAML_BYTES = 8 * 1024 * 1024;
export const MAX_YAML_NODES = 500_000;
export const MAX_JSON_VALUES = 12_000_000;
export const MAX_JSON_ENTRIES = 3_000_000;
export const MAX_DEPTH = 64;
export const MAX_ALIAS_COUNT = 1000;

/**
 * One pass over a YAML text, without parsing it. Depth: a conservative estimate of the nesting depth,
 * the number of open flow brackets (outside quotes and comments) plus the block depth of the line (its
 * indentation and compact `- ` / `? ` markers); `deepAt` is the offset of the first place where it
 * exceeds `limit`, or −1. Block depth is only bounded loosely (MAX_INDENT columns): it costs the
 * parser little, and the exact depth is checked again on the parsed tree. Nodes: `nodes` counts lines
 * and the indicators `, : - ? [ {` outside quotes and comments, at least one per key, value or item.
 */
const MAX_INDENT = 1000;

/** A quote opens a quoted scalar only at the start of a scalar, not inside a word ("don't"). */
function startsScalar(prev: number): boolean {
  return Number.isNaN(prev) || prev === 0x20 || prev === 0x09 || prev === 0x0a || prev === 0x5b || prev === 0x7b ||
    prev === 0x2c || prev === 0x3a || prev === 0x2d;
}

export function scanYaml(text: string, limit: number): { deepAt: number; nodes: number } {
  let nodes = 0;
  let flow = 0;
  let quote = 0; // 0, 0x22 ("), 0x27 (')
  let lineStart = true;
  let block = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x0a) {
      nodes++;
      lineStart = true;
      block = 0;
      continue;
    }
    if (quote !== 0) {
      if (c === 0x5c && quote === 0x22) i++;
      else if (c === quote) quote = 0;
      continue;
    }
    if (lineStart) {
      if (c === 0x20 || c === 0x09) {
        if (++block > MAX_INDENT) return { deepAt: i, nodes };
        continue;
      }
      if ((c === 0x2d || c === 0x3f) && (text.charCodeAt(i + 1) === 0x20 || text.charCodeAt(i + 1) === 0x0a)) {
        nodes++;
        block += 2;
        if (block > MAX_INDENT) return { deepAt: i, nodes };
        continue;
      }
      lineStart = false;
    }
    if (c === 0x23 && (i === 0 || text.charCodeAt(i - 1) === 0x20 || text.charCodeAt(i - 1) === 0x09)) {
      while (i + 1 < text.length && text.charCodeAt(i + 1) !== 0x0a) i++;
    } else if ((c === 0x22 || c === 0x27) && startsScalar(text.charCodeAt(i - 1))) {
      nodes++;
      quote = c;
    } else if (c === 0x5b || c === 0x7b) {
      nodes++;
      if (++flow > limit) return { deepAt: i, nodes };
    } else if (c === 0x5d || c === 0x7d) {
      if (flow > 0) flow--;
    } else if (c === 0x2c || c === 0x3a || c === 0x2d || c === 0x3f) {
      nodes++;
    }
  }
  return { deepAt: -1, nodes };
}
