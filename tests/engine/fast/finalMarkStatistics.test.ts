/**
 * finalMarkStatistics (each group sorted once) must equal the plain sectionStatistics on final
 * marks in every field — summaries (describe(), checked against NIST StRD, Hyndman & Fan 1996 and
 * Tukey's rule in tests/engine/stats/), values, names, roster indices and left-out counts — for
 * every quantile type, on random courses graded by the plain engine and by the store's fast path.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { sectionStatistics } from '../../../renderer/engine/analysis/sectionStatistics';
import { compileCourse, gradeCompiled, sectionFinalStatistics } from '../../../renderer/engine/fast';
import { finalMarkStatistics } from '../../../renderer/engine/fast/finalMarkStatistics';
import { gradeCourse } from '../../../renderer/engine/grading/gradeCourse';
import type { QuantileType } from '../../../renderer/engine/stats/quantile';
import { CourseGrading } from '../../../renderer/state/courseGrading';
import { courseArb } from './arbitraries';

const typeArb = fc.constantFrom<QuantileType>(1, 2, 3, 4, 5, 6, 7, 8, 9);

describe('finalMarkStatistics equals sectionStatistics on final marks', () => {
  it('on random courses and every quantile type', () => {
    fc.assert(
      fc.property(courseArb, typeArb, ({ book, plan }, quantileType) => {
        const full = { ...book, scores: book.scores.map((row) => book.assessments.map((_, a) => row[a] ?? { kind: 'missing' as const })) };
        const plain = sectionStatistics(full, gradeCourse(full, plan).students, { quantileType, measure: { kind: 'final' } });
        expect(finalMarkStatistics(full, gradeCourse(full, plan).students, quantileType)).toStrictEqual(plain);
        expect(finalMarkStatistics(full, new CourseGrading().grade(full, plan).students, quantileType)).toStrictEqual(plain);
        // Sorted on the plan's rounding grid (sortFinals.ts); groups of 64 or more use the grid.
        expect(finalMarkStatistics(full, gradeCourse(full, plan).students, quantileType, plan.rounding.decimals)).toStrictEqual(plain);
      }),
      { numRuns: 300 },
    );
  });

  it('on many tied marks in many sections, small and large groups, 0 to 2 decimals', () => {
    // Ties and repeated values are where a sort order could differ; half marks out of 7 force them,
    // and groups of 64 or more take the counting sort on the rounding grid (sortFinals.ts).
    const rowsArb = fc.array(fc.tuple(fc.integer({ min: 0, max: 3 }), fc.integer({ min: 0, max: 14 })), { minLength: 1, maxLength: 400, size: 'max' });
    fc.assert(
      fc.property(rowsArb, typeArb, fc.integer({ min: 0, max: 2 }), (rows, quantileType, decimals) => {
        const book = {
          students: rows.map(([section], i) => ({ id: `s${i}`, name: `S ${i}`, section: `Sec ${section}` })),
          assessments: [{ id: 'a', name: 'A', possible: 7 }],
          scores: rows.map(([, halves]) => [{ kind: 'earned' as const, points: halves / 2 }]),
        };
        const plan = {
          categories: [{ id: 'c', name: 'C', weight: 100, combine: 'totalPoints' as const, dropLowest: 0, missingAs: 'zero' as const, capPercent: null, droppedForCourse: false }],
          items: { a: { categoryId: 'c', extraCredit: false } },
          sectionWaivers: [],
          studentWaivers: [],
          markMode: 'current' as const,
          scale: { name: 'P/F', cutoffs: [{ letter: 'P', minPercent: 50 }] },
          rounding: { decimals },
          adjustments: [],
        };
        const results = gradeCourse(book, plan).students;
        const plain = sectionStatistics(book, results, { quantileType, measure: { kind: 'final' } });
        expect(finalMarkStatistics(book, results, quantileType)).toStrictEqual(plain);
        expect(finalMarkStatistics(book, results, quantileType, decimals)).toStrictEqual(plain);
        const course = compileCourse(book, plan);
        const fast = sectionFinalStatistics(course, gradeCompiled(course), { quantileType });
        expect(fast.course.summary).toStrictEqual(plain.course);
        expect(fast.sections.map((g) => g.summary)).toStrictEqual(plain.sections.map((g) => g.summary));
      }),
      { numRuns: 200 },
    );
  });
});
