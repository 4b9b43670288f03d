/**
 * When to write the recovery copy: once the user pauses — `quietMs` with no change to the course
 * and no input (typing, wheel, pointer) — but never later than `maxMs` after the first change not
 * yet saved, so a long burst of work is still covered. Writing the copy serialises the whole
 * course (hundreds of milliseconds at 10 000 students); doing it while the user scrolls or types
 * is what made those interactions stall, so input postpones it like a change does.
 *
 * Framework-free so it can be tested with fake timers (tests/state/quietTimer.test.ts).
 */
export interface Clock {
  now(): number;
  setTimeout(run: () => void, ms: number): unknown;
  clearTimeout(handle: unknown): void;
}

const realClock: Clock = {
  now: () => Date.now(),
  setTimeout: (run, ms) => setTimeout(run, ms),
  clearTimeout: (handle) => clearTimeout(handle as ReturnType<typeof setTimeout>),
};

export class QuietTimer {
  private handle: unknown = null;
  /** When the first unsaved change came (null: nothing pending). */
  private since: number | null = null;

  constructor(
    private readonly run: () => void,
    private readonly quietMs: number,
    private readonly maxMs: number,
    private readonly clock: Clock = realClock,
  ) {}

  /** The course changed: a save is due once things are quiet. */
  change(): void {
    if (this.since === null) this.since = this.clock.now();
    this.arm();
  }

  /** The user did something: a pending save waits for the next pause (within maxMs). */
  activity(): void {
    if (this.since !== null) this.arm();
  }

  /** Nothing to save any more (saved to the project file, or closed). */
  cancel(): void {
    if (this.handle !== null) this.clock.clearTimeout(this.handle);
    this.handle = null;
    this.since = null;
  }

  get pending(): boolean {
    return this.since !== null;
  }

  private arm(): void {
    if (this.handle !== null) this.clock.clearTimeout(this.handle);
    const since = this.since ?? this.clock.now();
    const wait = Math.max(0, Math.min(this.quietMs, since + this.maxMs - this.clock.now()));
    this.handle = this.clock.setTimeout(() => this.fire(), wait);
  }

  private fire(): void {
    this.handle = null;
    this.since = null;
    this.run();
  }
}
