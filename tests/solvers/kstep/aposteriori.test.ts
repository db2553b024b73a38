/**
 * The a-posteriori truncation bound A of one k-step interval (solvers/kstep/aposteriori.ts) and the
 * interval lengths chosen from it, tried against closed forms and the optimal-control oracle.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildModel, type ModelObject } from '../../../corpus/format/build.js';
import { compile, type CompiledModel } from '../../../corpus/format/compile.js';
import { solveOracle } from '../../../oracles/index.js';
import { aposterioriBound } from '../../../solvers/kstep/aposteriori.js';
import { localBound } from '../../../solvers/kstep/bound.js';
import { solveKstep } from '../../../solvers/kstep/index.js';
import { makeWork, runInterval } from '../../../solvers/kstep/interval.js';

const solved = (o: ReturnType<typeof solveKstep>) => {
  if (o.kind !== 'solved') throw new Error(`refused: ${o.reason}`);
  return o;
};

/** One interval of length len from the goal indicator: f̃^k(len) and A(len). */
function oneInterval(m: CompiledModel, k: number, len: number): { values: Float64Array; A: number } {
  const S = m.nStates;
  const active = new Uint8Array(S);
  const x = new Float64Array(S);
  for (let s = 0; s < S; s++) {
    x[s] = m.goal[s]!;
    const frozen = m.goalMode === 'within' && m.goal[s] === 1;
    for (let a = m.actionStart[s]!; a < m.actionStart[s + 1]!; a++) if (!frozen && m.exitRate[a]! > 0) active[s] = 1;
  }
  const w = makeWork(m, k, active, x, 64);
  const out = new Float64Array(S);
  if (!runInterval(w, x, len, out)) throw new Error('piece cap');
  return { values: out, A: aposterioriBound(w, m.lambda, len) };
}

// The symmetric two-state chain, rate λ each way, goal b in mode `at`: from a, v(t) = ½(1 − e^{−2λt})
// (textbook two-state formula p(t) = a/(a+b)(1 − e^{−(a+b)t}) with a = b = λ). It nearly attains the
// a-priori bound (L), so it is the hardest case for any bound of the truncation.
const lambda = 2;
const sym = compile(buildModel({ time_bound: 1, goal: ['b'], goal_mode: 'at', states: { a: { actions: { x: { b: lambda } } }, b: { actions: { y: { a: lambda } } } } }));
const exact = (t: number) => 0.5 * (1 - Math.exp(-2 * lambda * t));

describe('kstep a-posteriori bound (A)', () => {
  it('one interval of the two-state chain: the error is below A, also far beyond the contraction range (λε up to 2)', () => {
    for (const k of [1, 2, 3, 4, 5, 6])
      for (const le of [0.01, 0.1, 0.5, 1, 2]) {
        const len = le / lambda;
        const { values, A } = oneInterval(sym, k, len);
        const err = Math.max(Math.abs(values[0]! - exact(len)), Math.abs(values[1]! - (1 - exact(len))));
        // 1e-15: the rounding of one interval (ρ in solvers/kstep/bound.ts is ~1e-15 here), which A leaves out.
        expect(err).toBeLessThanOrEqual(A + 1e-15);
        // A is a usable bound: within a factor e^{2λε}·(k + 2)·2 of the error where the error is
        // well above rounding (on this chain D(σ) = |c_k|σ^k and the error is ≈ 2λ|c_k|ε^{k+1}/(k+1)·½).
        if (err > 1e-13 && le <= 0.5) expect(A / err).toBeLessThan(Math.exp(2 * le) * (k + 2) * 2);
      }
  });

  it('race chains (switches inside the interval, the piecewise path): one long interval against the oracle', () => {
    // Switching models from the race family of switching.test.ts, one interval over the whole time
    // bound, so the piecewise levels and their difference bound are exercised where A < L.
    const arb = fc.record({ mu: fc.double({ min: 0.3, max: 2, noNaN: true }), nu: fc.double({ min: 2, max: 6, noNaN: true }), nu2: fc.double({ min: 2, max: 6, noNaN: true }), T: fc.double({ min: 0.05, max: 0.6, noNaN: true }), min: fc.boolean() });
    let compared = 0;
    let usedA = 0;
    fc.assert(
      fc.property(arb, fc.integer({ min: 1, max: 5 }), (p, k) => {
        const r = (x: number) => Number(x.toPrecision(4));
        const obj: ModelObject = {
          name: 'race', time_bound: Number(p.T.toPrecision(3)), goal: ['goal'],
          states: {
            c0: { owner: p.min ? 'min' : 'max', actions: { A: { c1: 2 * r(p.mu) }, B: { m0: r(p.nu) } } },
            m0: { actions: { go: { c1: r(p.nu2) } } },
            c1: { owner: 'max', actions: { A: { goal: r(p.mu) }, B: { m1: r(p.nu) } } },
            m1: { actions: { go: { goal: r(p.nu2) } } },
            goal: {},
          },
        };
        const model = buildModel(obj);
        const m = compile(model);
        const ref = solveOracle(model, { digits: 14 });
        if (ref.kind !== 'solved') return;
        const o = solveKstep(m, { precision: 1e6, k, intervals: 1, pieceCap: 64 });
        if (o.kind !== 'solved') return;
        compared++;
        const L = localBound(m.lambda, m.timeBound, k);
        if (o.stats.truncationBound! < L) usedA++;
        for (let s = 0; s < m.nStates; s++) expect(Math.abs(o.values[s]! - ref.values[s]!)).toBeLessThanOrEqual(o.errorBound + ref.errorBound);
      }),
      { numRuns: 40, seed: 2718 },
    );
    expect(compared).toBeGreaterThan(30);
    // Coverage guard: A (not L) must be what is tested on a good share of these switching models.
    expect(usedA).toBeGreaterThanOrEqual(8);
  });

  it('adaptive lengths: a slowly varying solution needs far fewer intervals, and the bound holds (two-state chain, closed form)', () => {
    // Two-state chain a ⇄ b with rates 0.4 and 1.1 and a fast unrelated state (rate 10, which sets λ):
    // p(T) = a/(a+b)(1 − e^{−(a+b)T}) (textbook two-state formula); the fast state settles at once.
    const m = compile(buildModel({
      time_bound: 3, goal: ['b', 'z'], goal_mode: 'at',
      states: { a: { actions: { x: { b: 0.4 } } }, b: { actions: { y: { a: 1.1 } } }, f: { actions: { go: { z: 10 } } }, z: { actions: { back: { f: 1e-3 } } } },
    }));
    const p = (0.4 / 1.5) * (1 - Math.exp(-1.5 * 3));
    for (const k of [3, 4])
      for (const precision of [1e-6, 1e-9]) {
        const ad = solved(solveKstep(m, { precision, k }));
        const fixed = solved(solveKstep(m, { precision, k, adaptive: false }));
        expect(Math.abs(ad.values[0]! - p)).toBeLessThanOrEqual(ad.errorBound);
        expect(ad.errorBound).toBeLessThanOrEqual(precision);
        expect(ad.stats.intervals!).toBeLessThan(fixed.stats.intervals! / 3);
      }
  });
});

describe('kstep last-level shortcut', () => {
  it('switches spread to predecessors (race chains with fan-in): values within the bound of the optimal oracle, shortcut used', () => {
    // A switching race state r (max: A straight to the goal at rate μ, or B through m at ν, ν′) with
    // predecessors p_i that reach r at different rates, and a pre-predecessor q (min between p_0 and
    // p_1): at level k the predecessors see a piecewise successor while their own choice is fixed.
    const arb = fc.record({
      mu: fc.double({ min: 0.3, max: 2, noNaN: true }), nu: fc.double({ min: 2, max: 6, noNaN: true }), nu2: fc.double({ min: 2, max: 6, noNaN: true }),
      p: fc.array(fc.double({ min: 0.2, max: 3, noNaN: true }), { minLength: 2, maxLength: 3 }), T: fc.double({ min: 0.3, max: 2, noNaN: true }),
    });
    let compared = 0;
    let shortcut = 0;
    fc.assert(
      fc.property(arb, fc.integer({ min: 2, max: 4 }), fc.integer({ min: 1, max: 4 }), (a, k, n) => {
        const r = (x: number) => Number(x.toPrecision(4));
        const states: NonNullable<ModelObject['states']> = {
          r: { owner: 'max', actions: { A: { goal: r(a.mu) }, B: { m: r(a.nu) } } },
          m: { actions: { go: { goal: r(a.nu2) } } },
          q: { owner: 'min', actions: { x: { p0: 1.5 }, y: { p1: 0.9, fail: 0.4 } } },
          goal: {}, fail: {},
        };
        a.p.forEach((rate, i) => (states[`p${i}`] = { actions: { go: { r: r(rate), fail: 0.1 * (i + 1) } } }));
        const model = buildModel({ name: 'fan-in', time_bound: Number(a.T.toPrecision(3)), goal: ['goal'], states });
        const m = compile(model);
        const ref = solveOracle(model, { digits: 14 });
        if (ref.kind !== 'solved') return;
        compared++;
        for (const o of [solveKstep(m, { precision: 1e-8, k }), solveKstep(m, { precision: 1e6, k, intervals: n, pieceCap: 64 })]) {
          if (o.kind !== 'solved') continue;
          if (o.stats.shortcutStateLevels! > 0) shortcut++;
          for (let s = 0; s < m.nStates; s++) expect(Math.abs(o.values[s]! - ref.values[s]!)).toBeLessThanOrEqual(o.errorBound + ref.errorBound);
        }
      }),
      { numRuns: 30, seed: 1618 },
    );
    expect(compared).toBeGreaterThan(20);
    expect(shortcut).toBeGreaterThan(10);
  });
});
