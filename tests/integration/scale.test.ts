/** Scale-out: shards merged equal one run; --jobs 1 and --jobs 2 give the same verdicts. */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { crossbound, expectOneLineError, tempFile } from './cli.js';

const dir = dirname(tempFile('x', ''));
// Two independent families on every model of corpus/models (the oracle applies to all of them).
const METHODS = ['--methods', 'kstep:2,oracle'];

interface Report { verdict: string; models: { file: string; checks: { name: string; status: string }[] }[] }
const read = (f: string): Report => JSON.parse(readFileSync(f, 'utf8')) as Report;
const verdicts = (r: Report): string[] => r.models.flatMap((m) => m.checks.map((c) => `${m.file} | ${c.name} | ${c.status}`)).sort();

describe('shards, merge and worker threads', () => {
  it('three shards cover every model exactly once, and their merge equals one unsharded run', () => {
    const whole = join(dir, 'whole.json');
    expect(crossbound(['check', 'corpus/models', ...METHODS, '--jobs', '1', '--json', whole]).code).toBe(0);
    const parts = [1, 2, 3].map((i) => join(dir, `part${i}.json`));
    parts.forEach((p, i) => expect(crossbound(['check', 'corpus/models', ...METHODS, '--shard', `${i + 1}/3`, '--jobs', '1', '--json', p]).code).toBe(0));
    const files = parts.flatMap((p) => read(p).models.map((m) => m.file));
    expect(files.sort()).toEqual(read(whole).models.map((m) => m.file).sort());
    const merged = join(dir, 'merged.json');
    const r = crossbound(['merge', ...parts, '--json', merged]);
    expect(r.code).toBe(0);
    expect(verdicts(read(merged))).toEqual(verdicts(read(whole)));
    expect(read(merged).verdict).toBe('pass');
  });
  it('--jobs 2 gives the same verdicts, in the same order, as --jobs 1', () => {
    const one = join(dir, 'one.json');
    const two = join(dir, 'two.json');
    crossbound(['check', 'corpus/models', ...METHODS, '--jobs', '1', '--json', one]);
    crossbound(['check', 'corpus/models', ...METHODS, '--jobs', '2', '--json', two]);
    expect(read(two).models.map((m) => m.file)).toEqual(read(one).models.map((m) => m.file));
    expect(verdicts(read(two))).toEqual(verdicts(read(one)));
  });
  it('merge: a file that is not a check report is bad input (exit 2)', () => {
    const bogus = tempFile('bogus.json', '{"format":"something-else"}');
    expect(expectOneLineError(crossbound(['merge', bogus]))).toMatch(/bogus\.json: not a check report/);
  });
});
