/**
 * Re-normalisation of category weights — which categories count for a student, and how much.
 *
 *   final = Σ_c wᶜ·sᶜ / Σ_c wᶜ   over the categories c that count for this student,
 *   effective weight of c = 100 · wᶜ / Σ wᶜ  (0 for categories that do not count),
 * so the effective weights of the counted categories sum to 100 (to float precision, ≤ 1e−12) and
 * the ratios between them equal the ratios between the nominal weights.
 *
 * A category does not count when (first reason wins, in this order): it is dropped for the course;
 * it is waived for the student's section; it is waived for the student (accommodation); it has nothing
 * graded yet (its percent is not defined — see categoryScore.ts).
 *
 * Source: weighted arithmetic mean with weights rescaled over the available components — common
 * practice, no source.
 */
import type { Category, SectionWaiver, StudentWaiver } from '../model';
import type { CategoryStatus } from '../results';
import { defined, notDefined, type Defined } from '../defined';

/** Why (or whether) a category counts for a student, apart from "nothing graded" which needs the items. */
export function waiverStatus(
  category: Category,
  student: { readonly id: string; readonly section: string },
  sectionWaivers: readonly SectionWaiver[],
  studentWaivers: readonly StudentWaiver[],
): CategoryStatus {
  if (category.droppedForCourse) return 'droppedForCourse';
  if (sectionWaivers.some((w) => w.categoryId === category.id && w.section === student.section)) return 'waivedForSection';
  if (studentWaivers.some((w) => w.categoryId === category.id && w.studentId === student.id)) return 'waivedForStudent';
  return 'counted';
}

export interface WeightInput {
  readonly weight: number;
  readonly status: CategoryStatus;
}

/**
 * Effective weights (percent), index-aligned with the input. Negative or non-finite nominal
 * weights are treated as 0 (the plan check reports them). Not defined when no category counts or
 * the counted ones weigh 0 in total.
 */
export function renormalise(inputs: readonly WeightInput[]): Defined<readonly number[]> {
  const usable = inputs.map((c) => (c.status === 'counted' ? safeWeight(c.weight) : 0));
  const counted = inputs.filter((c) => c.status === 'counted').length;
  if (counted === 0) return notDefined('no category counts for this student');
  const total = usable.reduce((s, w) => s + w, 0);
  if (!(total > 0)) return notDefined('the categories that count have a total weight of 0');
  return defined(usable.map((w) => (100 * w) / total));
}

/** Σ wᶜ·sᶜ / Σ wᶜ over counted categories (percents index-aligned; null where not counted). */
export function weightedPercent(inputs: readonly WeightInput[], percents: readonly (number | null)[]): Defined<number> {
  let num = 0;
  let den = 0;
  inputs.forEach((c, i) => {
    const s = percents[i];
    if (c.status !== 'counted' || s === null || s === undefined) return;
    const w = safeWeight(c.weight);
    num += w * s;
    den += w;
  });
  return den > 0 ? defined(num / den) : notDefined('no category with a positive weight counts for this student');
}

export function safeWeight(w: number): number {
  return Number.isFinite(w) && w > 0 ? w : 0;
}
