import { describe, expect, it } from 'vitest';
import { loadModelFile } from '../../../corpus/format/load.js';
import { compile } from '../../../corpus/format/compile.js';
import { runInternal } from '../../../harness/check/methods.js';
import { dominance, strategyValue } from '../../../harness/check/properties.js';

// ferry-crossing: the optimum (max) uses the ferry with time to spare and the speedboat near the end.
const model = loadModelFile('corpus/models/ferry-crossing.yaml');
const ctx = { model, compiled: compile(model), precision: 1e-6, oracleDigits: 20 };
const k3 = runInternal('kstep:3', ctx);

describe('strategy-value and dominance', () => {
  it("pass for the k-step scheme's own scheduler", () => {
    expect(strategyValue(model, k3)?.passed).toBe(true);
    expect(dominance(model, k3)?.passed).toBe(true);
  });
  it('strategy-value fails when the scheduler is wrong (speedboat throughout), dominance does not', () => {
    const wrong = { ...k3, scheduler: { choices: { dock: [{ from: 0, action: 'speedboat' }] } } };
    const c = strategyValue(model, wrong)!;
    expect(c.passed).toBe(false);
    expect(c.ratio).toBeGreaterThan(1);
    // A worse strategy does not beat the optimum: dominance holds.
    expect(dominance(model, wrong)?.passed).toBe(true);
  });
  it('dominance fails when a claimed optimum is beaten by the returned scheduler', () => {
    const low = { ...k3, values: k3.values!.map((v) => v - 0.01) };
    expect(dominance(model, low)?.passed).toBe(false);
  });
  it('a scheduler naming an unknown action fails', () => {
    const bad = { ...k3, scheduler: { choices: { dock: [{ from: 0, action: 'helicopter' }] } } };
    expect(dominance(model, bad)?.detail).toMatch(/unknown state or action/);
  });
});
