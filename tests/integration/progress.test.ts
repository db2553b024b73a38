/**
 * Progress as a user sees it when stderr is not a terminal (a pipe, as in CI): `check` writes plain
 * lines (no bar, no control characters), and `solve --json` keeps stdout pure JSON.
 */
import { describe, expect, it } from 'vitest';
import { crossbound } from './cli.js';

describe('progress on a pipe', () => {
  it('check writes plain progress lines on stderr: a header, the final count, no control characters', () => {
    const r = crossbound(['check', 'corpus/models/kettle-scale.yaml', 'corpus/models/relay-race.yaml', '--jobs', '2', '--methods', 'uniformization,kstep:2']);
    expect(r.code).toBe(0);
    expect(r.stderr).not.toMatch(/[\r\x1b]/);
    const progress = r.stderr.split('\n').filter((l) => l.startsWith('check: '));
    expect(progress[0]).toBe('check: 2 model(s), 2 job(s)');
    expect(progress.at(-1)).toMatch(/^check: 2\/2 models in \d/);
    expect(r.stdout).not.toMatch(/check: /);
  });
  it('solve --json prints only the result on stdout, Euler included (it reports progress on a terminal only)', () => {
    const r = crossbound(['solve', 'corpus/models/kettle-scale.yaml', '--method', 'euler', '--precision', '1e-6', '--json']);
    expect(r.code).toBe(0);
    const result = JSON.parse(r.stdout) as { format: string; method: string };
    expect(result.format).toBe('crossbound-result/1');
    expect(result.method).toBe('euler');
    expect(r.stderr).toBe('');
  });
});
