/**
 * The model in a time unit where the largest exit rate is of order 1, exactly: every rate times 10^−k
 * and the time bound times 10^k, done on the decimal texts (a shift of the decimal exponent, no
 * rounding). Values depend on rates and time only through R·t (common practice, no source), so they
 * are unchanged; switching times of a scheduler scale by 10^k. The oracles' tolerances and cell sizes
 * are chosen for rates of moderate size, so a model with rates near 1e−24 and a time bound near 1e+22
 * would otherwise hit them.
 */
import { Decimal } from 'decimal.js';
import type { Model } from '../../corpus/format/types.js';

/** Enough digits for any mantissa the number grammar admits in a file of the size limit. */
const D = Decimal.clone({ precision: 1e6 });

/**
 * Decimal exponent k with max exit rate · 10^−k in [0.1, 10); 0 when nothing moves or it is moderate
 * already. Goal states in mode `within` are frozen (the oracles drop their actions), so their rates,
 * however large, do not set the unit.
 */
export function timeUnitExponent(model: Model): number {
  const frozen = new Set(model.goalMode === 'within' ? model.goal : []);
  let maxExit = 0;
  model.states.forEach((s, i) => {
    if (frozen.has(i)) return;
    for (const a of s.actions) {
      let e = 0;
      for (const t of a.successors) if (t.target !== i) e += t.rate;
      maxExit = Math.max(maxExit, e);
    }
  });
  if (!(maxExit > 0) || (maxExit >= 1e-3 && maxExit <= 1e3)) return 0;
  return Math.round(Math.log10(maxExit));
}

function shift(text: string, k: number): string {
  return new D(text).times(new D(10).pow(k)).toString();
}

/** The same model with rates × 10^−k and the time bound × 10^k, on the exact decimal texts. */
export function inTimeUnit(model: Model, k: number): Model {
  if (k === 0) return model;
  const states = model.states.map((s) => ({
    ...s,
    actions: s.actions.map((a) => ({
      ...a,
      successors: a.successors.map((t) => {
        const rateText = shift(t.rateText, -k);
        return { ...t, rateText, rate: Number(rateText) };
      }),
    })),
  }));
  const timeBoundText = shift(model.timeBoundText, k);
  return { ...model, states, timeBoundText, timeBound: Number(timeBoundText) };
}
