/**
 * The commit read from git metadata without running git: a folder .git, a worktree's .git file with
 * commondir, a packed ref, a detached HEAD, and no metadata at all (the layout of git's repository
 * format: common practice, no source).
 */
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { commandLine, gitCommit, mergeStamps, type RunStamp } from '../../../harness/reports/identity.js';

const A = 'a'.repeat(40);
const B = 'b'.repeat(40);
const root = (): string => mkdtempSync(join(tmpdir(), 'crossbound-git-'));
const write = (p: string, text: string): void => {
  mkdirSync(join(p, '..'), { recursive: true });
  writeFileSync(p, text);
};

describe('gitCommit', () => {
  it('a branch as a loose ref, and a detached HEAD', () => {
    const r = root();
    write(join(r, '.git/HEAD'), 'ref: refs/heads/main\n');
    write(join(r, '.git/refs/heads/main'), `${A}\n`);
    expect(gitCommit(r)).toBe(A);
    write(join(r, '.git/HEAD'), `${B}\n`);
    expect(gitCommit(r)).toBe(B);
  });
  it('a worktree: .git is a file naming its folder, whose commondir holds the packed refs', () => {
    const r = root();
    const common = join(r, 'main/.git');
    write(join(common, 'packed-refs'), `# pack-refs with: peeled fully-peeled sorted\n${A} refs/heads/other\n${B} refs/heads/h-report\n`);
    write(join(common, 'worktrees/wt/HEAD'), 'ref: refs/heads/h-report\n');
    write(join(common, 'worktrees/wt/commondir'), '../..\n');
    write(join(r, 'wt/.git'), `gitdir: ${join(common, 'worktrees/wt')}\n`);
    expect(gitCommit(join(r, 'wt'))).toBe(B);
  });
  it("'unknown' without metadata, for a ref that is nowhere, and for a ref that climbs out", () => {
    const r = root();
    expect(gitCommit(r)).toBe('unknown');
    write(join(r, '.git/HEAD'), 'ref: refs/heads/gone\n');
    expect(gitCommit(r)).toBe('unknown');
    write(join(r, '.git/HEAD'), 'ref: refs/../../etc/passwd\n');
    expect(gitCommit(r)).toBe('unknown');
  });
});

describe('the command line and merged stamps', () => {
  it('quotes each word for a POSIX shell', () => {
    expect(commandLine(['check', 'corpus', '--solver', "my solver {model} --tag 'x'"])).toBe(`crossbound check corpus --solver 'my solver {model} --tag '\\''x'\\'''`);
  });
  const stamp = (over: Partial<RunStamp>): RunStamp => ({
    crossbound_version: '0.1.0', commit: A, date: '2026-01-02T00:00:00.000Z', duration_seconds: 2,
    environment: { node: 'v20.0.0', platform: 'linux', arch: 'x64', cpu_model: 'cpu', cpus: 2 }, precision: 1e-6,
    solvers: [{ id: 'solver:s#1', template: 's {model}' }], command: 'crossbound check corpus --shard 1/2', working_directory: '/w', ...over,
  });
  it('joins shards of one build and one set of templates; refuses others', () => {
    const m = mergeStamps([{ file: 'a.json', stamp: stamp({}) }, { file: 'b.json', stamp: stamp({ date: '2026-01-01T00:00:00.000Z', duration_seconds: 3 }) }], 'crossbound merge a.json b.json');
    expect(m).toMatchObject({ date: '2026-01-01T00:00:00.000Z', duration_seconds: 5, command: 'crossbound merge a.json b.json' });
    expect(mergeStamps([{ file: 'a.json', stamp: stamp({}) }, { file: 'b.json', stamp: stamp({ commit: B }) }], 'm')).toMatch(/b\.json was written by crossbound commit b+, a\.json by a+/);
    expect(mergeStamps([{ file: 'a.json', stamp: stamp({}) }, { file: 'b.json', stamp: stamp({ solvers: [] }) }], 'm')).toMatch(/b\.json checked the solver template\(s\) \[\]/);
  });
});
