/** Run the built command line as a user would (npm test builds dist/ first). */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export const CLI = join(process.cwd(), 'dist/harness/cli/main.js');

export interface Run {
  code: number | null;
  stdout: string;
  stderr: string;
}

/**
 * A limit against hangs only, never a speed test: generous enough for a busy 2-core machine running
 * several test files at once. A child that is killed (by this limit or anything else) fails the test
 * with the signal, the limit and the end of its stderr, not with a silent null exit code.
 */
export const CHILD_LIMIT_MS = 15 * 60_000;

export function crossbound(args: string[], timeoutMs = CHILD_LIMIT_MS): Run {
  const r = spawnSync(process.execPath, [CLI, ...args], { encoding: 'utf8', timeout: timeoutMs, killSignal: 'SIGKILL', maxBuffer: 64 << 20 });
  if (r.error || r.signal) {
    const why = r.signal ? `killed by ${r.signal}` : `failed to run (${r.error!.message})`;
    const limit = r.signal === 'SIGKILL' ? ` (limit ${timeoutMs / 1000} s)` : '';
    throw new Error(`crossbound ${args.join(' ')}: ${why}${limit}; stderr tail: ${(r.stderr ?? '').slice(-500)}`);
  }
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

export function tempFile(name: string, text: string): string {
  const dir = mkdtempSync(join(tmpdir(), 'crossbound-test-'));
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
}

/** A bad-input run: exit 2, exactly one line on stderr, no stack trace, nothing on stdout. */
export function expectOneLineError(r: Run): string {
  const lines = r.stderr.trimEnd().split('\n');
  if (r.code !== 2 || lines.length !== 1 || /\n\s+at /.test(r.stderr) || r.stdout !== '') {
    throw new Error(`expected exit 2 with one line on stderr, got code ${r.code}, stderr:\n${r.stderr}\nstdout:\n${r.stdout}`);
  }
  return lines[0]!;
}
