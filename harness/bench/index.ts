/**
 * The bench runner: every model × method × precision (× k for the k-step scheme) is solved once and
 * measured: intervals or steps, seconds, the reported bound and, when a reference is given, the
 * actual error max_s |v_s − ref_s| (the bound audit's numerator). A refusal is a row too.
 *
 * Solvers come from a method table, the real solvers by default; tests may pass their own.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import type { Outcome } from '../../corpus/format/result.js';
import { solveEuler } from '../../solvers/euler/index.js';
import { solveKstep } from '../../solvers/kstep/index.js';
import { solveUniformization } from '../../solvers/uniformization/index.js';
import { formatError, formatRatio, formatSeconds } from '../numbers.js';

export type BenchMethod = 'kstep' | 'euler' | 'uniformization';

export interface BenchModel {
  readonly name: string;
  readonly compiled: CompiledModel;
  /** A more precise answer per state, if known, and its own bound. */
  readonly reference?: Float64Array;
  readonly referenceBound?: number;
}

export interface BenchOptions {
  readonly methods: readonly BenchMethod[];
  /** Orders of the k-step scheme (ignored by the other methods). */
  readonly ks: readonly number[];
  readonly precisions: readonly number[];
}

export interface BenchRow {
  readonly model: string;
  readonly method: BenchMethod;
  readonly k?: number;
  readonly precision: number;
  /** Intervals (kstep), steps (euler) or Poisson terms (uniformization); undefined if refused. */
  readonly steps?: number;
  readonly seconds: number;
  readonly errorBound?: number;
  /** max_s |value − reference|, when a reference is given. */
  readonly actualError?: number;
  /** The reference's own bound, so that actualError ≤ errorBound + referenceBound is the check. */
  readonly referenceBound?: number;
  readonly refused?: string;
}

export type MethodTable = Partial<Record<BenchMethod, (m: CompiledModel, precision: number, k: number) => Outcome>>;

export const defaultMethods: MethodTable = {
  kstep: (m, precision, k) => solveKstep(m, { precision, k }),
  euler: (m, precision) => solveEuler(m, { precision }),
  uniformization: (m, precision) => solveUniformization(m, { precision }),
};

function stepsOf(o: Outcome): number | undefined {
  if (o.kind !== 'solved') return undefined;
  const s = o.stats;
  return s.intervals ?? s.steps ?? s.iterations ?? s.right;
}

export function runBench(models: readonly BenchModel[], opts: BenchOptions, table: MethodTable = defaultMethods): BenchRow[] {
  const rows: BenchRow[] = [];
  for (const bm of models) {
    for (const method of opts.methods) {
      const solve = table[method];
      if (!solve) throw new Error(`no solver for method '${method}'`);
      const ks = method === 'kstep' ? opts.ks : [undefined];
      for (const k of ks) {
        for (const precision of opts.precisions) {
          const t0 = performance.now();
          let out: Outcome;
          try {
            out = solve(bm.compiled, precision, k ?? 0);
          } catch (e) {
            out = { kind: 'refused', method, reason: `crashed: ${e instanceof Error ? e.message : String(e)}` };
          }
          const seconds = (performance.now() - t0) / 1000;
          const base = { model: bm.name, method, ...(k !== undefined ? { k } : {}), precision, seconds };
          if (out.kind === 'refused') {
            rows.push({ ...base, refused: out.reason });
            continue;
          }
          let actualError: number | undefined;
          if (bm.reference) {
            actualError = 0;
            for (let s = 0; s < bm.compiled.nStates; s++) actualError = Math.max(actualError, Math.abs(out.values[s]! - bm.reference[s]!));
          }
          const steps = stepsOf(out);
          rows.push({
            ...base,
            ...(steps !== undefined ? { steps } : {}),
            errorBound: out.errorBound,
            ...(actualError !== undefined ? { actualError } : {}),
            ...(bm.referenceBound !== undefined ? { referenceBound: bm.referenceBound } : {}),
          });
        }
      }
    }
  }
  return rows;
}

const exp = (x: number | undefined): string => (x === undefined ? '–' : formatError(x));

/** A plain-text table, one row per run; "error/bound" above 1 marks a broken bound. */
export function formatBenchTable(rows: readonly BenchRow[]): string {
  const head = ['model', 'method', 'k', 'precision', 'steps', 'seconds', 'bound', 'actual error', 'error/bound'];
  const body = rows.map((r) => [
    r.model,
    r.method,
    r.k === undefined ? '' : String(r.k),
    exp(r.precision),
    r.refused ? 'refused' : String(r.steps ?? '–'),
    formatSeconds(r.seconds),
    exp(r.errorBound),
    exp(r.actualError),
    r.actualError !== undefined && r.errorBound ? formatRatio(r.actualError / r.errorBound) : '–',
  ]);
  const widths = head.map((h, i) => Math.max(h.length, ...body.map((b) => b[i]!.length)));
  const line = (cells: string[]) => cells.map((c, i) => (i < 3 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join('  ').trimEnd();
  const lines = body.map((b, i) => (rows[i]!.refused ? `${line(b)}  (${rows[i]!.refused})` : line(b)));
  return [line(head), line(widths.map((w) => '-'.repeat(w))), ...lines].join('\n');
}
