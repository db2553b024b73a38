/**
 * Every JSON file the tool writes uses snake_case keys, like the result format (check --json,
 * merge --json, bench --json); merge still reads a report written with camelCase keys.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { toCamelKeys } from '../../harness/jsonKeys.js';
import { crossbound, tempFile } from './cli.js';

const dir = dirname(tempFile('x', ''));

/** Keys with a capital letter, outside the state names of `choices`. */
function camelKeys(value: unknown, path = ''): string[] {
  if (Array.isArray(value)) return value.flatMap((v) => camelKeys(v, `${path}[]`));
  if (value === null || typeof value !== 'object') return [];
  return Object.entries(value).flatMap(([k, v]) => [
    ...(/[A-Z]/.test(k) ? [`${path}.${k}`] : []),
    ...(k === 'choices' ? Object.values(v as object).flatMap((x) => camelKeys(x, `${path}.choices.*`)) : camelKeys(v, `${path}.${k}`)),
  ]);
}
const read = (f: string): unknown => JSON.parse(readFileSync(f, 'utf8'));

describe('JSON keys are snake_case', () => {
  it('check --json and merge --json (reading a camelCase report too)', () => {
    const report = join(dir, 'keys.json');
    // thermostat-duel: a game, so that a scheduler with state names is in the report.
    const r = crossbound(['check', 'corpus/models/thermostat-duel.yaml', '--methods', 'euler,kstep:2,oracle', '--json', report]);
    expect(r.code).toBe(0);
    const json = read(report) as { models: { methods: Record<string, unknown>[] }[] };
    expect(camelKeys(json)).toEqual([]);
    expect(json.models[0]!.methods[0]).toHaveProperty('error_bound');
    expect(json).toHaveProperty('allow_unchecked', false);

    const old = join(dir, 'old-style.json');
    writeFileSync(old, JSON.stringify(toCamelKeys(json)));
    const merged = join(dir, 'merged-keys.json');
    expect(crossbound(['merge', old, '--json', merged]).code).toBe(0);
    // Everything but the run identity reads back unchanged; the identity is the merge's own, keeping the shard's command.
    const { identity: mergedId, ...mergedRest } = read(merged) as { identity: { shard_commands: string[] } };
    const { identity: checkId, ...checkRest } = json as unknown as { identity: { command: string } };
    expect(mergedRest).toEqual(checkRest);
    expect(mergedId.shard_commands).toEqual([checkId.command]);
  });
  it('bench --json', () => {
    const out = join(dir, 'bench.json');
    const r = crossbound(['bench', 'corpus/models/kettle-scale.yaml', '--precisions', '1e-4', '--ks', '2', '--json', out]);
    expect(r.code).toBe(0);
    const rows = read(out) as Record<string, unknown>[];
    expect(rows.length).toBeGreaterThan(0);
    expect(camelKeys(rows)).toEqual([]);
    expect(rows[0]).toHaveProperty('error_bound');
  });
});
