/**
 * The k-step scheme's level-k pieces, handed out through its `dense` option and certified a posteriori
 * (harness/check/certified.ts): the certified enclosure must hold the true value, and the certified
 * bound sits beside the scheme's a-priori bound. True values: closed forms on three corpus CTMCs —
 * the two-state chain (kettle-scale; S. M. Ross, Introduction to Probability Models, the two-state
 * continuous-time chain), the hypoexponential distribution (relay-race; Ross, sums of independent
 * exponentials with distinct rates) and the Erlang distribution (dough-proofing; Ross, the
 * gamma/Erlang distribution), as decimal strings in the files' `expect` — and, where decisions switch
 * inside an interval (so that the pieces have breakpoints and are cut and re-expanded), the project's
 * high-precision optimal-control oracle at 25 digits.
 */
import { describe, expect, it } from 'vitest';
import { compile } from '../../../corpus/format/compile.js';
import { loadModelFile } from '../../../corpus/format/load.js';
import { CertifySink, certifiedBound } from '../../../harness/check/certified.js';
import { solveOracle } from '../../../oracles/index.js';
import { solveKstep } from '../../../solvers/kstep/index.js';

function certifiedKstep(file: string, k: number, precision: number) {
  const model = loadModelFile(file);
  const m = compile(model);
  const sink = new CertifySink('pieces');
  const out = solveKstep(m, { precision, k, dense: sink });
  if (out.kind !== 'solved') throw new Error(out.reason);
  const cert = sink.result();
  if (cert?.status !== 'certified') throw new Error(`not certified: ${JSON.stringify(cert)}`);
  return { model, m, out, cert, X: certifiedBound(out.values, cert).bound };
}

describe('kstep pieces, certified', () => {
  for (const file of ['corpus/models/kettle-scale.yaml', 'corpus/models/relay-race.yaml', 'corpus/models/dough-proofing.yaml']) {
    it(`${file}: the certified enclosure holds the closed form of the file's expect values (k = 3, 1e-7)`, () => {
      const { model, m, out, cert, X } = certifiedKstep(file, 3, 1e-7);
      const exp = model.expect!;
      expect(exp.source).toMatch(/Ross/);
      for (const [name, text] of Object.entries(exp.values)) {
        const s = m.stateNames.indexOf(name);
        const v = Number(text); // the decimal to the nearest double: within 1.2e-16 of the closed form
        expect(v).toBeGreaterThanOrEqual(cert.center[s]! - cert.below - 2e-16);
        expect(v).toBeLessThanOrEqual(cert.center[s]! + cert.above + 2e-16);
        expect(Math.abs(out.values[s]! - v)).toBeLessThanOrEqual(X + 2e-16);
      }
      // Beside the a-priori bound: both below the precision; the certificate is the tighter here.
      expect(out.errorBound).toBeLessThanOrEqual(1e-7);
      expect(X).toBeLessThan(out.errorBound);
    });
  }

  for (const file of ['corpus/models/ferry-crossing.yaml', 'corpus/models/thermostat-duel.yaml']) {
    it(`${file}: pieces with breakpoints are cut, re-expanded and certified; the enclosure holds the oracle's value`, () => {
      const { model, out, cert } = certifiedKstep(file, 3, 1e-6);
      expect(cert.steps).toBeGreaterThan(out.stats.intervals!);
      const ref = solveOracle(model, { digits: 25 });
      if (ref.kind !== 'solved') throw new Error(ref.reason);
      ref.values.forEach((v, s) => {
        expect(v).toBeGreaterThanOrEqual(cert.center[s]! - cert.below - ref.errorBound);
        expect(v).toBeLessThanOrEqual(cert.center[s]! + cert.above + ref.errorBound);
      });
    });
  }

  it('the hook is additive: the same values and bound with and without it', () => {
    const m = compile(loadModelFile('corpus/models/ferry-crossing.yaml'));
    const plain = solveKstep(m, { precision: 1e-6, k: 2 });
    const hooked = solveKstep(m, { precision: 1e-6, k: 2, dense: new CertifySink('pieces') });
    if (plain.kind !== 'solved' || hooked.kind !== 'solved') throw new Error('refused');
    expect([...hooked.values]).toEqual([...plain.values]);
    expect(hooked.errorBound).toBe(plain.errorBound);
  });
});
