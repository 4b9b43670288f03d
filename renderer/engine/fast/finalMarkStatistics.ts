/**
 * Statistics of the final marks per section and for the course in sectionStatistics' shape (the
 * one the Sections screen, the report and the export read), with each group sorted ONCE by a
 * typed-array numeric sort and summarised by describeWithSorted (sectionFinalStatistics.ts) —
 * equal to sectionStatistics(book, results, { quantileType, measure: { kind: 'final' } }) in every
 * field (property-tested in tests/engine/fast/finalMarkStatistics.test.ts). Rounded finals are
 * finite and never −0, so the numeric sort orders them exactly as describe()'s comparator does.
 *
 * Cost O(n log n) per group for one native sort (O(n) on the rounding grid when the decimals are
 * given), instead of a comparator sort.
 */
import { sectionStatisticsBy, type GroupSummariser, type SectionStatistics } from '../analysis/sectionStatistics';
import type { Gradebook } from '../model';
import type { StudentResult } from '../results';
import type { QuantileType } from '../stats/quantile';
import { describeWithSorted } from './sectionFinalStatistics';
import { sortFinals } from './sortFinals';

/** Sorted once per group: on the rounding grid when the plan's decimals are given (sortFinals.ts). */
const sortedOnce =
  (decimals: number | undefined): GroupSummariser =>
  (values, labels, quantileType) => {
    const typed = Float64Array.from(values);
    return describeWithSorted(values, decimals === undefined ? typed.sort() : sortFinals(typed, decimals), labels, quantileType);
  };

/**
 * @example
 * finalMarkStatistics(book, gradeCourse(book, plan).students, 7).course.mean; // === sectionStatistics(…, { measure: { kind: 'final' } }).course.mean
 */
export function finalMarkStatistics(
  book: Gradebook,
  results: readonly StudentResult[],
  quantileType: QuantileType = 7,
  /** The plan's rounding decimals, when known: the finals are then sorted on that grid. */
  decimals?: number,
): SectionStatistics {
  return sectionStatisticsBy(book, results, { quantileType, measure: { kind: 'final' } }, sortedOnce(decimals));
}
