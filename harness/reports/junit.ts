/**
 * JUnit XML for CI servers: one test suite per model, one test case per check (failed: <failure>,
 * could not run: <skipped> with its reason), and one test case `verdict` per model, a failure when
 * the model is unchecked (skipped instead under --allow-unchecked), so that nothing shows green
 * that was not compared.
 */
import junitModule from 'junit-report-builder';
import type { Builder } from 'junit-report-builder';
import { modelVerdict, uncheckedReason, type ModelReport } from '../check/types.js';

// The package is CommonJS (module.exports = builder) while its types declare a default export.
const root = ((junitModule as unknown as { default?: Builder }).default ?? junitModule) as unknown as Builder;

export function junitXml(reports: readonly ModelReport[], opts: { allowUnchecked: boolean; shard?: { index: number; count: number } }): string {
  const builder = root.newBuilder();
  if (reports.length === 0) {
    // An empty run claims nothing: one skipped case says so, rather than zero green tests.
    const where = opts.shard ? `shard ${opts.shard.index}/${opts.shard.count}` : 'the run';
    builder.testSuite().name('crossbound').testCase().className('crossbound').name('models').skipped().standardOutput(`${where} holds no model`);
  }
  for (const r of reports) {
    const suite = builder.testSuite().name(`crossbound.${r.model}`);
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
