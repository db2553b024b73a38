/**
 * Command templates of external solvers, split into an argument vector without a shell.
 *
 * Splitting follows the familiar POSIX word rules, reduced to what a template needs (common
 * practice, no source): words are separated by unquoted blanks (space, tab, newline); inside
 * single quotes every character is literal; inside double quotes a backslash escapes only `"` and
 * `\`; outside quotes a backslash makes the next character literal. Adjacent pieces join into one
 * word (`a"b c"` is the single word `ab c`), and `''` is an empty word. Nothing else is special:
 * there is no expansion of variables, globs, `~`, `;`, `|` or `$(...)` — no shell ever runs.
 *
 * Placeholders are filled AFTER splitting, inside each word, in one pass: a substituted value
 * (a model path with blanks, quotes or `;rm -rf` in it) stays inside its word and is never
 * scanned again, so it can neither become a command nor an extra argument.
 *
 * Refuses (TemplateError): unbalanced quotes, a trailing backslash, an empty command, an unknown
 * placeholder `{name}`, and a template without `{model}` (the solver would never see the model).
 */

export class TemplateError extends Error {
  override name = 'TemplateError';
}

/** The placeholders a template may use. */
export const PLACEHOLDERS = ['model', 'precision', 'time'] as const;
export type Placeholder = (typeof PLACEHOLDERS)[number];
export type TemplateValues = Readonly<Record<Placeholder, string>>;

const BLANK = new Set([' ', '\t', '\n', '\r']);
/** `{identifier}`: anything else in braces (say a JSON argument) is left as it is. */
const PLACEHOLDER_RE = /\{([A-Za-z_][A-Za-z0-9_]*)\}/g;

/** Split a template into words; throws TemplateError on unbalanced quotes or a trailing backslash. */
export function splitTemplate(template: string): string[] {
  const words: string[] = [];
  let word = '';
  let inWord = false;
  let i = 0;
  while (i < template.length) {
    const c = template[i]!;
    if (BLANK.has(c)) {
      if (inWord) words.push(word);
      word = '';
      inWord = false;
      i++;
      continue;
    }
    inWord = true;
    if (c === "'") {
      const end = template.indexOf("'", i + 1);
      if (end < 0) throw new TemplateError(`unbalanced single quote at column ${i + 1} of the solver template`);
      word += template.slice(i + 1, end);
      i = end + 1;
    } else if (c === '"') {
      let j = i + 1;
      for (;;) {
        if (j >= template.length) throw new TemplateError(`unbalanced double quote at column ${i + 1} of the solver template`);
        const d = template[j]!;
        if (d === '"') break;
        if (d === '\\' && (template[j + 1] === '"' || template[j + 1] === '\\')) {
          word += template[j + 1];
          j += 2;
        } else {
          word += d;
          j++;
        }
      }
      i = j + 1;
    } else if (c === '\\') {
      if (i + 1 >= template.length) throw new TemplateError('trailing backslash at the end of the solver template');
      word += template[i + 1];
      i += 2;
    } else {
      word += c;
      i++;
    }
  }
  if (inWord) words.push(word);
  return words;
}

/** Check the placeholders of split words: throws on an unknown one or a missing `{model}`. */
export function checkPlaceholders(words: readonly string[]): void {
  if (words.length === 0 || words[0] === '') throw new TemplateError('the solver template names no command');
  let hasModel = false;
  for (const w of words) {
    for (const m of w.matchAll(PLACEHOLDER_RE)) {
      const name = m[1]!;
      if (!(PLACEHOLDERS as readonly string[]).includes(name)) {
        throw new TemplateError(`unknown placeholder {${name}} in the solver template (known: ${PLACEHOLDERS.map((p) => `{${p}}`).join(', ')})`);
      }
      if (name === 'model') hasModel = true;
    }
  }
  if (!hasModel) throw new TemplateError('the solver template has no {model} placeholder, so the solver would never see the model');
}

/** Fill the placeholders of each word in one pass; the result has exactly as many words. */
export function fillWords(words: readonly string[], values: TemplateValues): string[] {
  return words.map((w) => w.replace(PLACEHOLDER_RE, (whole, name: string) => (Object.hasOwn(values, name) ? values[name as Placeholder] : whole)));
}

/** The number as a placeholder shows it: the shortest text that reads back as the same double. */
export function formatNumber(x: number): string {
  return String(x);
}

/** Split, check and fill: the argument vector for child_process.spawn (argv[0] is the command). */
export function buildArgv(template: string, values: { model: string; precision: number; time: number }): string[] {
  const words = splitTemplate(template);
  checkPlaceholders(words);
  return fillWords(words, { model: values.model, precision: formatNumber(values.precision), time: formatNumber(values.time) });
}
