/**
 * Adversarial models for `fuzz`, as fast-check arbitraries: the cases where a solver's tie-breaking,
 * scaling or rate reading goes wrong while its error bound still looks fine.
 *
 * Every draw is one near-tie (./nearTie.ts): state s, owned by the max or the min player, has actions
 * a1 and a2 whose Bellman right-hand sides agree at time left 0 in value and in derivatives up to
 * order j − 1 and differ at order j (j = 0 … 3) by a relative gap δ in [10^-13, 10^-3); a2 is the
 * better action for the owner near the deadline or the worse one. The successors of s are the goal
 * g, a sink z and (for higher orders) states u1, u2 that reach g at their own rates. Around it:
 * - a frozen goal: in mode `within`, g has a huge rate (10^6 … 10^12) out of it, which the Bellman
 *   equations never see (goal states are absorbing there) but a solver's global rate scale does;
 *   in mode `at`, g may leak to z at a moderate rate instead;
 * - an unrelated fast state f (rate 1 … 1000 to z; the other rates are 0.1 … 1), which raises λ without
 *   touching s: a solver's tolerance that grows with λ then swallows gaps that still cost values;
 * - the whole model scaled by 10^S, S = −150 … 150 (every rate × 10^S, the time bound × 10^−S, so λT
 *   and every value stay the same);
 * - every rate and the time bound written as decimal text in a drawn form ("2.5e+1", "2.5E+1",
 *   "25e-0", ".25e2", plain digits, a JSON number; see ./decimalText.ts), read exactly by the oracles.
 * Shrinking is fast-check's on the parameters, and the model is rebuilt from them each time, so a
 * shrunk counterexample is still a near-tie; features that the failure does not need shrink away
 * (the option of a huge rate or a fast state to none, S to 0, j to 0, δ towards 10^-4).
 */
import fc from 'fast-check';
import type { ModelObject, RateInput } from '../format/build.js';
import type { GoalMode } from '../format/types.js';
import { Dec, TEXT_FORMS, decimalText, type TextForm } from './decimalText.js';
import { nearTieRates, type SuccessorChain } from './nearTie.js';

export interface AdversarialDraw {
  readonly order: number;
  /** δ = gapMant/1000 · 10^-(gapExp − 1): gapExp 4 … 13, gapMant 100 … 999. */
  readonly gapExp: number;
  readonly gapMant: number;
  /** a2 is the better action for the owner at time left 0 (else the worse). */
  readonly a2Better: boolean;
  readonly owner: 'max' | 'min';
  readonly mode: GoalMode;
  /** Successors of s beyond the order + 1 that the tie needs (0 … 3). */
  readonly extra: number;
  /** Mantissas 100 … 999 of the base rates (/ 1000: 0.1 … 0.999) and the time bound (/ 500: 0.2 … 1.998). */
  readonly rates: readonly number[];
  readonly time: number;
  /** Exponent of the huge rate out of the frozen goal (mode within), or undefined. */
  readonly hugeExp?: number | undefined;
  /** Mantissa of g's leak to z in mode `at`, or undefined. */
  readonly leak?: number | undefined;
  /** Mantissa of the fast state's rate, or undefined for no fast state; rate = mantissa·10^(fastExp − 3):
   *  1 … 10, 10 … 100 or 100 … 1000 (fastExp 1, 2, 3). */
  readonly fast?: number | undefined;
  readonly fastExp: number;
  readonly scaleExp: number;
  readonly forms: readonly TextForm[];
}

/** What a draw turned into (the order may be lower than drawn when the tie system is singular). */
export interface AdversarialFeatures {
  readonly order: number;
  readonly gap: number;
  readonly a2Better: boolean;
  readonly owner: 'max' | 'min';
  readonly mode: GoalMode;
  readonly frozenHuge: boolean;
  readonly fast: boolean;
  readonly scaleExp: number;
  readonly successors: number;
}

const RATE_SLOTS = 8;
const FORM_SLOTS = 12;

export function arbAdversarialDraw(opts: { maxStates?: number } = {}): fc.Arbitrary<AdversarialDraw> {
  const mant = fc.integer({ min: 100, max: 999 });
  const maxOrder = Math.max(0, Math.min(3, (opts.maxStates ?? 8) - 2));
  return fc.record({
    order: fc.integer({ min: 0, max: maxOrder }),
    // Half the gaps coarse (1e-4 … 1e-3: a wrong decision then costs more than a typical precision),
    // half anywhere in 1e-13 … 1e-3 (down to the rounding level of doubles).
    gapExp: fc.oneof(fc.constant(4), fc.integer({ min: 4, max: 13 })),
    gapMant: mant,
    // The later action better twice as often: keeping the lowest index on a tie is the common slip.
    a2Better: fc.oneof({ weight: 2, arbitrary: fc.constant(true) }, { weight: 1, arbitrary: fc.constant(false) }),
    owner: fc.constantFrom<'max' | 'min'>('max', 'min'),
    mode: fc.constantFrom<GoalMode>('within', 'at'),
    extra: fc.integer({ min: 0, max: 3 }),
    rates: fc.array(mant, { minLength: RATE_SLOTS, maxLength: RATE_SLOTS }),
    time: mant,
    hugeExp: fc.option(fc.integer({ min: 6, max: 12 }), { nil: undefined }),
    leak: fc.option(mant, { nil: undefined }),
    fast: fc.option(fc.noBias(mant), { nil: undefined }),
    // Half the fast states 100 … 1000 times faster than s: a tolerance that grows with λ is then large.
    fastExp: fc.oneof(fc.constant(3), fc.integer({ min: 1, max: 3 })),
    scaleExp: fc.oneof(fc.constant(0), fc.integer({ min: -150, max: 150 })),
    forms: fc.array(fc.constantFrom(...TEXT_FORMS), { minLength: FORM_SLOTS, maxLength: FORM_SLOTS }),
  });
}

export function arbAdversarialModelObject(opts: { maxStates?: number } = {}): fc.Arbitrary<ModelObject> {
  return arbAdversarialDraw(opts).map((d) => buildAdversarial(d, opts.maxStates).model);
}

const NAMES = ['g', 'z', 'u1', 'u2'];

export function buildAdversarial(
  d: AdversarialDraw,
  maxStates = 8,
): { model: ModelObject; features: AdversarialFeatures } {
  const r = (i: number): Dec => new Dec(d.rates[i % RATE_SLOTS]!).div(1000);
  // Successors of s: g, z, u1, u2 (the first n of them); states s, g, z, u1 …, and f if room is left.
  const n = Math.min(4, Math.max(d.order + 1, Math.min(4, d.order + 1 + d.extra)), Math.max(1, maxStates - 1));
  const within = d.mode === 'within';
  const rows: { to: number; rate: Dec }[][] = [
    within ? [] : d.leak !== undefined ? [{ to: 1, rate: new Dec(d.leak).div(500) }] : [],
    [],
    [{ to: 0, rate: r(4) }, { to: 1, rate: r(5) }],
    [{ to: 0, rate: r(6) }, { to: 2, rate: r(7) }],
  ];
  const chain: SuccessorChain = { goal: [true, false, false, false], frozen: [within, false, false, false], rows };
  const base = [0, 1, 2, 3].slice(0, n).map(r);
  const gap = new Dec(d.gapMant).div(1000).times(new Dec(10).pow(1 - d.gapExp));
  const sign = (d.a2Better ? 1 : -1) * (d.owner === 'max' ? 1 : -1) as 1 | -1;
  let order = Math.min(d.order, n - 1);
  let second = nearTieRates(chain, base, order, gap, sign);
  while (!second && order > 0) second = nearTieRates(chain, base, --order, gap, sign);
  // Order 0 always succeeds: only the rate to the goal changes, by the factor 1 ± δ.
  const a2 = second!;

  const scale = new Dec(10).pow(d.scaleExp);
  let slot = 0;
  const text = (x: Dec): RateInput => decimalText(x.times(scale), d.forms[slot++ % FORM_SLOTS]!);
  const action = (rates: readonly Dec[]): Record<string, RateInput> =>
    Object.fromEntries(rates.map((x, u) => [NAMES[u]!, text(x)]));
  const states: NonNullable<ModelObject['states']> = {
    s: { owner: d.owner, actions: { a1: action(base), a2: action(a2) } },
  };
  const hugeRate = within && d.hugeExp !== undefined ? new Dec(10).pow(d.hugeExp) : undefined;
  const leakRate = !within && d.leak !== undefined ? new Dec(d.leak).div(500) : undefined;
  if (hugeRate) states.g = { actions: { boom: { z: text(hugeRate) } } };
  else if (leakRate) states.g = { actions: { leak: { z: text(leakRate) } } };
  else states.g = {};
  states.z = {};
  if (n >= 3) states.u1 = { actions: { go: { g: text(r(4)), z: text(r(5)) } } };
  if (n >= 4) states.u2 = { actions: { go: { g: text(r(6)), u1: text(r(7)) } } };
  const fast = d.fast !== undefined && Object.keys(states).length < maxStates;
  if (fast) states.f = { actions: { spin: { z: text(new Dec(d.fast!).times(new Dec(10).pow(d.fastExp - 3))) } } };
  const features: AdversarialFeatures = {
    order, gap: gap.toNumber(), a2Better: d.a2Better, owner: d.owner, mode: d.mode,
    frozenHuge: hugeRate !== undefined, fast, scaleExp: d.scaleExp, successors: n,
  };
  return {
    model: {
      format: 'crossbound/1',
      name: `adversarial-tie${order}`,
      description: describe(features),
      time_bound: decimalText(new Dec(d.time).div(500).div(scale), d.forms[slot++ % FORM_SLOTS]!),
      goal: ['g'],
      goal_mode: d.mode,
      initial: 's',
      states,
    },
    features,
  };
}

function describe(f: AdversarialFeatures): string {
  const parts = [
    `near-tie at order ${f.order} in state s (owner ${f.owner}): a1 and a2 agree at time left 0 below ` +
      `order ${f.order} and differ there by relative gap ${f.gap.toExponential()}, ` +
      `a2 the ${f.a2Better ? 'better' : 'worse'} for the owner`,
    f.frozenHuge ? 'the frozen goal g has a huge rate out of it' : '',
    f.fast ? 'an unrelated fast state f' : '',
    f.scaleExp !== 0 ? `rates scaled by 1e${f.scaleExp} and the time bound by 1e${-f.scaleExp}` : '',
  ];
  return `Adversarial fuzz model (corpus/generators/adversarial.ts): ${parts.filter(Boolean).join('; ')}.`;
}
