/**
 * Which numbers a statistic is computed on, and what is left out of them.
 *
 * - Final mark: the rounded final percent of every student who has one (`StudentResult.final`);
 *   students with no mark (no category counts for them) are left out.
 * - Assessment: the item percent, earned / possible × 100, of every *earned* score; missing,
 *   excused and pending cells are left out (a missing cell is not a zero here: whether it counts
 *   as zero is a category rule of the plan, not a fact about the item). Extra credit is included
 *   as scored, so an item percent may exceed 100.
 * - Category: the category percent after drop-lowest and cap, as the plan computed it, of every
 *   student for whom the category counts; waived, dropped-for-course and not-yet-graded are left out.
 *
 * Left-out counts are returned by reason so the UI can state them beside the numbers.
 */
import type { Gradebook } from '../model';
import type { CategoryPercent, CategoryStatus, StudentResult } from '../results';

export type Measure =
  | { readonly kind: 'final' }
  | { readonly kind: 'assessment'; readonly assessmentId: string }
  | { readonly kind: 'category'; readonly categoryId: string };

export type LeftOutReason = 'noMark' | 'missing' | 'excused' | 'pending' | Exclude<CategoryStatus, 'counted'>;

export const LEFT_OUT_WORDS: Record<LeftOutReason, string> = {
  noMark: 'no final mark (no category counts yet)',
  missing: 'missing (no submission)',
  excused: 'excused',
  pending: 'pending (not yet due or not marked)',
  droppedForCourse: 'category dropped for the course',
  waivedForSection: 'category waived for the section',
  waivedForStudent: 'category waived for the student',
  nothingGraded: 'nothing graded yet in the category',
};

export interface LeftOutCount {
  readonly reason: LeftOutReason;
  readonly count: number;
}

/** One observation: which student, in which section, with what value. */
export interface Observation {
  readonly studentIndex: number;
  readonly name: string;
  readonly section: string;
  readonly value: number;
}

export interface MeasureValues {
  /** What the numbers are, in words ("Final mark (%)", "Lab 1 (% of 10 points)"). */
  readonly label: string;
  readonly observations: readonly Observation[];
  /** Left-out students by reason, in a fixed order; reasons with a zero count are omitted. */
  readonly leftOut: readonly LeftOutCount[];
  /** Per section: the same counts (keyed by section). */
  readonly leftOutBySection: Readonly<Record<string, readonly LeftOutCount[]>>;
}

const REASON_ORDER: readonly LeftOutReason[] = [
  'noMark',
  'missing',
  'excused',
  'pending',
  'droppedForCourse',
  'waivedForSection',
  'waivedForStudent',
  'nothingGraded',
];

function tally(reasons: readonly LeftOutReason[]): LeftOutCount[] {
  return REASON_ORDER.map((reason) => ({ reason, count: reasons.filter((r) => r === reason).length })).filter((c) => c.count > 0);
}

/** How many students the counts leave out, whatever the reason. */
export function leftOutTotal(leftOut: readonly LeftOutCount[]): number {
  return leftOut.reduce((n, c) => n + c.count, 0);
}

/** The left-out list in words: "3 missing (no submission), 1 excused". Empty string when none. */
export function describeLeftOut(leftOut: readonly LeftOutCount[]): string {
  return leftOut.map((c) => `${c.count} ${LEFT_OUT_WORDS[c.reason]}`).join(', ');
}

/**
 * The observations for `measure`, index-aligned with the gradebook's students in roster order.
 * @throws {Error} when the assessment or category id is not in the gradebook/results
 */
export function measureValues(book: Gradebook, results: readonly StudentResult[], measure: Measure): MeasureValues {
  const observations: Observation[] = [];
  const reasons: { section: string; reason: LeftOutReason }[] = [];
  let label: string;

  const push = (i: number, value: number) => {
    const s = book.students[i];
    if (s !== undefined) observations.push({ studentIndex: i, name: s.name, section: s.section, value });
  };
  const leave = (i: number, reason: LeftOutReason) => reasons.push({ section: book.students[i]?.section ?? '', reason });

  if (measure.kind === 'final') {
    label = 'Final mark (%)';
    book.students.forEach((_, i) => {
      const final = results[i]?.final ?? null;
      if (final === null) leave(i, 'noMark');
      else push(i, final);
    });
  } else if (measure.kind === 'assessment') {
    const a = book.assessments.findIndex((x) => x.id === measure.assessmentId);
    const assessment = book.assessments[a];
    if (assessment === undefined) throw new Error(`measureValues: no assessment with id "${measure.assessmentId}" in the gradebook`);
    label = `${assessment.name} (% of ${assessment.possible} points)`;
    book.students.forEach((_, i) => {
      const cell = book.scores[i]?.[a] ?? { kind: 'missing' as const };
      if (cell.kind === 'earned') push(i, (cell.points * 100) / assessment.possible);
      else leave(i, cell.kind);
    });
  } else {
    label = `${measure.categoryId} (category %)`;
    book.students.forEach((_, i) => {
      const line = categoryPercentOf(results[i], measure.categoryId);
      if (line === undefined) {
        throw new Error(`measureValues: no category with id "${measure.categoryId}" in the results`);
      }
      if (line.status === 'counted' && line.percent !== null) push(i, line.percent);
      else leave(i, line.status === 'counted' ? 'nothingGraded' : line.status);
    });
  }

  const bySection: Record<string, LeftOutReason[]> = {};
  for (const r of reasons) (bySection[r.section] ??= []).push(r.reason);
  const leftOutBySection: Record<string, readonly LeftOutCount[]> = {};
  for (const [section, rs] of Object.entries(bySection)) leftOutBySection[section] = tally(rs);

  return { label, observations, leftOut: tally(reasons.map((r) => r.reason)), leftOutBySection };
}

/** The student's category line for `categoryId` — through the result's shortcut when it has one. */
function categoryPercentOf(result: StudentResult | undefined, categoryId: string): CategoryPercent | undefined {
  if (result === undefined) return undefined;
  if (result.categoryPercent !== undefined) return result.categoryPercent(categoryId);
  const line = result.lines.find((l) => l.kind === 'category' && l.categoryId === categoryId);
  return line?.kind === 'category' ? line : undefined;
}

/** Sections in natural order ("A2" before "A10"), from the roster. */
export function sectionsOf(book: Gradebook): string[] {
  return [...new Set(book.students.map((s) => s.section))].sort((a, b) => a.localeCompare(b, undefined, { numeric: true }));
}
