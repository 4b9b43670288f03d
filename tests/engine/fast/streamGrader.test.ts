/** Row-at-a-time grading must give gradeCourse's finals and letters exactly on random courses. */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { gradeCourse } from '../../../renderer/engine/grading';
import { createStreamGrader, fillRow } from '../../../renderer/engine/fast';
import { courseArb } from './arbitraries';

describe('createStreamGrader equals gradeCourse', () => {
  it('on random courses', () => {
    fc.assert(
      fc.property(courseArb, ({ book, plan }) => {
        const grader = createStreamGrader(book.assessments, plan);
        book.students.forEach((st, s) => {
          fillRow(grader.row, book.scores[s] ?? []);
          grader.add(st);
        });
        const { course, grades } = grader.finish();
        const plain = gradeCourse(book, plan).students;
        plain.forEach((r, s) => {
          expect(Number.isNaN(grades.final[s]!) ? null : grades.final[s]).toBe(r.final);
          const letter = grades.letter[s]! >= 0 ? course.compiled.cutoffs[grades.letter[s]!]!.letter : null;
          expect(letter).toBe(r.letter);
          expect(grades.hasWeighted[s] === 1 ? grades.weighted[s] : null).toBe(r.weighted);
        });
      }),
      { numRuns: 300 },
    );
  });
});
