/**
 * Descriptive statistics per section and for the whole course, on one measure (final mark, one
 * assessment's item percent, or one category percent — see measure.ts for what each counts and
 * leaves out). Every statistic is `describe()` from the statistics engine (sources there: NIST
 * StRD, Hyndman & Fan 1996, Tukey 1977); outliers carry the student's name as label.
 *
 * The course summary pools every section; sections are in natural order. Cost O(n log n).
 */
import type { Gradebook } from '../model';
import type { StudentResult } from '../results';
import { describe, type Summary } from '../stats/describe';
import type { QuantileType } from '../stats/quantile';
import { measureValues, sectionsOf, type LeftOutCount, type Measure, type Observation } from './measure';

export interface SectionStatisticsOptions {
  readonly quantileType?: QuantileType;
  readonly measure: Measure;
}

export interface SectionSummary {
  readonly section: string;
  readonly summary: Summary;
  /** The values summarised, in roster order (for charts and tests). */
  readonly values: readonly number[];
  readonly names: readonly string[];
  readonly leftOut: readonly LeftOutCount[];
}

export interface SectionStatistics {
  readonly label: string;
  readonly course: Summary;
  readonly courseValues: readonly number[];
  readonly courseNames: readonly string[];
  readonly leftOut: readonly LeftOutCount[];
  readonly sections: readonly SectionSummary[];
}

function summarise(obs: readonly Observation[], quantileType: QuantileType): { summary: Summary; values: number[]; names: string[] } {
  const values = obs.map((o) => o.value);
  const names = obs.map((o) => o.name);
  return { summary: describe(values, { quantileType, labels: names }), values, names };
}

/**
 * @throws {Error} when the measure names an assessment or category that does not exist
 * @example
 * sectionStatistics(book, gradeCourse(book, plan).students, { measure: { kind: 'final' } }).sections[0].summary.mean;
 */
export function sectionStatistics(
  book: Gradebook,
  results: readonly StudentResult[],
  options: SectionStatisticsOptions,
): SectionStatistics {
  const quantileType = options.quantileType ?? 7;
  const m = measureValues(book, results, options.measure);
  const course = summarise(m.observations, quantileType);
  const sections = sectionsOf(book).map((section) => {
    const s = summarise(m.observations.filter((o) => o.section === section), quantileType);
    return { section, summary: s.summary, values: s.values, names: s.names, leftOut: m.leftOutBySection[section] ?? [] };
  });
  return {
    label: m.label,
    course: course.summary,
    courseValues: course.values,
    courseNames: course.names,
    leftOut: m.leftOut,
    sections,
  };
}
