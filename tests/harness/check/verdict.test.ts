/** Model verdicts by method families, on real runs of check (in-process). */
import { describe, expect, it } from 'vitest';
import { loadModelFile } from '../../../corpus/format/load.js';
import { checkModel } from '../../../harness/check/checkModel.js';
import { modelVerdict, uncheckedReason } from '../../../harness/check/types.js';
// Planted variants are loaded only on request (harness/check/planted.ts); this test asks for one.
import '../../../harness/selftest/variants.js';

const ferry = loadModelFile('corpus/models/ferry-crossing.yaml'); // a CTMDP without expected values
const kettle = loadModelFile('corpus/models/kettle-scale.yaml'); // a CTMC with a closed-form expectation
const run = (model: typeof ferry, methods: string[]) => checkModel('m.yaml', model, [], { precision: 1e-6, methods });

describe('verdicts: pass needs an independent comparison', () => {
  it('kstep:2 agreeing with kstep:4 (one family) is unchecked, and says why', async () => {
    const r = await run(ferry, ['kstep:2', 'kstep:4']);
    const agree = r.checks.find((c) => c.kind === 'agree')!;
    expect(agree.status).toBe('passed');
    expect(agree.independent).toBe(false);
    expect(agree.methods).toEqual(['kstep:2', 'kstep:4']);
    expect(modelVerdict(r)).toBe('unchecked');
    expect(uncheckedReason(r)).toMatch(/only the kstep family answered/);
  });
  it('kstep:2 agreeing with the oracle passes', async () => {
    const r = await run(ferry, ['kstep:2', 'oracle']);
    expect(r.checks.find((c) => c.kind === 'agree')!.independent).toBe(true);
    expect(modelVerdict(r)).toBe('pass');
  });
  it('one family and a reference value (expect) passes', async () => {
    const r = await run(kettle, ['kstep:3']);
    expect(r.checks.some((c) => c.kind === 'expect' && c.independent && c.status === 'passed')).toBe(true);
    expect(modelVerdict(r)).toBe('pass');
  });
  it('a method that does not apply, alone, is unchecked (no check ran)', async () => {
    const r = await run(ferry, ['uniformization']);
    expect(r.methods[0]).toMatchObject({ status: 'refused', code: 'out-of-scope' });
    expect(r.checks).toEqual([]);
    expect(modelVerdict(r)).toBe('unchecked');
  });
  it('a failed check fails the model whatever else passed', async () => {
    // The shrunk model on which fuzz caught the planted variant min-as-max (a regression of the corpus).
    const shrunk = loadModelFile('corpus/regressions/fuzz-seed11-agree-variant-min-as-max-kstep-4.json');
    const r = await run(shrunk, ['kstep:2', 'oracle', 'variant:min-as-max']);
    expect(r.checks.some((c) => c.status === 'passed' && c.independent)).toBe(true);
    expect(r.checks.some((c) => c.status === 'failed' && c.methods.includes('variant:min-as-max'))).toBe(true);
    expect(modelVerdict(r)).toBe('fail');
  });
});
