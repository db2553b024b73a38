import { existsSync, readFileSync } from 'node:fs';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runExternal, STDERR_TAIL, type ExternalOutcome } from '../../../harness/external/run.js';
import { TemplateError } from '../../../harness/external/template.js';
import { solverPath, solverTemplate } from '../../fixtures/solvers/index.js';

const q = (w: string): string => `'${w.replace(/'/g, `'\\''`)}'`;
/** A template running an inline Node script; the script sees the filled arguments in process.argv.slice(1). */
const inline = (script: string, args = '{model}'): string => `${q(process.execPath)} -e ${q(script)} ${args}`;

const model = {
  format: 'crossbound/1', name: 'fork', time_bound: 1, goal: ['done'], initial: 'start',
  states: { start: { actions: { go: { done: 1, lost: 1 } } }, done: {}, lost: {} },
};
const names = ['start', 'done', 'lost'];

let root = '';
beforeAll(async () => {
  // A temporary root whose path has blanks, quotes and shell operators in it.
  root = await mkdtemp(join(tmpdir(), `cb ext; rm -rf x 'q' $(id) `));
});
afterAll(async () => {
  await rm(root, { recursive: true, force: true });
});

const run = (template: string, opts: Partial<Parameters<typeof runExternal>[3]> = {}): Promise<ExternalOutcome> =>
  runExternal(template, model, names, { precision: 1e-6, timeBound: 1, timeoutMs: 20_000, tmpRoot: root, ...opts });
const faultOf = (o: ExternalOutcome): string => (o.kind === 'fault' ? o.fault : 'solved');

/** Gone, or a zombie waiting to be reaped (Linux /proc; elsewhere signal 0). */
function alive(pid: number): boolean {
  if (existsSync('/proc/self/stat')) {
    try {
      return !/^\d+ \(.*\) Z /s.test(readFileSync(`/proc/${pid}/stat`, 'utf8'));
    } catch {
      return false;
    }
  }
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}
async function waitDead(pid: number, ms: number): Promise<boolean> {
  for (let t = 0; t < ms; t += 50) {
    if (!alive(pid)) return true;
    await new Promise((r) => setTimeout(r, 50));
  }
  return !alive(pid);
}

describe('runExternal', () => {
  it('runs the reference fixture and returns its result, method prefixed; the temp dir is removed', async () => {
    const o = await run(solverTemplate('correct.mjs'));
    expect(o.kind).toBe('solved');
    if (o.kind !== 'solved') return;
    expect(o.solved.method).toBe('external:uniformization');
    expect(o.solved.values.length).toBe(3);
    // 1/2 (1 − e^{−2}): a race of two exponential clocks (common practice, no source)
    expect(Math.abs(o.solved.values[0]! - 0.5 * (1 - Math.exp(-2)))).toBeLessThanOrEqual(o.solved.errorBound);
    expect(o.seconds).toBeGreaterThan(0);
    expect(await readdir(root)).toEqual([]);
  });

  it('hands over the model path as exactly one argument, and the model as crossbound/1 JSON', async () => {
    const script = `const a = process.argv.slice(1); const fs = require('fs');
      console.error(JSON.stringify({ a, exists: fs.existsSync(a[0]), model: JSON.parse(fs.readFileSync(a[0], 'utf8')) })); process.exit(7);`;
    const o = await run(inline(script, '{model} {precision} {time}'));
    expect(faultOf(o)).toBe('exit-code');
    if (o.kind !== 'fault') return;
    expect(o.detail).toMatch(/code 7/);
    const seen = JSON.parse(o.stderrTail!);
    expect(seen.a.length).toBe(3);
    expect(seen.a[0].startsWith(root)).toBe(true);
    expect(seen.a.slice(1)).toEqual(['0.000001', '1']);
    expect(seen.exists).toBe(true);
    expect(seen.model).toEqual(model);
    expect(existsSync(seen.a[0])).toBe(false);
  });

  it("'spawn-failed' for a missing or non-executable command", async () => {
    expect(faultOf(await run('/nonexistent/solver-xyz {model}'))).toBe('spawn-failed');
    expect(faultOf(await run(`${q(solverPath('_core.mjs'))} {model}`))).toBe('spawn-failed');
    expect(await readdir(root)).toEqual([]);
  });

  it('throws for a malformed template (a usage error, not a fault of the solver)', async () => {
    await expect(run(`solver 'unbalanced {model}`)).rejects.toThrow(TemplateError);
    await expect(run('solver {precision}')).rejects.toThrow(TemplateError);
  });

  it.each([
    ['text', 'not-json'],
    ['wrong-format', 'bad-format'],
    ['missing-state', 'missing-state'],
    ['no-bound', 'no-bound'],
    ['out-of-range', 'bad-value'],
  ])("garbage mode %s gives '%s'", async (mode, fault) => {
    expect(faultOf(await run(solverTemplate('garbage.mjs', [mode])))).toBe(fault);
  });

  it("'bad-value' for a NaN, which JSON serialises as null", async () => {
    expect(faultOf(await run(solverTemplate('nan.mjs')))).toBe('bad-value');
  });

  it("'exit-code' for an uncaught exception, with the stderr tail; 'crash' for a signal", async () => {
    const thrown = await run(solverTemplate('crash.mjs', ['throw']));
    expect(faultOf(thrown)).toBe('exit-code');
    expect(thrown.kind === 'fault' && thrown.stderrTail).toMatch(/fixture crash/);
    const killed = await run(solverTemplate('crash.mjs', ['signal']));
    expect(faultOf(killed)).toBe('crash');
    expect(killed.kind === 'fault' && killed.detail).toMatch(/SIGKILL/);
  });

  it('keeps only the last STDERR_TAIL bytes of stderr', async () => {
    const o = await run(inline(`process.stderr.write('a'.repeat(10000) + 'THE END'); process.exitCode = 1;`));
    expect(faultOf(o)).toBe('exit-code');
    const tail = o.kind === 'fault' ? o.stderrTail! : '';
    expect(tail.length).toBe(STDERR_TAIL);
    expect(tail.endsWith('aTHE END')).toBe(true);
  });

  it("'output-too-large' when stdout floods past the cap; the flooder is killed", async () => {
    const o = await run(solverTemplate('garbage.mjs', ['flood']), { maxOutputBytes: 65536 });
    expect(faultOf(o)).toBe('output-too-large');
    expect(await readdir(root)).toEqual([]);
  });

  it("a hang is a 'timeout' within the limit + 5 s, and the grandchild dies with the group", async () => {
    const o = await run(solverTemplate('hang.mjs'), { timeoutMs: 1500 });
    expect(faultOf(o)).toBe('timeout');
    expect(o.seconds).toBeLessThan(1.5 + 5);
    const pid = Number(/child pid (\d+)/.exec(o.kind === 'fault' ? o.stderrTail ?? '' : '')?.[1]);
    expect(pid).toBeGreaterThan(0);
    expect(await waitDead(pid, 3000)).toBe(true);
    expect(await readdir(root)).toEqual([]);
  });

  it('a solver that answers and exits, leaving a grandchild holding stdout, is solved and the straggler killed', async () => {
    const side = await mkdtemp(join(tmpdir(), 'cb-side-'));
    const pidFile = join(side, 'pid');
    const script = `const { spawn } = require('child_process');
      const c = spawn(process.execPath, ['-e', 'setInterval(() => {}, 1 << 30)'], { stdio: ['ignore', 'inherit', 'inherit'] });
      require('fs').writeFileSync(process.argv[2], String(c.pid));
      const values = { start: 0.4323323583816936, done: 1, lost: 0 };
      process.stdout.write(JSON.stringify({ format: 'crossbound-result/1', method: 'inline', values, error_bound: 1e-15 }));
      process.exit(0);`;
    try {
      // Were the straggler not killed, its open stdout would hold the run until the time limit.
      const o = await run(inline(script, `{model} ${q(pidFile)}`), { timeoutMs: 30_000 });
      expect(faultOf(o)).toBe('solved');
      expect(await waitDead(Number(readFileSync(pidFile, 'utf8')), 3000)).toBe(true);
    } finally {
      await rm(side, { recursive: true, force: true });
    }
  });

  it('a grandchild that left the process group and holds stdout cannot hold the run: the pipes are closed after a grace period', async () => {
    const side = await mkdtemp(join(tmpdir(), 'cb-side-'));
    const pidFile = join(side, 'pid');
    const script = `const { spawn } = require('child_process');
      const c = spawn(process.execPath, ['-e', 'setInterval(() => {}, 1 << 30)'], { detached: true, stdio: ['ignore', 'inherit', 'inherit'] });
      require('fs').writeFileSync(process.argv[2], String(c.pid));
      const values = { start: 0.4323323583816936, done: 1, lost: 0 };
      process.stdout.write(JSON.stringify({ format: 'crossbound-result/1', method: 'inline', values, error_bound: 1e-15 }));
      process.exit(0);`;
    let pid = 0;
    try {
      const o = await run(inline(script, `{model} ${q(pidFile)}`), { timeoutMs: 30_000 });
      pid = Number(readFileSync(pidFile, 'utf8'));
      expect(faultOf(o)).toBe('solved');
      expect(alive(pid)).toBe(true); // out of reach of a group kill, as expected
    } finally {
      if (pid > 0) process.kill(pid, 'SIGKILL'); // the test started it, the test ends it
      await rm(side, { recursive: true, force: true });
    }
  });
});
