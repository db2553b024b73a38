/**
 * The adversarial fuzz family (corpus/generators/adversarial.ts): over a fixed seed it draws every
 * feature it promises, and every near-tie is verified on the emitted model itself — the rates read
 * back from their decimal text and the Taylor coefficients at time left 0 recomputed here, in
 * decimal.js 10.6.0 with code of this test (not the generator's).
 */
import fc from 'fast-check';
import { Decimal } from 'decimal.js';
import { describe, expect, test } from 'vitest';
import type { ModelObject } from '../../../corpus/format/build.js';
import { validateModelObject } from '../../../corpus/format/load.js';
import { arbAdversarialDraw, buildAdversarial } from '../../../corpus/generators/adversarial.js';
import type { AdversarialFeatures } from '../../../corpus/generators/adversarial.js';
import { Dec, TEXT_FORMS, decimalText } from '../../../corpus/generators/decimalText.js';

const D = Decimal.clone({ precision: 80, toExpNeg: -9e15, toExpPos: 9e15 });
type Num = InstanceType<typeof D>;
const read = (r: string | number): Num => new D(typeof r === 'number' ? String(r) : r);

/**
 * r_i(a) for i = 0 … order at time left 0 for both actions of s, with v_s^{(i)} taken from a1:
 * d_0 = [u ∈ G], d_{i+1}(u) = Σ_w R(u, w)(d_i(w) − d_i(u)) over the states other than s (frozen goals
 * in mode `within` have zero rows), then r_i(a) = Σ_u R_a(u)(d_i(u) − v_s^{(i)}).
 */
function coefficients(m: ModelObject, order: number): { a1: Num[]; a2: Num[]; size: Num[] } {
  const states = m.states!;
  const names = Object.keys(states).filter((n) => n !== 's');
  const within = m.goal_mode !== 'at';
  let d = new Map(names.map((n) => [n, new D(m.goal.includes(n) ? 1 : 0)]));
  const ds = [d];
  for (let i = 1; i <= order; i++) {
    const prev = d;
    d = new Map(
      names.map((n) => {
        const acts = Object.values(states[n]!.actions ?? {});
        if ((within && m.goal.includes(n)) || acts.length === 0) return [n, new D(0)];
        let acc = new D(0);
        for (const [w, r] of Object.entries(acts[0]!)) acc = acc.plus(read(r).times(prev.get(w)!.minus(prev.get(n)!)));
        return [n, acc];
      }),
    );
    ds.push(d);
  }
  const a1 = states.s!.actions!.a1!;
  const a2 = states.s!.actions!.a2!;
  const out = { a1: [] as Num[], a2: [] as Num[], size: [] as Num[] };
  let vs = new D(0);
  for (let i = 0; i <= order; i++) {
    const r = (act: Record<string, string | number>): Num =>
      Object.entries(act).reduce((acc, [u, rate]) => acc.plus(read(rate).times(ds[i]!.get(u)!.minus(vs))), new D(0));
    const size = Object.entries(a1).reduce((acc, [u, rate]) => acc.plus(read(rate).times(ds[i]!.get(u)!.minus(vs).abs())),
      new D(0));
    out.a1.push(r(a1));
    out.a2.push(r(a2));
    out.size.push(size);
    vs = out.a1[i]!;
  }
  return out;
}

/** Checks that the model has the near-tie its features state; returns the measured relative gap. */
function verifyTie(m: ModelObject, f: AdversarialFeatures): number {
  const c = coefficients(m, f.order);
  for (let i = 0; i < f.order; i++) {
    // Agree below the order up to the 30 digits the second action's rates are written with.
    expect(c.a2[i]!.minus(c.a1[i]!).abs().lte(c.size[i]!.times('1e-27'))).toBe(true);
  }
  const j = f.order;
  const diff = c.a2[j]!.minus(c.a1[j]!);
  const scale = c.a1[j]!.isZero() ? c.size[j]! : c.a1[j]!.abs();
  const gap = diff.abs().div(scale).toNumber();
  expect(Math.abs(gap / f.gap - 1)).toBeLessThan(1e-9);
  // a2 better for the owner: a larger coefficient for max, a smaller one for min.
  const better = f.owner === 'max' ? diff.gt(0) : diff.lt(0);
  expect(better).toBe(f.a2Better);
  return gap;
}

function rateTexts(m: ModelObject): (string | number)[] {
  return Object.values(m.states!).flatMap((s) => Object.values(s.actions ?? {}).flatMap((a) => Object.values(a)));
}

describe('adversarial family', () => {
  const draws = fc.sample(arbAdversarialDraw({ maxStates: 8 }), { seed: 42, numRuns: 300 })
    .map((d) => buildAdversarial(d, 8));

  test('300 draws at seed 42: valid models, each with the near-tie it states, verified on the model', () => {
    for (const { model, features } of draws) {
      validateModelObject(model, 'adversarial.json');
      const gap = verifyTie(model, features);
      expect(gap).toBeGreaterThanOrEqual(1e-13 * (1 - 1e-9));
      expect(gap).toBeLessThan(1e-3);
    }
  });

  test('ties at orders 0, 1, 2 and 3, gaps over ten decades, both players, both goal modes', () => {
    const f = draws.map((d) => d.features);
    expect(new Set(f.map((x) => x.order))).toEqual(new Set([0, 1, 2, 3]));
    for (const order of [0, 1, 2, 3]) expect(f.filter((x) => x.order === order).length).toBeGreaterThan(20);
    const decades = new Set(f.map((x) => Math.ceil(-Math.log10(x.gap)))); // e: δ in [1e-e, 1e-(e-1))
    for (let e = 4; e <= 13; e++) expect(decades.has(e)).toBe(true);
    for (const owner of ['max', 'min']) {
      for (const better of [true, false]) expect(f.some((x) => x.owner === owner && x.a2Better === better)).toBe(true);
    }
    expect(new Set(draws.map((d) => d.model.goal_mode))).toEqual(new Set(['within', 'at']));
  });

  test('frozen goals with huge rates (mode within), unrelated fast states, models scaled by 10^±150', () => {
    let frozen = 0;
    let fast = 0;
    let up = 0;
    let down = 0;
    for (const { model, features } of draws) {
      const T = Number(model.time_bound);
      const rate = (x: string | number | undefined): number => Number(x) * T;
      const g = Object.values(model.states!.g!.actions ?? {})[0];
      if (model.goal_mode === 'within' && g && rate(g.z) >= 1e5) frozen++;
      const f = model.states!.f?.actions?.spin?.z;
      if (f !== undefined && rate(f) >= 50) fast++;
      expect(features.frozenHuge).toBe(model.goal_mode === 'within' && g !== undefined);
      // λT stays moderate however the model is scaled: rate × time bound is scale-free.
      for (const r of rateTexts(model)) expect(rate(r)).toBeLessThan(1e13);
      if (T < 1e-100) up++;
      if (T > 1e100) down++;
    }
    expect(frozen).toBeGreaterThan(30);
    expect(fast).toBeGreaterThan(30);
    expect(up).toBeGreaterThan(5);
    expect(down).toBeGreaterThan(5);
  });

  test('rates written in every decimal form', () => {
    const texts = draws.flatMap((d) => [...rateTexts(d.model), d.model.time_bound]);
    const has = (re: RegExp): boolean => texts.some((t) => typeof t === 'string' && re.test(t));
    expect(has(/^[0-9.]+e\+[0-9]+$/)).toBe(true); // "1e+0"
    expect(has(/^[0-9.]+E\+[0-9]+$/)).toBe(true); // "2.5E+1"
    expect(has(/e-0$/)).toBe(true); // "1e-0"
    expect(has(/^\.[0-9]+$/)).toBe(true); // ".5"
    expect(has(/^\.[0-9]+e-?[0-9]+$/)).toBe(true); // ".25e2"
    expect(has(/^[0-9]+\.[0-9]+$/)).toBe(true); // plain
    expect(texts.some((t) => typeof t === 'number')).toBe(true);
  });

  test('every text form denotes the same decimal exactly', () => {
    for (const s of ['1', '25', '0.5', '0.000123', '9.99e150', '1.23456789012345678901234567890e-150']) {
      const x = new Dec(s);
      for (const form of TEXT_FORMS) {
        const t = decimalText(x, form);
        expect(new D(String(t)).eq(x), `${s} as ${form}: ${t}`).toBe(true);
      }
    }
    expect(decimalText(new Dec(1), 'e+')).toBe('1e+0');
    expect(decimalText(new Dec(25), 'E+')).toBe('2.5E+1');
    expect(decimalText(new Dec(1), 'e-0')).toBe('1e-0');
    expect(decimalText(new Dec('0.5'), 'dot')).toBe('.5');
  });

  test('shrinking keeps the structure: a failure that needs an order-2 tie in mode at shrinks to one', () => {
    const prop = fc.property(arbAdversarialDraw({ maxStates: 8 }), (d) => {
      const f = buildAdversarial(d, 8).features;
      return !(f.order >= 2 && f.mode === 'at');
    });
    const out = fc.check(prop, { seed: 7, numRuns: 200 });
    expect(out.failed).toBe(true);
    const { model, features } = buildAdversarial(out.counterexample![0], 8);
    expect(features.order).toBe(2);
    expect(features.mode).toBe('at');
    // Everything the failure does not need has shrunk away, and the tie is still exact.
    expect(features.fast).toBe(false);
    expect(features.scaleExp).toBe(0);
    verifyTie(model, features);
  });
});
