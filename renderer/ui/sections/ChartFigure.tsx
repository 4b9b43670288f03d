/**
 * One chart: a keyboard-reachable <figure> holding the Plot SVG, a readout that arrow keys step
 * through (the values a pointer user sees on hover), and the numbers behind the chart as a table
 * behind a visible toggle — the chart's text alternative, built when the toggle is opened
 * (LazyDetails). The SVG is built before the next paint when the chart is on screen, else just
 * after it (drawSoon).
 */
import { createContext, useContext, useId, useLayoutEffect, useRef, useState, type KeyboardEvent, type ReactNode } from 'react';
import { drawSoon, inViewport } from './drawSoon';
import { LazyDetails } from './LazyDetails';

/** True inside a panel of charts built after the first paint, because it was below the screen then. */
export const ChartsBuiltLate = createContext(false);

export function ChartFigure({ chart, title, build, readoutCount, readout, table, children }: {
  /** data-chart value, for tests and styling. */
  chart: string;
  title: string;
  /** Builds the chart on the given document; null when there is nothing to draw. */
  build: (doc: Document) => Element | null;
  /** One sentence per value a keyboard user can step through with the arrow keys. */
  readoutCount: number;
  /** Readout `i` of `readoutCount`; called only for the one shown. */
  readout: (i: number) => string;
  /** The numbers behind the chart; called only while the toggle is open. */
  table: () => ReactNode;
  /** Controls shown under the title (rule selector, slider …). */
  children?: ReactNode;
}) {
  const host = useRef<HTMLDivElement>(null);
  const [active, setActive] = useState<number | null>(null);
  const ids = { caption: useId(), readout: useId() };

  // A chart on screen is drawn before the browser paints; one below it soon after (drawSoon.ts).
  // data-drawn says whether the chart shown is the one for the current inputs. Charts whose panel
  // was itself built after the first paint (below the screen then) queue their first drawing
  // without asking where they are: that question lays out the page inside the task.
  const queueFirst = useContext(ChartsBuiltLate);
  const drawnOnce = useRef(false);
  useLayoutEffect(() => {
    const el = host.current;
    if (el === null) return;
    const draw = () => {
      const node = build(document);
      el.replaceChildren(...(node === null ? [] : [node]));
      el.setAttribute('data-drawn', 'true');
      drawnOnce.current = true;
    };
    if (!(queueFirst && !drawnOnce.current) && inViewport(el)) {
      draw();
      return;
    }
    el.setAttribute('data-drawn', 'false');
    return drawSoon(draw);
  }, [build, queueFirst]);

  const current = active !== null && active < readoutCount ? active : null;

  const onKey = (e: KeyboardEvent<HTMLElement>) => {
    if (readoutCount === 0) return;
    const last = readoutCount - 1;
    let next: number | null = null;
    if (e.key === 'ArrowRight' || e.key === 'ArrowDown') next = current === null ? 0 : Math.min(last, current + 1);
    else if (e.key === 'ArrowLeft' || e.key === 'ArrowUp') next = current === null ? 0 : Math.max(0, current - 1);
    else if (e.key === 'Home') next = 0;
    else if (e.key === 'End') next = last;
    if (next !== null) {
      e.preventDefault();
      setActive(next);
    }
  };

  return (
    <section className="wb-chart-block" aria-labelledby={ids.caption}>
      <h3 id={ids.caption} className="wb-chart-title">{title}</h3>
      {children}
      <figure
        className="wb-chart"
        data-chart={chart}
        tabIndex={0}
        aria-labelledby={ids.caption}
        aria-describedby={ids.readout}
        onKeyDown={onKey}
      >
        <div ref={host} className="wb-chart-host" />
        <figcaption id={ids.readout} className="wb-chart-readout" aria-live="polite">
          {current !== null ? readout(current) : readoutCount > 0 ? 'Focus the chart and use the arrow keys to read its values.' : 'Nothing to draw.'}
        </figcaption>
      </figure>
      <LazyDetails className="wb-chart-table" summary={`Numbers behind “${title}”`}>{table}</LazyDetails>
    </section>
  );
}
