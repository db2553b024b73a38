/**
 * JUnit XML for CI servers: one test suite per model, one test case per check (failed: <failure>,
 * could not run: <skipped> with its reason), and one test case `verdict` per model, a failure when
 * the model is unchecked (skipped instead under --allow-unchecked), so that nothing shows green
 * that was not compared. Every test suite carries the run's identity as <properties> (crossbound's
 * version and commit, date, Node, platform, CPU, the precision, each external solver's template and
 * reported method, the command), so a CI record says what was tested.
 */
import junitModule from 'junit-report-builder';
import type { Builder } from 'junit-report-builder';
import { modelVerdict, uncheckedReason, type ModelReport } from '../check/types.js';
import { formatPrecision, formatSeconds } from '../numbers.js';
import type { RunIdentity } from './identity.js';

// The package is CommonJS (module.exports = builder) while its types declare a default export.
const root = ((junitModule as unknown as { default?: Builder }).default ?? junitModule) as unknown as Builder;

/** The identity as JUnit properties, in a fixed order. */
export function identityProperties(id: RunIdentity): [string, string][] {
  const e = id.environment;
  const props: [string, string][] = [
    ['crossbound.version', id.crossbound_version],
    ['crossbound.commit', id.commit],
    ['date', id.date],
    ['duration', formatSeconds(id.duration_seconds)],
    ['node', e.node],
    ['platform', `${e.platform} ${e.arch}`],
    ['cpu', `${e.cpu_model} × ${e.cpus}`],
    ['precision', formatPrecision(id.precision)],
  ];
  for (const [i, s] of id.solver_identity.entries()) {
    props.push([`solver.${i + 1}.id`, s.id], [`solver.${i + 1}.template`, s.template]);
    if (s.methods.length > 0) props.push([`solver.${i + 1}.method`, s.methods.join(', ')]);
    if (s.versions.length > 0) props.push([`solver.${i + 1}.version`, s.versions.join(', ')]);
  }
  for (const r of id.precision_ran) {
    const coarser = r.ran_at.filter((a) => a.precision !== id.precision && r.method !== 'oracle');
    if (coarser.length > 0) props.push([`ran-coarser.${r.method}`, coarser.map((a) => `${formatPrecision(a.precision)} on ${a.models} model(s)`).join(', ')]);
  }
  props.push(['command', id.command], ['working-directory', id.working_directory]);
  return props;
}

export function junitXml(
  reports: readonly ModelReport[],
  opts: { allowUnchecked: boolean; shard?: { index: number; count: number }; identity?: RunIdentity },
): string {
  const builder = root.newBuilder();
  const props = opts.identity ? identityProperties(opts.identity) : [];
  const newSuite = () => {
    const suite = builder.testSuite();
    for (const [k, v] of props) suite.property(k, v);
    return suite;
  };
  if (reports.length === 0) {
    // An empty run claims nothing: one skipped case says so, rather than zero green tests.
    const where = opts.shard ? `shard ${opts.shard.index}/${opts.shard.count}` : 'the run';
    newSuite().name('crossbound').testCase().className('crossbound').name('models').skipped().standardOutput(`${where} holds no model`);
  }
  for (const r of reports) {
    const suite = newSuite().name(`crossbound.${r.model}`);
    const seconds = r.methods.reduce((t, m) => t + m.seconds, 0);
    suite.time(seconds);
    if (r.error) {
      suite.testCase().className(r.model).name('load').file(r.file).error(r.error, 'bad-input');
      continue;
    }
    for (const c of r.checks) {
      const tc = suite.testCase().className(r.model).name(c.name).file(r.file);
      if (c.status === 'failed') tc.failure(`${c.detail}${c.reproduce ? ` — reproduce: ${c.reproduce}` : ''}`, c.kind === 'fault' ? 'fault' : 'disagreement');
      else if (c.status === 'skipped') tc.skipped().standardOutput(`skipped: ${c.detail}`);
      else tc.standardOutput(c.detail);
    }
    const verdict = modelVerdict(r);
    const tc = suite.testCase().className(r.model).name('verdict').file(r.file);
    if (verdict === 'unchecked') {
      const why = `unchecked: ${uncheckedReason(r)}`;
      if (opts.allowUnchecked) tc.skipped().standardOutput(why);
      else tc.failure(why, 'unchecked');
    } else if (verdict === 'fail') tc.failure(`${r.checks.filter((c) => c.status === 'failed').length} failed check(s)`, 'fail');
    else tc.standardOutput('pass: every check that ran passed, with an independent comparison');
  }
  return builder.build();
}
