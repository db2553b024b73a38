/** JUnit for skipped checks: <skipped/> with the reason, never a passing case; the verdict ignores them. */
import { describe, expect, it } from 'vitest';
import { loadModelFile } from '../../../corpus/format/load.js';
import { checkModel } from '../../../harness/check/checkModel.js';
import { metamorphic, type Solve } from '../../../harness/check/properties.js';
import { modelVerdict, type SolvedMethod } from '../../../harness/check/types.js';
import { checkJson } from '../../../harness/reports/json.js';
import { junitXml } from '../../../harness/reports/junit.js';

describe('skipped checks in the reports', () => {
  it('are <skipped/> in JUnit with their reason, "skipped" in JSON, and leave an otherwise passing verdict pass', async () => {
    const model = loadModelFile('corpus/models/ferry-crossing.yaml');
    const base = await checkModel('ferry.yaml', model, [], { precision: 1e-6, methods: ['kstep:3', 'oracle'] });
    const k3 = base.methods.find((m): m is SolvedMethod => m.label === 'kstep:3' && m.status === 'solved')!;
    // A planted solve that refuses every transformed copy: each metamorphic check could not run.
    const refuse: Solve = async (label) => ({ label, family: 'kstep', status: 'refused', code: 'work-cap', reason: 'planted refusal', seconds: 0 });
    const skipped = await metamorphic(model, k3, refuse);
    const report = { ...base, checks: [...base.checks.filter((c) => c.kind !== 'metamorphic'), ...skipped] };
    expect(modelVerdict(report)).toBe('pass');
    const xml = junitXml([report], { allowUnchecked: false });
    expect(xml.match(/<skipped\/>/g)?.length).toBe(skipped.length);
    expect(xml).toMatch(/name="metamorphic rename kstep:3"[^>]*>\s*<skipped\/>\s*<system-out><!\[CDATA\[skipped: transformed copy not solved: refused \(work-cap\): planted refusal/);
    const j = checkJson([report], 1e-6, { shard: { index: 1, count: 1 }, corpusFiles: 1, corpusDigest: 'x', files: ['ferry.yaml'] }, false);
    expect(j.models[0]!.checks.filter((c) => c.status === 'skipped').length).toBe(skipped.length);
  });
});
