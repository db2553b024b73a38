/**
 * Progress of check, fuzz and solve (harness/cli/progress.ts), with an injected clock: the estimate's
 * arithmetic, the plain-line format and its throttle, the models in flight, and the shrinking messages
 * fed by the events of a real fuzz run. No test here depends on machine speed.
 */
import { describe, expect, test } from 'vitest';
import {
  CheckProgress, FuzzProgress, LineView, SolveProgress, estimateLeft, formatInFlight, formatLeft,
  type FuzzProgressEvent, type ProgressView,
} from '../../../harness/cli/progress.js';
import { runFuzz } from '../../../harness/fuzz/index.js';
// Planted variants are loaded only on request (harness/check/planted.ts); this test asks for one.
import '../../../harness/selftest/variants.js';

/** A clock the test moves by hand. */
function manualClock(): { now: () => number; advance: (s: number) => void } {
  let t = 100;
  return { now: () => t, advance: (s) => void (t += s) };
}

/** A plain-line view writing into an array. */
function lines(clock: () => number, every = 10): { view: LineView; out: string[] } {
  const out: string[] = [];
  return { view: new LineView((l) => out.push(l), clock, 'check', every), out };
}

describe('estimateLeft: the rate so far', () => {
  test('elapsed × left / done', () => {
    expect(estimateLeft(30, 10, 40)).toBe(90);
    expect(estimateLeft(12, 3, 4)).toBe(4);
  });
  test('nothing done: no estimate; all done: nothing left', () => {
    expect(estimateLeft(5, 0, 10)).toBeUndefined();
    expect(estimateLeft(5, 10, 10)).toBe(0);
    expect(estimateLeft(Number.NaN, 1, 10)).toBeUndefined();
  });
  test('formatLeft says estimating… until some work is done, and uses the one duration format', () => {
    expect(formatLeft(undefined)).toBe('estimating…');
    expect(formatLeft(70)).toBe('about 1 min 10 s left');
    expect(formatLeft(4.2)).toBe('about 4.20 s left');
  });
  test('models in flight: at most three named', () => {
    expect(formatInFlight(['a'])).toBe('a');
    expect(formatInFlight(['a', 'b', 'c', 'd', 'e'])).toBe('a, b, c +2 more');
  });
});

describe('check progress, plain lines', () => {
  test('a header, then at most one line per 10 s, then the final line; no control characters', () => {
    const c = manualClock();
    const { view, out } = lines(c.now);
    const p = new CheckProgress(view, c.now);
    p.plan(4, 2);
    p.start(0, 'ferry-crossing');
    p.start(1, 'glacier-hike');
    c.advance(3);
    p.tick(); // 3 s after the header: too soon
    c.advance(8);
    p.tick(); // 11 s: a line, before anything finished
    p.finish(0);
    p.start(2, 'kettle-scale');
    c.advance(11);
    p.finish(1); // 22 s, 2 of 4 done: 22 s left at this rate
    p.start(3, 'relay-race');
    c.advance(2);
    p.finish(2); // too soon after the last line
    c.advance(2);
    p.finish(3); // final, always written
    expect(out).toEqual([
      'check: 4 model(s), 2 job(s)\n',
      'check: 0/4 models, 11.0 s elapsed, estimating…; solving ferry-crossing, glacier-hike\n',
      'check: 2/4 models, 22.0 s elapsed, about 22.0 s left; solving kettle-scale\n',
      'check: 4/4 models in 26.0 s\n',
    ]);
    for (const l of out) expect(l).not.toMatch(/[\r\x1b]/);
  });
  test('the models shown are those in flight, not the last one finished', () => {
    const c = manualClock();
    const p = new CheckProgress(lines(c.now).view, c.now);
    p.plan(3, 2);
    p.start(0, 'a');
    p.start(1, 'b');
    p.finish(0);
    p.start(2, 'c');
    expect(p.text()).toMatch(/; solving b, c$/);
  });
});

/** A view that records every update and note. */
function recorder(): { view: ProgressView; updates: string[]; notes: string[] } {
  const updates: string[] = [];
  const notes: string[] = [];
  return {
    view: { update: (d, t, text) => void updates.push(`${d}/${t} ${text}`), note: (t) => void notes.push(t), stop: () => {} },
    updates,
    notes,
  };
}

describe('fuzz progress', () => {
  test('the model it is at, the estimate, then shrinking with steps tried, successful and the size', () => {
    const c = manualClock();
    const r = recorder();
    const p = new FuzzProgress(r.view, c.now);
    p.event({ kind: 'model', index: 1, total: 50 });
    c.advance(4);
    p.event({ kind: 'model', index: 3, total: 50 });
    expect(r.updates.at(-1)).toBe('2/50 models done, at model 3, 4.00 s elapsed, about 1 min 36 s left');
    p.event({ kind: 'found', index: 3, total: 50, states: 6, check: 'agree euler ~ kstep:4' });
    expect(r.notes.at(-1)).toBe('model 3 of 50 failed agree euler ~ kstep:4 (6 states); shrinking it');
    p.event({ kind: 'shrink', tried: 7, successful: 2, states: 4 });
    expect(r.updates.at(-1)).toBe('3/50 models; shrinking a failure: 7 step(s) tried, 2 successful, now 4 state(s), 4.00 s elapsed');
    c.advance(1);
    p.finish();
    expect(r.notes.at(-1)).toBe('shrunk in 5.00 s: 7 step(s) tried, 2 successful, 4 state(s)');
  });

  test('a real fuzz run reports its models, the failure and each shrink step (seed 1, variant:min-as-max)', async () => {
    const events: FuzzProgressEvent[] = [];
    const s = await runFuzz({ runs: 100, seed: 1, maxStates: 6, precision: 1e-5, methods: ['variant:min-as-max'], onEvent: (e) => events.push(e) });
    expect(s.failure).toBeDefined();
    const models = events.filter((e) => e.kind === 'model');
    const found = events.filter((e) => e.kind === 'found');
    const shrinks = events.filter((e) => e.kind === 'shrink');
    // Models 1 … runs, each once, then one failure at the last of them, then only shrink steps.
    expect(models.map((e) => e.index)).toEqual(Array.from({ length: s.runs }, (_, i) => i + 1));
    expect(found).toHaveLength(1);
    expect(found[0]).toMatchObject({ index: s.runs, total: 100 });
    expect(events.indexOf(found[0]!)).toBe(models.length);
    expect(shrinks.length).toBe(events.length - models.length - 1);
    shrinks.forEach((e, i) => {
      expect(e.tried).toBe(i + 1);
      expect(e.successful).toBeLessThanOrEqual(e.tried);
    });
    const last = shrinks.at(-1);
    if (last) expect(last.states).toBe(s.failure!.states);
  }, 600_000);
});

describe('solve progress', () => {
  test('at most one update per 0.2 s, in percent of the solver\'s own units', () => {
    const c = manualClock();
    const r = recorder();
    const p = new SolveProgress(r.view, c.now, 'euler');
    p.report(0, 1000);
    p.report(10, 1000); // same instant: dropped
    c.advance(2);
    p.report(250, 1000);
    expect(r.updates).toEqual(['0/1000 euler: 0 %, 0 s elapsed, estimating…', '250/1000 euler: 25 %, 2.00 s elapsed, about 6.00 s left']);
  });
});
