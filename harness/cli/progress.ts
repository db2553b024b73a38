/**
 * Progress of long runs (`check`, `fuzz`, `solve`), on stderr only, never on stdout.
 *
 * On a terminal (stderr is a TTY) a bar that redraws in place (cli-progress); otherwise plain lines,
 * one every few seconds at most, with no control characters, so that CI logs stay readable.
 *
 * The estimate of the time left is the rate so far: elapsed × (work left) / (work done), and nothing
 * before some work is done ("estimating…"). `check` counts models, not their size: in the bundled corpus
 * a model's time follows λT and the work caps of the methods, not its size (a 3-state stiff model takes
 * longer than a 100-state game), so weighting by size would make the estimate worse, not better.
 *
 * The logic is separate from the output and takes its clock as a parameter, so that it is tested
 * without timing.
 */
import cliProgress from 'cli-progress';
import type { FuzzEvent } from '../fuzz/index.js';
import { formatSeconds } from '../numbers.js';

/** Seconds on a monotone clock. */
export type Clock = () => number;
export const systemClock: Clock = () => performance.now() / 1000;

/** Seconds left at the rate so far; undefined before any work is done. */
export function estimateLeft(elapsed: number, done: number, total: number): number | undefined {
  if (!(done > 0) || !(elapsed >= 0)) return undefined;
  if (done >= total) return 0;
  return (elapsed * (total - done)) / done;
}

/** "about 1 min 10 s left", or "estimating…" before any work is done. */
export function formatLeft(left: number | undefined): string {
  return left === undefined ? 'estimating…' : `about ${formatSeconds(left)} left`;
}

/** The names of the models in flight: the first `max`, then "+N more". */
export function formatInFlight(names: readonly string[], max = 3): string {
  if (names.length <= max) return names.join(', ');
  return `${names.slice(0, max).join(', ')} +${names.length - max} more`;
}

/**
 * Where progress goes: a bar redrawn in place, or plain lines. An update shows `done/total text`
 * (text such as "models, 41.2 s elapsed, about 1 min 10 s left").
 */
export interface ProgressView {
  /** `final`: the last update (a line view always writes it; a bar stops). */
  update(done: number, total: number, text: string, final?: boolean): void;
  /** A message that must be shown now (a line of its own, also on a terminal). */
  note(text: string): void;
  stop(): void;
}

/**
 * Plain lines: an update is written when `final`, or when `everySeconds` have passed since the last
 * line; a note is always written.
 */
export class LineView implements ProgressView {
  private last = -Infinity;
  constructor(
    private readonly write: (line: string) => void,
    private readonly clock: Clock,
    private readonly prefix: string,
    private readonly everySeconds = 10,
  ) {}
  update(done: number, total: number, text: string, final = false): void {
    const now = this.clock();
    if (!final && now - this.last < this.everySeconds) return;
    this.last = now;
    this.write(`${this.prefix}: ${done}/${total} ${text}\n`);
  }
  note(text: string): void {
    this.last = this.clock();
    this.write(`${this.prefix}: ${text}\n`);
  }
  stop(): void {}
}

/** A bar on a terminal (cli-progress), redrawn in place and cleared at the end. */
export class BarView implements ProgressView {
  private readonly bar: cliProgress.SingleBar;
  private started = false;
  /** `counts`: show `done/total` after the bar (off: the text says how far it got). */
  constructor(private readonly prefix: string, stream: NodeJS.WriteStream = process.stderr, counts = true) {
    const format = counts ? `${prefix} [{bar}] {value}/{total} {text}` : `${prefix} [{bar}] {text}`;
    this.bar = new cliProgress.SingleBar(
      { format, hideCursor: true, clearOnComplete: true, stream, barsize: 24 },
      cliProgress.Presets.shades_classic,
    );
  }
  update(done: number, total: number, text: string, final = false): void {
    if (final && !this.started) return;
    if (!this.started) this.bar.start(total, done, { text });
    this.started = true;
    this.bar.setTotal(total);
    this.bar.update(done, { text });
    if (final) this.stop();
  }
  note(text: string): void {
    // Written above the bar; the bar is redrawn below it on its next update.
    if (this.started) process.stderr.write('\r\x1b[K');
    process.stderr.write(`${this.prefix}: ${text}\n`);
  }
  stop(): void {
    if (this.started) this.bar.stop();
    this.started = false;
  }
}

/** A bar on a terminal, plain lines otherwise. */
export function viewFor(
  prefix: string,
  stream: NodeJS.WriteStream = process.stderr,
  clock: Clock = systemClock,
): ProgressView {
  return stream.isTTY ? new BarView(prefix, stream) : new LineView((l) => stream.write(l), clock, prefix);
}

/** Progress of `check`: models done, elapsed, the estimate, and the models being solved now. */
export class CheckProgress {
  private readonly t0: number;
  private done = 0;
  private total = 0;
  private readonly inFlight = new Map<number, string>();
  constructor(private readonly view: ProgressView, private readonly clock: Clock) {
    this.t0 = clock();
  }
  plan(total: number, jobs: number): void {
    this.total = total;
    this.view.note(`${total} model(s), ${jobs} job(s)`);
  }
  start(index: number, model: string): void {
    this.inFlight.set(index, model);
    this.show(false);
  }
  finish(index: number): void {
    this.inFlight.delete(index);
    this.done++;
    this.show(this.done === this.total);
  }
  /** Called by a timer, so that a long model still gives a sign of life. */
  tick(): void {
    if (this.done < this.total) this.show(false);
  }
  /** What follows `done/total`: "models, 41.2 s elapsed, about 1 min 10 s left; solving a, b". */
  text(): string {
    const elapsed = this.clock() - this.t0;
    if (this.done === this.total) return `models in ${formatSeconds(elapsed)}`;
    const solving = this.inFlight.size > 0 ? `; solving ${formatInFlight([...this.inFlight.values()])}` : '';
    const left = formatLeft(estimateLeft(elapsed, this.done, this.total));
    return `models, ${formatSeconds(elapsed)} elapsed, ${left}${solving}`;
  }
  private show(final: boolean): void {
    this.view.update(this.done, this.total, this.text(), final);
  }
}

/** The events of a fuzz run (harness/fuzz). */
export type FuzzProgressEvent = FuzzEvent;

/**
 * Progress of `fuzz`: the model number it is at, elapsed and the estimate; once a check fails, that
 * it is shrinking, and how far it got (shrink steps tried and successful, the size in states now).
 */
export class FuzzProgress {
  private readonly t0: number;
  private at = 0;
  private total = 0;
  private shrink: { tried: number; successful: number; states: number } | undefined;
  constructor(private readonly view: ProgressView, private readonly clock: Clock) {
    this.t0 = clock();
  }
  event(e: FuzzProgressEvent): void {
    if (e.kind === 'model') {
      this.at = e.index;
      this.total = e.total;
      this.view.update(e.index - 1, e.total, this.text(), false);
    } else if (e.kind === 'found') {
      this.shrink = { tried: 0, successful: 0, states: e.states };
      this.view.note(`model ${e.index} of ${e.total} failed ${e.check} (${e.states} states); shrinking it`);
    } else {
      this.shrink = { tried: e.tried, successful: e.successful, states: e.states };
      this.view.update(this.at, this.total, this.text(), false);
    }
  }
  /** The last word of a run (a shrink summary after a failure). */
  finish(): void {
    if (this.shrink) {
      const s = this.shrink;
      this.view.stop();
      const steps = `${s.tried} step(s) tried, ${s.successful} successful`;
      this.view.note(`shrunk in ${formatSeconds(this.elapsed())}: ${steps}, ${s.states} state(s)`);
    } else {
      this.view.update(this.total, this.total, `models in ${formatSeconds(this.elapsed())}`, true);
    }
  }
  /** What follows `done/total` in a line or after the bar. */
  text(): string {
    const elapsed = this.elapsed();
    if (this.shrink) {
      const s = this.shrink;
      const steps = `${s.tried} step(s) tried, ${s.successful} successful`;
      return `models; shrinking a failure: ${steps}, now ${s.states} state(s), ${formatSeconds(elapsed)} elapsed`;
    }
    const left = formatLeft(estimateLeft(elapsed, this.at - 1, this.total));
    return `models done, at model ${this.at}, ${formatSeconds(elapsed)} elapsed, ${left}`;
  }
  private elapsed(): number {
    return this.clock() - this.t0;
  }
}

/**
 * Progress of one long solver run (`solve` on a terminal): the solver reports (done, total) in its own
 * units (Euler: steps; the optimal oracle: time); shown at most every `everySeconds`.
 */
export class SolveProgress {
  private readonly t0: number;
  private last = -Infinity;
  constructor(
    private readonly view: ProgressView,
    private readonly clock: Clock,
    private readonly method: string,
    private readonly everySeconds = 0.2,
  ) {
    this.t0 = clock();
  }
  report(done: number, total: number): void {
    const now = this.clock();
    if (now - this.last < this.everySeconds || !(total > 0)) return;
    this.last = now;
    this.view.update(Math.min(1000, Math.round((1000 * done) / total)), 1000, this.text(done, total, now - this.t0));
  }
  text(done: number, total: number, elapsed: number): string {
    const pct = Math.min(100, Math.floor((100 * done) / total));
    const left = formatLeft(estimateLeft(elapsed, done, total));
    return `${this.method}: ${pct} %, ${formatSeconds(elapsed)} elapsed, ${left}`;
  }
}
