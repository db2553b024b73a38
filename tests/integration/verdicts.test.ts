/**
 * The verdicts of check, merge and their reports on the failure paths, through the built CLI (fixed
 * models and methods, so every run is deterministic): no model, an empty shard, unchecked models,
 * incomplete and overlapping shard sets, unstartable solvers, JUnit <failure> and <skipped>, the HTML
 * failure section, and the precision a method ran at.
 */
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { CLI, crossbound, expectOneLineError, tempFile } from './cli.js';

const dir = mkdtempSync(join(tmpdir(), 'crossbound-verdicts-'));
const out = (name: string): string => join(dir, name);
const json = (f: string) => JSON.parse(readFileSync(f, 'utf8'));
const FERRY = 'corpus/models/ferry-crossing.yaml';
const KETTLE = 'corpus/models/kettle-scale.yaml';

describe('what check is given', () => {
  it('no model on the given paths is a usage error: exit 2, one line, no report written', () => {
    const empty = mkdtempSync(join(tmpdir(), 'crossbound-empty-'));
    const line = expectOneLineError(crossbound(['check', empty, '--json', out('none.json')]));
    expect(line).toMatch(/no model file .* found/);
    expect(existsSync(out('none.json'))).toBe(false);
  });
  it('an empty shard of a non-empty corpus exits 0 and claims nothing (verdict empty, not pass; JUnit one skipped case)', () => {
    const r = crossbound(['check', KETTLE, '--shard', '2/2', '--json', out('empty.json'), '--junit', out('empty.xml')]);
    expect(readFileSync(out('empty.xml'), 'utf8')).toMatch(/<testsuites tests="1" failures="0" errors="0" skipped="1">/);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/shard 2\/2 holds no model \(1 model file\(s\) in all\): nothing checked, nothing claimed/);
    expect(r.stdout).not.toMatch(/pass/);
    expect(json(out('empty.json'))).toMatchObject({ verdict: 'empty', files: [], shard: { index: 2, count: 2 } });
  });
  it('an external solver that cannot be started, or a mistyped placeholder, is a usage error before anything is solved', () => {
    const missing = expectOneLineError(crossbound(['check', KETTLE, '--solver', 'no-such-solver-cb {model}', '--json', out('x.json')]));
    expect(missing).toMatch(/cannot start 'no-such-solver-cb': not found on PATH/);
    const typo = expectOneLineError(crossbound(['check', KETTLE, '--solver', 'node solver.js {modle}']));
    expect(typo).toMatch(/unknown placeholder \{modle\}/);
    expect(typo).not.toMatch(/internal error/);
    expect(existsSync(out('x.json'))).toBe(false);
  });
});

describe('unchecked', () => {
  it('a CTMDP with only uniformization (nothing applies) is unchecked: exit 1, JSON unchecked, JUnit a failed verdict case', () => {
    const r = crossbound(['check', FERRY, '--methods', 'uniformization', '--json', out('u.json'), '--junit', out('u.xml')]);
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(/ferry-crossing .* UNCHECKED/);
    expect(r.stdout).toMatch(/0 of 1 model\(s\) pass .*; 0 fail; 1 unchecked/);
    const report = json(out('u.json'));
    expect(report.verdict).toBe('unchecked');
    expect(report.models[0].verdict).toBe('unchecked');
    expect(report.models[0].methods[0]).toMatchObject({ status: 'refused', code: 'out-of-scope' });
    const xml = readFileSync(out('u.xml'), 'utf8');
    expect(xml).toMatch(/<testcase[^>]*name="verdict"[^>]*>\s*<failure[^>]*type="unchecked"/);
    expect(xml).not.toMatch(/tests="0"/);
  });
  it('--allow-unchecked: exit 0, and the JUnit verdict case is skipped, not passed', () => {
    const r = crossbound(['check', FERRY, '--methods', 'uniformization', '--allow-unchecked', '--junit', out('ua.xml')]);
    expect(r.code).toBe(0);
    expect(readFileSync(out('ua.xml'), 'utf8')).toMatch(/<testcase[^>]*name="verdict"[^>]*>\s*<skipped\/>/);
  });
  it('two orders of the k-step scheme agreeing are one family: unchecked', () => {
    const r = crossbound(['check', FERRY, '--methods', 'kstep:2,kstep:4', '--json', out('k.json')]);
    expect(r.code).toBe(1);
    const m = json(out('k.json')).models[0];
    expect(m.verdict).toBe('unchecked');
    expect(m.checks.find((c: { kind: string }) => c.kind === 'agree')).toMatchObject({ status: 'passed', independent: false });
  });
});

describe('failures in every report', () => {
  const src = readFileSync('corpus/models/relay-race.yaml', 'utf8').replace('leg3: "0.9989667023613523629585970161711040854809"', 'leg3: "0.9989"');
  const wrong = tempFile('relay-wrong.yaml', src);
  const r = crossbound(['check', wrong, '--methods', 'uniformization,kstep:2', '--json', out('f.json'), '--junit', out('f.xml'), '--report', out('f.html')]);
  it('exit 1, JSON verdict fail with the failed checks', () => {
    expect(r.code).toBe(1);
    const m = json(out('f.json')).models[0];
    expect(m.verdict).toBe('fail');
    const failed = m.checks.filter((c: { status: string }) => c.status === 'failed').map((c: { name: string }) => c.name);
    expect(failed).toEqual(['expect uniformization', 'expect kstep:2']);
  });
  it('the table says first when every failure involves one method, and not otherwise', () => {
    // Two failed expectations, of two methods: no common method.
    expect(r.stdout).not.toMatch(/Every failed check involves/);
    // The shrunk model on which fuzz caught the planted variant min-as-max: every failure involves it.
    const shrunk = 'corpus/regressions/fuzz-seed11-agree-variant-min-as-max-kstep-4.json';
    const v = crossbound(['check', shrunk, '--methods', 'kstep:2,oracle,variant:min-as-max']);
    expect(v.code).toBe(1);
    expect(v.stdout).toMatch(/\n\nEvery failed check involves method variant:min-as-max\.\n\d+ failed check\(s\):\n/);
  });
  it('JUnit: a <failure> per failed check, with the command that reproduces it', () => {
    const xml = readFileSync(out('f.xml'), 'utf8');
    expect(xml).toMatch(/name="expect uniformization"[^>]*>\s*<failure message="state leg3: [^"]*reproduce: crossbound check /);
    expect(xml).toMatch(/name="verdict"[^>]*>\s*<failure[^>]*type="fail"/);
  });
  it('HTML: verdict FAIL first, and a failure section per failed check with its reproduce command', () => {
    const html = readFileSync(out('f.html'), 'utf8');
    expect(html).toMatch(/class="verdict FAIL"/);
    expect(html.match(/<section class="fail">/g)?.length).toBe(2);
    expect(html).toMatch(/<h4>relay-race: expect kstep:2<\/h4><p>state leg3: /);
    // Two independent families both miss the file's value: the failures implicate the file's expect values, not a method.
    expect(html).toMatch(/<section class="fail-group" data-method="expect values of relay-race"><h3>expect values of relay-race: 2 failed check\(s\)<\/h3>/);
    expect(html).toMatch(/Reproduce: <code>crossbound check /);
  });
});

describe('the precision a method ran at', () => {
  it('Euler over its work cap at 1e-6 on kettle-scale runs at 1e-5 and says so in the table, JSON, JUnit and HTML', () => {
    const r = crossbound(['check', KETTLE, '--methods', 'euler,oracle', '--json', out('p.json'), '--junit', out('p.xml'), '--report', out('p.html')]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/kettle-scale .* euler@1e-5 /);
    const euler = json(out('p.json')).models[0].methods.find((m: { label: string }) => m.label === 'euler');
    expect(euler).toMatchObject({ status: 'solved', requested_precision: 1e-6, precision: 1e-5 });
    expect(euler.error_bound).toBeLessThanOrEqual(1e-5);
    expect(readFileSync(out('p.xml'), 'utf8')).toMatch(/name="agree euler@1e-5 ~ oracle"/);
    expect(readFileSync(out('p.html'), 'utf8')).toMatch(/<td>euler@1e-5<\/td>/);
  });
});

describe('merge', () => {
  const args = ['check', KETTLE, FERRY, '--methods', 'kstep:3,oracle'];
  const s1 = out('s1.json');
  const s2 = out('s2.json');
  crossbound([...args, '--shard', '1/2', '--json', s1]);
  crossbound([...args, '--shard', '2/2', '--json', s2]);
  it('refuses an incomplete shard set (exit 1), naming the missing shard, writing nothing', () => {
    const r = crossbound(['merge', s1, '--json', out('m1.json')]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/merge refused: incomplete shard set: missing shard\(s\) 2\/2/);
    expect(existsSync(out('m1.json'))).toBe(false);
  });
  it('refuses overlapping shards (exit 1)', () => {
    const r = crossbound(['merge', s1, s2, s1]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/merge refused: overlapping shards/);
  });
  it('refuses shards of different corpora (exit 1)', () => {
    const other = out('other.json');
    crossbound(['check', KETTLE, '--methods', 'kstep:3,oracle', '--shard', '2/2', '--json', other]);
    expect(crossbound(['merge', s1, other]).stderr).toMatch(/another corpus/);
  });
  it('a complete set that includes an empty shard merges', () => {
    const a = out('e1.json');
    const b = out('e2.json');
    crossbound(['check', KETTLE, '--methods', 'kstep:3', '--shard', '1/2', '--json', a]);
    crossbound(['check', KETTLE, '--methods', 'kstep:3', '--shard', '2/2', '--json', b]);
    const r = crossbound(['merge', b, a, '--json', out('em.json')]);
    expect(r.code).toBe(0);
    expect(json(out('em.json'))).toMatchObject({ verdict: 'pass', counts: { models: 1, pass: 1 } });
  });
  it('merges a complete set into one verdict, the same as one run', () => {
    const r = crossbound(['merge', s1, s2, '--json', out('m.json')]);
    expect(r.code).toBe(0);
    expect(json(out('m.json'))).toMatchObject({ verdict: 'pass', counts: { models: 2, pass: 2 }, shard: { index: 1, count: 1 } });
    // The shards' identities merge: one crossbound, the earliest date, the summed duration, each shard's command.
    const [a, b, m] = [json(s1).identity, json(s2).identity, json(out('m.json')).identity];
    expect(m).toMatchObject({ crossbound_version: a.crossbound_version, commit: a.commit, date: [a.date, b.date].sort()[0] });
    expect(m.duration_seconds).toBeCloseTo(a.duration_seconds + b.duration_seconds, 9);
    expect(m.shard_commands).toEqual([a.command, b.command]);
    expect(m.command).toMatch(/^crossbound merge /);
  });
  it('refuses (exit 1) shards written by different builds of crossbound', () => {
    const forged = out('s2-other-commit.json');
    const doc = json(s2);
    doc.identity.commit = 'f'.repeat(40);
    writeFileSync(forged, JSON.stringify(doc));
    const r = crossbound(['merge', s1, forged]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/merge refused: the shards ran different builds or solvers: .* was written by crossbound commit f{40}, /);
  });
});

describe('external solvers that refuse, or give no bound', () => {
  const script = (name: string, body: string): string => tempFile(name, body);
  // Prints the project's own k-step result without its error_bound.
  const noBound = script('nobound.mjs', `
import { execFileSync } from 'node:child_process';
const r = JSON.parse(execFileSync(process.execPath, [${JSON.stringify(CLI)}, 'solve', process.argv[2], '--method', 'kstep', '--precision', process.argv[3], '--json'], { encoding: 'utf8' }));
delete r.error_bound;
process.stdout.write(JSON.stringify(r));
`);
  const refuses = script('refuses.mjs', `process.stdout.write(JSON.stringify({ format: 'crossbound-result/1', method: 'refuser', refused: 'not supported here' }));\n`);
  const tpl = (f: string): string => `'${process.execPath}' '${f}' {model} {precision}`;
  it('no error_bound is a fault (exit 1) without --default-bound', () => {
    const r = crossbound(['check', KETTLE, '--methods', 'oracle', '--solver', tpl(noBound)]);
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(/fault solver:nobound\.mjs#1: no-bound: `error_bound` is missing: .*\(--default-bound precision or --default-bound B assumes one\)/);
  });
  it('--default-bound precision holds it to the precision asked, marked as assumed in the table, JSON and JUnit (HTML: report.test.ts)', () => {
    const r = crossbound(['check', KETTLE, '--methods', 'oracle', '--solver', tpl(noBound), '--default-bound', 'precision', '--json', out('d.json'), '--junit', out('d.xml')]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/solver:nobound\.mjs#1: no error_bound; the bound used on 1 model\(s\) is the user's --default-bound/);
    const m = json(out('d.json')).models[0].methods.find((x: { label: string }) => x.label === 'solver:nobound.mjs#1');
    expect(m).toMatchObject({ status: 'solved', bound_assumed: true, error_bound: 1e-6 });
    expect(readFileSync(out('d.xml'), 'utf8')).toMatch(/name="agree oracle ~ solver:nobound\.mjs#1\[bound assumed\]"/);
  });
  it('JUnit: every test suite carries the run identity as <properties>', () => {
    const xml = readFileSync(out('d.xml'), 'utf8');
    const props = Object.fromEntries([...xml.split('</properties>')[0]!.matchAll(/<property name="([^"]+)" value="([^"]*)"\/>/g)].map((m) => [m[1], m[2]]));
    const pkg = json('package.json') as { version: string };
    expect(props).toMatchObject({ 'crossbound.version': pkg.version, node: process.version, precision: '1e-6', 'solver.1.id': 'solver:nobound.mjs#1', 'solver.1.method': 'kstep' });
    expect(props['crossbound.commit']).toMatch(/^([0-9a-f]{40}|unknown)$/);
    expect(props.date).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/);
    expect(props['solver.1.template']).toBe(tpl(noBound));
    expect(props.command).toMatch(/^crossbound check corpus\/models\/kettle-scale\.yaml --methods oracle --solver /);
    // One suite per model, each with the same properties.
    expect(xml.match(/<properties>/g)?.length).toBe(xml.match(/<testsuite /g)?.length);
  });
  it('a solver that refuses two-player games: exit 0 when other families still check every model; its coverage line counts the refusals', () => {
    const games = 'tests/fixtures/solvers/refuse-games.mjs';
    const r = crossbound(['check', KETTLE, 'corpus/models/thermostat-duel.yaml', '--methods', 'kstep:3,oracle', '--precision', '1e-4',
      '--solver', `node ${games} {model} {precision}`, '--json', out('g.json'), '--report', out('g.html')]);
    expect(r.code, r.stdout).toBe(0);
    const line = 'solver:refuse-games.mjs#1 (no-games): answered 1 of 2, refused 1: two-player games are not supported (1)';
    expect(r.stdout).toContain(`\n  ${line}\n`);
    expect(json(out('g.json')).solver_coverage).toEqual([
      { id: 'solver:refuse-games.mjs#1', methods: ['no-games'], models: 2, answered: 1, refused: 1, faulted: 0, refusals: [{ reason: 'two-player games are not supported', count: 1 }] },
    ]);
    expect(readFileSync(out('g.html'), 'utf8')).toContain(`<li class="coverage">${line}</li>`);
  });
  it('a refusal is recorded as a refusal, not a fault; alone it leaves the model unchecked', () => {
    const r = crossbound(['check', KETTLE, '--methods', 'none', '--solver', tpl(refuses), '--json', out('r.json')]);
    expect(r.code).toBe(1);
    const m = json(out('r.json')).models[0];
    expect(m.methods[0]).toMatchObject({ status: 'refused', code: 'unspecified', reason: 'not supported here' });
    expect(m.checks).toEqual([]);
    expect(m.verdict).toBe('unchecked');
  });
});
