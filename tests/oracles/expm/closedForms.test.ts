/**
 * The expm oracle against closed forms, to 30 digits. The references are evaluated independently
 * here with decimal.js exp at 50 digits.
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import { solveExpm } from '../../../oracles/expm/index.js';

const D = Decimal.clone({ precision: 50 });

function solved(model: ReturnType<typeof buildModel>, digits: number) {
  const out = solveExpm(model, { digits });
  if (out.kind !== 'solved') throw new Error(out.reason);
  return out;
}

/** |decimal string − reference| in units of 10^-digits. */
function agrees(text: string, ref: Decimal, digits: number): boolean {
  return new D(text).minus(ref).abs().lte(new D(10).pow(-digits));
}

describe('expm oracle: closed forms', () => {
  // Two-state chain 0 ⇄ 1 with rates a, b: P(X_t = 1 | X_0 = 0) = a/(a+b)·(1 − e^{−(a+b)t}).
  // Source: S. M. Ross, Introduction to Probability Models (two-state chain, Kolmogorov backward
  // equations, chapter 6); from memory.
  it('two-state chain, goal mode at, 30 digits (Ross, two-state chain)', () => {
    const m = buildModel({
      time_bound: '1.7', goal: ['up'], goal_mode: 'at',
      states: { down: { actions: { go: { up: '0.3' } } }, up: { actions: { go: { down: '1.9', up: '5' } } } },
    });
    const out = solved(m, 30);
    const a = new D('0.3');
    const b = new D('1.9');
    const t = new D('1.7');
    const s = a.plus(b);
    const p01 = a.div(s).times(new D(1).minus(s.neg().times(t).exp()));
    const p11 = a.div(s).plus(b.div(s).times(s.neg().times(t).exp()));
    expect(out.stats.digitsConfirmed).toBe(30);
    expect(agrees(out.valuesDecimal![0]!, p01, 30)).toBe(true);
    expect(agrees(out.valuesDecimal![1]!, p11, 30)).toBe(true);
    expect(Math.abs(out.values[0]! - p01.toNumber())).toBeLessThanOrEqual(out.errorBound);
  });

  // Erlang(k, λ): P(S_k ≤ t) = 1 − Σ_{j<k} e^{−λt}(λt)^j/j!. Source: Ross, Introduction to
  // Probability Models, the gamma (Erlang) distribution as a sum of exponentials; from memory.
  it('Erlang-5 reaching time, goal mode within, 30 digits (Ross, gamma distribution)', () => {
    const k = 5;
    const states: Record<string, { actions?: Record<string, Record<string, string>> }> = {};
    for (let i = 0; i < k; i++) states[`s${i}`] = { actions: { step: { [`s${i + 1}`]: '2.5' } } };
    states[`s${k}`] = {};
    const m = buildModel({ time_bound: '1.3', goal: [`s${k}`], states });
    const out = solved(m, 30);
    const lt = new D('2.5').times('1.3');
    let sum = new D(0);
    let term = new D(1);
    for (let j = 0; j < k; j++) {
      if (j > 0) term = term.times(lt).div(j);
      sum = sum.plus(term);
    }
    const ref = new D(1).minus(sum.times(lt.neg().exp()));
    expect(agrees(out.valuesDecimal![0]!, ref, 30)).toBe(true);
    expect(out.valuesDecimal![k]).toBe('1.' + '0'.repeat(30));
  });

  // Hypoexponential with distinct rates λ_i: P(S ≤ t) = 1 − Σ_i C_i e^{−λ_i t},
  // C_i = Π_{j≠i} λ_j/(λ_j − λ_i). Source: Ross, Introduction to Probability Models, section on the
  // hypoexponential distribution (chapter 5); from memory.
  it('hypoexponential with rates 0.5, 3, 40, 30 digits (Ross, hypoexponential)', () => {
    const rates = ['0.5', '3', '40'];
    const m = buildModel({
      time_bound: '0.8', goal: ['done'],
      states: {
        a: { actions: { go: { b: rates[0]! } } },
        b: { actions: { go: { c: rates[1]! } } },
        c: { actions: { go: { done: rates[2]!, c: '7' } } },
        done: {},
      },
    });
    const out = solved(m, 30);
    const l = rates.map((r) => new D(r));
    const t = new D('0.8');
    let tail = new D(0);
    for (let i = 0; i < l.length; i++) {
      let c = new D(1);
      for (let j = 0; j < l.length; j++) if (j !== i) c = c.times(l[j]!).div(l[j]!.minus(l[i]!));
      tail = tail.plus(c.times(l[i]!.neg().times(t).exp()));
    }
    expect(agrees(out.valuesDecimal![0]!, new D(1).minus(tail), 30)).toBe(true);
  });
});
