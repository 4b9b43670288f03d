/**
 * Compiling a course for the fast path: the gradebook and plan resolved ONCE into flat typed
 * arrays, so grading is tight loops over numbers instead of a walk over objects.
 *
 *   earned[s·A + a]   points of student s on assessment a, already passed through the plain
 *                     engine's earnedOf rule (not finite or ≤ 0 → 0), so the loops never re-check;
 *   state[s·A + a]    EARNED | MISSING | EXCUSED | PENDING (Score['kind'] as a byte);
 *   waived[s·C + c]   the category status from waiverStatus (renormalise.ts), 0 = counted;
 *   per category:     its assessment indices in gradebook order, extra-credit flags and points
 *                     possible (exactly layoutFor's list), weight (safeWeight), rule, drop, cap.
 *
 * The compiled plan (compilePlan) does not depend on the roster, so a streaming grader can compile
 * it once and grade rows as they arrive (see gradeRow in gradeCompiled.ts).
 *
 * Memory: 9 bytes per score cell plus 1 byte per student × category.
 */
import type { Assessment, Gradebook, GradingPlan, Score, Student } from '../model';
import type { CategoryStatus } from '../results';
import { usableDecimals } from '../grading/checkPlan';
import { sortedCutoffs } from '../grading/gradeScale';
import { layoutFor } from '../grading/gradeCourse';
import { safeWeight, waiverStatus } from '../grading/renormalise';
import type { GradeCutoff } from '../model';

export const EARNED = 0;
export const MISSING = 1;
export const EXCUSED = 2;
export const PENDING = 3;

const STATE_OF: Record<Score['kind'], number> = { earned: EARNED, missing: MISSING, excused: EXCUSED, pending: PENDING };

/** Category status codes, index-aligned with CATEGORY_STATUSES. */
export const COUNTED = 0;
export const CATEGORY_STATUSES: readonly CategoryStatus[] = ['counted', 'droppedForCourse', 'waivedForSection', 'waivedForStudent', 'nothingGraded'];
export const NOTHING_GRADED = 4;

export interface CompiledCategory {
  readonly id: string;
  readonly weight: number;
  readonly totalPoints: boolean;
  readonly dropLowest: number;
  /** NaN when the category has no cap. */
  readonly cap: number;
  readonly hasCap: boolean;
  readonly missingCountsZero: boolean;
  /** Assessment indices in gradebook order (layoutFor). */
  readonly items: Int32Array;
  readonly extraCredit: Uint8Array;
  readonly possible: Float64Array;
  // Derived once from the above for the grading loops (gradeCompiled.ts categoryPercent):
  /** The items that are not extra credit, in the same order, and their points possible. */
  readonly regular: Int32Array;
  readonly regularPossible: Float64Array;
  /** The extra-credit items. */
  readonly extra: Int32Array;
  /**
   * counts[state] = 1 when a cell in that state enters the category (earned always; missing when
   * the category counts it as 0; pending in a projected final), else 0 — categoryScore.ts's rule
   * as a table, so the loop does one lookup instead of three tests.
   */
  readonly counts: Uint8Array;
  /**
   * Every regular item's points possible is finite and > 0, so a cell that does not count can be
   * added as 0 (its compiled earned points are 0, its possible and percent finite, times 0 is 0) —
   * the grading loops then multiply by counts[state] instead of branching on it.
   */
  readonly possibleAllPositive: boolean;
  /** The category percent when the category has no assessments: 0 in a projected final, else none. */
  readonly emptyPercent: number;
}

export interface CompiledPlan {
  readonly plan: GradingPlan;
  readonly assessmentCount: number;
  readonly categories: readonly CompiledCategory[];
  readonly projected: boolean;
  readonly decimals: number;
  /** Cutoffs highest first (sortedCutoffs), for the letter of a rounded final. */
  readonly cutoffs: readonly GradeCutoff[];
}

export interface CompiledCourse {
  readonly compiled: CompiledPlan;
  readonly students: readonly Student[];
  readonly studentCount: number;
  /** Distinct sections in first-appearance order; sectionOf[s] indexes it. */
  readonly sections: readonly string[];
  readonly sectionOf: Int32Array;
  readonly earned: Float64Array;
  readonly state: Uint8Array;
  readonly waived: Uint8Array;
}

export function compilePlan(assessments: readonly Assessment[], plan: GradingPlan): CompiledPlan {
  const layout = layoutFor({ students: [], assessments, scores: [] }, plan);
  const projected = plan.markMode === 'projected';
  const categories = layout.map(({ category, items }): CompiledCategory => {
    const missingCountsZero = category.missingAs !== 'excluded';
    const regular = items.filter((it) => !it.extraCredit);
    const counts = new Uint8Array(4);
    counts[EARNED] = 1;
    counts[MISSING] = missingCountsZero ? 1 : 0;
    counts[EXCUSED] = 0;
    counts[PENDING] = projected ? 1 : 0;
    return {
      id: category.id,
      weight: safeWeight(category.weight),
      totalPoints: category.combine === 'totalPoints',
      dropLowest: category.dropLowest,
      cap: category.capPercent ?? Number.NaN,
      hasCap: category.capPercent !== null,
      missingCountsZero,
      items: Int32Array.from(items, (it) => it.index),
      extraCredit: Uint8Array.from(items, (it) => (it.extraCredit ? 1 : 0)),
      possible: Float64Array.from(items, (it) => it.possible),
      regular: Int32Array.from(regular, (it) => it.index),
      regularPossible: Float64Array.from(regular, (it) => it.possible),
      extra: Int32Array.from(items.filter((it) => it.extraCredit), (it) => it.index),
      counts,
      possibleAllPositive: regular.every((it) => Number.isFinite(it.possible) && it.possible > 0),
      emptyPercent: projected ? 0 : Number.NaN,
    };
  });
  return {
    plan,
    assessmentCount: assessments.length,
    categories,
    projected,
    decimals: usableDecimals(plan.rounding.decimals),
    cutoffs: sortedCutoffs(plan.scale),
  };
}

/** The plain engine's earnedOf: points that are not finite or not positive count as 0. */
export function earnedPoints(score: Score): number {
  if (score.kind !== 'earned') return 0;
  const p = score.points;
  return Number.isFinite(p) && p > 0 ? p : 0;
}

/** Waiver status codes of one student for every category of the plan. */
export function waiverCodes(compiled: CompiledPlan, student: Pick<Student, 'id' | 'section'>, out: Uint8Array, offset = 0): void {
  const { plan } = compiled;
  plan.categories.forEach((category, c) => {
    out[offset + c] = CATEGORY_STATUSES.indexOf(waiverStatus(category, student, plan.sectionWaivers, plan.studentWaivers));
  });
}

/** Distinct section names in first-appearance order, and each name's index (added when new). */
export function sectionList(): { readonly sections: string[]; indexOf(section: string): number } {
  const sections: string[] = [];
  const index = new Map<string, number>();
  return {
    sections,
    indexOf(section) {
      let k = index.get(section);
      if (k === undefined) {
        k = sections.length;
        sections.push(section);
        index.set(section, k);
      }
      return k;
    },
  };
}

export function compileCourse(book: Gradebook, plan: GradingPlan): CompiledCourse {
  const compiled = compilePlan(book.assessments, plan);
  const S = book.students.length;
  const A = book.assessments.length;
  const C = compiled.categories.length;
  const earned = new Float64Array(S * A);
  const state = new Uint8Array(S * A).fill(MISSING); // absent cells are missing, as in gradeCourse
  const waived = new Uint8Array(S * C);
  const { sections, indexOf } = sectionList();
  const sectionOf = new Int32Array(S);
  book.students.forEach((student, s) => {
    sectionOf[s] = indexOf(student.section);
    const row = book.scores[s] ?? [];
    const base = s * A;
    const n = Math.min(row.length, A);
    for (let a = 0; a < n; a++) {
      const cell = row[a]!;
      state[base + a] = STATE_OF[cell.kind];
      earned[base + a] = earnedPoints(cell);
    }
    waiverCodes(compiled, student, waived, s * C);
  });
  return { compiled, students: book.students, studentCount: S, sections, sectionOf, earned, state, waived };
}

/** Replace one cell of a compiled course (the caller then re-grades that student). */
export function setCompiledScore(course: CompiledCourse, student: number, assessment: number, score: Score): void {
  const i = student * course.compiled.assessmentCount + assessment;
  course.state[i] = STATE_OF[score.kind];
  course.earned[i] = earnedPoints(score);
}
