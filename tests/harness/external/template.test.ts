import { describe, expect, it } from 'vitest';
import { buildArgv, checkPlaceholders, fillWords, splitTemplate, TemplateError } from '../../../harness/external/template.js';

// Word rules: POSIX shell quoting, reduced (common practice, no source).
describe('splitTemplate', () => {
  it('splits on blanks and keeps quoted blanks', () => {
    expect(splitTemplate('  solve   --x 1\t{model} ')).toEqual(['solve', '--x', '1', '{model}']);
    expect(splitTemplate(`'my solver' "a b" c\\ d`)).toEqual(['my solver', 'a b', 'c d']);
  });
  it('joins adjacent pieces and keeps empty quoted words', () => {
    expect(splitTemplate(`a"b c"'d'e`)).toEqual(['ab cde']);
    expect(splitTemplate(`x '' ""`)).toEqual(['x', '', '']);
  });
  it('applies backslash escapes outside quotes and only \\" and \\\\ inside double quotes', () => {
    expect(splitTemplate(`a\\"b`)).toEqual(['a"b']);
    expect(splitTemplate(`"a\\"b\\\\c\\n"`)).toEqual(['a"b\\c\\n']);
    expect(splitTemplate(`'a\\b'`)).toEqual(['a\\b']);
    expect(splitTemplate(`'it'\\''s'`)).toEqual(["it's"]);
  });
  it('treats shell operators as plain text', () => {
    expect(splitTemplate('run {model}; rm -rf / | cat $(x) > out')).toEqual(['run', '{model};', 'rm', '-rf', '/', '|', 'cat', '$(x)', '>', 'out']);
  });
  it('rejects unbalanced quotes and a trailing backslash with a clear error', () => {
    expect(() => splitTemplate(`solve 'model`)).toThrow(/unbalanced single quote at column 7/);
    expect(() => splitTemplate(`solve "mo\\"del`)).toThrow(/unbalanced double quote/);
    expect(() => splitTemplate('solve \\')).toThrow(TemplateError);
  });
});

describe('placeholders', () => {
  it('rejects an empty command, an unknown placeholder and a template without {model}', () => {
    expect(() => checkPlaceholders(splitTemplate('   '))).toThrow(/names no command/);
    expect(() => checkPlaceholders(splitTemplate('solve {modle}'))).toThrow(/unknown placeholder \{modle\}/);
    expect(() => checkPlaceholders(splitTemplate('solve {precision}'))).toThrow(/no \{model\}/);
    expect(() => checkPlaceholders(splitTemplate(`solve {model} '{"k": 3}'`))).not.toThrow();
  });
  it('fills inside words, once, without rescanning the substituted text', () => {
    const argv = buildArgv('solve --in={model} -p {precision} -t {time} {model}.log', { model: '/t/{precision}', precision: 1e-6, time: 12.5 });
    expect(argv).toEqual(['solve', '--in=/t/{precision}', '-p', '0.000001', '-t', '12.5', '/t/{precision}.log']);
  });
  it('writes numbers as JavaScript prints them (they read back to the same double)', () => {
    expect(buildArgv('s {model} {precision}', { model: 'm', precision: 1e-8, time: 1 })[2]).toBe('1e-8');
  });
  it('a model path with blanks, quotes and ";rm -rf" stays one argument', () => {
    const nasty = `/tmp/my models/a'b"c; rm -rf ~ && echo $(id) \`x\`.json`;
    const argv = buildArgv(`'/usr/bin/solver x' --model {model} {precision}`, { model: nasty, precision: 0.001, time: 1 });
    expect(argv).toEqual(['/usr/bin/solver x', '--model', nasty, '0.001']);
  });
  it('keeps the word count whatever the values are', () => {
    const words = splitTemplate('a {model} b{time}c');
    expect(fillWords(words, { model: 'x y z', precision: '1', time: ' ' })).toEqual(['a', 'x y z', 'b c']);
  });
});
