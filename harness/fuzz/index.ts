/**
 * `fuzz`: random models (corpus/generators/random.ts) through the methods and solvers; every
 * disagreement, broken bound or fault is shrunk by fast-check to a minimal model and saved as a
 * regression. The same seed replays the same run exactly.
 *
 * Each model is solved by the methods under test at `precision` and by a tight reference (kstep:4 at
 * `referencePrecision`), and judged by the checks of `check` (pairwise rule, range, dominance) —
 * the same comparator, so fuzz and check cannot disagree about what a disagreement is.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { buildModel, type ModelObject } from '../../corpus/format/build.js';
import { exportJson } from '../../corpus/format/export.js';
import { arbAdversarialModelObject } from '../../corpus/generators/adversarial.js';
import { arbDipModelObject } from '../../corpus/generators/dip.js';
import { arbModelObject, arbSwitchingModelObject } from '../../corpus/generators/random.js';
import { checkModel } from '../check/checkModel.js';
import { shellQuote } from '../check/reproduce.js';
import type { CheckResult, ModelReport } from '../check/types.js';
import { formatPrecision } from '../numbers.js';

export interface FuzzOptions {
  readonly runs: number;
  readonly seed: number;
  readonly maxStates: number;
  readonly precision: number;
  /** Methods under test (labels of check), e.g. ['euler', 'kstep:2', 'variant:min-as-max']. */
  readonly methods: readonly string[];
  readonly solvers?: readonly string[];
  readonly timeoutMs?: number;
  /** Folder for shrunk counterexamples; none: not saved. */
  readonly save?: string;
  /** What the run is doing: the model it is at, a disagreement found, each shrink step. */
  readonly onEvent?: (e: FuzzEvent) => void;
}

/**
 * `model`: the run is at model `index` (1-based) of `total`; `found`: model `index` failed a check
 * (`check`), with `states` states, and shrinking starts; `shrink`: one shrink step was tried (`tried`
 * so far, `successful` of them gave a smaller failing model), the smallest failing model has `states`.
 */
export type FuzzEvent =
  | { readonly kind: 'model'; readonly index: number; readonly total: number }
  | {
      readonly kind: 'found';
      readonly index: number;
      readonly total: number;
      readonly states: number;
      readonly check: string;
    }
  | { readonly kind: 'shrink'; readonly tried: number; readonly successful: number; readonly states: number };

export interface FuzzFailure {
  readonly seed: number;
  readonly path: string;
  readonly model: ModelObject;
  readonly states: number;
  readonly failed: CheckResult[];
  readonly savedTo?: string;
  readonly reproduce: string;
}

export interface FuzzSummary {
  readonly runs: number;
  /** Models drawn per family in the runs (not counting shrink steps). */
  readonly drawn: Readonly<Record<FuzzFamily, number>>;
  readonly seed: number;
  readonly seconds: number;
  readonly failure?: FuzzFailure;
}

/**
 * The references of every fuzz run: the k-step scheme of order 4, tight, and the high-precision oracle
 * (another method family, so that a bug shared by every k-step order cannot hide behind its reference;
 * it refuses models beyond its reach, and then kstep:4 stands alone).
 */
export const FUZZ_REFERENCE = 'kstep:4';
export const FUZZ_REFERENCE_PRECISION = 1e-9;
export const FUZZ_ORACLE = 'oracle';

function judgeModel(obj: ModelObject, opts: FuzzOptions): Promise<ModelReport> {
  const methods = [...new Set([...opts.methods, FUZZ_REFERENCE, FUZZ_ORACLE])];
  return checkModel('fuzz', buildModel(obj, 'fuzz'), [], {
    precision: opts.precision,
    methods,
    methodPrecision: { [FUZZ_REFERENCE]: FUZZ_REFERENCE_PRECISION },
    solvers: opts.solvers ?? [],
    timeoutMs: opts.timeoutMs ?? 60_000,
  });
}

export type FuzzFamily = 'random' | 'switching' | 'adversarial' | 'dip';

/**
 * The families of a fuzz run and their weights (out of 16): 8 unstructured random models; 3 chains
 * of race gadgets whose optimal decisions switch in time (random models rarely make decisions
 * switch); 4 — one model in four — adversarial near-ties (corpus/generators/adversarial.ts: ties
 * at orders 0 … 3 with tiny relative gaps, frozen goals with huge rates, fast unrelated states,
 * models scaled by 10^±150, rates in every decimal form, both players, both goal modes); 1
 * near-tangent crossing (corpus/generators/dip.ts: the better action changes twice within a short
 * time, so a decision held over a step is wrong inside it and right at both of its ends).
 */
export function fuzzArbitrary(maxStates: number): fc.Arbitrary<{ family: FuzzFamily; model: ModelObject }> {
  const tag = (family: FuzzFamily) => (model: ModelObject) => ({ family, model });
  return fc.oneof(
    { withCrossShrink: true },
    { weight: 8, arbitrary: arbModelObject({ maxStates, decades: 4, maxTime: 2, kind: 'any' }).map(tag('random')) },
    {
      weight: 3,
      arbitrary: arbSwitchingModelObject({ maxGadgets: Math.max(1, Math.floor((maxStates - 2) / 2)) }).map(tag('switching')),
    },
    { weight: 4, arbitrary: arbAdversarialModelObject({ maxStates }).map(tag('adversarial')) },
    { weight: 1, arbitrary: arbDipModelObject().map(tag('dip')) },
  );
}

export async function runFuzz(opts: FuzzOptions): Promise<FuzzSummary> {
  const t0 = performance.now();
  const arb = fuzzArbitrary(opts.maxStates);
  let done = 0;
  // Family of every run proper (shrink steps not counted).
  const families: FuzzFamily[] = [];
  // After the first failure, every call is a shrink step.
  const shrink = { on: false, tried: 0, successful: 0, states: 0 };
  const prop = fc.asyncProperty(arb, async ({ family, model: obj }) => {
    // fast-check calls the property once per run and once per shrink step.
    if (!shrink.on) {
      families.push(family);
      opts.onEvent?.({ kind: 'model', index: ++done, total: opts.runs });
    }
    const r = await judgeModel(obj, opts);
    const failed = r.checks.find((c) => c.status === 'failed');
    if (shrink.on) {
      shrink.tried++;
      if (failed) {
        shrink.successful++;
        shrink.states = r.states;
      }
      opts.onEvent?.({ kind: 'shrink', tried: shrink.tried, successful: shrink.successful, states: shrink.states });
    } else if (failed) {
      Object.assign(shrink, { on: true, states: r.states });
      opts.onEvent?.({ kind: 'found', index: done, total: opts.runs, states: r.states, check: failed.name });
    }
    return !failed;
  });
  const out = await fc.check(prop, { numRuns: opts.runs, seed: opts.seed });
  const seconds = (performance.now() - t0) / 1000;
  const drawn: Record<FuzzFamily, number> = { random: 0, switching: 0, adversarial: 0, dip: 0 };
  for (const f of families.slice(0, out.numRuns)) drawn[f]++;
  if (!out.failed || !out.counterexample) return { runs: out.numRuns, drawn, seed: opts.seed, seconds };
  const model = out.counterexample[0].model;
  const final = await judgeModel(model, opts);
  const failure: Omit<FuzzFailure, 'reproduce' | 'savedTo'> = {
    seed: opts.seed,
    path: out.counterexamplePath ?? '',
    model,
    states: Object.keys(model.states ?? {}).length,
    failed: final.checks.filter((c) => c.status === 'failed'),
  };
  // Every option that changes the run, external solvers included, quoted for a POSIX shell.
  const solverArgs = [
    ...(opts.solvers ?? []).flatMap((t) => ['--solver', shellQuote(t)]),
    ...((opts.solvers ?? []).length > 0 && opts.timeoutMs !== undefined ? ['--timeout', String(opts.timeoutMs / 1000)] : []),
  ].join(' ');
  const replay = `crossbound fuzz --seed ${opts.seed} --runs ${opts.runs} --max-states ${opts.maxStates} --precision ${formatPrecision(opts.precision)} ` +
    `--methods ${opts.methods.join(',') || 'none'}${solverArgs ? ` ${solverArgs}` : ''}`;
  const savedTo = opts.save ? saveRegression(opts.save, await withSelfLoops(failure, opts), opts, replay) : undefined;
  const methods = [...opts.methods, FUZZ_REFERENCE].join(',');
  const reproduce = savedTo
    ? `crossbound check ${shellQuote(savedTo)} --precision ${formatPrecision(opts.precision)} --methods ${methods}${solverArgs ? ` ${solverArgs}` : ''}`
    : replay;
  return { runs: out.numRuns, drawn, seed: opts.seed, seconds, failure: { ...failure, reproduce, ...(savedTo ? { savedTo } : {}) } };
}

/**
 * The counterexample as it will be saved: an action without successors (which the corpus would warn
 * about) written as a self-loop at rate 1 — the same dynamics — provided the model still fails the same
 * check that way (an external solver may treat the two forms differently); otherwise as drawn.
 */
async function withSelfLoops(
  f: Omit<FuzzFailure, 'reproduce' | 'savedTo'>,
  opts: FuzzOptions,
): Promise<Omit<FuzzFailure, 'reproduce' | 'savedTo'> & { note?: string }> {
  const states = f.model.states;
  if (!states) return f;
  const empty: string[] = [];
  const loops: NonNullable<ModelObject['states']> = {};
  for (const [s, st] of Object.entries(states)) {
    const actions = Object.fromEntries(
      Object.entries(st.actions ?? {}).map(([a, succ]) => {
        if (Object.keys(succ).length > 0) return [a, succ];
        empty.push(`${s}.${a}`);
        return [a, { [s]: 1 }];
      }),
    );
    loops[s] = { ...st, actions };
  }
  if (empty.length === 0) return f;
  const model = { ...f.model, states: loops };
  const r = await judgeModel(model, opts);
  if (!r.checks.some((c) => c.status === 'failed' && c.name === f.failed[0]!.name)) return f;
  const note = `Action(s) ${empty.join(', ')} had no successors as shrunk and are written as self-loops at rate 1 ` +
    '(no effect on the dynamics; the model fails the same check this way).';
  return { ...f, model, note };
}

function saveRegression(
  dir: string,
  f: Omit<FuzzFailure, 'reproduce' | 'savedTo'> & { note?: string },
  opts: FuzzOptions,
  replay: string,
): string {
  mkdirSync(dir, { recursive: true });
  const model = buildModel(f.model, 'fuzz');
  const first = f.failed[0]!;
  const name = `fuzz-seed${f.seed}-${first.name.replace(/[^A-Za-z0-9]+/g, '-').replace(/-+$/, '')}`.slice(0, 80);
  const file = join(dir, `${name}.json`);
  const json = exportJson({ ...model, name }) as unknown as Record<string, unknown>;
  json.description =
    `Shrunk by crossbound fuzz (seed ${f.seed}, path ${f.path}, precision ${formatPrecision(opts.precision)}, methods ${opts.methods.join(',')}). ` +
    `Verdict: ${first.name}: ${first.detail}. Found by: ${replay}. ` +
    `Kept forever as a regression; every correct solver must pass it.` +
    (f.note ? ` ${f.note}` : '') +
    (f.model.description ? ` The model as drawn: ${f.model.description}` : '');
  writeFileSync(file, `${JSON.stringify(json, null, 2)}\n`);
  return file;
}
