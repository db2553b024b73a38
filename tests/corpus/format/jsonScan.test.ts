import { describe, expect, test } from 'vitest';
import { scanJson } from '../../../corpus/format/jsonScan.js';
import { MAX_JSON_ENTRIES, MAX_JSON_VALUES } from '../../../corpus/format/limits.js';

// The budgets stop a JSON text before JSON.parse builds it; what is counted is checked on small texts
// (the JSON grammar is RFC 8259; the counts are ours).
describe('JSON scanner budgets', () => {
  const text = '{"a": [1, 2, {"b": null}], "c": "x"}'; // values: the root, the list, 1, 2, {…}, null, "x" = 7; entries: a, b, c = 3
  test('a text within both budgets is accepted', () => {
    expect(scanJson(text, 64, { values: 7, entries: 3 })).toEqual({ ok: true });
  });
  test('one value over the budget is refused where the value starts', () => {
    const r = scanJson(text, 64, { values: 6, entries: 3 });
    expect(r).toMatchObject({ ok: false, rule: 'model too large' });
    expect(r.ok === false && r.offset).toBe(text.indexOf('"x"'));
    expect(r.ok === false && r.message).toMatch(/more than 6 JSON values/);
  });
  test('one mapping entry over the budget is refused at its key', () => {
    const r = scanJson(text, 64, { values: 7, entries: 2 });
    expect(r).toMatchObject({ ok: false, rule: 'model too large' });
    expect(r.ok === false && r.offset).toBe(text.indexOf('"c"'));
  });
  test('an empty list or mapping costs one value and no entry', () => {
    expect(scanJson('{"a": [], "b": {}}', 64, { values: 3, entries: 2 })).toEqual({ ok: true });
  });
  test('the loader budgets admit the benchmark models (10^6 transitions, flat or states form)', () => {
    // flat: one list per row of four scalars (5 values per row); states form: ~1.5 entries per transition
    expect(MAX_JSON_VALUES).toBeGreaterThanOrEqual(5 * 1e6 + 2e5);
    expect(MAX_JSON_ENTRIES).toBeGreaterThanOrEqual(1.5 * 1e6 + 2e5);
  });
});
