import { describe, expect, it } from 'vitest';
import { parseResult, VALUE_SLACK } from '../../../harness/external/parseResult.js';

const names = ['both_ok', 'a_worn', 'dry'];
const good = () => ({
  format: 'crossbound-result/1',
  model: 'pumps',
  method: 'kstep',
  params: { k: 3, precision: 1e-6 },
  time_bound: 12,
  goal_mode: 'within',
  values: { both_ok: 0.41234, a_worn: 0.7, dry: 1 },
  error_bound: 1e-6,
  stats: { intervals: 412 },
  extra_key: { anything: [1, 2] },
});
const parse = (doc: unknown, expect = {}) => parseResult(typeof doc === 'string' ? doc : JSON.stringify(doc), names, expect);
const faultOf = (doc: unknown, expect = {}) => {
  const r = parse(doc, expect);
  return r.ok === true ? 'ok' : r.ok === 'refused' ? 'refused' : r.fault;
};

describe('parseResult', () => {
  it('accepts a valid result, values in state order, method prefixed, extra keys allowed', () => {
    const r = parse({ ...good(), values_decimal: { both_ok: '0.41234', a_worn: '0.7', dry: '1' } });
    expect(r.ok).toBe(true);
    if (r.ok !== true) return;
    expect([...r.solved.values]).toEqual([0.41234, 0.7, 1]);
    expect(r.solved.method).toBe('external:kstep');
    expect(r.solved.errorBound).toBe(1e-6);
    expect(r.solved.params).toEqual({ k: 3, precision: 1e-6 });
    expect(r.solved.valuesDecimal).toEqual(['0.41234', '0.7', '1']);
    expect(r.reported).toEqual({ method: 'kstep' });
  });
  it('keeps the version the solver reports (a string or a number) for the qualification record; ignores any other type', () => {
    const v = (version: unknown) => { const r = parse({ ...good(), version }); return r.ok === true ? r.reported : undefined; };
    expect(v('2.1.0-rc1')).toEqual({ method: 'kstep', version: '2.1.0-rc1' });
    expect(v(3)).toEqual({ method: 'kstep', version: '3' });
    expect(v({ major: 2 })).toEqual({ method: 'kstep' });
  });
  it('carries a scheduler and drops a partial values_decimal', () => {
    const r = parse({ ...good(), values_decimal: { both_ok: '0.41234' }, scheduler: { format: 'crossbound-scheduler/1', choices: { both_ok: [{ from: 0, action: 'run_b' }] } } });
    expect(r.ok === true && r.solved.valuesDecimal).toBe(undefined);
    expect(r.ok === true && r.solved.scheduler?.choices.both_ok).toEqual([{ from: 0, action: 'run_b' }]);
  });
  it("'not-json': text, empty output, a NaN literal", () => {
    expect(faultOf('iteration 1 done')).toBe('not-json');
    expect(faultOf('')).toBe('not-json');
    expect(faultOf('{"values": {"dry": NaN}}')).toBe('not-json');
  });
  it("'bad-format': not an object, wrong format, wrong types, another time bound or goal mode", () => {
    expect(faultOf([1, 2])).toBe('bad-format');
    expect(faultOf(null)).toBe('bad-format');
    expect(faultOf({ ...good(), format: 'crossbound-result/2' })).toBe('bad-format');
    expect(faultOf({ ...good(), method: 3 })).toBe('bad-format');
    expect(faultOf({ ...good(), values: [0.4, 0.7, 1] })).toBe('bad-format');
    expect(faultOf({ ...good(), params: { k: [3] } })).toBe('bad-format');
    expect(faultOf({ ...good(), stats: { seconds: '0.1' } })).toBe('bad-format');
    expect(faultOf({ ...good(), values_decimal: { dry: 'one' } })).toBe('bad-format');
    // values_decimal uses the model format's one number grammar (corpus/format/numbers.ts): no '+', no spaces
    expect(faultOf({ ...good(), values_decimal: { dry: '+1' } })).toBe('bad-format');
    expect(faultOf({ ...good(), values_decimal: { dry: ' 1' } })).toBe('bad-format');
    expect(faultOf({ ...good(), values_decimal: { dry: '1e+0' } })).not.toBe('bad-format');
    expect(faultOf({ ...good(), scheduler: { choices: { both_ok: [{ from: 'x', action: 'a' }] } } })).toBe('bad-format');
    expect(faultOf(good(), { timeBound: 10 })).toBe('bad-format');
    expect(faultOf(good(), { goalMode: 'at' })).toBe('bad-format');
    expect(faultOf(good(), { timeBound: 12, goalMode: 'within' })).toBe('ok');
  });
  it("'missing-state' names the states", () => {
    const doc = good();
    delete (doc.values as Record<string, number>).a_worn;
    const r = parse(doc);
    expect(r.ok ? '' : `${r.fault}: ${r.detail}`).toMatch(/^missing-state: .*a_worn/);
  });
  it("'bad-value': null (a serialised NaN), a string, Infinity, outside [0, 1] beyond the slack", () => {
    const withValue = (v: unknown) => `{"format":"crossbound-result/1","method":"m","values":{"both_ok":${v},"a_worn":0,"dry":1},"error_bound":0}`;
    expect(faultOf(withValue('null'))).toBe('bad-value');
    expect(faultOf(withValue('"0.5"'))).toBe('bad-value');
    expect(faultOf(withValue('1e999'))).toBe('bad-value');
    expect(faultOf(withValue('-0.001'))).toBe('bad-value');
    expect(faultOf(withValue(String(1 + 2 * VALUE_SLACK)))).toBe('bad-value');
    // Rounding just past 1 is not an error (0.1 + 0.2 + 0.7 in binary floating point).
    expect(faultOf(withValue(String(0.1 + 0.2 + 0.7)))).toBe('ok');
    expect(faultOf(withValue(String(-VALUE_SLACK / 2)))).toBe('ok');
  });
  it("'no-bound': missing, null, negative, not finite, not a number", () => {
    for (const eb of [undefined, null, -1e-9, '1e-6']) expect(faultOf({ ...good(), error_bound: eb })).toBe('no-bound');
    expect(faultOf(JSON.stringify(good()).replace('"error_bound":0.000001', '"error_bound":1e999'))).toBe('no-bound');
    expect(faultOf({ ...good(), error_bound: 0 })).toBe('ok');
  });
  it('--default-bound: a missing or null error_bound becomes the given bound, marked as assumed; a bad one stays a fault', () => {
    for (const eb of [undefined, null]) {
      const r = parse({ ...good(), error_bound: eb }, { defaultBound: 1e-4 });
      expect(r).toMatchObject({ ok: true, boundAssumed: true });
      expect(r.ok === true && r.solved.errorBound).toBe(1e-4);
    }
    expect(parse(good(), { defaultBound: 1e-4 })).not.toHaveProperty('boundAssumed');
    for (const eb of [-1e-9, '1e-6']) expect(faultOf({ ...good(), error_bound: eb }, { defaultBound: 1e-4 })).toBe('no-bound');
  });
  it('a refusal (refused, no values) is a refusal, not a fault; an empty or non-string reason is bad-format', () => {
    expect(parse({ format: 'crossbound-result/1', method: 'mysolver', refused: 'two-player games are not supported' }))
      .toEqual({ ok: 'refused', reason: 'two-player games are not supported', reported: { method: 'mysolver' } });
    // An optional code of the known kinds is kept; another value is the solver's own key and ignored.
    expect(parse({ format: 'crossbound-result/1', method: 'm', refused: 'too fine', code: 'precision-floor' }))
      .toEqual({ ok: 'refused', reason: 'too fine', code: 'precision-floor', reported: { method: 'm' } });
    expect(parse({ format: 'crossbound-result/1', method: 'm', refused: 'no', code: 'internal' })).toEqual({ ok: 'refused', reason: 'no', reported: { method: 'm' } });
    expect(parse({ format: 'crossbound-result/1', method: 'm', refused: 'no', code: 7 })).toEqual({ ok: 'refused', reason: 'no', reported: { method: 'm' } });
    expect(faultOf({ format: 'crossbound-result/1', method: 'm', refused: '' })).toBe('bad-format');
    expect(faultOf({ format: 'crossbound-result/1', method: 'm', refused: 42 })).toBe('bad-format');
  });
  it('reports the first fault in the documented order', () => {
    expect(faultOf({ format: 'x', values: {} })).toBe('bad-format');
    expect(faultOf({ format: 'crossbound-result/1', method: 'm', values: { both_ok: null } })).toBe('missing-state');
    expect(faultOf({ format: 'crossbound-result/1', method: 'm', values: { both_ok: null, a_worn: 0, dry: 1 } })).toBe('bad-value');
  });

  it('`trajectory`: read in state order by time; every broken rule is bad-format and names the rule', () => {
    const tr = { time_left: [0, 6, 12], values: { both_ok: [0, 0.2, 0.41234], a_worn: [0, 0.5, 0.7], dry: [1, 1, 1] } };
    const r = parse({ ...good(), trajectory: tr }, { timeBound: 12 });
    expect(r.ok).toBe(true);
    if (r.ok !== true) return;
    expect([...r.solved.trajectory!.timeLeft]).toEqual([0, 6, 12]);
    expect([...r.solved.trajectory!.values[1]!]).toEqual([0.2, 0.5, 1]);
    const detail = (t: unknown, timeBound = 12): string => {
      const x = parse({ ...good(), time_bound: undefined, trajectory: t }, { timeBound });
      return x.ok === false ? `${x.fault}: ${x.detail}` : 'ok';
    };
    const vals = tr.values;
    expect(detail([1, 2])).toBe('bad-format: `trajectory` is not an object');
    expect(detail({ ...tr, time_left: [0] })).toMatch(/at least two times/);
    expect(detail({ ...tr, time_left: [1e-300, 6, 12] })).toMatch(/must start at 0/);
    expect(detail({ ...tr, time_left: [0, 6, 6] })).toMatch(/increase strictly \(index 2/);
    expect(detail({ ...tr, time_left: [0, 12, 6] })).toMatch(/increase strictly \(index 2/);
    expect(detail({ ...tr, time_left: [0, null, 12] })).toMatch(/time_left\[1\]. is null, not a finite number/);
    expect(detail({ ...tr, time_left: [0, 6, 11.9] })).toMatch(/must end at the time bound 12/);
    expect(detail(tr, 12 * (1 + 1e-13))).toBe('ok'); // within the relative 1e-12
    expect(detail({ ...tr, values: { both_ok: vals.both_ok, dry: vals.dry } })).toMatch(/no list for state a_worn/);
    expect(detail({ ...tr, values: { ...vals, dry: [1, 1] } })).toMatch(/values.dry. has 2 values for 3 times/);
    expect(detail({ ...tr, values: { ...vals, a_worn: [0, null, 0.7] } })).toMatch(/values.a_worn\[1\]. is null, not a finite number/);
    expect(detail({ ...tr, values: { ...vals, a_worn: [0, '0.5', 0.7] } })).toMatch(/is "0.5", not a finite number/);
    const long = Array.from({ length: 100_001 }, (_, i) => (12 * i) / 100_000);
    expect(detail({ ...tr, time_left: long })).toMatch(/more than the limit 100000/);
  });
});
