/**
 * The category measure (analysis/measure.ts) on the fast path's results reads each student's
 * category status and percent from the fast grades (StudentResult.categoryPercent), without
 * building explanation lines, and must give exactly what the plain gradeCourse's lines give —
 * values, labels and left-out reasons — on random courses (waivers, drops, caps, missing, excused,
 * pending, both mark modes).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { measureValues } from '../../../renderer/engine/analysis/measure';
import { sectionStatistics } from '../../../renderer/engine/analysis/sectionStatistics';
import { gradeCourse } from '../../../renderer/engine/grading/gradeCourse';
import type { StudentResult } from '../../../renderer/engine/results';
import { CourseGrading } from '../../../renderer/state/courseGrading';
import { courseArb } from './arbitraries';

/** The fast results with `lines` made unreadable: the measure must not need them. */
function withoutLines(results: readonly StudentResult[]): StudentResult[] {
  return results.map((r) =>
    Object.create(r, {
      lines: {
        get() {
          throw new Error('explanation lines were read');
        },
      },
    }) as StudentResult,
  );
}

describe('category measure on fast results', () => {
  it('equals the plain lines for every category, and reads no explanation lines', () => {
    fc.assert(
      fc.property(courseArb, ({ book, plan }) => {
        const plain = gradeCourse(book, plan).students;
        const fast = new CourseGrading().grade(book, plan).students;
        for (const c of plan.categories) {
          const measure = { kind: 'category' as const, categoryId: c.id };
          const expected = measureValues(book, plain, measure);
          expect(measureValues(book, withoutLines(fast), measure)).toStrictEqual(expected);
          expect(sectionStatistics(book, fast, { measure })).toStrictEqual(sectionStatistics(book, plain, { measure }));
        }
        expect(() => measureValues(book, withoutLines(fast), { kind: 'category', categoryId: 'no such category' })).toThrow(/no category with id/);
      }),
      { numRuns: 300 },
    );
  });
});
