/**
 * projectedWeighted (fast path) must give neededOnPending exactly what its own plain computation
 * gives: the same weighted percents, so the same answers for every student and cutoff, on random
 * courses (waivers, drops, extra credit, caps, pending work, adjustments including scale-to-mean).
 * The plain neededOnPending is checked against worked cases in tests/engine/grading/whatIf.test.ts.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { layoutFor, weighStudent } from '../../../renderer/engine/grading/gradeCourse';
import { neededOnPending } from '../../../renderer/engine/grading/whatIf';
import { projectedWeighted } from '../../../renderer/engine/fast/projectedWeighted';
import { courseArb } from './arbitraries';

describe('projectedWeighted', () => {
  it('equals the plain projected weighStudent of every student', () => {
    fc.assert(
      fc.property(courseArb, ({ book, plan }) => {
        const projected = { ...plan, markMode: 'projected' as const };
        const layout = layoutFor(book, projected);
        const plain = book.students.map((s, i) => weighStudent(s, book.scores[i] ?? [], layout, projected).weighted);
        expect(projectedWeighted(book, plan)).toStrictEqual(plain);
      }),
      { numRuns: 300 },
    );
  });

  it('gives neededOnPending the same answers as its own computation', () => {
    fc.assert(
      fc.property(courseArb, fc.nat(), ({ book, plan }, pick) => {
        fc.pre(book.students.length > 0);
        const i = pick % book.students.length;
        expect(neededOnPending(book, plan, i, projectedWeighted(book, plan))).toStrictEqual(neededOnPending(book, plan, i));
      }),
      { numRuns: 150 },
    );
  });
});
