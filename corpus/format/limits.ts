/**
 * Resource limits of the loaders. They protect the harness from inputs that would exhaust memory or
 * the stack; each is checked before the expensive step it guards.
 *
 * - MAX_FILE_BYTES: 256 MiB. A flat JSON model of 10^6 transitions takes about 40 MB, so the limit
 *   admits models several times larger than the solvers' benchmark targets.
 * - MAX_YAML_BYTES: 32 MiB. YAML parsing builds a node tree with positions and is an order of
 *   magnitude slower than JSON; write larger models as JSON.
 * - MAX_DEPTH: 64 levels of nesting. A model needs at most 6; the bound keeps the recursive parts of
 *   parsing far from the stack limit.
 * - MAX_ALIAS_COUNT: 1000 YAML alias expansions (an "alias bomb" doubles its size per level).
 */
export const MAX_FILE_BYTES = 256 * 1024 * 1024;
export const MAX_YAML_BYTES = 32 * 1024 * 1024;
export const MAX_DEPTH = 64;
export const MAX_ALIAS_COUNT = 1000;

/**
 * A conservative estimate of the nesting depth of a YAML text, without parsing it: the number of
 * open flow brackets (outside quotes and comments) plus the block depth of the line (its
 * indentation and compact `- ` / `? ` markers). Returns the offset of the first place where the
 * estimate exceeds `limit`, or −1. Block depth is only bounded loosely (MAX_INDENT columns): it
 * costs the parser little, and the exact depth is checked again on the parsed tree.
 */
const MAX_INDENT = 1000;

/** A quote opens a quoted scalar only at the start of a scalar, not inside a word ("don't"). */
function startsScalar(prev: number): boolean {
  return Number.isNaN(prev) || prev === 0x20 || prev === 0x09 || prev === 0x0a || prev === 0x5b || prev === 0x7b ||
    prev === 0x2c || prev === 0x3a || prev === 0x2d;
}

export function yamlDepthExceeded(text: string, limit: number): number {
  let flow = 0;
  let quote = 0; // 0, 0x22 ("), 0x27 (')
  let lineStart = true;
  let block = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x0a) {
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
        block++;
        if (block > MAX_INDENT) return i;
        continue;
      }
      if ((c === 0x2d || c === 0x3f) && (text.charCodeAt(i + 1) === 0x20 || text.charCodeAt(i + 1) === 0x0a)) {
        block += 2;
        if (block > MAX_INDENT) return i;
        continue;
      }
      lineStart = false;
    }
    if (c === 0x23 && (i === 0 || text.charCodeAt(i - 1) === 0x20 || text.charCodeAt(i - 1) === 0x09)) {
      while (i + 1 < text.length && text.charCodeAt(i + 1) !== 0x0a) i++;
    } else if ((c === 0x22 || c === 0x27) && startsScalar(text.charCodeAt(i - 1))) {
      quote = c;
    } else if (c === 0x5b || c === 0x7b) {
      flow++;
      if (flow > limit) return i;
    } else if (c === 0x5d || c === 0x7d) {
      if (flow > 0) flow--;
    }
  }
  return -1;
}
