/**
 * The fixed-point Taylor-step oracle (expm) on CTMCs of hundreds of states against closed forms that
 * scale, evaluated independently here with decimal.js 10.6.0 at 60 digits:
 *  - a ring of n states (rate a forward, b backward): its generator is circulant, and circulant
 *    matrices are diagonalised by the discrete Fourier transform (common practice; e.g. P. J. Davis,
 *    "Circulant Matrices", Wiley 1979, from memory), so with φ_m = 2πm/n the probability of being
 *    moved j places forward after time t is
 *      p_j(t) = (1/n) Σ_m exp(t(a+b)(cos φ_m − 1)) · cos(t(a−b) sin φ_m − j φ_m);
 *  - an Erlang chain (S. M. Ross, Introduction to Probability Models, the gamma distribution as a sum
 *    of exponentials; from memory): P(S_k ≤ t) = 1 − Σ_{j<k} e^{−λt}(λt)^j/j!.
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { stateIndex } from '../../../corpus/format/types.js';
import { decimalAt, decModel } from '../../../oracles/common/decModel.js';
import { solveExpm } from '../../../oracles/expm/index.js';
import { fixedToDec } from '../../../oracles/fixed/numbers.js';
import { propagateFixed } from '../../../oracles/fixed/propagate.js';
import { ring } from '../../../bench/oracleStructures.js';

const D = Decimal.clone({ precision: 60 });

/** p_j(t) for every j asked, sharing the amplitudes and phases of the n Fourier modes. */
function ringReference(n: number, a: string, b: string, t: string, C: typeof Decimal = D): (j: number) => Decimal {
  const pi = C.acos(-1);
  const s = new C(a).plus(b).times(t);
  const d = new C(a).minus(b).times(t);
  const amp: Decimal[] = [];
  const phase: Decimal[] = [];
  const phis: Decimal[] = [];
  for (let m = 0; m < n; m++) {
    const phi = pi.times(2 * m).div(n);
    phis.push(phi);
    amp.push(s.times(phi.cos().minus(1)).exp());
    phase.push(d.times(phi.sin()));
  }
  return (j) => {
    let sum = new C(0);
    for (let m = 0; m < n; m++) sum = sum.plus(amp[m]!.times(phase[m]!.minus(phis[m]!.times(j)).cos()));
    return sum.div(n);
  };
}

function solved(m: ReturnType<typeof buildModel>, digits: number) {
  const out = solveExpm(m, { digits });
  if (out.kind !== 'solved') throw new Error(out.reason);
  return out;
}

describe('expm oracle on rings (circulant closed form, DFT diagonalisation)', () => {
  it('300 states, a = 0.75, b = 0.25, λT = 100: 30 digits at states around the drift and far away', () => {
    const n = 300;
    const m = buildModel(ring(n, '0.75', '0.25', '100'));
    const out = solved(m, 30);
    expect(out.stats.digitsConfirmed).toBe(30);
    // v_s(T) = P(X_T = q0 | X_0 = qs) = p_{(n − s) mod n}(T).
    const p = ringReference(n, '0.75', '0.25', '100');
    for (const s of [250, 240, 260, 230, 200, 299, 0, 150]) {
      const ref = p((n - s) % n);
      expect(new D(out.valuesDecimal![s]!).minus(ref).abs().toNumber()).toBeLessThanOrEqual(1e-30);
      expect(Math.abs(out.values[s]! - ref.toNumber())).toBeLessThanOrEqual(out.errorBound);
    }
  });

  it('1,000 states, a = 1.3, b = 0.2, T = 60 (λT = 90): 30 digits at four states', () => {
    const n = 1000;
    const m = buildModel(ring(n, '1.3', '0.2', '60'));
    const out = solved(m, 30);
    expect(out.stats.digitsConfirmed).toBe(30);
    const p = ringReference(n, '1.3', '0.2', '60');
    for (const s of [934, 910, 960, 500]) {
      const ref = p((n - s) % n);
      expect(new D(out.valuesDecimal![s]!).minus(ref).abs().toNumber()).toBeLessThanOrEqual(1e-30);
    }
  });

  it('80 digits asked on 120 states (λT = 30): confirmed at two working precisions, against the closed form', () => {
    const n = 120;
    const m = buildModel(ring(n, '2.5', '0.5', '10'));
    const out = solved(m, 80);
    expect(out.stats.digitsConfirmed).toBe(80);
    expect(out.stats.precisionDisagreement!).toBeLessThanOrEqual(0.5e-80);
    expect(out.stats.aPrioriBound!).toBeLessThanOrEqual(0.5e-80);
    const D110 = Decimal.clone({ precision: 110 });
    const p = ringReference(n, '2.5', '0.5', '10', D110);
    for (const s of [100, 90, 110, 0, 60]) {
      expect(new D110(out.valuesDecimal![s]!).minus(p((n - s) % n)).abs().lte('1e-80')).toBe(true);
    }
  });

  it('the rigorous bound holds at a low working precision (64 bits) and is not vacuous', () => {
    const n = 60;
    const m = buildModel(ring(n, '2', '1', '7'));
    const dm = decModel(m, decimalAt(20));
    const r = propagateFixed(dm, [{ length: '7', choice: new Int32Array(n) }], 64);
    let err = 0;
    const p = ringReference(n, '2', '1', '7');
    for (const s of [0, 5, 20, 40, 45, 59]) {
      const v = fixedToDec(D, r.X[s]!, 64);
      err = Math.max(err, v.minus(p((n - s) % n)).abs().toNumber());
    }
    expect(err).toBeLessThanOrEqual(r.bound);
    expect(r.bound).toBeLessThan(1e-12);
  });
});

describe('expm oracle on an Erlang chain (Erlang distribution function)', () => {
  it('500 stages of rate 1, T = 100 (λT = 100), goal within: every state to 30 digits', () => {
    const k = 500;
    const states: Record<string, { actions?: Record<string, Record<string, string>> }> = {};
    for (let i = 0; i < k; i++) states[`s${i}`] = { actions: { step: { [`s${i + 1}`]: '1' } } };
    states[`s${k}`] = {};
    const m = buildModel({ time_bound: '100', goal: [`s${k}`], states });
    const out = solved(m, 30);
    expect(out.stats.digitsConfirmed).toBe(30);
    // P(Erlang(r, 1) ≤ 100) = 1 − Σ_{j<r} e^{−100} 100^j/j!, for r = k − i stages left.
    const lt = new D(100);
    const e = lt.neg().exp();
    let cdfTail = new D(0);
    let term = new D(1);
    const below: Decimal[] = [];
    for (let j = 0; j < k; j++) {
      if (j > 0) term = term.times(lt).div(j);
      cdfTail = cdfTail.plus(term);
      below.push(cdfTail.times(e)); // P(Poisson(100) ≤ j)
    }
    for (let i = 0; i < k; i++) {
      const ref = new D(1).minus(below[k - i - 1]!);
      const s = stateIndex(m, `s${i}`);
      expect(new D(out.valuesDecimal![s]!).minus(ref).abs().toNumber()).toBeLessThanOrEqual(1e-30);
    }
  });
});
