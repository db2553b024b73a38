/**
 * Methods planted for `selftest`: deliberately broken solvers, run under labels `variant:NAME`. The
 * harness itself defines none; harness/selftest/variants.ts registers them when it is loaded (by
 * selftest, and by the command line or a worker only when a `variant:` label is asked for), so
 * production runs never load planted code.
 */
import type { CompiledModel } from '../../corpus/format/compile.js';
import type { Outcome } from '../../corpus/format/result.js';
import type { Model } from '../../corpus/format/types.js';

export interface PlantedMethod {
  readonly name: string;
  readonly bug: string;
  solve(model: Model, m: CompiledModel, precision: number): Outcome;
}

const planted = new Map<string, PlantedMethod>();

export function registerPlanted(list: readonly PlantedMethod[]): void {
  for (const p of list) planted.set(p.name, p);
}

export function plantedByName(name: string): PlantedMethod | undefined {
  return planted.get(name);
}

export function plantedNames(): string[] {
  return [...planted.keys()];
}

/** Load the planted variants if any label asks for one (a dynamic import: nothing is loaded otherwise). */
export async function loadPlantedFor(labels: readonly string[]): Promise<void> {
  if (labels.some((l) => l.startsWith('variant:'))) await import('../selftest/variants.js');
}
