/**
 * Fast final-mark statistics must equal the plain path exactly: analysis/sectionStatistics
 * (describe() per section and for the course, labelled by name), histogram() and ecdfSteps() on the
 * same values. The plain statistics are checked against NIST StRD, Hyndman & Fan (1996) and Tukey's
 * rule in tests/engine/stats/.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { gradeCourse } from '../../../renderer/engine/grading';
import { sectionStatistics } from '../../../renderer/engine/analysis/sectionStatistics';
import { describe as describeStats } from '../../../renderer/engine/stats/describe';
import { ecdfSteps } from '../../../renderer/engine/stats/ecdf';
import { histogram, type BinRule } from '../../../renderer/engine/stats/histogram';
import type { QuantileType } from '../../../renderer/engine/stats/quantile';
import { compileCourse, describeWithSorted, gradeCompiled, sectionFinalStatistics } from '../../../renderer/engine/fast';
import { courseArb } from './arbitraries';

const binsArb = fc.constantFrom<BinRule>({ kind: 'sturges' }, { kind: 'scott' }, { kind: 'freedmanDiaconis' }, { kind: 'fixed', width: 5 });
const typeArb = fc.constantFrom<QuantileType>(1, 2, 3, 4, 5, 6, 7, 8, 9);

describe('sectionFinalStatistics equals the plain statistics', () => {
  it('on random courses, every quantile type and bin rule', () => {
    fc.assert(
      fc.property(courseArb, typeArb, binsArb, ({ book, plan }, quantileType, bins) => {
        const results = gradeCourse(book, plan).students;
        const plain = sectionStatistics(book, results, { measure: { kind: 'final' }, quantileType });
        const course = compileCourse(book, plan);
        const fast = sectionFinalStatistics(course, gradeCompiled(course), { quantileType, bins });
        expect(fast.course.summary).toStrictEqual(plain.course);
        expect(fast.course.histogram).toStrictEqual(histogram(plain.courseValues, bins));
        if (plain.courseValues.length > 0) expect(fast.course.ecdf).toStrictEqual(ecdfSteps(plain.courseValues));
        expect(fast.sections.map((s) => s.section)).toStrictEqual(plain.sections.map((s) => s.section));
        fast.sections.forEach((s, i) => {
          const p = plain.sections[i]!;
          expect(s.summary).toStrictEqual(p.summary);
          expect(s.histogram).toStrictEqual(histogram(p.values, bins));
          if (p.values.length > 0) expect(s.ecdf).toStrictEqual(ecdfSteps(p.values));
          expect(s.noMark).toBe(p.leftOut.find((l) => l.reason === 'noMark')?.count ?? 0);
        });
      }),
      { numRuns: 300 },
    );
  });

  it('describeWithSorted equals describe on random marks with ties and outliers', () => {
    const marks = fc.array(fc.oneof(fc.integer({ min: 0, max: 100 }), fc.double({ min: -50, max: 150, noNaN: true })), { maxLength: 60 });
    fc.assert(
      fc.property(marks, typeArb, (values, quantileType) => {
        const labels = values.map((_, i) => `n${i}`);
        const sorted = Float64Array.from(values).sort();
        // −0 and +0 sort differently in a typed array; marks never hold −0 (rounding returns +0).
        fc.pre(!values.some((v) => Object.is(v, -0)));
        expect(describeWithSorted(values, sorted, labels, quantileType)).toStrictEqual(describeStats(values, { quantileType, labels }));
      }),
      { numRuns: 2000 },
    );
  });
});
