/**
 * The published JSON Schema (corpus/format/model.schema.json, draft 2020-12) against the loader,
 * judged by ajv 8.20.0 on the fixture files: both accept the good files, both reject the bad ones,
 * and on the loader-only files (rules a schema cannot express: cross-references between parts of
 * the model, duplicate keys, underflow, ranges of decimal strings, family-specific parameter
 * relations) the schema accepts and the loader rejects.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import Ajv2020Module from 'ajv/dist/2020.js';
import { describe, expect, test } from 'vitest';
import { loadModelFile, ModelError } from '../../../corpus/format/load.js';

const SCHEMA_PATH = join(import.meta.dirname, '../../../corpus/format/model.schema.json');
const DIR = join(import.meta.dirname, '../../fixtures/models/schema');
// ajv is CommonJS; under Node's ESM loader its class is the default export's `default`.
const Ajv2020 = ((Ajv2020Module as unknown as { default?: unknown }).default ?? Ajv2020Module) as unknown as typeof Ajv2020Module.default;
const ajv = new Ajv2020({ allErrors: true, strict: true, strictRequired: false, allowUnionTypes: true });
const schemaOk = ajv.compile(JSON.parse(readFileSync(SCHEMA_PATH, 'utf8')));

const files = (d: string): string[] => readdirSync(join(DIR, d)).filter((f) => f.endsWith('.json')).sort();
function loaderOk(path: string): boolean {
  try {
    loadModelFile(path);
    return true;
  } catch (e) {
    if (e instanceof ModelError) return false;
    throw e;
  }
}
const schemaVerdict = (path: string): boolean => schemaOk(JSON.parse(readFileSync(path, 'utf8'))) as boolean;

describe('model.schema.json agrees with the loader', () => {
  test('there are fixtures of every kind', () => {
    expect(files('good').length).toBeGreaterThanOrEqual(5);
    expect(files('bad').length).toBeGreaterThanOrEqual(25);
    expect(files('loader-only').length).toBeGreaterThanOrEqual(8);
  });
  test.each(files('good'))('good/%s: both accept', (f) => {
    const p = join(DIR, 'good', f);
    expect(schemaVerdict(p), JSON.stringify(schemaOk.errors)).toBe(true);
    expect(loaderOk(p)).toBe(true);
  });
  test.each(files('bad'))('bad/%s: both reject', (f) => {
    const p = join(DIR, 'bad', f);
    expect(schemaVerdict(p)).toBe(false);
    expect(loaderOk(p)).toBe(false);
  });
  test.each(files('loader-only'))('loader-only/%s: the schema cannot see it, the loader rejects it', (f) => {
    const p = join(DIR, 'loader-only', f);
    expect(schemaVerdict(p), JSON.stringify(schemaOk.errors)).toBe(true);
    expect(loaderOk(p)).toBe(false);
  });
});
