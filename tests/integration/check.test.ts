import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { crossbound, expectOneLineError, tempFile } from './cli.js';

describe('crossbound check (the built CLI)', () => {
  it('checks a closed-form model with every method, writes JSON and JUnit, exit 0', () => {
    const dir = dirname(tempFile('x', ''));
    const json = join(dir, 'out.json');
    const junit = join(dir, 'out.xml');
    const r = crossbound(['check', 'corpus/models/relay-race.yaml', '--json', json, '--junit', junit]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/relay-race\s+CTMC\s+4/);
    expect(r.stdout).toMatch(/1 of 1 model\(s\) pass every check/);
    const report = JSON.parse(readFileSync(json, 'utf8'));
    expect(report.format).toBe('crossbound-check/1');
    expect(report.verdict).toBe('pass');
    const labels = report.models[0].methods.map((m: { label: string }) => m.label);
    expect(labels).toEqual(expect.arrayContaining(['uniformization', 'euler', 'kstep:3', 'oracle']));
    const checks = report.models[0].checks.map((c: { name: string }) => c.name);
    expect(checks).toEqual(expect.arrayContaining(['expect oracle', 'agree uniformization ~ oracle']));
    const xml = readFileSync(junit, 'utf8');
    expect(xml).toMatch(/<testsuites/);
    expect(xml).toMatch(/testcase[^>]*name="expect oracle"/);
  });
  it('a wrong expectation is a failure: exit 1, and the failure names the command that reproduces it', () => {
    const src = readFileSync('corpus/models/relay-race.yaml', 'utf8').replace('leg3: "0.9989667023613523629585970161711040854809"', 'leg3: "0.9989"');
    const f = tempFile('relay-wrong.yaml', src);
    const r = crossbound(['check', f, '--methods', 'uniformization,kstep:2']);
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(/expect uniformization: state leg3/);
    expect(r.stdout).toMatch(/reproduce: crossbound check .*relay-wrong\.yaml --precision 1e-6 --methods uniformization/);
  });
  it('bad usage is exit 2 with one line, and no report file is written', () => {
    const dir = dirname(tempFile('y', ''));
    const json = join(dir, 'never.json');
    expectOneLineError(crossbound(['check', 'corpus/models/kettle-scale.yaml', '--shard', '3/2', '--json', json]));
    expectOneLineError(crossbound(['check', 'corpus/models/kettle-scale.yaml', '--methods', 'kstep:99']));
    expect(existsSync(json)).toBe(false);
  });
  it('a bad model anywhere in the paths stops the run before anything is solved', () => {
    const bad = tempFile('broken.yaml', 'format: crossbound/1\ntime_bound: 0\ngoal: []\nstates: { a: {} }\n');
    const line = expectOneLineError(crossbound(['check', 'corpus/models/kettle-scale.yaml', bad]));
    expect(line).toMatch(/broken\.yaml:2:\d+: .*time_bound/);
  });
});
