/**
 * Closed forms, derived by hand, for the one-switch family used by the optimal-oracle tests.
 *
 * State s (max) chooses `direct` (rate μ to the goal g) or `via` (rate λ to t); t reaches g at
 * rate γ; mode within. With τ the time left, v_t = 1 − e^{−γτ}. Near the deadline `direct` is
 * better (g_direct = μ > g_via = 0 at τ = 0); under `direct` v_s = 1 − e^{−μτ}, and the advantage
 * of `via`, λ(v_t − v_s) − μ(1 − v_s) = (λ − μ)e^{−μτ} − λe^{−γτ}, vanishes at
 *   τ* = ln(λ/(λ − μ)) / (γ − μ)      (λ > μ, γ > μ).
 * After τ*, under `via`, w = 1 − v_s solves w' = −λw + λe^{−γτ}, so
 *   w(τ) = C e^{−λτ} + λ e^{−γτ}/(λ − γ),   C = (e^{−μτ*} − λe^{−γτ*}/(λ − γ)) e^{λτ*}.
 * (That `via` stays optimal after τ* is checked per parameter set by the oracle's own certificate
 * and by the random-scheduler tests; for μ = 1, λ = 3, γ = 2 the advantage is 3e^{−3τ}(e^τ − 3/2).)
 */
import { Decimal } from 'decimal.js';

export const DC = Decimal.clone({ precision: 60 });

export interface OneSwitch {
  readonly tauStar: Decimal;
  readonly vs: Decimal;
  readonly vt: Decimal;
}

export function oneSwitch(mu: string, lambda: string, gamma: string, T: string): OneSwitch {
  return oneSwitchMixed(mu, '0', lambda, gamma, T);
}

/**
 * The same family with the second action mixed: rate a to g and b to t (`via` is a = 0, b = λ).
 * Under it w' = −(a+b)w + b e^{−γτ}; the switch is at e^{(γ−μ)τ*} = b/(a + b − μ), and after it
 *   w(τ) = C e^{−(a+b)τ} + b e^{−γτ}/(a + b − γ),   C = (e^{−μτ*} − b e^{−γτ*}/(a + b − γ)) e^{(a+b)τ*}.
 */
export function oneSwitchMixed(mu: string, a: string, b: string, gamma: string, T: string): OneSwitch {
  const m = new DC(mu);
  const rb = new DC(b);
  const ab = new DC(a).plus(rb);
  const g = new DC(gamma);
  const t = new DC(T);
  const tauStar = rb.div(ab.minus(m)).ln().div(g.minus(m));
  const vt = new DC(1).minus(g.neg().times(t).exp());
  if (t.lte(tauStar)) return { tauStar, vs: new DC(1).minus(m.neg().times(t).exp()), vt };
  const k = rb.div(ab.minus(g));
  const C = m.neg().times(tauStar).exp().minus(k.times(g.neg().times(tauStar).exp())).times(ab.times(tauStar).exp());
  const w = C.times(ab.neg().times(t).exp()).plus(k.times(g.neg().times(t).exp()));
  return { tauStar, vs: new DC(1).minus(w), vt };
}

/** |text − ref| ≤ 10^-digits. */
export function within(text: string, ref: Decimal, digits: number): boolean {
  return new DC(text).minus(ref).abs().lte(new DC(10).pow(-digits));
}
