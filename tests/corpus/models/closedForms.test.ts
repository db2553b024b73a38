/**
 * The `expect` values of the corpus files, recomputed here from the textbook formulas with
 * decimal.js 10.6.0 at 50 digits, independently of the file's own numbers:
 *  - two-state chain: p(t) = a/(a+b)(1 − e^{−(a+b)t}) (S. M. Ross, Introduction to Probability Models);
 *  - Erlang: P(Erlang(n, λ) ≤ t) = 1 − Σ_{k<n} e^{−λt}(λt)^k/k! (same book);
 *  - hypoexponential, distinct rates: 1 − Σ_i Π_{j≠i} λ_j/(λ_j − λ_i) e^{−λ_i t} (same book).
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { loadModelFileWithWarnings } from '../../../corpus/format/load.js';

const D = Decimal.clone({ precision: 50 });
const expected = (file: string): Record<string, string> => loadModelFileWithWarnings(file).model.expect!.values;
const agree30 = (a: string, b: InstanceType<typeof D>): void => {
  expect(new D(a).minus(b).abs().lessThan('1e-30')).toBe(true);
};

describe('corpus closed forms, recomputed with decimal.js', () => {
  it('kettle-scale: the two-state chain (Ross)', () => {
    const [a, b, T] = [new D('0.4'), new D('1.1'), new D(3)];
    const e = a.plus(b).neg().times(T).exp();
    const v = expected('corpus/models/kettle-scale.yaml');
    agree30(v.clean!, a.div(a.plus(b)).times(new D(1).minus(e)));
    agree30(v.scaled!, a.plus(b.times(e)).div(a.plus(b)));
  });
  it('dough-proofing: the Erlang distribution function (Ross)', () => {
    const x = new D('1.5').times(2);
    const v = expected('corpus/models/dough-proofing.yaml');
    for (const [state, n] of [['stage1', 4], ['stage2', 3], ['stage3', 2], ['stage4', 1]] as const) {
      let sum = new D(0);
      let term = new D(1);
      for (let k = 0; k < n; k++) {
        if (k > 0) term = term.times(x).div(k);
        sum = sum.plus(term);
      }
      agree30(v[state]!, new D(1).minus(sum.times(x.neg().exp())));
    }
  });
  it('relay-race: the hypoexponential distribution function (Ross)', () => {
    const rates = ['0.5', '1.25', '2.75'].map((r) => new D(r));
    const T = new D('2.5');
    const v = expected('corpus/models/relay-race.yaml');
    ['leg1', 'leg2', 'leg3'].forEach((state, st) => {
      const r = rates.slice(st);
      let p = new D(1);
      r.forEach((ri, i) => {
        let c = new D(1);
        r.forEach((rj, j) => {
          if (j !== i) c = c.times(rj).div(rj.minus(ri));
        });
        p = p.minus(c.times(ri.neg().times(T).exp()));
      });
      agree30(v[state]!, p);
    });
  });
});
