/**
 * `selftest`: how much power the harness has. Every broken variant (variants.ts) is planted beside
 * the correct methods; a variant is caught when a check that involves it and no other variant fails
 * — on the corpus (one check run with every variant at once) or in a short fuzz run of its own.
 */
import { runCheck } from '../check/index.js';
import { formatTable } from '../check/table.js';
import { runFuzz } from '../fuzz/index.js';
import { VARIANTS } from './variants.js';

export interface SelftestRow {
  readonly variant: string;
  readonly bug: string;
  /** Where it was caught: 'corpus: MODEL — CHECK' or 'fuzz: CHECK (N states)'. Empty: not caught. */
  readonly caughtBy: string[];
}

export const SELFTEST_REFERENCES = ['uniformization', 'kstep:4', 'oracle'];

export async function runSelftest(
  paths: readonly string[],
  opts: { fuzzRuns: number; seed: number; precision?: number; jobs?: number; onProgress?: (msg: string) => void },
): Promise<SelftestRow[]> {
  const precision = opts.precision ?? 1e-6;
  const labels = VARIANTS.map((v) => `variant:${v.name}`);
  opts.onProgress?.(`corpus with ${labels.length} planted variants`);
  const { reports } = await runCheck(paths, { precision, methods: [...SELFTEST_REFERENCES, ...labels], oracleDigits: 20, jobs: opts.jobs ?? 1 });
  const rows: SelftestRow[] = [];
  for (const v of VARIANTS) {
    const label = `variant:${v.name}`;
    const caughtBy: string[] = [];
    for (const r of reports) {
      for (const c of r.checks) {
        const involved = c.methods.filter((m) => m.startsWith('variant:'));
        if (c.status === 'failed' && involved.length === 1 && involved[0] === label) caughtBy.push(`corpus: ${r.model} — ${c.name}`);
      }
    }
    opts.onProgress?.(`fuzz ${label}`);
    const f = await runFuzz({ runs: opts.fuzzRuns, seed: opts.seed, maxStates: 6, precision: 1e-5, methods: [label] });
    if (f.failure) caughtBy.push(`fuzz: ${f.failure.failed.map((c) => c.name).join(', ')} (shrunk to ${f.failure.states} states)`);
    rows.push({ variant: v.name, bug: v.bug, caughtBy });
  }
  return rows;
}

export function formatSelftest(rows: readonly SelftestRow[]): string {
  const table = formatTable(
    ['variant', 'caught', 'corpus checks', 'fuzz', 'bug'],
    rows.map((r) => [
      r.variant,
      r.caughtBy.length > 0 ? 'yes' : 'NO',
      String(r.caughtBy.filter((c) => c.startsWith('corpus')).length),
      r.caughtBy.find((c) => c.startsWith('fuzz'))?.slice(6) ?? '-',
      r.bug,
    ]),
  );
  const caught = rows.filter((r) => r.caughtBy.length > 0).length;
  return `${table}\n\nselftest: ${caught} of ${rows.length} broken variants caught.`;
}
