import { describe, expect, it } from 'vitest';
import { loadModelFile } from '../../../corpus/format/load.js';
import { compile } from '../../../corpus/format/compile.js';
import { runInternal } from '../../../harness/check/methods.js';
import { dominance, metamorphic, MAX_DOMINANCE_SEGMENTS, monotoneInT, strategyValue, type Solve } from '../../../harness/check/properties.js';
import type { MethodResult, SolvedMethod } from '../../../harness/check/types.js';

// ferry-crossing: the optimum (max) uses the ferry with time to spare and the speedboat near the end.
const model = loadModelFile('corpus/models/ferry-crossing.yaml');
const ctx = { model, compiled: compile(model), precision: 1e-6, oracleDigits: 20 };

function solved(m: MethodResult): SolvedMethod {
  if (m.status !== 'solved') throw new Error(`${m.label} did not solve: ${m.reason}`);
  return m;
}
const k3 = solved(runInternal('kstep:3', ctx));

describe('strategy-value and dominance', () => {
  it("pass for the k-step scheme's own scheduler", () => {
    expect(strategyValue(model, k3)?.status).toBe('passed');
    expect(dominance(model, k3)?.status).toBe('passed');
  });
  it('strategy-value fails when the scheduler is wrong (speedboat throughout), dominance does not', () => {
    const wrong = { ...k3, scheduler: { choices: { dock: [{ from: 0, action: 'speedboat' }] } } };
    const c = strategyValue(model, wrong)!;
    expect(c.status).toBe('failed');
    expect(c.ratio).toBeGreaterThan(1);
    // A worse strategy does not beat the optimum: dominance holds.
    expect(dominance(model, wrong)?.status).toBe('passed');
  });
  it('dominance fails when a claimed optimum is beaten by the returned scheduler', () => {
    const low = { ...k3, values: k3.values.map((v) => v - 0.01) };
    expect(dominance(model, low)?.status).toBe('failed');
  });
  it('a scheduler naming an unknown action fails', () => {
    const bad = { ...k3, scheduler: { choices: { dock: [{ from: 0, action: 'helicopter' }] } } };
    const c = dominance(model, bad)!;
    expect(c.status).toBe('failed');
    expect(c.detail).toMatch(/unknown state or action/);
  });
  it('a scheduler too long to evaluate is skipped with its reason, not passed', () => {
    const n = MAX_DOMINANCE_SEGMENTS + 1;
    const segs = Array.from({ length: n }, (_, i) => ({ from: (i * model.timeBound) / n, action: i % 2 ? 'ferry' : 'speedboat' }));
    const long = { ...k3, scheduler: { choices: { dock: segs } } };
    for (const c of [dominance(model, long)!, strategyValue(model, long)!]) {
      expect(c.status).toBe('skipped');
      expect(c.detail).toMatch(/not evaluated: \d+ segments/);
      expect(c.independent).toBe(false);
    }
  });
});

describe('checks whose second run could not be made are skipped, a faulting second run fails', () => {
  const refuse: Solve = async (label) => ({ label, family: 'kstep', status: 'refused', code: 'work-cap', reason: 'planted refusal', seconds: 0 });
  const crash: Solve = async (label) => ({ label, family: 'kstep', status: 'fault', fault: 'exception', reason: 'planted crash', seconds: 0 });
  it('monotone-in-T: T/2 refused is skipped, T/2 faulted is failed', async () => {
    const s = (await monotoneInT(model, k3, refuse))!;
    expect(s.status).toBe('skipped');
    expect(s.detail).toMatch(/refused \(work-cap\): planted refusal/);
    expect((await monotoneInT(model, k3, crash))!.status).toBe('failed');
  });
  it('metamorphic: every refused transformed copy is skipped, none passed', async () => {
    const cs = await metamorphic(model, k3, refuse);
    expect(cs.length).toBeGreaterThanOrEqual(4);
    expect(cs.every((c) => c.status === 'skipped' && c.methods.join() === 'kstep:3')).toBe(true);
    expect((await metamorphic(model, k3, crash)).every((c) => c.status === 'failed')).toBe(true);
  });
});
