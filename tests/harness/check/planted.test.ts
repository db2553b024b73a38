/**
 * Layering: the harness's own dispatch does not load the planted (deliberately broken) variants; they
 * are there only after harness/selftest/variants.ts is loaded, which the command line and the workers
 * do only when a `variant:` label is asked for.
 */
import { describe, expect, it } from 'vitest';
import { parseMethodLabel } from '../../../harness/check/methods.js';
import { loadPlantedFor, plantedNames } from '../../../harness/check/planted.js';

describe('planted variants', () => {
  it('are unknown until asked for, then known', async () => {
    expect(plantedNames()).toEqual([]);
    expect(() => parseMethodLabel('variant:min-as-max')).toThrow(/none loaded/);
    await loadPlantedFor(['kstep:3']);
    expect(plantedNames()).toEqual([]);
    await loadPlantedFor(['variant:min-as-max']);
    expect(plantedNames()).toContain('min-as-max');
    expect(parseMethodLabel('variant:min-as-max').method).toBe('variant');
  });
});
