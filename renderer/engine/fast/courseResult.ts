/**
 * A CourseResult (gradeCourse's shape) from fast grades, with the explanation lines of each
 * student computed only when they are read — for the one student a screen shows, not for the
 * whole roster on every edit.
 *
 *   finals, letters, grade points, weighted and adjusted percents: read from the fast grades
 *     (property-tested === to gradeCourse in tests/engine/fast/gradeCompiled.test.ts);
 *   effectiveWeights (on first read): effectiveWeightsOf over the category statuses;
 *   categoryPercent(id): a category line's status and percent, from the fast category percents;
 *   lines (on first read): explainStudent — the plain weighStudent + finishStudent of that one
 *     student, with the course's adjustments computed once per result by adjustCourse from the
 *     fast weighted percents (a scale-to-mean step needs the group mean; the rule stays in
 *     adjustments.ts). Equal to gradeCourse(book, plan).students[i].lines.
 *
 * The fast grades are updated in place by the next reweigh/updateScore, so the arrays a lazy read
 * needs later (weighted percents, category statuses) are copied here; the copies are memcpy-cheap
 * (a few hundred kB at 10 000 students). Everything else read lazily (book, plan, compiled plan)
 * is never mutated.
 *
 * Cost O(S) for the result objects; a student's lines cost what gradeCourse spends on one student,
 * plus O(S) once per result for the adjustments.
 */
import type { AdjustedValues } from '../grading/adjustments';
import { checkPlan } from '../grading/checkPlan';
import { adjustCourse, explainStudent, layoutFor, type CategoryLayout, type CourseResult } from '../grading/gradeCourse';
import type { Gradebook, GradingPlan } from '../model';
import type { CategoryPercent, ExplanationLine, StudentResult } from '../results';
import { CATEGORY_STATUSES, type CompiledCourse } from './compileCourse';
import { effectiveWeightsOf, type FastGrades } from './gradeCompiled';

/** What the lazy parts of every student of one result share. */
class Explainer {
  private layout: readonly CategoryLayout[] | null = null;
  private adjusted: AdjustedValues | null = null;
  private readonly grades: FastGrades;

  constructor(
    private readonly book: Gradebook,
    private readonly plan: GradingPlan,
    private readonly course: CompiledCourse,
    grades: FastGrades,
  ) {
    // Copies of what a later read needs: the live arrays change with the next edit.
    this.grades = {
      ...grades,
      weighted: grades.weighted.slice(),
      hasWeighted: grades.hasWeighted.slice(),
      catStatus: grades.catStatus.slice(),
      catPercent: grades.catPercent.slice(),
    };
    const { categories } = course.compiled;
    for (let c = categories.length - 1; c >= 0; c--) this.categoryIndex.set(categories[c]!.id, c); // first index wins
  }

  private readonly categoryIndex = new Map<string, number>();

  /** The category line's status and percent from the fast grades (catStatus, catPercent). */
  categoryPercent(s: number, categoryId: string): CategoryPercent | undefined {
    const c = this.categoryIndex.get(categoryId);
    if (c === undefined) return undefined;
    const k = s * this.course.compiled.categories.length + c;
    const status = CATEGORY_STATUSES[this.grades.catStatus[k]!]!;
    const p = this.grades.catPercent[k]!;
    return { status, percent: status === 'counted' && p === p ? p : null };
  }

  effectiveWeights(s: number): Readonly<Record<string, number>> {
    return effectiveWeightsOf(this.course, this.grades, s);
  }

  explain(s: number): StudentResult {
    this.layout ??= layoutFor(this.book, this.plan);
    if (this.adjusted === null) {
      const { weighted, hasWeighted } = this.grades;
      const values: (number | null)[] = [];
      for (let i = 0; i < this.course.studentCount; i++) values.push(hasWeighted[i] === 1 ? weighted[i]! : null);
      this.adjusted = adjustCourse(this.book, this.plan, values);
    }
    return explainStudent(this.book, this.plan, this.layout, s, this.adjusted);
  }
}

/** One student's result: the numbers at once, effective weights and lines on first read. */
class LazyStudentResult implements StudentResult {
  private weights: Readonly<Record<string, number>> | null = null;
  private explained: readonly ExplanationLine[] | null = null;

  constructor(
    readonly studentId: string,
    readonly section: string,
    readonly weighted: number | null,
    readonly adjusted: number | null,
    readonly final: number | null,
    readonly letter: string | null,
    readonly gradePoints: number | null,
    private readonly index: number,
    private readonly explainer: Explainer,
  ) {}

  get effectiveWeights(): Readonly<Record<string, number>> {
    this.weights ??= this.explainer.effectiveWeights(this.index);
    return this.weights;
  }

  get lines(): readonly ExplanationLine[] {
    this.explained ??= this.explainer.explain(this.index).lines;
    return this.explained;
  }

  categoryPercent(categoryId: string): CategoryPercent | undefined {
    return this.explainer.categoryPercent(this.index, categoryId);
  }
}

/**
 * gradeCourse(book, plan) from `grades` = the fast grades of `course` compiled from (book, plan):
 * equal in every field, explanation lines included, with the lines and effective weights computed
 * per student on first read.
 * @example
 * const course = compileCourse(book, plan);
 * courseResultOf(book, plan, course, gradeCompiled(course)).students[0].final; // === gradeCourse(book, plan).students[0].final
 */
export function courseResultOf(book: Gradebook, plan: GradingPlan, course: CompiledCourse, grades: FastGrades): CourseResult {
  const explainer = new Explainer(book, plan, course, grades);
  const { cutoffs } = course.compiled;
  const students: StudentResult[] = [];
  for (let s = 0; s < course.studentCount; s++) {
    const student = course.students[s]!;
    const has = grades.hasWeighted[s] === 1;
    const f = grades.final[s]!;
    const a = grades.adjusted[s]!;
    const k = grades.letter[s]!;
    const cutoff = k >= 0 ? cutoffs[k] : undefined;
    students.push(
      new LazyStudentResult(
        student.id,
        student.section,
        has ? grades.weighted[s]! : null,
        // finishStudent: no adjusted value when there is no mark (weighted missing or not finite).
        has && Number.isFinite(a) ? a : null,
        f === f ? f : null,
        cutoff?.letter ?? null,
        cutoff?.gradePoints ?? null,
        s,
        explainer,
      ),
    );
  }
  return { students, planProblems: [...checkPlan(book, plan), ...grades.problems] };
}
