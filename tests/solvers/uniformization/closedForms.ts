/**
 * Closed forms for small chains, evaluated in 50-digit decimal arithmetic (decimal.js 10.6.0) so
 * that they are a more precise reference than any double-precision solver. Shared by the
 * uniformization and Euler tests.
 */
import { Decimal } from 'decimal.js';
import { buildModel } from '../../../corpus/format/build.js';
import { compile, type CompiledModel } from '../../../corpus/format/compile.js';

export const D = Decimal.clone({ precision: 50 });
export type Dec = InstanceType<typeof D>;

/** Two states a ⇄ b with rates α (a→b) and β (b→a), goal b. */
export function twoState(alpha: number, beta: number, T: number, mode: 'within' | 'at'): CompiledModel {
  return compile(buildModel({
    name: 'two-state', time_bound: T, goal: ['b'], goal_mode: mode, initial: 'a',
    states: { a: { actions: { go: { b: alpha } } }, b: { actions: { back: { a: beta } } } },
  }));
}

/**
 * Mode `at`, from a: p(t) = α/(α+β)·(1 − e^{−(α+β)t}) (the two-state chain; e.g. S. M. Ross,
 * "Introduction to Probability Models", 10th ed., 2010, ch. 6, the Kolmogorov
 * equations of the two-state chain; chapter from memory). Mode `within`: 1 − e^{−αt}.
 */
export function twoStateExact(alpha: number, beta: number, t: number, mode: 'within' | 'at'): Dec {
  const a = new D(alpha);
  if (mode === 'within') return new D(1).minus(a.neg().times(t).exp());
  const s = a.plus(beta);
  return a.div(s).times(new D(1).minus(s.neg().times(t).exp()));
}

/** A chain s0 → s1 → … → s_n with the given rates, goal s_n, mode within. */
export function chain(rates: readonly number[], T: number): CompiledModel {
  const states: Record<string, { actions?: Record<string, Record<string, number>> }> = {};
  rates.forEach((r, i) => (states[`s${i}`] = { actions: { next: { [`s${i + 1}`]: r } } }));
  states[`s${rates.length}`] = {};
  return compile(buildModel({ name: 'chain', time_bound: T, goal: [`s${rates.length}`], initial: 's0', states }));
}

/** P(Erlang(n, λ) ≤ t) = 1 − Σ_{k<n} e^{−λt}(λt)^k/k! (the Erlang distribution as a sum of exponentials; Ross 2010, ch. 5, from memory). */
export function erlangCdf(n: number, lambda: number, t: number): Dec {
  const x = new D(lambda).times(t);
  let term = x.neg().exp();
  let sum = new D(0);
  for (let k = 0; k < n; k++) {
    sum = sum.plus(term);
    term = term.times(x).div(k + 1);
  }
  return new D(1).minus(sum);
}

/**
 * Hypoexponential with distinct rates λ_i: P(X ≤ t) = 1 − Σ_i C_i e^{−λ_i t}, C_i = Π_{j≠i} λ_j/(λ_j − λ_i)
 * (Ross 2010, ch. 5, convolutions of exponentials,
 * from memory).
 */
export function hypoexponentialCdf(rates: readonly number[], t: number): Dec {
  let sum = new D(0);
  rates.forEach((li, i) => {
    let c = new D(1);
    rates.forEach((lj, j) => {
      if (j !== i) c = c.times(new D(lj).div(new D(lj).minus(li)));
    });
    sum = sum.plus(c.times(new D(li).neg().times(t).exp()));
  });
  return new D(1).minus(sum);
}

/** |x − exact| as a double (the difference is computed in 50 digits). */
export function errorOf(x: number, exact: Dec): number {
  return new D(x).minus(exact).abs().toNumber();
}
