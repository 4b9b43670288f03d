/**
 * Every student's weighted percent with pending work counted as 0 (the plan in projected mode) —
 * what whatIf.ts's neededOnPending needs of the other students, since a scale-to-mean adjustment
 * makes one student's final depend on the group's mean. From the fast path (compileCourse +
 * gradeCompiled), whose weighted percents equal the plain weighStudent's exactly
 * (tests/engine/fast/gradeCompiled.test.ts, both mark modes); index-aligned with book.students,
 * null where no category counts.
 *
 * Cost O(students × assessments) once; a caller showing several students computes it once per
 * (gradebook, plan) and passes it to each neededOnPending call.
 */
import type { Gradebook, GradingPlan } from '../model';
import { compileCourse } from './compileCourse';
import { gradeCompiled } from './gradeCompiled';

export function projectedWeighted(book: Gradebook, plan: GradingPlan): (number | null)[] {
  const course = compileCourse(book, { ...plan, markMode: 'projected' });
  const grades = gradeCompiled(course);
  return Array.from({ length: course.studentCount }, (_, s) => (grades.hasWeighted[s] === 1 ? grades.weighted[s]! : null));
}
