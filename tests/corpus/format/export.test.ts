/**
 * Export round-trip (random models from the shared arbitrary, and a fixture) and agreement of the
 * flat fast path with `buildModel` on the same rows.
 */
import fc from 'fast-check';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { buildModel } from '../../../corpus/format/build.js';
import type { ModelObject, RateInput } from '../../../corpus/format/build.js';
import { exportJson, exportTable } from '../../../corpus/format/export.js';
import { loadModelFile, loadModelText } from '../../../corpus/format/load.js';
import { arbModelObject } from '../../../corpus/generators/random.js';

const FIX = join(import.meta.dirname, '../../fixtures/models');

describe('exportJson', () => {
  test('round-trips random models through the loader to an equal model', () => {
    fc.assert(
      fc.property(arbModelObject({ maxStates: 6 }), (obj) => {
        const m = buildModel(obj);
        expect(loadModelText(JSON.stringify(exportJson(m)), 'r.json')).toEqual(m);
      }),
      { numRuns: 200, seed: 20240611 },
    );
  });
  test('keeps exact decimal texts and expectations', () => {
    const m = loadModelFile(join(FIX, 'two-state.yaml'));
    const out = exportJson(m);
    expect(out.time_bound).toBe(2); // "2" is the shortest form of 2, so it is written as a number
    expect(out.states!.lit!.actions!.burn).toEqual({ out: 0.5 });
    expect(loadModelText(JSON.stringify(out), 'two-state.json')).toEqual(m);
    const odd = loadModelText('format: crossbound/1\ntime_bound: "1.50"\ngoal: [b]\nstates: {b: {actions: {x: {b: "0.10"}}}}\n', 'o.yaml');
    const o = exportJson(odd);
    expect(o.time_bound).toBe('1.50');
    expect(o.states!.b!.actions!.x).toEqual({ b: '0.10' });
    expect(loadModelText(JSON.stringify(o), 'o.json')).toEqual(odd);
  });
});

describe('exportTable', () => {
  test('lists every transition with owners, goal and initial marks', () => {
    const t = exportTable(loadModelFile(join(FIX, 'greenhouse.yaml')));
    const lines = t.trimEnd().split('\n');
    expect(lines[0]).toBe('model greenhouse-pumps: 4 states, time bound 12, goal mode within');
    expect(lines[3]!.split(/\s+/)).toEqual(['state', 'owner', 'action', 'successor', 'rate']);
    const body = lines.slice(5).map((l) => l.split(/\s{2,}/));
    expect(body).toEqual([
      ['both_ok (initial)', 'max', 'run_a', 'a_worn', '0.3'],
      ['both_ok (initial)', 'max', 'run_b', 'b_worn', '0.25'],
      ['both_ok (initial)', 'max', 'run_b', 'both_ok', '0.05'],
      ['a_worn', '-', 'run', 'dry', '0.8'],
      ['a_worn', '-', 'run', 'both_ok', '2'],
      ['b_worn', '-', 'run', 'dry', '0.6'],
      ['b_worn', '-', 'run', 'both_ok', '1.5'],
      ['dry (goal)', '-', '-', '(absorbing)'],
    ]);
  });
});

/** The flat rows of a states-form object (states that appear in no row are lost, so goals are filtered). */
function toFlat(obj: ModelObject): ModelObject | undefined {
  const rows: [string, string, string, RateInput][] = [];
  const owners: Record<string, 'max' | 'min'> = {};
  for (const [s, st] of Object.entries(obj.states!)) {
    if (st.owner) owners[s] = st.owner;
    for (const [a, succ] of Object.entries(st.actions ?? {})) for (const [t, r] of Object.entries(succ)) rows.push([s, a, t, r]);
  }
  const seen = new Set(rows.flatMap((r) => [r[0], r[2]]));
  if (rows.length === 0) return undefined;
  for (const s of Object.keys(owners)) if (!seen.has(s)) delete owners[s];
  const { states: _s, ...rest } = obj;
  const flat: ModelObject = { ...rest, goal: obj.goal.filter((g) => seen.has(g)), transitions: rows, owners };
  if (obj.initial !== undefined && !seen.has(obj.initial)) delete flat.initial;
  return flat;
}

describe('flat fast path', () => {
  test('builds the same model as buildModel from the same rows', () => {
    let checked = 0;
    fc.assert(
      fc.property(arbModelObject({ maxStates: 7, maxActions: 3 }), (obj) => {
        const flat = toFlat(obj);
        if (!flat) return;
        checked++;
        expect(loadModelText(JSON.stringify(flat), 'f.json')).toEqual(buildModel(flat, 'f'));
      }),
      { numRuns: 200, seed: 7 },
    );
    expect(checked).toBeGreaterThan(100);
  });
});
