/**
 * Random courses for the fast-path property tests: every rule the plain engine has (waivers for
 * course/section/student, extra credit, caps, missing/excused/pending, drops of both kinds, both
 * mark modes, adjustments including ones that cannot apply, odd rounding and scales) appears with
 * a fair probability, together with awkward numbers (non-integer points, ties, bad cells).
 */
import fc from 'fast-check';
import type { Adjustment, Assessment, Category, Gradebook, GradeScale, GradingPlan, ItemRule, Score, Student } from '../../../renderer/engine/model';
import { SCALE_PRESETS } from '../../../renderer/engine/grading/gradeScale';

const SECTIONS = ['A', 'B', 'A10', 'A2'];

const possibleArb = fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom(1, 2, 5, 10, 20, 25, 100) },
  { weight: 2, arbitrary: fc.double({ min: 0.5, max: 150, noNaN: true }) },
  { weight: 1, arbitrary: fc.constantFrom(0, -5) }, // refused possible: the item is left out
);

function scoreArb(possible: number): fc.Arbitrary<Score> {
  const top = Math.max(1, possible) * 1.2;
  return fc.oneof(
    { weight: 8, arbitrary: fc.integer({ min: 0, max: Math.ceil(top) }).map((p): Score => ({ kind: 'earned', points: p })) },
    { weight: 3, arbitrary: fc.double({ min: 0, max: top, noNaN: true }).map((p): Score => ({ kind: 'earned', points: p })) },
    { weight: 1, arbitrary: fc.integer({ min: 0, max: Math.ceil(top) * 2 }).map((p): Score => ({ kind: 'earned', points: p / 2 })) },
    { weight: 2, arbitrary: fc.constant<Score>({ kind: 'missing' }) },
    { weight: 1, arbitrary: fc.constant<Score>({ kind: 'excused' }) },
    { weight: 1, arbitrary: fc.constant<Score>({ kind: 'pending' }) },
    // Cells only a hand-edited project can hold: counted as 0 by the plain engine.
    { weight: 1, arbitrary: fc.constantFrom<Score>({ kind: 'earned', points: -3 }, { kind: 'earned', points: Number.NaN }) },
  );
}

export const scoreFor = scoreArb;

const categoryArb = (id: string): fc.Arbitrary<Category> =>
  fc.record({
    id: fc.constant(id),
    name: fc.constant(`Category ${id}`),
    weight: fc.oneof(fc.constantFrom(0, 10, 20, 25, 33.33, 50, 100), fc.double({ min: 0, max: 100, noNaN: true })),
    combine: fc.constantFrom('totalPoints' as const, 'equalItems' as const),
    dropLowest: fc.oneof({ weight: 3, arbitrary: fc.constant(0) }, { weight: 3, arbitrary: fc.integer({ min: 1, max: 4 }) }, { weight: 1, arbitrary: fc.constant(1.5) }),
    missingAs: fc.constantFrom('zero' as const, 'excluded' as const),
    capPercent: fc.oneof({ weight: 3, arbitrary: fc.constant(null) }, { weight: 2, arbitrary: fc.constantFrom(100, 90, 105.5) }),
    droppedForCourse: fc.oneof({ weight: 9, arbitrary: fc.constant(false) }, { weight: 1, arbitrary: fc.constant(true) }),
  });

export const adjustmentArb: fc.Arbitrary<Adjustment> = fc.oneof(
  fc.record({ kind: fc.constant('addPoints' as const), section: fc.constantFrom(null, 'A', 'B', 'Z'), points: fc.oneof(fc.double({ min: -5, max: 5, noNaN: true }), fc.constant(Number.NaN)) }),
  fc.record({ kind: fc.constant('scaleToMean' as const), section: fc.constantFrom(null, 'A', 'B', 'Z'), targetMean: fc.oneof(fc.constantFrom(75, 80), fc.double({ min: 0, max: 95, noNaN: true })) }),
  fc.record({ kind: fc.constant('cap' as const), section: fc.constantFrom(null, 'A', 'A2'), maxPercent: fc.constantFrom(100, 95, 88.5) }),
);

const scaleArb: fc.Arbitrary<GradeScale> = fc.oneof(
  fc.constantFrom(...SCALE_PRESETS),
  fc
    .uniqueArray(fc.integer({ min: 1, max: 99 }), { minLength: 1, maxLength: 5 })
    .map((mins) => ({ name: 'random', cutoffs: mins.map((m, i) => ({ letter: `L${i}`, minPercent: m, ...(i % 2 === 0 ? { gradePoints: i } : {}) })) })),
);

export interface Course {
  readonly book: Gradebook;
  readonly plan: GradingPlan;
}

export const courseArb: fc.Arbitrary<Course> = fc
  .record({
    possibles: fc.array(possibleArb, { minLength: 1, maxLength: 9 }),
    categoryCount: fc.integer({ min: 1, max: 4 }),
    studentCount: fc.integer({ min: 1, max: 14 }),
  })
  .chain(({ possibles, categoryCount, studentCount }) => {
    const assessments: Assessment[] = possibles.map((possible, i) => ({ id: `a${i}`, name: `Item ${i}`, possible }));
    const ids = Array.from({ length: categoryCount }, (_, i) => `c${i}`);
    const students = fc.array(
      fc.record({ section: fc.constantFrom(...SECTIONS), short: fc.oneof({ weight: 9, arbitrary: fc.constant(false) }, { weight: 1, arbitrary: fc.constant(true) }) }),
      { minLength: studentCount, maxLength: studentCount },
    );
    const rows = fc.tuple(...Array.from({ length: studentCount }, () => fc.tuple(...possibles.map((p) => scoreArb(p)))));
    const items = fc.tuple(
      ...possibles.map(() =>
        fc.record({
          categoryId: fc.oneof({ weight: 9, arbitrary: fc.constantFrom(...ids) }, { weight: 1, arbitrary: fc.constant(null) }),
          extraCredit: fc.oneof({ weight: 6, arbitrary: fc.constant(false) }, { weight: 1, arbitrary: fc.constant(true) }),
        }),
      ),
    );
    return fc.record({
      assessments: fc.constant(assessments),
      students,
      rows,
      items,
      categories: fc.tuple(...ids.map((id) => categoryArb(id))),
      sectionWaivers: fc.array(fc.record({ section: fc.constantFrom(...SECTIONS), categoryId: fc.constantFrom(...ids) }), { maxLength: 2 }),
      studentWaivers: fc.array(fc.record({ student: fc.integer({ min: 0, max: studentCount - 1 }), categoryId: fc.constantFrom(...ids) }), { maxLength: 2 }),
      markMode: fc.constantFrom('current' as const, 'projected' as const),
      scale: scaleArb,
      decimals: fc.constantFrom(0, 0, 1, 2, 3, 7),
      adjustments: fc.array(adjustmentArb, { maxLength: 3 }),
    });
  })
  .map((r) => {
    const students: Student[] = r.students.map((s, i) => ({ id: `s${i}`, name: `Student ${i}`, section: s.section }));
    const scores = r.rows.map((row, i) => (r.students[i]!.short ? row.slice(0, Math.floor(row.length / 2)) : row));
    const items: Record<string, ItemRule> = {};
    r.assessments.forEach((a, i) => (items[a.id] = r.items[i]!));
    const plan: GradingPlan = {
      categories: r.categories,
      items,
      sectionWaivers: r.sectionWaivers,
      studentWaivers: r.studentWaivers.map((w) => ({ studentId: `s${w.student}`, categoryId: w.categoryId })),
      markMode: r.markMode,
      scale: r.scale,
      rounding: { decimals: r.decimals },
      adjustments: r.adjustments,
    };
    return { book: { students, assessments: r.assessments, scores }, plan };
  });
