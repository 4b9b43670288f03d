// The Roster grid's dropped items (renderer/ui/roster/droppedItems.ts) against the plain engine:
// for every student, exactly the items whose explanation line in gradeCourse(book, plan) has the
// status 'dropped'. Random courses from the fast-path property tests (every rule: waivers, extra
// credit, caps, missing/excused/pending, both kinds of drop, both mark modes, short rows).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { gradeCourse } from '../../renderer/engine/grading/gradeCourse';
import { droppedItems } from '../../renderer/ui/roster/droppedItems';
import { courseArb } from '../engine/fast/arbitraries';

describe('droppedItems', () => {
  it('equals the dropped item lines of gradeCourse for every student', () => {
    let seenDropped = 0;
    fc.assert(
      fc.property(courseArb, ({ book, plan }) => {
        const expected = gradeCourse(book, plan).students.map((r) =>
          r.lines.flatMap((l) => (l.kind === 'item' && l.status === 'dropped' ? [l.assessmentId] : [])).sort(),
        );
        const dropped = droppedItems(book, plan);
        book.students.forEach((_, s) => {
          const got = [...dropped.of(s)].sort();
          expect(got).toEqual(expected[s]);
          seenDropped += got.length;
        });
      }),
      { numRuns: 300 },
    );
    // The courses did drop items, so the comparison was not only of empty sets.
    expect(seenDropped).toBeGreaterThan(50);
  });

  it('gives the same set again for the same student, also after many others (a scroll)', () => {
    fc.assert(
      fc.property(courseArb, ({ book, plan }) => {
        const dropped = droppedItems(book, plan, 4);
        const first = book.students.map((_, s) => dropped.of(s));
        // Within the cache, the very same object (memoised rows keep their props).
        const last = book.students.length - 1;
        expect(dropped.of(last)).toBe(first[last]);
        // Past it, an equal set.
        book.students.forEach((_, s) => expect([...dropped.of(s)].sort()).toEqual([...first[s]!].sort()));
      }),
      { numRuns: 50 },
    );
  });
});
