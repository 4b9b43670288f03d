/**
 * Work that must not hold up a screen's first paint (the item analysis, the tests of difference
 * between sections): started once the next frame has been produced, then run in slices of about
 * SLICE_MS, with the browser free to paint and handle input between slices. The work is an engine
 * step generator (analysis/steps.ts), so the value is the very one the plain function returns.
 *
 * Finished values are kept per (owner, name) — the owner being the store's course result, which is
 * replaced on every change of gradebook or plan — so going back to a workspace without a change
 * shows them right after the first paint without computing again, and an edit starts the work
 * again. A change of owner or name while the work runs abandons it.
 */
import { useEffect, useRef, useState } from 'react';

/** Longest stretch of work between two chances for the browser to paint or handle input. */
export const SLICE_MS = 12;

export type AfterPaint<T> = { readonly ready: true; readonly value: T } | { readonly ready: false };

const finished = new WeakMap<object, Map<string, unknown>>();

/**
 * @param owner what the value is computed from (null: nothing to compute; never ready)
 * @param name  which value of that owner (e.g. the measure it is computed on)
 * @param steps starts the work; read when the work starts, so it may be a new function each render
 */
export function useAfterPaint<T>(owner: object | null, name: string, steps: () => Generator<unknown, T>): AfterPaint<T> {
  const latest = useRef(steps);
  latest.current = steps;
  const [shown, setShown] = useState<{ readonly owner: object; readonly name: string; readonly value: T } | null>(null);

  useEffect(() => {
    if (owner === null) return;
    let stopped = false;
    let work: Generator<unknown, T> | null = null;
    const channel = new MessageChannel();
    const slice = () => {
      if (stopped) return;
      let byName = finished.get(owner);
      if (byName?.has(name) === true) {
        // Known already: still shown only after the first paint, which it must not hold up.
        setShown({ owner, name, value: byName.get(name) as T });
        return;
      }
      const until = performance.now() + SLICE_MS;
      work ??= latest.current();
      for (;;) {
        const next = work.next();
        if (next.done === true) {
          if (byName === undefined) finished.set(owner, (byName = new Map()));
          byName.set(name, next.value);
          setShown({ owner, name, value: next.value });
          return;
        }
        if (performance.now() >= until) break;
      }
      channel.port2.postMessage(null); // a task, not a timer: no 4 ms clamp between slices
    };
    channel.port1.onmessage = slice;
    // A task queued from requestAnimationFrame runs once that frame has been produced; the timer
    // starts the work anyway when no frame comes (a hidden window).
    let started = false;
    const start = () => {
      if (started) return;
      started = true;
      channel.port2.postMessage(null);
    };
    const frame = requestAnimationFrame(start);
    const timer = setTimeout(start, 250);
    return () => {
      stopped = true;
      cancelAnimationFrame(frame);
      clearTimeout(timer);
      channel.port1.close();
    };
  }, [owner, name]);

  return shown !== null && shown.owner === owner && shown.name === name ? { ready: true, value: shown.value } : { ready: false };
}
