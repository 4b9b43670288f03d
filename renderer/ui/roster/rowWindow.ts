/**
 * Which rows of the Roster grid are in the DOM.
 *
 * The rows on screen are built in the frame that shows them. The overscan (rows kept beyond the
 * screen, so a small scroll or a keyboard move finds them already built) is taken around where the
 * screen was at the last *deferred* render (React `useDeferredValue`), which runs after the frame:
 * a long wheel step builds only the rows that come on screen before painting, and the overscan
 * around the new position in a later, interruptible render.
 *
 * The rows form one run of consecutive indexes (laid out in normal flow under a top padding), plus
 * the active row when it has been scrolled away from the run: it keeps the grid's focus, so it stays
 * in the DOM on its own (`detached`).
 */
export interface RowWindow {
  /** First and last index of the run (`to < from` when there are no rows). */
  readonly from: number;
  readonly to: number;
  /** The active row, when it lies outside the run; else null. */
  readonly detached: number | null;
}

export interface RowWindowInput {
  readonly count: number;
  /** First and last row on screen now (`last < first` when none). */
  readonly first: number;
  readonly last: number;
  /** The same at the last deferred render. */
  readonly settledFirst: number;
  readonly settledLast: number;
  readonly overscan: number;
  /** The row holding the grid's tab stop. */
  readonly active: number;
}

export function rowWindow(w: RowWindowInput): RowWindow {
  if (w.count <= 0) return { from: 0, to: -1, detached: null };
  const clamp = (i: number) => Math.max(0, Math.min(w.count - 1, i));
  let from: number;
  let to: number;
  if (w.last < w.first) {
    from = clamp(w.active);
    to = from;
  } else {
    from = clamp(w.first);
    to = clamp(w.last);
    const lo = clamp(w.settledFirst - w.overscan);
    const hi = clamp(w.settledLast + w.overscan);
    // The settled overscan joins the run only where it touches it (no gap in the flow).
    if (w.settledLast >= w.settledFirst && lo <= to + 1 && hi >= from - 1) {
      from = Math.min(from, lo);
      to = Math.max(to, hi);
    }
  }
  const active = clamp(w.active);
  if (active === from - 1) from = active;
  else if (active === to + 1) to = active;
  return { from, to, detached: active >= from && active <= to ? null : active };
}
