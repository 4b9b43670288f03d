/**
 * Drawing a chart that is not on screen, soon rather than now: once the next frame has been
 * produced, then one chart after another in slices of about SLICE_MS (useAfterPaint.ts), with the
 * browser free to paint and handle input between them. The Sections workspace opens with its
 * charts below the statistics table; building them (Observable Plot, a few hundred to a few
 * thousand SVG elements each on a large course) inside the first paint made that paint wait for
 * pictures nobody could see yet.
 *
 * Charts are drawn in the order they were queued. Returns a function that takes a draw out of the
 * queue (the chart changed again, or left the screen) before it has run.
 */
import { runInSlices } from '../../state/slices';
import { SLICE_MS } from './useAfterPaint';

interface Entry {
  readonly draw: () => void;
  cancelled: boolean;
}

const queue: Entry[] = [];
let scheduled = false;

function* drain(): Generator<void, void> {
  for (let next = queue.shift(); next !== undefined; next = queue.shift()) {
    if (next.cancelled) continue;
    next.draw();
    yield;
  }
}

function schedule(): void {
  if (scheduled) return;
  scheduled = true;
  let started = false;
  const start = () => {
    if (started) return;
    started = true;
    runInSlices(drain, () => {
      scheduled = false;
      if (queue.length > 0) schedule();
    }, SLICE_MS);
  };
  // As in useAfterPaint: a task queued from requestAnimationFrame runs once that frame has been
  // produced; the timer starts the drawing anyway when no frame comes (a hidden window).
  requestAnimationFrame(start);
  setTimeout(start, 250);
}

export function drawSoon(draw: () => void): () => void {
  const entry: Entry = { draw, cancelled: false };
  queue.push(entry);
  schedule();
  return () => {
    entry.cancelled = true;
  };
}

/** Whether any part of `el` is inside the window's viewport now (forces layout). */
export function inViewport(el: Element): boolean {
  const r = el.getBoundingClientRect();
  return r.bottom >= 0 && r.top <= window.innerHeight && r.right >= 0 && r.left <= window.innerWidth;
}
