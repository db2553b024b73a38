/**
 * Running an external solver so that it cannot hurt the harness.
 *
 * The model is written as JSON to a fresh temporary directory; the command template is split
 * into arguments without a shell and filled in (template.ts); the command runs with no shell, no
 * stdin, in a process group of its own. Its stdout is collected up to a byte cap, the last
 * STDERR_TAIL bytes of its stderr are kept for the report, and its answer is validated
 * (parseResult.ts). A solver that runs past its time limit, or floods stdout, is killed with its
 * whole process group (SIGKILL to −pid), so grandchildren it spawned die too. The temporary
 * directory is always removed.
 *
 * Whatever the solver does, `runExternal` resolves to an outcome and never throws for it; it throws
 * only for the caller's mistakes (a malformed template: TemplateError; nonsensical options:
 * RangeError), which are usage errors, not faults of the solver.
 *
 * Process groups are POSIX; on Windows the group kill falls back to killing the child alone.
 */
import { spawn } from 'node:child_process';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Solved } from '../../corpus/format/result.js';
import type { GoalMode } from '../../corpus/format/types.js';
import { parseResult, type ExternalRefusalCode, type ParseFault, type ReportedIdentity } from './parseResult.js';
import { buildArgv, checkPlaceholders, splitTemplate } from './template.js';

export type ExternalFault = ParseFault | 'timeout' | 'crash' | 'exit-code' | 'output-too-large' | 'spawn-failed';

export type ExternalOutcome =
  | { kind: 'solved'; solved: Solved; seconds: number; boundAssumed?: true; reported: ReportedIdentity }
  | { kind: 'refused'; reason: string; code?: ExternalRefusalCode; seconds: number; reported: ReportedIdentity }
  | { kind: 'fault'; fault: ExternalFault; detail: string; seconds: number; stderrTail?: string };

export interface ExternalOptions {
  /** Requested absolute error, filled into {precision}. */
  precision: number;
  /** The model's time bound, filled into {time}. */
  timeBound: number;
  /** The bound of a result without `error_bound` (the user's assumption); none: such a result is a 'no-bound' fault. */
  defaultBound?: number;
  /** Wall-clock limit; default 60 000 ms. */
  timeoutMs?: number;
  /** Cap on stdout; default 64 MiB. */
  maxOutputBytes?: number;
  /** Parent of the temporary directory; default the system's temporary directory. */
  tmpRoot?: string;
  /** Working directory of the solver; default this process's. */
  cwd?: string;
}

export const DEFAULT_TIMEOUT_MS = 60_000;
export const DEFAULT_MAX_OUTPUT_BYTES = 64 * 1024 * 1024;
/** Wait for the pipes to close after a kill or an exit, before closing them from this side. */
export const GRACE_MS = 2000;
/** Bytes of stderr kept for the report. */
export const STDERR_TAIL = 2048;

/** Kill the solver's process group; ESRCH (already gone) is not an error. */
function killGroup(pid: number | undefined): void {
  if (pid === undefined) return;
  try {
    process.kill(process.platform === 'win32' ? pid : -pid, 'SIGKILL');
  } catch {
    // the group is gone already
  }
}

function checkOptions(o: ExternalOptions): { timeoutMs: number; maxOutputBytes: number } {
  const timeoutMs = o.timeoutMs ?? DEFAULT_TIMEOUT_MS;
  const maxOutputBytes = o.maxOutputBytes ?? DEFAULT_MAX_OUTPUT_BYTES;
  if (!(o.precision > 0) || !Number.isFinite(o.precision)) throw new RangeError(`precision must be a finite number > 0, got ${o.precision}`);
  if (!(o.timeBound > 0) || !Number.isFinite(o.timeBound)) throw new RangeError(`time bound must be a finite number > 0, got ${o.timeBound}`);
  if (!(timeoutMs > 0) || !Number.isFinite(timeoutMs)) throw new RangeError(`timeoutMs must be a finite number > 0, got ${timeoutMs}`);
  if (!(maxOutputBytes > 0) || !Number.isFinite(maxOutputBytes)) throw new RangeError(`maxOutputBytes must be a finite number > 0, got ${maxOutputBytes}`);
  return { timeoutMs, maxOutputBytes };
}

interface RawRun {
  stdout: Buffer;
  stderrTail: string;
  code: number | null;
  signal: NodeJS.Signals | null;
  stop?: 'timeout' | 'output-too-large';
  spawnError?: Error;
}

function runProcess(argv: readonly string[], cwd: string | undefined, timeoutMs: number, maxOutputBytes: number): Promise<RawRun> {
  return new Promise((resolve) => {
    const out: Buffer[] = [];
    let outBytes = 0;
    let errTail = Buffer.alloc(0);
    let stop: RawRun['stop'];
    let spawnError: Error | undefined;
    let settled = false;
    const child = spawn(argv[0]!, argv.slice(1), { shell: false, detached: true, stdio: ['ignore', 'pipe', 'pipe'], cwd, windowsHide: true });
    let exitCode: number | null = null;
    let exitSignal: NodeJS.Signals | null = null;
    let grace: NodeJS.Timeout | undefined;
    // A process that left its group (setsid) can hold the pipes open after the group is killed:
    // after GRACE_MS the pipes are closed from this side and the run ends anyway.
    const startGrace = (): void => {
      grace ??= setTimeout(() => {
        child.stdout.destroy();
        child.stderr.destroy();
        finish(exitCode, exitSignal);
      }, GRACE_MS);
    };
    const halt = (why: NonNullable<RawRun['stop']>): void => {
      if (stop === undefined) stop = why;
      killGroup(child.pid);
      startGrace();
    };
    const timer = setTimeout(() => halt('timeout'), timeoutMs);
    child.stdout.on('data', (chunk: Buffer) => {
      if (stop !== undefined) return;
      outBytes += chunk.length;
      if (outBytes > maxOutputBytes) halt('output-too-large');
      else out.push(chunk);
    });
    child.stderr.on('data', (chunk: Buffer) => {
      errTail = Buffer.concat([errTail, chunk]);
      if (errTail.length > STDERR_TAIL) errTail = errTail.subarray(errTail.length - STDERR_TAIL);
    });
    // A process that exits while something still holds the pipes open: kill the stragglers in its
    // group now (while a member lives the group id cannot be reused; if none does, the id was
    // freed a moment ago and sequential pid allocation will not hand it out again so soon).
    child.on('exit', (code, signal) => {
      exitCode = code;
      exitSignal = signal;
      if (!child.stdout.readableEnded || !child.stderr.readableEnded) {
        killGroup(child.pid);
        startGrace();
      }
    });
    const finish = (code: number | null, signal: NodeJS.Signals | null): void => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      if (grace) clearTimeout(grace);
      resolve({
        stdout: Buffer.concat(out),
        stderrTail: errTail.toString('utf8'),
        code,
        signal,
        ...(stop ? { stop } : {}),
        ...(spawnError ? { spawnError } : {}),
      });
    };
    child.on('error', (e) => {
      // Spawning failed (ENOENT, EACCES); no 'close' is guaranteed to follow.
      if (child.pid === undefined) {
        spawnError = e;
        finish(null, null);
      }
    });
    child.on('close', (code, signal) => finish(code, signal));
  });
}

export async function runExternal(
  template: string,
  modelJson: object,
  stateNames: readonly string[],
  opts: ExternalOptions,
): Promise<ExternalOutcome> {
  const { timeoutMs, maxOutputBytes } = checkOptions(opts);
  checkPlaceholders(splitTemplate(template)); // a malformed template is the caller's error: throw before any work
  const t0 = performance.now();
  const seconds = (): number => (performance.now() - t0) / 1000;
  let dir: string | undefined;
  try {
    dir = await mkdtemp(join(opts.tmpRoot ?? tmpdir(), 'crossbound-'));
    const modelPath = join(dir, 'model.json');
    await writeFile(modelPath, JSON.stringify(modelJson), 'utf8');
    const argv = buildArgv(template, { model: modelPath, precision: opts.precision, time: opts.timeBound });
    const raw = await runProcess(argv, opts.cwd, timeoutMs, maxOutputBytes);
    const tail = raw.stderrTail.length > 0 ? { stderrTail: raw.stderrTail } : {};
    const fault = (f: ExternalFault, detail: string): ExternalOutcome => ({ kind: 'fault', fault: f, detail, seconds: seconds(), ...tail });

    if (raw.spawnError) return fault('spawn-failed', `cannot start ${JSON.stringify(argv[0])}: ${raw.spawnError.message}`);
    if (raw.stop === 'timeout') return fault('timeout', `no answer within ${timeoutMs} ms; the solver's process group was killed`);
    if (raw.stop === 'output-too-large') return fault('output-too-large', `stdout passed ${maxOutputBytes} bytes; the solver's process group was killed`);
    if (raw.signal) return fault('crash', `the solver was killed by ${raw.signal}`);
    if (raw.code !== 0) return fault('exit-code', `the solver exited with code ${raw.code}`);

    // crossbound/1: goal_mode defaults to within.
    const goalMode: GoalMode = (modelJson as { goal_mode?: unknown }).goal_mode === 'at' ? 'at' : 'within';
    const expect = { timeBound: opts.timeBound, goalMode, ...(opts.defaultBound !== undefined ? { defaultBound: opts.defaultBound } : {}) };
    const parsed = parseResult(raw.stdout.toString('utf8'), stateNames, expect);
    if (parsed.ok === 'refused') return { kind: 'refused', reason: parsed.reason, ...(parsed.code ? { code: parsed.code } : {}), seconds: seconds(), reported: parsed.reported };
    if (!parsed.ok) return fault(parsed.fault, parsed.detail);
    const assumed = parsed.boundAssumed ? { boundAssumed: true as const } : {};
    return { kind: 'solved', solved: parsed.solved, seconds: seconds(), ...assumed, reported: parsed.reported };
  } catch (e) {
    // Only the harness's own file operations can get here (a full disk, a bad tmpRoot).
    return { kind: 'fault', fault: 'spawn-failed', detail: `could not prepare the solver's run: ${(e as Error).message}`, seconds: seconds() };
  } finally {
    if (dir !== undefined) await rm(dir, { recursive: true, force: true }).catch(() => undefined);
  }
}
