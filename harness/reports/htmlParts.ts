/** Small pieces the HTML reports are built from: escaping and tables. */

export const esc = (s: string): string =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** A table of text cells (escaped here). */
export function table(header: readonly string[], rows: readonly (readonly string[])[], cls?: string): string {
  return htmlTable(header.map(esc), rows.map((r) => r.map(esc)), cls);
}

/** A cell that spans several columns. */
export interface Span {
  readonly html: string;
  readonly span: number;
}

const cell = (c: string | Span): string => (typeof c === 'string' ? `<td>${c}</td>` : `<td colspan="${c.span}">${c.html}</td>`);

/** A table of cells that are HTML already (the caller escaped every text in them); no header row when `header` is empty. */
export function htmlTable(header: readonly string[], rows: readonly (readonly (string | Span)[])[], cls?: string): string {
  const head = header.length > 0 ? `<thead><tr>${header.map((h) => `<th>${h}</th>`).join('')}</tr></thead>` : '';
  const body = `<tbody>${rows.map((r) => `<tr>${r.map(cell).join('')}</tr>`).join('')}</tbody>`;
  return `<table${cls ? ` class="${cls}"` : ''}>${head}${body}</table>`;
}
