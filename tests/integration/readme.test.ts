/** The README's examples and the help texts, run as a user would. */
import { readFileSync } from 'node:fs';
import { dirname } from 'node:path';
import { describe, expect, it } from 'vitest';
import { crossbound, tempFile } from './cli.js';

const readme = readFileSync('README.md', 'utf8');
const examples = [...readme.matchAll(/^ {4}\$ node dist\/harness\/cli\/main\.js (.+)$/gm)].map((m) => m[1]!);

describe('README', () => {
  it('opens with one paragraph stating the job, and says agreement is evidence, not proof', () => {
    const first = readme.split('\n\n')[1]!;
    expect(first).toMatch(/cross-checks solvers/);
    expect(first).toMatch(/evidence, not proof/);
    expect(readme).toMatch(/npm ci && npm test/);
    expect(readme).toMatch(/npm ci && npm start/);
  });
  it('has worked examples, and each runs with exit code 0', () => {
    expect(examples.length).toBeGreaterThanOrEqual(3);
    const dir = dirname(tempFile('x', ''));
    for (const ex of examples) {
      const args = ex.split(/\s+/).map((a) => (/^out\.(json|xml)$/.test(a) ? `${dir}/${a}` : a));
      const r = crossbound(args);
      expect(r.code, `${ex}\n${r.stderr}`).toBe(0);
    }
  });
  it('the oracle example prints the two-state closed form (Ross) to 29 digits', () => {
    const r = crossbound(['solve', 'corpus/models/kettle-scale.yaml', '--method', 'oracle', '--precision', '1e-30']);
    expect(r.stdout).toMatch(/0\.26370426758980205160102849752/);
  });
});

describe('help', () => {
  it('lists every command, and each command shows its options with their defaults', () => {
    const top = crossbound(['--help']);
    expect(top.code).toBe(0);
    for (const c of ['solve', 'check', 'merge', 'fuzz', 'selftest', 'bench', 'validate', 'export']) expect(top.stdout).toMatch(new RegExp(`^  ${c}\\b`, 'm'));
    expect(crossbound(['solve', '--help']).stdout).toMatch(/--precision <p>.*\(default: "1e-6"\)/s);
    expect(crossbound(['check', '--help']).stdout).toMatch(/--timeout <seconds>.*\(default: "60"\)/s);
    expect(crossbound(['fuzz', '--help']).stdout).toMatch(/--runs <n>.*\(default: "200"\)/s);
  });
  it('an unknown command or option is exit code 2 with one line', () => {
    for (const args of [['frobnicate'], ['check', '--frobnicate']]) {
      const r = crossbound(args);
      expect(r.code).toBe(2);
      expect(r.stderr.trim().split('\n').length).toBe(1);
    }
  });
});
