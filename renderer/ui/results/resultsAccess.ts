/**
 * Reading the engine's course result from the workspaces: one place that knows its shape, so the
 * Roster, Plan and Results screens look students up the same way. Nothing here computes a mark.
 */
import type { CourseResult } from '../../state/courseStore';
import type { CategoryLine, ItemLine, StudentResult } from '../../engine/results';

export function studentResultList(results: CourseResult | null): readonly StudentResult[] {
  return results === null ? [] : results.students;
}

/** Student id → result. */
export function studentResultMap(results: CourseResult | null): ReadonlyMap<string, StudentResult> {
  const map = new Map<string, StudentResult>();
  for (const r of studentResultList(results)) map.set(r.studentId, r);
  return map;
}

export function categoryLines(result: StudentResult): readonly CategoryLine[] {
  return result.lines.filter((l): l is CategoryLine => l.kind === 'category');
}

export function itemLines(result: StudentResult, categoryId: string): readonly ItemLine[] {
  return result.lines.filter((l): l is ItemLine => l.kind === 'item' && l.categoryId === categoryId);
}

const percentFormat = (decimals: number) => new Intl.NumberFormat('en', { minimumFractionDigits: decimals, maximumFractionDigits: decimals, useGrouping: false });

/** A percent as the plan rounds it (the final is already rounded by the engine; this only prints it). */
export function formatPercent(value: number | null, decimals: number): string {
  if (value === null) return '—';
  return `${percentFormat(decimals).format(value)} %`;
}

/** A weight or derived percent for display: up to 2 decimals, no trailing zeros. */
export function formatShare(value: number): string {
  return `${new Intl.NumberFormat('en', { maximumFractionDigits: 2, useGrouping: false }).format(value)} %`;
}

/** Why a category does or does not count, in words (same words on every screen). */
export const CATEGORY_STATUS_WORDS: Readonly<Record<CategoryLine['status'], string>> = {
  counted: 'counts',
  droppedForCourse: 'dropped for the course',
  waivedForSection: 'waived for the section',
  waivedForStudent: 'waived for this student',
  nothingGraded: 'nothing graded yet',
};
