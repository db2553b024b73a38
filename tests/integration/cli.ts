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

export function crossbound(args: string[], timeoutMs = 120_000): Run {
  const r = spawnSync(process.execPath, [CLI, ...args], { encoding: 'utf8', timeout: timeoutMs, maxBuffer: 64 << 20 });
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
