/**
 * Every change the Plan workspace can make, as a pure function GradingPlan → GradingPlan.
 *
 * The UI never builds a plan by hand: it calls one of these and hands the result to the course
 * store (`apply({ kind: 'updatePlan', … })`), so undo/redo and autosave see each change as one step.
 * Functions never mutate their input, and they throw a RangeError (naming the field and the fix) on a
 * value the plan cannot hold; the UI validates typed input first, so a throw means a UI bug.
 */
import { itemRuleFor } from '../engine/grading/itemRule';
import type {
  Adjustment,
  Category,
  CombineRule,
  GradeCutoff,
  GradeScale,
  GradingPlan,
  MarkMode,
} from '../engine/model';

/** The per-category rules the Plan workspace edits (everything but id and name). */
export type CategoryRules = Pick<Category, 'weight' | 'combine' | 'dropLowest' | 'missingAs' | 'capPercent' | 'droppedForCourse'>;

function requireCategory(plan: GradingPlan, categoryId: string): Category {
  const found = plan.categories.find((c) => c.id === categoryId);
  if (found === undefined) throw new RangeError(`No category with id "${categoryId}" in the plan.`);
  return found;
}

function replaceCategory(plan: GradingPlan, categoryId: string, change: (c: Category) => Category): GradingPlan {
  requireCategory(plan, categoryId);
  return { ...plan, categories: plan.categories.map((c) => (c.id === categoryId ? change(c) : c)) };
}

function checkRules(rules: Partial<CategoryRules>): void {
  if (rules.weight !== undefined && !(Number.isFinite(rules.weight) && rules.weight >= 0)) {
    throw new RangeError(`Category weight must be a number ≥ 0, got ${rules.weight}.`);
  }
  if (rules.dropLowest !== undefined && !(Number.isInteger(rules.dropLowest) && rules.dropLowest >= 0)) {
    throw new RangeError(`"Drop lowest" must be a whole number ≥ 0, got ${rules.dropLowest}.`);
  }
  if (rules.capPercent !== undefined && rules.capPercent !== null && !(Number.isFinite(rules.capPercent) && rules.capPercent > 0)) {
    throw new RangeError(`A category cap must be a percent > 0 (or none), got ${rules.capPercent}.`);
  }
}

/** A category id not yet used in the plan: "cat-1", "cat-2", … */
export function freshCategoryId(plan: GradingPlan): string {
  const used = new Set(plan.categories.map((c) => c.id));
  let n = plan.categories.length + 1;
  while (used.has(`cat-${n}`)) n += 1;
  return `cat-${n}`;
}

/**
 * Add a category with neutral rules (weight 0, total points, keep all, missing counts as zero, no
 * cap) so adding one never changes any mark until the user gives it weight or items.
 */
export function addCategory(plan: GradingPlan, name: string, id: string = freshCategoryId(plan)): GradingPlan {
  const trimmed = name.trim();
  if (trimmed === '') throw new RangeError('A category needs a name.');
  if (plan.categories.some((c) => c.id === id)) throw new RangeError(`Category id "${id}" is already used.`);
  const category: Category = {
    id,
    name: trimmed,
    weight: 0,
    combine: 'totalPoints',
    dropLowest: 0,
    missingAs: 'zero',
    capPercent: null,
    droppedForCourse: false,
  };
  return { ...plan, categories: [...plan.categories, category] };
}

export function renameCategory(plan: GradingPlan, categoryId: string, name: string): GradingPlan {
  const trimmed = name.trim();
  if (trimmed === '') throw new RangeError('A category needs a name.');
  return replaceCategory(plan, categoryId, (c) => ({ ...c, name: trimmed }));
}

/**
 * Remove a category. Its assessments become "not graded" (they keep their extra-credit flag) and
 * waivers naming it go too, so the plan never refers to a category that does not exist.
 */
export function removeCategory(plan: GradingPlan, categoryId: string): GradingPlan {
  requireCategory(plan, categoryId);
  // fromEntries defines own keys, so an assessment id such as "__proto__" stays an ordinary key.
  const items = Object.fromEntries(
    Object.entries(plan.items).map(([assessmentId, rule]) => [assessmentId, rule.categoryId === categoryId ? { ...rule, categoryId: null } : rule]),
  );
  return {
    ...plan,
    categories: plan.categories.filter((c) => c.id !== categoryId),
    items,
    sectionWaivers: plan.sectionWaivers.filter((w) => w.categoryId !== categoryId),
    studentWaivers: plan.studentWaivers.filter((w) => w.categoryId !== categoryId),
  };
}

/** Change any of a category's rules (weight, combine rule, drop lowest, missing, cap, dropped for course). */
export function setCategoryRules(plan: GradingPlan, categoryId: string, rules: Partial<CategoryRules>): GradingPlan {
  checkRules(rules);
  return replaceCategory(plan, categoryId, (c) => ({ ...c, ...rules }));
}

export function setCategoryWeight(plan: GradingPlan, categoryId: string, weight: number): GradingPlan {
  return setCategoryRules(plan, categoryId, { weight });
}

export function setCombineRule(plan: GradingPlan, categoryId: string, combine: CombineRule): GradingPlan {
  return setCategoryRules(plan, categoryId, { combine });
}

/** Move a category one place up (-1) or down (+1) in display order; no effect on any mark. */
export function moveCategory(plan: GradingPlan, categoryId: string, direction: -1 | 1): GradingPlan {
  const from = plan.categories.findIndex((c) => c.id === categoryId);
  if (from < 0) throw new RangeError(`No category with id "${categoryId}" in the plan.`);
  const to = from + direction;
  if (to < 0 || to >= plan.categories.length) return plan;
  const categories = [...plan.categories];
  const [moved] = categories.splice(from, 1);
  if (moved === undefined) return plan;
  categories.splice(to, 0, moved);
  return { ...plan, categories };
}

/** Put an assessment in a category, or take it out of grading (`null`). */
export function assignAssessment(plan: GradingPlan, assessmentId: string, categoryId: string | null): GradingPlan {
  if (categoryId !== null) requireCategory(plan, categoryId);
  const previous = itemRuleFor(plan, assessmentId);
  return { ...plan, items: { ...plan.items, [assessmentId]: { categoryId, extraCredit: previous?.extraCredit ?? false } } };
}

export function setExtraCredit(plan: GradingPlan, assessmentId: string, extraCredit: boolean): GradingPlan {
  const previous = itemRuleFor(plan, assessmentId);
  return { ...plan, items: { ...plan.items, [assessmentId]: { categoryId: previous?.categoryId ?? null, extraCredit } } };
}

/** Waive a category for a whole section (no effect if that waiver exists already). */
export function addSectionWaiver(plan: GradingPlan, section: string, categoryId: string, note = ''): GradingPlan {
  requireCategory(plan, categoryId);
  if (plan.sectionWaivers.some((w) => w.section === section && w.categoryId === categoryId)) return plan;
  const waiver = note.trim() === '' ? { section, categoryId } : { section, categoryId, note: note.trim() };
  return { ...plan, sectionWaivers: [...plan.sectionWaivers, waiver] };
}

export function removeSectionWaiver(plan: GradingPlan, section: string, categoryId: string): GradingPlan {
  return { ...plan, sectionWaivers: plan.sectionWaivers.filter((w) => !(w.section === section && w.categoryId === categoryId)) };
}

export function setSectionWaiverNote(plan: GradingPlan, section: string, categoryId: string, note: string): GradingPlan {
  return {
    ...plan,
    sectionWaivers: plan.sectionWaivers.map((w) => {
      if (w.section !== section || w.categoryId !== categoryId) return w;
      const { note: _old, ...rest } = w;
      return note.trim() === '' ? rest : { ...rest, note: note.trim() };
    }),
  };
}

/** Waive a category for one student (an accommodation); no effect if that waiver exists already. */
export function addStudentWaiver(plan: GradingPlan, studentId: string, categoryId: string, note = ''): GradingPlan {
  requireCategory(plan, categoryId);
  if (plan.studentWaivers.some((w) => w.studentId === studentId && w.categoryId === categoryId)) return plan;
  const waiver = note.trim() === '' ? { studentId, categoryId } : { studentId, categoryId, note: note.trim() };
  return { ...plan, studentWaivers: [...plan.studentWaivers, waiver] };
}

export function removeStudentWaiver(plan: GradingPlan, studentId: string, categoryId: string): GradingPlan {
  return { ...plan, studentWaivers: plan.studentWaivers.filter((w) => !(w.studentId === studentId && w.categoryId === categoryId)) };
}

export function setStudentWaiverNote(plan: GradingPlan, studentId: string, categoryId: string, note: string): GradingPlan {
  return {
    ...plan,
    studentWaivers: plan.studentWaivers.map((w) => {
      if (w.studentId !== studentId || w.categoryId !== categoryId) return w;
      const { note: _old, ...rest } = w;
      return note.trim() === '' ? rest : { ...rest, note: note.trim() };
    }),
  };
}

export function setMarkMode(plan: GradingPlan, markMode: MarkMode): GradingPlan {
  return { ...plan, markMode };
}

export function setRoundingDecimals(plan: GradingPlan, decimals: number): GradingPlan {
  // roundHalfUp accepts 0–20 places; more than 4 is never useful for a final mark.
  if (!(Number.isInteger(decimals) && decimals >= 0 && decimals <= 4)) {
    throw new RangeError(`Rounding keeps 0 to 4 decimal places, got ${decimals}.`);
  }
  return { ...plan, rounding: { decimals } };
}

/** Replace the whole scale (e.g. with a preset); cutoffs are copied so the preset is never shared. */
export function setScale(plan: GradingPlan, scale: GradeScale): GradingPlan {
  return { ...plan, scale: { name: scale.name, cutoffs: scale.cutoffs.map((c) => ({ ...c })) } };
}

export function renameScale(plan: GradingPlan, name: string): GradingPlan {
  return { ...plan, scale: { ...plan.scale, name } };
}

function checkCutoffIndex(plan: GradingPlan, index: number): void {
  if (!(Number.isInteger(index) && index >= 0 && index < plan.scale.cutoffs.length)) {
    throw new RangeError(`No cutoff at position ${index + 1}; the scale has ${plan.scale.cutoffs.length}.`);
  }
}

/**
 * Change one cutoff (letter, minimum %, grade points, passing). `gradePoints: undefined` in the
 * patch removes the grade points. Problems such as two letters with the same minimum are left for
 * `validateScale` to report, so the user can pass through an intermediate state while typing.
 */
export function updateCutoff(plan: GradingPlan, index: number, patch: Partial<GradeCutoff>): GradingPlan {
  checkCutoffIndex(plan, index);
  if (patch.minPercent !== undefined && !Number.isFinite(patch.minPercent)) {
    throw new RangeError(`A cutoff's minimum must be a number, got ${patch.minPercent}.`);
  }
  if (patch.gradePoints !== undefined && !Number.isFinite(patch.gradePoints)) {
    throw new RangeError(`Grade points must be a number, got ${patch.gradePoints}.`);
  }
  const cutoffs = plan.scale.cutoffs.map((c, i) => {
    if (i !== index) return c;
    const next: GradeCutoff = { ...c, ...patch };
    if ('gradePoints' in patch && patch.gradePoints === undefined) {
      const { gradePoints: _gp, ...rest } = next;
      return rest;
    }
    return next;
  });
  return { ...plan, scale: { ...plan.scale, cutoffs } };
}

/** Append a cutoff (letter, minimum %, optional grade points). */
export function addCutoff(plan: GradingPlan, cutoff: GradeCutoff): GradingPlan {
  if (!Number.isFinite(cutoff.minPercent)) throw new RangeError(`A cutoff's minimum must be a number, got ${cutoff.minPercent}.`);
  return { ...plan, scale: { ...plan.scale, cutoffs: [...plan.scale.cutoffs, { ...cutoff }] } };
}

export function removeCutoff(plan: GradingPlan, index: number): GradingPlan {
  checkCutoffIndex(plan, index);
  return { ...plan, scale: { ...plan.scale, cutoffs: plan.scale.cutoffs.filter((_, i) => i !== index) } };
}

function checkAdjustment(adjustment: Adjustment): void {
  const value = adjustment.kind === 'addPoints' ? adjustment.points : adjustment.kind === 'scaleToMean' ? adjustment.targetMean : adjustment.maxPercent;
  if (!Number.isFinite(value)) throw new RangeError(`An adjustment needs a number, got ${value}.`);
  if (adjustment.kind === 'scaleToMean' && value <= 0) throw new RangeError(`A target mean must be > 0, got ${value}.`);
  if (adjustment.kind === 'cap' && value <= 0) throw new RangeError(`A cap must be > 0 %, got ${value}.`);
}

/** Append a section adjustment; adjustments apply in list order. */
export function addAdjustment(plan: GradingPlan, adjustment: Adjustment): GradingPlan {
  checkAdjustment(adjustment);
  return { ...plan, adjustments: [...plan.adjustments, adjustment] };
}

function checkAdjustmentIndex(plan: GradingPlan, index: number): void {
  if (!(Number.isInteger(index) && index >= 0 && index < plan.adjustments.length)) {
    throw new RangeError(`No adjustment at position ${index + 1}; the plan has ${plan.adjustments.length}.`);
  }
}

export function replaceAdjustment(plan: GradingPlan, index: number, adjustment: Adjustment): GradingPlan {
  checkAdjustmentIndex(plan, index);
  checkAdjustment(adjustment);
  return { ...plan, adjustments: plan.adjustments.map((a, i) => (i === index ? adjustment : a)) };
}

export function removeAdjustment(plan: GradingPlan, index: number): GradingPlan {
  checkAdjustmentIndex(plan, index);
  return { ...plan, adjustments: plan.adjustments.filter((_, i) => i !== index) };
}

/** Move an adjustment one place earlier (-1) or later (+1); order matters (e.g. cap after add). */
export function moveAdjustment(plan: GradingPlan, index: number, direction: -1 | 1): GradingPlan {
  checkAdjustmentIndex(plan, index);
  const to = index + direction;
  if (to < 0 || to >= plan.adjustments.length) return plan;
  const adjustments = [...plan.adjustments];
  const [moved] = adjustments.splice(index, 1);
  if (moved === undefined) return plan;
  adjustments.splice(to, 0, moved);
  return { ...plan, adjustments };
}

/** Σ nominal weights of the categories not dropped for the course (what the live sum shows). */
export function nominalWeightSum(plan: GradingPlan): number {
  return plan.categories.filter((c) => !c.droppedForCourse).reduce((sum, c) => sum + c.weight, 0);
}
