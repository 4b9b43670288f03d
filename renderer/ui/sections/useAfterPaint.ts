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
import { runInSlices } from '../../state/slices';

/** Longest stretch of work between two chances for the browser to paint or handle input. */
export const SLICE_MS = 12;

export type AfterPaint<T> = { readonly ready: true; readonly value: T } | { readonly ready: false };

const finished = new WeakMap<object, Map<string, unknown>>();

/** A value already known, as a generator that is done at once. */
function* known<T>(value: T): Generator<unknown, T> {
  return value;
}

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
    let cancel: (() => void) | null = null;
    let started = false;
    const start = () => {
      if (started) return;
      started = true;
      cancel = runInSlices(
        // Known already: still shown only after the first paint (in the first slice's task), which it must not hold up.
        () => (finished.get(owner)?.has(name) === true ? known(finished.get(owner)!.get(name) as T) : latest.current()),
        (value) => {
          let byName = finished.get(owner);
          if (byName === undefined) finished.set(owner, (byName = new Map()));
          byName.set(name, value);
          setShown({ owner, name, value });
        },
        SLICE_MS,
      );
    };
    // A task queued from requestAnimationFrame runs once that frame has been produced; the timer
    // starts the work anyway when no frame comes (a hidden window).
    const frame = requestAnimationFrame(start);
    const timer = setTimeout(start, 250);
    return () => {
      started = true;
      cancelAnimationFrame(frame);
      clearTimeout(timer);
      cancel?.();
    };
  }, [owner, name]);

  return shown !== null && shown.owner === owner && shown.name === name ? { ready: true, value: shown.value } : { ready: false };
}
