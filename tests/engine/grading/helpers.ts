/** Small builders for grading tests: a gradebook from a compact table, a plan with defaults. */
import type { Assessment, Category, Gradebook, GradingPlan, ItemRule, Score, Student } from '../../../renderer/engine/model';
import { DEFAULT_SCALE } from '../../../renderer/engine/grading/gradeScale';

export const E = (points: number): Score => ({ kind: 'earned', points });
export const MISS: Score = { kind: 'missing' };
export const EXC: Score = { kind: 'excused' };
export const PEND: Score = { kind: 'pending' };

export function category(id: string, weight: number, extra: Partial<Category> = {}): Category {
  return {
    id,
    name: id[0]!.toUpperCase() + id.slice(1),
    weight,
    combine: 'totalPoints',
    dropLowest: 0,
    missingAs: 'zero',
    capPercent: null,
    droppedForCourse: false,
    ...extra,
  };
}

export interface Column {
  readonly id: string;
  readonly possible: number;
  readonly categoryId: string | null;
  readonly extraCredit?: boolean;
}

export function book(columns: readonly Column[], rows: readonly { student: Partial<Student> & { id: string }; scores: readonly Score[] }[]): Gradebook {
  const assessments: Assessment[] = columns.map((c) => ({ id: c.id, name: c.id, possible: c.possible }));
  const students: Student[] = rows.map((r) => ({ name: r.student.id, section: 'A', ...r.student }));
  return { assessments, students, scores: rows.map((r) => r.scores) };
}

export function plan(columns: readonly Column[], categories: readonly Category[], extra: Partial<GradingPlan> = {}): GradingPlan {
  const items: Record<string, ItemRule> = {};
  for (const c of columns) items[c.id] = { categoryId: c.categoryId, extraCredit: c.extraCredit ?? false };
  return {
    categories,
    items,
    sectionWaivers: [],
    studentWaivers: [],
    markMode: 'current',
    scale: DEFAULT_SCALE,
    rounding: { decimals: 2 },
    adjustments: [],
    ...extra,
  };
}
