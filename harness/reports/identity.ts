/**
 * The identity of a run of `check`, for the qualification record (HTML), the JSON report and JUnit:
 * what was tested (each external solver's template exactly as given, and the `method`, `version` and
 * `params` its answers reported), by what (crossbound's version from package.json and the commit it
 * was checked out at, read from the git metadata: no git command and no shell is run), when (start
 * date, duration), where (Node version, platform, CPU model and count), at what precision (asked, and
 * what each method actually ran at), and the command line that re-runs it, quoted for a POSIX shell.
 *
 * Keys are snake_case, as in the result format. The static part (`RunStamp`) is taken once by the
 * command line; the parts that depend on the answers are derived from the model reports, so that a
 * merge of shard reports derives them again from the merged models.
 */
import { existsSync, readFileSync, statSync } from 'node:fs';
import { availableParallelism, cpus } from 'node:os';
import { dirname, isAbsolute, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { solverLabel } from '../check/external.js';
import { shellQuote } from '../check/reproduce.js';
import type { ModelReport } from '../check/types.js';

export interface Environment {
  node: string;
  platform: string;
  arch: string;
  cpu_model: string;
  cpus: number;
}

/** What the command line knows before and after the run. */
export interface RunStamp {
  crossbound_version: string;
  /** The commit of the checkout crossbound ran from, or 'unknown'. Local changes are not detected. */
  commit: string;
  /** Start of the run, ISO 8601 in UTC. */
  date: string;
  duration_seconds: number;
  environment: Environment;
  /** The precision asked of every method. */
  precision: number;
  /** The external solvers, in order: id and the template exactly as given. */
  solvers: { id: string; template: string }[];
  /** The command line, each word quoted for a POSIX shell where needed, and where it was run (paths in it are relative to it). */
  command: string;
  working_directory: string;
  /** Only in a merged report: the shard runs' own commands and differing environments. */
  shard_commands?: string[];
  other_environments?: Environment[];
}

export interface SolverIdentity {
  id: string;
  template: string;
  /** The `method` names its answers and refusals reported. */
  methods: string[];
  versions: string[];
  /** Each `params` key with its value when every answer gave the same one, else 'varies'. */
  params: Record<string, string>;
}

export interface RanAt {
  method: string;
  /** Per precision the method ran at, on how many models (coarser than asked: a work cap). */
  ran_at: { precision: number; models: number }[];
}

export interface RunIdentity extends RunStamp {
  solver_identity: SolverIdentity[];
  precision_ran: RanAt[];
}

/** The folder of package.json named crossbound, above this file. */
function packageRoot(): string | undefined {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (let i = 0; i < 6; i++) {
    const p = join(dir, 'package.json');
    try {
      if ((JSON.parse(readFileSync(p, 'utf8')) as { name?: unknown }).name === 'crossbound') return dir;
    } catch {
      // no package.json here
    }
    dir = dirname(dir);
  }
  return undefined;
}

function readText(p: string): string | undefined {
  try {
    return readFileSync(p, 'utf8').trim();
  } catch {
    return undefined;
  }
}

const HASH = /^[0-9a-f]{40}([0-9a-f]{24})?$/;

/**
 * The commit of a checkout from its git metadata: `.git` is a folder, or (a worktree) a file
 * 'gitdir: PATH' whose folder may name the shared one in `commondir`. HEAD is a hash (detached) or
 * 'ref: refs/heads/NAME', looked up as a loose ref, then in packed-refs. Anything else: 'unknown'.
 */
export function gitCommit(root: string): string {
  const dotGit = join(root, '.git');
  if (!existsSync(dotGit)) return 'unknown';
  let gitDir = dotGit;
  if (statSync(dotGit).isFile()) {
    const m = /^gitdir:\s*(.+)$/m.exec(readText(dotGit) ?? '');
    if (!m) return 'unknown';
    gitDir = isAbsolute(m[1]!) ? m[1]! : resolve(root, m[1]!);
  }
  const common = readText(join(gitDir, 'commondir'));
  const commonDir = common ? resolve(gitDir, common) : gitDir;
  const head = readText(join(gitDir, 'HEAD'));
  if (!head) return 'unknown';
  if (HASH.test(head)) return head;
  const ref = /^ref:\s*(refs\/\S+)$/.exec(head)?.[1];
  if (!ref || ref.split('/').includes('..')) return 'unknown';
  for (const dir of [gitDir, commonDir]) {
    const loose = readText(join(dir, ref));
    if (loose && HASH.test(loose)) return loose;
  }
  for (const line of (readText(join(commonDir, 'packed-refs')) ?? '').split('\n')) {
    const [hash, name] = line.trim().split(' ');
    if (name === ref && hash && HASH.test(hash)) return hash;
  }
  return 'unknown';
}

export function environment(): Environment {
  return {
    node: process.version,
    platform: process.platform,
    arch: process.arch,
    cpu_model: cpus()[0]?.model.trim() || 'unknown',
    cpus: availableParallelism(),
  };
}

/** crossbound's version and commit, 'unknown' when not found. */
export function toolIdentity(): { crossbound_version: string; commit: string } {
  const root = packageRoot();
  if (!root) return { crossbound_version: 'unknown', commit: 'unknown' };
  let version = 'unknown';
  try {
    const v = (JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { version?: unknown }).version;
    if (typeof v === 'string') version = v;
  } catch {
    // unreadable: unknown
  }
  return { crossbound_version: version, commit: gitCommit(root) };
}

/** The command line as one POSIX-shell line: 'crossbound', then every word quoted where needed. */
export function commandLine(words: readonly string[]): string {
  return ['crossbound', ...words.map(shellQuote)].join(' ');
}

export function runStamp(o: { started: Date; seconds: number; precision: number; templates: readonly string[]; args: readonly string[] }): RunStamp {
  return {
    ...toolIdentity(),
    date: o.started.toISOString(),
    duration_seconds: o.seconds,
    environment: environment(),
    precision: o.precision,
    solvers: o.templates.map((template, i) => ({ id: solverLabel(template, i), template })),
    command: commandLine(o.args),
    working_directory: process.cwd(),
  };
}

function solverIdentity(reports: readonly ModelReport[], s: { id: string; template: string }): SolverIdentity {
  const methods = new Set<string>();
  const versions = new Set<string>();
  const params = new Map<string, Set<string>>();
  for (const r of reports) {
    for (const m of r.methods) {
      if (m.label !== s.id || !m.reported) continue;
      methods.add(m.reported.method);
      if (m.reported.version !== undefined) versions.add(m.reported.version);
      for (const [k, v] of Object.entries(m.reported.params ?? {})) params.set(k, (params.get(k) ?? new Set()).add(String(v)));
    }
  }
  return {
    ...s,
    methods: [...methods],
    versions: [...versions],
    params: Object.fromEntries([...params].map(([k, vs]) => [k, vs.size === 1 ? [...vs][0]! : 'varies'])),
  };
}

/** Per method, the precisions it ran at and on how many models (the oracle's digits are its own). */
export function precisionRan(reports: readonly ModelReport[]): RanAt[] {
  const by = new Map<string, Map<number, number>>();
  for (const r of reports) {
    for (const m of r.methods) {
      if (m.status !== 'solved') continue;
      const at = by.get(m.label) ?? new Map<number, number>();
      by.set(m.label, at.set(m.precision, (at.get(m.precision) ?? 0) + 1));
    }
  }
  return [...by].map(([method, at]) => ({ method, ran_at: [...at].sort((a, b) => a[0] - b[0]).map(([precision, models]) => ({ precision, models })) }));
}

export function runIdentity(stamp: RunStamp, reports: readonly ModelReport[]): RunIdentity {
  return { ...stamp, solver_identity: stamp.solvers.map((s) => solverIdentity(reports, s)), precision_ran: precisionRan(reports) };
}

/** The static part of an identity (what a JSON report carries besides the derived parts). */
export function stampOf(id: RunIdentity | RunStamp): RunStamp {
  const { solver_identity: _s, precision_ran: _p, ...stamp } = id as RunIdentity;
  return stamp;
}

const sameEnv = (a: Environment, b: Environment): boolean => JSON.stringify(a) === JSON.stringify(b);

/**
 * The stamp of a merged set of shard reports: the shards must have run the same crossbound (version
 * and commit) on the same external solvers (templates, in order); else the problem is returned in
 * one line, and merge refuses. The date is the earliest start, the duration the sum of the shards'
 * (their machine time, not the wall time of a parallel CI run), the environment the first shard's,
 * with any others listed; the command is the merge's (run here), with each shard's kept.
 */
export function mergeStamps(entries: readonly { file: string; stamp: RunStamp }[], mergeCommand: string): RunStamp | string {
  const first = entries[0]!;
  for (const { file, stamp } of entries.slice(1)) {
    for (const key of ['crossbound_version', 'commit'] as const) {
      if (stamp[key] !== first.stamp[key]) return `${file} was written by crossbound ${key === 'commit' ? 'commit' : 'version'} ${stamp[key]}, ${first.file} by ${first.stamp[key]}`;
    }
    const t = (s: RunStamp): string => JSON.stringify(s.solvers.map((x) => x.template));
    if (t(stamp) !== t(first.stamp)) return `${file} checked the solver template(s) ${t(stamp)}, ${first.file} ${t(first.stamp)}`;
  }
  const others: Environment[] = [];
  for (const { stamp } of entries.slice(1)) {
    if (!sameEnv(stamp.environment, first.stamp.environment) && !others.some((o) => sameEnv(o, stamp.environment))) others.push(stamp.environment);
  }
  return {
    ...first.stamp,
    date: entries.map((e) => e.stamp.date).sort()[0]!,
    duration_seconds: entries.reduce((t, e) => t + e.stamp.duration_seconds, 0),
    command: mergeCommand,
    working_directory: process.cwd(),
    shard_commands: entries.map((e) => e.stamp.command),
    ...(others.length > 0 ? { other_environments: others } : {}),
  };
}
