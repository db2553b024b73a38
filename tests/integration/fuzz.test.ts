/** fuzz and selftest through the built CLI. */
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { crossbound, tempFile } from './cli.js';

describe('crossbound fuzz', () => {
  // Sized by work, not time: 40 models of up to 8 states (about 0.5 s each on one busy core, more for the
  // adversarial quarter); the long fuzz runs belong to `crossbound fuzz`, not to the test suite. The time
  // limit is only a safety net.
  it('finds no disagreement among the correct methods (seed 5, 40 models)', () => {
    const r = crossbound(['fuzz', '--runs', '40', '--seed', '5', '--max-states', '8', '--no-save'], 1_800_000);
    expect(r.stdout).toMatch(/40 random models \(seed 5, up to 8 states\), no disagreement/);
    const drawn = /families drawn: (\d+) random, (\d+) switching, (\d+) adversarial \(near-ties\), (\d+) dip/.exec(r.stdout);
    expect(drawn && Number(drawn[1]) + Number(drawn[2]) + Number(drawn[3]) + Number(drawn[4])).toBe(40);
    expect(Number(drawn?.[3])).toBeGreaterThan(3);
    expect(r.code).toBe(0);
  }, 1_800_000);
  it('catches a planted broken variant, shrinks it to at most 4 states, saves it, and the same seed replays it', () => {
    const dir = join(dirname(tempFile('x', '')), 'regressions');
    const args = ['fuzz', '--runs', '300', '--seed', '3', '--max-states', '8', '--methods', 'kstep:2,variant:min-as-max', '--save', dir];
    const r = crossbound(args, 1_800_000);
    expect(r.code).toBe(1);
    const states = Number(/shrunk to (\d+) state/.exec(r.stdout)?.[1]);
    expect(states).toBeLessThanOrEqual(4);
    expect(r.stdout).toMatch(/variant:min-as-max/);
    const saved = readdirSync(dir);
    expect(saved.length).toBe(1);
    // The saved model is a valid model, every correct method passes it, and the variant fails on it.
    const file = join(dir, saved[0]!);
    expect(crossbound(['check', file, '--methods', 'kstep:2,kstep:4,euler']).code).toBe(0);
    expect(crossbound(['check', file, '--methods', 'kstep:4,variant:min-as-max']).code).toBe(1);
    const again = crossbound([...args.slice(0, -2), '--no-save'], 1_800_000);
    const path = (s: string): string | undefined => /path ([0-9:]+)/.exec(s)?.[1];
    expect(path(again.stdout)).toBe(path(r.stdout));
  }, 3_600_000);
});

describe('crossbound selftest', () => {
  it('catches every broken variant of the own solvers by name', () => {
    const r = crossbound(['selftest', 'corpus/models', '--fuzz-runs', '60', '--jobs', '1'], 1_800_000);
    expect(r.stdout).toMatch(/selftest: (\d+) of \1 broken variants caught/);
    for (const v of ['min-as-max', 'selfloop-exit', 'short-tail', 'at-absorbing', 'skip-last', 'loose-tie', 'defect-ends', 'bound-third']) expect(r.stdout).toMatch(new RegExp(`^${v}\\s+yes`, 'm'));
    // loose-tie is caught by the fuzz stage itself (its fuzz column names the failed check), not only by a corpus file.
    expect(r.stdout).toMatch(/^loose-tie\s+yes\s+\d+\s+(certified kstep:4, )?agree variant:loose-tie ~ kstep:4/m);
    // defect-ends too, on a near-tangent crossing (corpus/generators/dip.ts) that the corpus lacks.
    expect(r.stdout).toMatch(/^defect-ends\s+yes\s+\d+\s+.*agree variant:defect-ends ~ kstep:4/m);
    expect(r.code).toBe(0);
  }, 1_800_000);
});
