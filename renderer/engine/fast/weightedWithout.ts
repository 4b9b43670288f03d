/**
 * Weighted percents with one assessment taken out of grading, on the fast path: exactly
 * gradeCourse(book, planWithout(plan, id)).students[s].weighted (the "rest" mark of the corrected
 * item–total correlation, analysis/itemAnalysis.ts), without regrading the course.
 *
 * Why only one category is recomputed: planWithout sets the item's category to null and changes
 * nothing else, so compilePlan gives the same categories, weights and waivers, and only the
 * category that held the item loses it from its list (layoutFor). Every other category percent is
 * the one already in the full grades. The weighted percent is then Σ wᶜ·sᶜ / Σ wᶜ over the counted
 * categories in plan order — the same operations in the same order as weighStudent in
 * gradeCompiled.ts, so the same doubles (property-tested in tests/engine/fast/weightedWithout.test.ts).
 *
 * Cost per assessment: O(S·m) for the m items of the changed category plus O(S·C) weighting,
 * instead of a full regrade of every cell.
 */
import type { Assessment, GradingPlan } from '../model';
import { COUNTED, compilePlan, type CompiledCourse } from './compileCourse';
import { categoryPercent, scratchFor, type FastGrades } from './gradeCompiled';

/** The plan with one assessment taken out of grading (everything else unchanged). */
export function planWithout(plan: GradingPlan, assessmentId: string): GradingPlan {
  const rule = plan.items[assessmentId];
  if (rule === undefined || rule.categoryId === null) return plan;
  return { ...plan, items: { ...plan.items, [assessmentId]: { ...rule, categoryId: null } } };
}

/** Weighted percent per student (NaN where hasWeighted is 0), index-aligned with the roster. */
export interface WeightedPercents {
  readonly weighted: Float64Array;
  readonly hasWeighted: Uint8Array;
}

/**
 * The weighted percent of every student under planWithout(course plan, assessmentId).
 * `grades` must be gradeCompiled(course) (its category percents are reused); `assessments` are the
 * gradebook's, in the order the course was compiled with.
 * @example
 * const course = compileCourse(book, plan);
 * const rest = weightedWithout(course, gradeCompiled(course), book.assessments, 'quiz-1');
 * rest.hasWeighted[0] === 1 ? rest.weighted[0] : null; // === gradeCourse(book, planWithout(plan, 'quiz-1')).students[0].weighted
 */
export function weightedWithout(course: CompiledCourse, grades: FastGrades, assessments: readonly Assessment[], assessmentId: string): WeightedPercents {
  const S = course.studentCount;
  const full = course.compiled;
  const without = compilePlan(assessments, planWithout(full.plan, assessmentId));
  const C = full.categories.length;
  // planWithout only removes the item, so a changed category is one whose list got shorter.
  const changed = new Uint8Array(C);
  let anyChanged = false;
  for (let c = 0; c < C; c++) {
    if (without.categories[c]!.items.length !== full.categories[c]!.items.length) {
      changed[c] = 1;
      anyChanged = true;
    }
  }
  if (!anyChanged) return { weighted: grades.weighted.slice(), hasWeighted: grades.hasWeighted.slice() };

  const weighted = new Float64Array(S);
  const hasWeighted = new Uint8Array(S);
  const scratch = scratchFor(without);
  const { earned, state, waived } = course;
  const A = full.assessmentCount;
  const cats = without.categories;
  for (let s = 0; s < S; s++) {
    let num = 0;
    let den = 0;
    for (let c = 0; c < C; c++) {
      const k = s * C + c;
      let p: number;
      if (changed[c] === 1) {
        if (waived[k] !== COUNTED) continue;
        p = categoryPercent(cats[c]!, earned, state, s * A, scratch);
        if (p !== p) continue; // nothing graded: the category does not count
      } else {
        if (grades.catStatus[k] !== COUNTED) continue;
        p = grades.catPercent[k]!;
      }
      const w = cats[c]!.weight;
      num += w * p;
      den += w;
    }
    const ok = den > 0;
    hasWeighted[s] = ok ? 1 : 0;
    weighted[s] = ok ? num / den : Number.NaN;
  }
  return { weighted, hasWeighted };
}
