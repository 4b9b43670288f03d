/**
 * The course data model shared by every layer: a gradebook (who, what, which scores) and a
 * grading plan (how the scores become a final mark). Plain data only — no classes, no functions —
 * so it survives structured clone (IPC), JSON (project file) and comparison in tests.
 *
 * Grids are index-aligned: `scores[s][a]` is student `students[s]` on assessment `assessments[a]`.
 */

/**
 * One cell of the gradebook, typed before any arithmetic so a blank never becomes a zero by
 * accident.
 * - `earned`: points earned (may exceed `possible` only on extra-credit items).
 * - `missing`: no submission. Counts as zero or is left out, per category (`missingAs`).
 * - `excused`: never counted and never "dropped" — as if the item did not exist for this student.
 * - `pending`: not yet due or not yet marked. Left out of the current mark; zero in the projected final.
 */
export type Score =
  | { readonly kind: 'earned'; readonly points: number }
  | { readonly kind: 'missing' }
  | { readonly kind: 'excused' }
  | { readonly kind: 'pending' };

export type ScoreKind = Score['kind'];

export interface Student {
  /** Institution's student ID; unique in a gradebook. */
  readonly id: string;
  readonly name: string;
  readonly section: string;
  readonly email?: string;
}

export interface Assessment {
  /** Stable key (usually the column header as imported); unique in a gradebook. */
  readonly id: string;
  readonly name: string;
  /** Points possible; > 0. */
  readonly possible: number;
}

export interface Gradebook {
  readonly students: readonly Student[];
  readonly assessments: readonly Assessment[];
  /** `scores[studentIndex][assessmentIndex]`. */
  readonly scores: readonly (readonly Score[])[];
}

/** How a category turns its items into one percentage. */
export type CombineRule =
  /** Σ earned / Σ possible over the counted items. */
  | 'totalPoints'
  /** Mean of the counted items' percents. */
  | 'equalItems';

export interface Category {
  readonly id: string;
  readonly name: string;
  /** Nominal weight (any non-negative unit; usually percent of the final mark). */
  readonly weight: number;
  readonly combine: CombineRule;
  /** Drop the lowest N counted (non-excused, non-extra-credit) items; 0 = keep all. */
  readonly dropLowest: number;
  /** Missing work counts as zero (`zero`) or is left out (`excluded`). */
  readonly missingAs: 'zero' | 'excluded';
  /** Upper cap on the category percent (e.g. 100 when extra credit may not push it higher); null = none. */
  readonly capPercent: number | null;
  /** Dropped for the whole course: its weight is re-normalised away for everyone. */
  readonly droppedForCourse: boolean;
}

/** How one assessment enters the plan. */
export interface ItemRule {
  /** Category the item belongs to; null = not graded (ignored). */
  readonly categoryId: string | null;
  /** Extra credit: earned points add to the category numerator only, never to the denominator. */
  readonly extraCredit: boolean;
}

/** A category that does not count for one section. */
export interface SectionWaiver {
  readonly section: string;
  readonly categoryId: string;
  readonly note?: string;
}

/** A category that does not count for one student (accommodation). */
export interface StudentWaiver {
  readonly studentId: string;
  readonly categoryId: string;
  readonly note?: string;
}

export interface GradeCutoff {
  readonly letter: string;
  /** Minimum rounded final percent for this letter (inclusive). */
  readonly minPercent: number;
  readonly gradePoints?: number;
  /** True when this letter is a pass (used by pass/fail reporting). */
  readonly passing?: boolean;
}

export interface GradeScale {
  readonly name: string;
  /** Any order; the engine sorts by `minPercent` descending. */
  readonly cutoffs: readonly GradeCutoff[];
}

/** Rounding of the final percent, applied once, half-up, on the decimal value. */
export interface RoundingRule {
  /** Decimal places kept (0 = whole percent). */
  readonly decimals: number;
}

/** A section-level adjustment of the final percent, applied in list order before rounding. */
export type Adjustment =
  | { readonly kind: 'addPoints'; readonly section: string | null; readonly points: number }
  /** Multiply every final in the section by target / (section mean before this step). */
  | { readonly kind: 'scaleToMean'; readonly section: string | null; readonly targetMean: number }
  | { readonly kind: 'cap'; readonly section: string | null; readonly maxPercent: number };

/**
 * `current`: ungraded categories and pending items are left out (the mark so far).
 * `projected`: pending items count as zero and ungraded categories count as zero (the final if
 * nothing more is handed in).
 */
export type MarkMode = 'current' | 'projected';

export interface GradingPlan {
  readonly categories: readonly Category[];
  /** Keyed by assessment id. An assessment without an entry is not graded. */
  readonly items: Readonly<Record<string, ItemRule>>;
  readonly sectionWaivers: readonly SectionWaiver[];
  readonly studentWaivers: readonly StudentWaiver[];
  readonly markMode: MarkMode;
  readonly scale: GradeScale;
  readonly rounding: RoundingRule;
  /** `section: null` applies to every section. */
  readonly adjustments: readonly Adjustment[];
}
