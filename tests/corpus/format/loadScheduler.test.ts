/** The scheduler loader: a good scheduler loads; each rule is refused with its position. */
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { loadModelFile, ModelError } from '../../../corpus/format/load.js';
import { loadSchedulerText } from '../../../corpus/format/loadScheduler.js';

const model = loadModelFile(join(import.meta.dirname, '../../fixtures/models/greenhouse.yaml'));
const sched = (...lines: string[]): string => `${['format: crossbound-scheduler/1', ...lines].join('\n')}\n`;

function errorOf(text: string): ModelError {
  try {
    loadSchedulerText(text, 's.yaml', model);
  } catch (e) {
    if (e instanceof ModelError) return e;
    throw e;
  }
  throw new Error('accepted');
}

describe('loadScheduler', () => {
  test('the two-segment scheduler of the example loads', () => {
    const s = loadSchedulerText(sched('model: greenhouse-pumps', 'choices:', '  both_ok: [ { from: 0, action: run_b }, { from: 7.25, action: run_a } ]'), 's.yaml', model);
    expect(s).toEqual({ model: 'greenhouse-pumps', choices: { both_ok: [{ from: 0, action: 'run_b' }, { from: 7.25, action: 'run_a' }] } });
  });
  const cases: [string, string, number, number, string][] = [
    ['format', 'format: crossbound-scheduler/2\nchoices: {}\n', 1, 9, 'format must be crossbound-scheduler/1'],
    ['unknown key', sched('choices: {}', 'extra: 1'), 3, 1, 'unknown key'],
    ['another model', sched('model: other', 'choices: {both_ok: [{from: 0, action: run_a}]}'), 2, 8, 'the scheduler names another model'],
    ['unknown state', sched('choices:', '  both_ok: [{from: 0, action: run_a}]', '  wet: [{from: 0, action: run}]'), 4, 3, 'choices must name states of the model'],
    ['unknown action', sched('choices:', '  both_ok: [{from: 0, action: run_c}]'), 3, 31, 'the action must exist in that state'],
    ['first from not 0', sched('choices:', '  both_ok: [{from: 1, action: run_a}]'), 3, 20, 'the first segment must start at from = 0'],
    ['not sorted', sched('choices:', '  both_ok: [{from: 0, action: run_a}, {from: 5, action: run_b}, {from: 5, action: run_a}]'), 3, 72, 'from values must be strictly increasing'],
    ['beyond T', sched('choices:', '  both_ok: [{from: 0, action: run_a}, {from: 12.5, action: run_b}]'), 3, 46, 'from must lie within [0, T] = [0, 12]'],
    ['from not a number', sched('choices:', '  both_ok: [{from: soon, action: run_a}]'), 3, 20, 'from must be a finite number'],
    ['owned state missing', sched('choices:', '  a_worn: [{from: 0, action: run}]'), 2, 1, 'every owned state must be given'],
    ['empty list', sched('choices:', '  both_ok: []'), 3, 12, 'the choices of a state must be a non-empty list of { from, action }'],
  ];
  test.each(cases)('%s', (_n, text, line, column, rule) => {
    const e = errorOf(text);
    expect([e.line, e.column, e.rule]).toEqual([line, column, rule]);
  });
});
