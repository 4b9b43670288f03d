/**
 * The fast path must give the plain engine's results exactly (===, not approximately): finals,
 * letters, grade points, weighted and adjusted percents, effective weights, category percents and
 * statuses, and the adjustment problems — on random courses (arbitraries.ts) and after incremental
 * weight and score edits. The reference is gradeCourse (renderer/engine/grading), itself checked
 * against published sources in tests/engine/grading/.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Gradebook, GradingPlan, Score } from '../../../renderer/engine/model';
import type { CategoryLine } from '../../../renderer/engine/results';
import { checkPlan, gradeCourse } from '../../../renderer/engine/grading';
import {
  CATEGORY_STATUSES,
  compileCourse,
  effectiveWeightsOf,
  gradeCompiled,
  reweigh,
  updateScore,
  type CompiledCourse,
  type FastGrades,
} from '../../../renderer/engine/fast';
import { courseArb, scoreFor } from './arbitraries';

const orNull = (x: number): number | null => (Number.isNaN(x) ? null : x);

function expectSame(book: Gradebook, plan: GradingPlan, course: CompiledCourse, grades: FastGrades): void {
  const plain = gradeCourse(book, plan);
  const C = plan.categories.length;
  plain.students.forEach((r, s) => {
    const where = `student ${s}`;
    expect(grades.hasWeighted[s] === 1 ? grades.weighted[s] : null, where).toBe(r.weighted);
    expect(r.weighted === null ? null : grades.adjusted[s], where).toBe(r.weighted === null ? null : (r.adjusted ?? grades.adjusted[s]));
    expect(orNull(grades.final[s]!), where).toBe(r.final);
    const cutoff = grades.letter[s]! >= 0 ? course.compiled.cutoffs[grades.letter[s]!]! : null;
    expect(cutoff?.letter ?? null, where).toBe(r.letter);
    expect(cutoff?.gradePoints ?? null, where).toBe(r.gradePoints);
    expect(effectiveWeightsOf(course, grades, s), where).toStrictEqual(r.effectiveWeights);
    const lines = r.lines.filter((l): l is CategoryLine => l.kind === 'category');
    lines.forEach((line, c) => {
      expect(CATEGORY_STATUSES[grades.catStatus[s * C + c]!], `${where} category ${c}`).toBe(line.status);
      expect(orNull(grades.catPercent[s * C + c]!), `${where} category ${c}`).toBe(line.percent);
    });
  });
  expect(grades.problems).toStrictEqual(plain.planProblems.slice(checkPlan(book, plan).length));
}

describe('gradeCompiled equals gradeCourse', () => {
  it('on random courses', () => {
    fc.assert(
      fc.property(courseArb, ({ book, plan }) => {
        const course = compileCourse(book, plan);
        expectSame(book, plan, course, gradeCompiled(course));
      }),
      { numRuns: 400 },
    );
  });

  it('on a total-points drop where the lowest percent is not the one to drop (Kane & Kane 2006)', () => {
    // Kane & Kane (2006), Mathematics Magazine 79(3) [from memory]: 20/100, 0/2, 10/10, drop one →
    // keep 0/2 and 10/10 = 83.3 %, not 30/110.
    const book: Gradebook = {
      students: [{ id: 's', name: 'S', section: 'A' }],
      assessments: [
        { id: 'a', name: 'a', possible: 100 },
        { id: 'b', name: 'b', possible: 2 },
        { id: 'c', name: 'c', possible: 10 },
      ],
      scores: [[{ kind: 'earned', points: 20 }, { kind: 'earned', points: 0 }, { kind: 'earned', points: 10 }]],
    };
    const plan: GradingPlan = {
      categories: [{ id: 'q', name: 'Q', weight: 100, combine: 'totalPoints', dropLowest: 1, missingAs: 'zero', capPercent: null, droppedForCourse: false }],
      items: { a: { categoryId: 'q', extraCredit: false }, b: { categoryId: 'q', extraCredit: false }, c: { categoryId: 'q', extraCredit: false } },
      sectionWaivers: [],
      studentWaivers: [],
      markMode: 'current',
      scale: { name: 'x', cutoffs: [{ letter: 'P', minPercent: 50 }, { letter: 'F', minPercent: 0 }] },
      rounding: { decimals: 1 },
      adjustments: [],
    };
    const course = compileCourse(book, plan);
    const grades = gradeCompiled(course);
    expect(grades.final[0]).toBe(83.3);
    expectSame(book, plan, course, grades);
  });
});

describe('incremental updates equal a full plain recompute', () => {
  it('after a sequence of weight edits (reweigh)', () => {
    fc.assert(
      fc.property(
        courseArb,
        fc.array(fc.tuple(fc.nat(), fc.oneof(fc.constantFrom(0, 15, 40), fc.double({ min: 0, max: 100, noNaN: true }))), { minLength: 1, maxLength: 4 }),
        ({ book, plan }, edits) => {
          let course = compileCourse(book, plan);
          const grades = gradeCompiled(course);
          let current = plan;
          for (const [which, weight] of edits) {
            const c = which % current.categories.length;
            current = { ...current, categories: current.categories.map((cat, i) => (i === c ? { ...cat, weight } : cat)) };
            course = reweigh(course, grades, current);
            expectSame(book, current, course, grades);
          }
        },
      ),
      { numRuns: 200 },
    );
  });

  it('after a sequence of score edits (updateScore)', () => {
    fc.assert(
      fc.property(
        courseArb.chain((c) =>
          fc.tuple(
            fc.constant(c),
            fc.array(
              fc.tuple(fc.nat(c.book.students.length - 1), fc.nat(c.book.assessments.length - 1)).chain(([s, a]) =>
                fc.tuple(fc.constant(s), fc.constant(a), scoreFor(c.book.assessments[a]!.possible)),
              ),
              { minLength: 1, maxLength: 5 },
            ),
          ),
        ),
        ([{ book, plan }, edits]) => {
          const course = compileCourse(book, plan);
          const grades = gradeCompiled(course);
          const scores: Score[][] = book.scores.map((row) => Array.from({ length: book.assessments.length }, (_, a) => row[a] ?? { kind: 'missing' }));
          for (const [s, a, score] of edits) {
            scores[s]![a] = score;
            updateScore(course, grades, s, a, score);
            expectSame({ ...book, scores }, plan, course, grades);
          }
        },
      ),
      { numRuns: 200 },
    );
  });

  it('refuses a plan that changes more than weights', () => {
    fc.assert(
      fc.property(courseArb, ({ book, plan }) => {
        const course = compileCourse(book, plan);
        const grades = gradeCompiled(course);
        const other: GradingPlan = { ...plan, markMode: plan.markMode === 'current' ? 'projected' : 'current' };
        expect(() => reweigh(course, grades, other)).toThrow(/more than category weights/);
      }),
      { numRuns: 20 },
    );
  });
});
