/**
 * A saved counterexample raises no warning in the corpus: an action shrunk to no successors is written
 * as a self-loop (same dynamics) when the model still fails the same check that way, and the saved
 * file reproduces the failure.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { loadModelFileWithWarnings } from '../../../corpus/format/load.js';
import { runCheck } from '../../../harness/check/index.js';
import { runFuzz } from '../../../harness/fuzz/index.js';
// Planted variants are loaded only on request (harness/check/planted.ts); this test asks for one.
import '../../../harness/selftest/variants.js';

describe('fuzz --save', () => {
  test('seed 11, variant:min-as-max: shrunk to an empty action, saved as a self-loop, no warning, still fails', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'crossbound-save-'));
    const s = await runFuzz({ runs: 300, seed: 11, maxStates: 6, precision: 1e-5, methods: ['variant:min-as-max'], save: dir });
    const file = s.failure?.savedTo;
    expect(file).toBeDefined();
    const { model, warnings } = loadModelFileWithWarnings(file!);
    expect(warnings).toEqual([]);
    expect(model.description).toMatch(/had no successors as shrunk and are written as self-loops at rate 1/);
    const { exitCode, reports } = await runCheck([file!], { precision: 1e-5, methods: ['variant:min-as-max', 'kstep:4'] });
    expect(exitCode).toBe(1);
    expect(reports[0]!.checks.some((c) => c.status === 'failed' && c.name === s.failure!.failed[0]!.name)).toBe(true);
  }, 600_000);
});
