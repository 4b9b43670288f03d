/**
 * The store's grading: the course kept compiled for the fast path (engine/fast) across edits, so
 * an edit redoes only the work whose inputs changed. Each call compares the (gradebook, plan) it is
 * given with the pair the compiled course holds — not the Edit that led there — so undo, redo,
 * open and import are handled the same way as a fresh edit:
 *
 *   same gradebook, plan differs in category weights only → reweigh (cached category percents);
 *   same plan, gradebook differs in exactly one score cell  → updateScore (that student only,
 *                                                              or the final step for all under
 *                                                              a scale-to-mean adjustment);
 *   anything else                                          → compileCourse + gradeCompiled.
 *
 * The result is gradeCourse's shape with explanation lines computed per student on first read
 * (engine/fast/courseResult.ts). Every path is property-tested equal to gradeCourse over random
 * edit sequences (tests/state/courseGrading.test.ts).
 */
import type { CourseResult } from '../engine/grading/gradeCourse';
import { compileCourse, type CompiledCourse } from '../engine/fast/compileCourse';
import { courseResultOf } from '../engine/fast/courseResult';
import { gradeCompiled, onlyWeightsChanged, reweigh, updateScore, type FastGrades } from '../engine/fast/gradeCompiled';
import type { Gradebook, GradingPlan } from '../engine/model';

/** How the last call brought the grades up to date (for tests and the benchmark's notes). */
export type GradingStep = 'unchanged' | 'reweigh' | 'updateScore' | 'full';

interface Graded {
  readonly book: Gradebook;
  readonly plan: GradingPlan;
  readonly course: CompiledCourse;
  readonly grades: FastGrades;
  readonly result: CourseResult;
}

/** The one cell in which `next` differs from `previous`, or null when it is not exactly one. */
export function singleChangedCell(previous: Gradebook, next: Gradebook): { student: number; assessment: number } | null {
  if (previous.students !== next.students || previous.assessments !== next.assessments) return null;
  if (previous.scores.length !== next.scores.length) return null;
  let found: { student: number; assessment: number } | null = null;
  for (let s = 0; s < next.scores.length; s++) {
    const before = previous.scores[s]!;
    const after = next.scores[s]!;
    if (before === after) continue; // an edit copies only the row it changes (history.ts)
    if (found !== null || before.length !== after.length) return null;
    for (let a = 0; a < after.length; a++) {
      if (before[a] === after[a]) continue;
      if (found !== null) return null;
      found = { student: s, assessment: a };
    }
  }
  return found;
}

export class CourseGrading {
  private last: Graded | null = null;
  private step: GradingStep = 'full';

  /** How the last `grade` call got its result. */
  get lastStep(): GradingStep {
    return this.step;
  }

  /** gradeCourse(book, plan), with lines on first read; the same object for the same pair. */
  grade(book: Gradebook, plan: GradingPlan): CourseResult {
    const last = this.last;
    if (last !== null && last.book === book && last.plan === plan) {
      this.step = 'unchanged';
      return last.result;
    }
    let course: CompiledCourse;
    let grades: FastGrades;
    const cell = last !== null && last.plan === plan ? singleChangedCell(last.book, book) : null;
    if (last !== null && last.book === book && onlyWeightsChanged(last.plan, plan)) {
      grades = last.grades;
      course = reweigh(last.course, grades, plan);
      this.step = 'reweigh';
    } else if (last !== null && cell !== null) {
      course = last.course;
      grades = last.grades;
      updateScore(course, grades, cell.student, cell.assessment, book.scores[cell.student]![cell.assessment]!);
      this.step = 'updateScore';
    } else {
      course = compileCourse(book, plan);
      grades = gradeCompiled(course);
      this.step = 'full';
    }
    const result = courseResultOf(book, plan, course, grades);
    this.last = { book, plan, course, grades, result };
    return result;
  }
}
