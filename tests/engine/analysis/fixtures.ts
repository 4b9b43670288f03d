/** Small hand-made gradebooks for the analysis tests (structure only; expected values are derived in each test). */
import { DEFAULT_SCALE } from '../../../renderer/engine/grading/gradeScale';
import type { Category, Gradebook, GradingPlan, Score } from '../../../renderer/engine/model';

export const earned = (points: number): Score => ({ kind: 'earned', points });
export const MISSING: Score = { kind: 'missing' };
export const EXCUSED: Score = { kind: 'excused' };
export const PENDING: Score = { kind: 'pending' };

export function category(id: string, weight: number, over: Partial<Category> = {}): Category {
  return { id, name: id, weight, combine: 'totalPoints', dropLowest: 0, missingAs: 'zero', capPercent: null, droppedForCourse: false, ...over };
}

/** One gradebook with `possible` points per assessment; rows are [name, section, ...scores]. */
export function book(possible: readonly number[], rows: readonly (readonly [string, string, ...Score[]])[]): Gradebook {
  return {
    students: rows.map(([name, section], i) => ({ id: `S${i + 1}`, name, section })),
    assessments: possible.map((p, i) => ({ id: `a${i + 1}`, name: `Item ${i + 1}`, possible: p })),
    scores: rows.map(([, , ...scores]) => scores),
  };
}

/** Every assessment in one category `all`, weight 100, decimals 2. */
export function onePlan(b: Gradebook, over: Partial<Category> = {}): GradingPlan {
  return {
    categories: [category('all', 100, over)],
    items: Object.fromEntries(b.assessments.map((a) => [a.id, { categoryId: 'all', extraCredit: false }])),
    sectionWaivers: [],
    studentWaivers: [],
    markMode: 'current',
    scale: DEFAULT_SCALE,
    rounding: { decimals: 2 },
    adjustments: [],
  };
}
