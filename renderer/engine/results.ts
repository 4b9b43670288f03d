/**
 * What the engine produces for each student: the final mark and the explanation lines that
 * produce it. The same data drives the Results screen, the CLI and the export, so every mark is
 * explainable line by line wherever it appears.
 */
import type { Adjustment, CombineRule } from './model';

/** Why an item did or did not enter its category. */
export type ItemStatus =
  | 'counted'
  | 'dropped'
  | 'excused'
  /** Missing, counted as zero by the category rule. */
  | 'missingZero'
  /** Missing, left out by the category rule. */
  | 'missingExcluded'
  /** Pending and left out (current mark). */
  | 'pendingExcluded'
  /** Pending and counted as zero (projected final). */
  | 'pendingZero'
  | 'extraCredit';

export interface ItemLine {
  readonly kind: 'item';
  readonly assessmentId: string;
  readonly categoryId: string;
  readonly status: ItemStatus;
  /** Points entering the numerator (0 for missing/pending-as-zero; null when not counted at all). */
  readonly earned: number | null;
  readonly possible: number;
  /** earned / possible × 100, null when there is no earned value. */
  readonly percent: number | null;
}

/** Why a category does or does not count for this student. */
export type CategoryStatus =
  | 'counted'
  | 'droppedForCourse'
  | 'waivedForSection'
  | 'waivedForStudent'
  /** Nothing graded yet (current mark only). */
  | 'nothingGraded';

export interface CategoryLine {
  readonly kind: 'category';
  readonly categoryId: string;
  readonly status: CategoryStatus;
  readonly combine: CombineRule;
  /** Category percent after cap; null when the category does not count. */
  readonly percent: number | null;
  /** Percent before the cap was applied (equals `percent` when no cap bit). */
  readonly uncappedPercent: number | null;
  readonly capped: boolean;
  readonly nominalWeight: number;
  /** Share of the final mark in percent (Σ over counted categories = 100); 0 when not counted. */
  readonly effectiveWeight: number;
  /** effectiveWeight × percent / 100: this category's contribution in final-mark points. */
  readonly contribution: number | null;
  readonly dropped: number;
}

export interface WeightedLine {
  readonly kind: 'weighted';
  /** Σ wᶜ·sᶜ / Σ wᶜ over counted categories. */
  readonly percent: number;
}

export interface AdjustmentLine {
  readonly kind: 'adjustment';
  readonly adjustment: Adjustment;
  readonly before: number;
  readonly after: number;
}

export interface RoundingLine {
  readonly kind: 'rounding';
  readonly decimals: number;
  readonly before: number;
  readonly after: number;
}

export interface CutoffLine {
  readonly kind: 'cutoff';
  readonly letter: string;
  readonly minPercent: number;
  readonly gradePoints: number | null;
}

export interface NoMarkLine {
  readonly kind: 'noMark';
  readonly reason: string;
}

export type ExplanationLine =
  | ItemLine
  | CategoryLine
  | WeightedLine
  | AdjustmentLine
  | RoundingLine
  | CutoffLine
  | NoMarkLine;

export interface StudentResult {
  readonly studentId: string;
  readonly section: string;
  /** Weighted percent before adjustments; null when no category counts. */
  readonly weighted: number | null;
  /** After adjustments, before rounding. */
  readonly adjusted: number | null;
  /** Rounded final percent (what the cutoff is applied to). */
  readonly final: number | null;
  readonly letter: string | null;
  readonly gradePoints: number | null;
  /** Effective weights (percent, summing to 100 over counted categories), keyed by category id. */
  readonly effectiveWeights: Readonly<Record<string, number>>;
  readonly lines: readonly ExplanationLine[];
  /**
   * Optional shortcut to one category's status and percent — the same as the first category line
   * of `lines` with that id — for results that can answer it without building the lines (the fast
   * path's, engine/fast/courseResult.ts). Undefined when no category has that id.
   */
  categoryPercent?(categoryId: string): CategoryPercent | undefined;
}

/** A category's status and percent for one student, as in its category line. */
export interface CategoryPercent {
  readonly status: CategoryStatus;
  readonly percent: number | null;
}
