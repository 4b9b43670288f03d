// Which Roster rows are in the DOM (renderer/ui/roster/rowWindow.ts). The rules are the grid's own
// (no outside source): every row on screen and the active row are present, the run has no gap,
// and the overscan around the settled window joins the run only where it touches it.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { rowWindow, type RowWindowInput } from '../../renderer/ui/roster/rowWindow';

const input = fc
  .record({
    count: fc.integer({ min: 0, max: 400 }),
    first: fc.integer({ min: 0, max: 400 }),
    span: fc.integer({ min: -1, max: 40 }),
    settledFirst: fc.integer({ min: 0, max: 400 }),
    settledSpan: fc.integer({ min: -1, max: 40 }),
    overscan: fc.integer({ min: 0, max: 10 }),
    active: fc.integer({ min: 0, max: 400 }),
  })
  .map(({ count, first, span, settledFirst, settledSpan, overscan, active }): RowWindowInput => {
    const clamp = (i: number) => Math.min(i, Math.max(0, count - 1));
    const f = clamp(first);
    const sf = clamp(settledFirst);
    return {
      count,
      first: f,
      last: span < 0 ? f - 1 : clamp(f + span),
      settledFirst: sf,
      settledLast: settledSpan < 0 ? sf - 1 : clamp(sf + settledSpan),
      overscan,
      active: clamp(active),
    };
  });

/** The indexes the window puts in the DOM. */
function indexes(w: ReturnType<typeof rowWindow>): number[] {
  const out: number[] = [];
  for (let i = w.from; i <= w.to; i++) out.push(i);
  if (w.detached !== null) out.push(w.detached);
  return out;
}

describe('rowWindow', () => {
  it('holds every row on screen and the active row, inside the roster, with no gap in the run', () => {
    fc.assert(
      fc.property(input, (w) => {
        const out = rowWindow(w);
        const shown = new Set(indexes(out));
        if (w.count === 0) {
          expect(shown.size).toBe(0);
          return;
        }
        for (let i = w.first; i <= w.last; i++) expect(shown.has(i)).toBe(true);
        expect(shown.has(w.active)).toBe(true);
        for (const i of shown) expect(i >= 0 && i < w.count).toBe(true);
        expect(out.to).toBeGreaterThanOrEqual(out.from);
        if (out.detached !== null) {
          // Detached means apart from the run: not inside it and not next to it.
          expect(out.detached < out.from - 1 || out.detached > out.to + 1).toBe(true);
        }
      }),
      { numRuns: 2000 },
    );
  });

  it('adds the settled overscan only where it touches the rows on screen', () => {
    fc.assert(
      fc.property(input, (w) => {
        fc.pre(w.count > 0 && w.last >= w.first && w.settledLast >= w.settledFirst);
        const out = rowWindow(w);
        const lo = Math.max(0, w.settledFirst - w.overscan);
        const hi = Math.min(w.count - 1, w.settledLast + w.overscan);
        const touches = lo <= w.last + 1 && hi >= w.first - 1;
        const run = new Set<number>();
        for (let i = out.from; i <= out.to; i++) run.add(i);
        const joinsActive = (i: number) => i === w.active && (i === w.first - 1 || i === w.last + 1);
        for (let i = lo; i <= hi; i++) expect(run.has(i)).toBe(touches || (i >= w.first && i <= w.last) || joinsActive(i));
      }),
      { numRuns: 2000 },
    );
  });

  it('once settled, keeps exactly the overscan around the screen', () => {
    const out = rowWindow({ count: 1000, first: 100, last: 114, settledFirst: 100, settledLast: 114, overscan: 4, active: 105 });
    expect(out).toEqual({ from: 96, to: 118, detached: null });
    const far = rowWindow({ count: 1000, first: 500, last: 514, settledFirst: 100, settledLast: 114, overscan: 4, active: 105 });
    expect(far).toEqual({ from: 500, to: 514, detached: 105 });
    const end = rowWindow({ count: 20, first: 10, last: 19, settledFirst: 10, settledLast: 19, overscan: 4, active: 0 });
    expect(end).toEqual({ from: 6, to: 19, detached: 0 });
  });
});
