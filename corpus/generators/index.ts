/**
 * The generated form `generate: { family, seed, ...parameters }`: each family is a seeded,
 * deterministic function from its parameters to a crossbound/1 object whose description states its
 * provenance (family, seed, parameters).
 */
import type { ModelObject } from '../format/build.js';
import { birthDeath } from './birthDeath.js';
import { gridPatrol } from './gridPatrol.js';
import { GeneratorError } from './params.js';
import type { Spec } from './params.js';
import { queueControl } from './queueControl.js';
import { randomGame } from './randomGame.js';
import { randomSparse } from './randomSparse.js';
import { redundantSystem } from './redundantSystem.js';

export { GeneratorError } from './params.js';
export type { Spec } from './params.js';

export const FAMILIES: Readonly<Record<string, (spec: Spec) => ModelObject>> = {
  'birth-death': birthDeath,
  'redundant-system': redundantSystem,
  'grid-patrol': gridPatrol,
  'random-sparse': randomSparse,
  'queue-control': queueControl,
  'random-game': randomGame,
};

/** Resolve a `generate` mapping; throws `GeneratorError` naming the bad parameter. */
export function generateModel(spec: Spec): ModelObject {
  const family = spec.family;
  if (family === undefined) throw new GeneratorError(undefined, `generate needs a family (one of ${Object.keys(FAMILIES).join(', ')})`);
  const make = typeof family === 'string' && Object.hasOwn(FAMILIES, family) ? FAMILIES[family] : undefined;
  if (!make) throw new GeneratorError('family', `unknown family ${JSON.stringify(family)} (known: ${Object.keys(FAMILIES).join(', ')})`);
  return make(spec);
}
