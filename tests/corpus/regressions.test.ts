/** Every saved regression (shrunk counterexamples, kept forever) passes every correct method. */
import { readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { crossbound } from '../integration/cli.js';

describe('corpus/regressions', () => {
  for (const f of readdirSync('corpus/regressions').filter((n) => n.endsWith('.json') || n.endsWith('.yaml'))) {
    it(`${f.replace(/\.(json|yaml)$/, '')}: every method agrees`, () => {
      const r = crossbound(['check', `corpus/regressions/${f}`, '--jobs', '1']);
      expect(r.stdout).toMatch(/1 of 1 model\(s\) pass every check/);
      expect(r.code).toBe(0);
    });
  }
});
