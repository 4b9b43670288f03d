/**
 * The recovery copy's timing (renderer/state/quietTimer.ts): written after a pause with no change
 * and no input, never later than the maximum delay after the first unsaved change, never when
 * nothing is pending. The delays are the app's own choice (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { QuietTimer, type Clock } from '../../renderer/state/quietTimer';

/** A manual clock: `advance` runs the timers that fall due, in order. */
function manualClock(): Clock & { advance(ms: number): void } {
  let now = 0;
  let next = 1;
  const timers = new Map<number, { at: number; run: () => void }>();
  return {
    now: () => now,
    setTimeout: (run, ms) => {
      const id = next++;
      timers.set(id, { at: now + ms, run });
      return id;
    },
    clearTimeout: (handle) => void timers.delete(handle as number),
    advance(ms) {
      const end = now + ms;
      for (;;) {
        const due = [...timers.entries()].filter(([, t]) => t.at <= end).sort((a, b) => a[1].at - b[1].at)[0];
        if (due === undefined) break;
        timers.delete(due[0]);
        now = due[1].at;
        due[1].run();
      }
      now = end;
    },
  };
}

function setup() {
  const clock = manualClock();
  const runs: number[] = [];
  const timer = new QuietTimer(() => runs.push(clock.now()), 2000, 30_000, clock);
  return { clock, runs, timer };
}

describe('QuietTimer', () => {
  it('writes once, a quiet period after the last change', () => {
    const { clock, runs, timer } = setup();
    timer.change();
    clock.advance(1500);
    timer.change();
    clock.advance(1999);
    expect(runs).toEqual([]);
    clock.advance(1);
    expect(runs).toEqual([3500]);
    clock.advance(10_000);
    expect(runs).toEqual([3500]);
    expect(timer.pending).toBe(false);
  });

  it('input postpones a pending write, but does not start one', () => {
    const { clock, runs, timer } = setup();
    timer.activity();
    clock.advance(5000);
    expect(runs).toEqual([]);
    timer.change();
    for (let t = 0; t < 5; t++) {
      clock.advance(1000);
      timer.activity(); // scrolling: an input every second
    }
    expect(runs).toEqual([]);
    clock.advance(2000);
    expect(runs).toEqual([5000 + 5000 + 2000]);
  });

  it('never waits longer than the maximum after the first unsaved change', () => {
    const { clock, runs, timer } = setup();
    timer.change();
    for (let t = 0; t < 100; t++) {
      clock.advance(500);
      if (t % 2 === 0) timer.change();
      else timer.activity();
    }
    expect(runs).toEqual([30_000]);
    // The next change starts a new period.
    timer.change();
    clock.advance(2000);
    expect(runs).toEqual([30_000, 52_000]);
  });

  it('cancel drops a pending write (saved to the project file)', () => {
    const { clock, runs, timer } = setup();
    timer.change();
    clock.advance(1000);
    timer.cancel();
    clock.advance(60_000);
    expect(runs).toEqual([]);
  });
});
