/**
 * Errors of the model and scheduler loaders. Every rule violation is a `ModelError` naming the file,
 * the line and column (1-based, when the input has a position for it) and the rule that was broken;
 * its `message` is one line, `file:line:column: text`, ready for a terminal.
 */

export class ModelError extends Error {
  readonly file: string;
  readonly line: number | undefined;
  readonly column: number | undefined;
  /** The rule that was broken, as a short stable phrase (e.g. "rate must be a finite number ≥ 0"). */
  readonly rule: string;

  constructor(file: string, line: number | undefined, column: number | undefined, rule: string, detail?: string) {
    const where = line === undefined ? file : `${file}:${line}:${column ?? 1}`;
    super(`${where}: ${rule}${detail ? (detail.startsWith(':') ? detail : ` ${detail}`) : ''}`.replace(/\s*\n\s*/g, ' '));
    this.name = 'ModelError';
    this.file = file;
    this.line = line;
    this.column = column;
    this.rule = rule;
  }
}

export interface Pos {
  readonly line: number;
  readonly column: number;
}

/** Line and column (1-based, in UTF-16 code units) of a character offset. Linear; used on errors only. */
export function posOf(text: string, offset: number): Pos {
  let line = 1;
  let lineStart = 0;
  const end = Math.min(Math.max(offset, 0), text.length);
  for (let i = text.indexOf('\n'); i !== -1 && i < end; i = text.indexOf('\n', i + 1)) {
    line++;
    lineStart = i + 1;
  }
  return { line, column: end - lineStart + 1 };
}

/** A short, printable rendering of a bad value for an error message: `(got ...)`. */
export function got(v: unknown): string {
  let s: string;
  if (v === null) s = 'null';
  else if (Array.isArray(v)) s = `a list of ${v.length}`;
  else if (typeof v === 'object') s = 'a mapping';
  else if (typeof v === 'string') s = JSON.stringify(v);
  else s = String(v);
  if (s.length > 60) s = `${s.slice(0, 57)}...`;
  return `(got ${s})`;
}
