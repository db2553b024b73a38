/** JUnit XML for CI servers: one test suite per model, one test case per check. */
import junitModule from 'junit-report-builder';
import type { Builder } from 'junit-report-builder';
import type { ModelReport } from '../check/types.js';

// The package is CommonJS (module.exports = builder) while its types declare a default export.
const root = ((junitModule as unknown as { default?: Builder }).default ?? junitModule) as unknown as Builder;

export function junitXml(reports: readonly ModelReport[]): string {
  const builder = root.newBuilder();
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
      if (!c.passed) tc.failure(`${c.detail}${c.reproduce ? ` — reproduce: ${c.reproduce}` : ''}`, 'disagreement');
      else tc.standardOutput(c.detail);
    }
  }
  return builder.build();
}
