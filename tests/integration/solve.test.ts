import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { CLI, crossbound, expectOneLineError, tempFile } from './cli.js';

// Two-state chain, goal mode `at`: p_clean(T) = a/(a+b)(1 − e^{−(a+b)T}) with a = 0.4, b = 1.1, T = 3
// (S. M. Ross, Introduction to Probability Models), evaluated with decimal.js 10.6.0.
const D = Decimal.clone({ precision: 40 });
const closedClean = D.div(0.4, 1.5).times(new D(1).minus(new D(-4.5).exp())).toNumber();

describe('crossbound solve (the built CLI)', () => {
  it('uniformization at 1e-12 matches the two-state closed form within 1e-12, and prints only the result JSON', () => {
    const r = crossbound(['solve', 'corpus/models/kettle-scale.yaml', '--method', 'uniformization', '--precision', '1e-12', '--json']);
    expect(r.code).toBe(0);
    const res = JSON.parse(r.stdout);
    expect(res.format).toBe('crossbound-result/1');
    expect(res.model).toBe('kettle-scale');
    expect(res.method).toBe('uniformization');
    expect(res.time_bound).toBe(3);
    expect(res.goal_mode).toBe('at');
    expect(Object.keys(res.values).sort()).toEqual(['clean', 'scaled']);
    expect(res.error_bound).toBeLessThanOrEqual(1e-12);
    expect(Math.abs(res.values.clean - closedClean)).toBeLessThanOrEqual(1e-12);
  });
  it('euler matches the closed form within its own reported bound', () => {
    const r = crossbound(['solve', 'corpus/models/kettle-scale.yaml', '--method', 'euler', '--precision', '1e-6', '--json']);
    expect(r.code).toBe(0);
    const res = JSON.parse(r.stdout);
    expect(res.error_bound).toBeLessThanOrEqual(1e-6);
    expect(Math.abs(res.values.clean - closedClean)).toBeLessThanOrEqual(res.error_bound);
  });
  it('prints a readable table without --json', () => {
    const r = crossbound(['solve', 'corpus/models/ferry-crossing.yaml', '--method', 'kstep', '--k', '2']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/ferry-crossing: kstep/);
    expect(r.stdout).toMatch(/dock \(initial\)\s+0\.\d+/);
  });
  it('refuses uniformization on a model with choices and no scheduler: exit 2, one line', () => {
    const line = expectOneLineError(crossbound(['solve', 'corpus/models/ferry-crossing.yaml', '--method', 'uniformization']));
    expect(line).toMatch(/ferry-crossing\.yaml: uniformization refused/);
  });
  it('with --json a refusal is a result (format crossbound-result/1, key refused, its code), exit 0', () => {
    const r = crossbound(['solve', 'corpus/models/ferry-crossing.yaml', '--method', 'uniformization', '--json']);
    expect(r.code).toBe(0);
    const res = JSON.parse(r.stdout);
    expect(res).toMatchObject({ format: 'crossbound-result/1', model: 'ferry-crossing', method: 'uniformization', code: 'out-of-scope' });
    expect(res.refused).toMatch(/uniformization needs a CTMC or a fixed scheduler/);
    expect(res).not.toHaveProperty('values');
  });
  it('solve --json serves as an external solver: its refusal is counted in its coverage, not a fault', () => {
    const template = `${process.execPath} ${CLI} solve {model} --method uniformization --precision {precision} --json`;
    const r = crossbound(['check', 'corpus/models/kettle-scale.yaml', 'corpus/models/ferry-crossing.yaml', '--methods', 'euler,kstep:2', '--solver', template, '--jobs', '1']);
    expect(r.code).toBe(0);
    // reasons are grouped with their numbers replaced by N
    expect(r.stdout).toMatch(/answered 1 of 2, refused 1: state 'dock' has N actions: uniformization needs a CTMC or a fixed scheduler \(1\)/);
    // its refusal code travels with it: skipped transformed copies say out-of-scope, not unspecified
    expect(r.stdout).toMatch(/transformed copy not solved: refused \(out-of-scope\)/);
    expect(r.stdout).not.toMatch(/unspecified/);
  });
  it('bad usage is exit 2 with one line: unknown method, bad precision, missing file', () => {
    expect(expectOneLineError(crossbound(['solve', 'corpus/models/kettle-scale.yaml', '--method', 'magic']))).toMatch(/method/);
    expect(expectOneLineError(crossbound(['solve', 'corpus/models/kettle-scale.yaml', '--method', 'euler', '--precision', '-1']))).toMatch(/--precision/);
    expect(expectOneLineError(crossbound(['solve', 'no/such/file.yaml', '--method', 'euler']))).toMatch(/no\/such\/file\.yaml/);
  });
  it('a model with a broken rule is rejected with file:line:column and the rule', () => {
    const f = tempFile('bad.yaml', 'format: crossbound/1\ntime_bound: 1\ngoal: [b]\nstates:\n  a: { actions: { go: { b: -1 } } }\n  b: {}\n');
    const line = expectOneLineError(crossbound(['solve', f, '--method', 'euler']));
    expect(line).toMatch(/bad\.yaml:5:\d+: .*rate/);
  });
});
