/**
 * Descriptive statistics per section and for the whole course, on one measure (final mark, one
 * assessment's item percent, or one category percent — see measure.ts for what each counts and
 * leaves out). Every statistic is `describe()` from the statistics engine (sources there: NIST
 * StRD, Hyndman & Fan 1996, Tukey 1977); outliers carry the student's name as label.
 *
 * Every group also carries the roster index of each value (`studentIndices`, aligned with
 * `values`), so a caller that labels students differently — the export and the command line use
 * the student ID — finds the student of an outlier with `outlierStudents` instead of summarising
 * again. One computation serves the screen, the export file and the CLI.
 *
 * The course summary pools every section; sections are in natural order. Cost O(n log n).
 */
import type { Gradebook } from '../model';
import type { StudentResult } from '../results';
import { describe, type Summary } from '../stats/describe';
import type { QuantileType } from '../stats/quantile';
import type { Outlier } from '../stats/tukeyFences';
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
  /** Roster index (position in `book.students`) of each value, aligned with `values`. */
  readonly studentIndices: readonly number[];
  readonly leftOut: readonly LeftOutCount[];
}

export interface SectionStatistics {
  readonly label: string;
  readonly course: Summary;
  readonly courseValues: readonly number[];
  readonly courseNames: readonly string[];
  /** Roster index of each course value, aligned with `courseValues`. */
  readonly courseStudentIndices: readonly number[];
  readonly leftOut: readonly LeftOutCount[];
  readonly sections: readonly SectionSummary[];
}

interface Summarised {
  summary: Summary;
  values: number[];
  names: string[];
  studentIndices: number[];
}

/**
 * How one group's values become its Summary: describe() here; a fast path may pass an equal
 * summariser (engine/fast/finalMarkStatistics.ts sorts each group once).
 */
export type GroupSummariser = (values: readonly number[], labels: readonly string[], quantileType: QuantileType) => Summary;

const describeGroup: GroupSummariser = (values, labels, quantileType) => describe(values, { quantileType, labels });

function summarise(obs: readonly Observation[], quantileType: QuantileType, summariseGroup: GroupSummariser): Summarised {
  const values = obs.map((o) => o.value);
  const names = obs.map((o) => o.name);
  const studentIndices = obs.map((o) => o.studentIndex);
  return { summary: summariseGroup(values, names, quantileType), values, names, studentIndices };
}

/** An outlier of a group, located on the roster rather than by label. */
export interface OutlierStudent {
  /** Position in `book.students`. */
  readonly studentIndex: number;
  readonly value: number;
  readonly side: Outlier['side'];
}

/**
 * The roster index of every outlier of `summary` (`Outlier.index` points into the group's
 * values; `studentIndices` maps that to the roster), in the summary's order.
 * @throws {Error} when `studentIndices` does not belong to `summary` (an outlier index past its end)
 * @example
 * const s = sectionStatistics(book, results, { measure: { kind: 'final' } }).sections[0];
 * outlierStudents(s.summary, s.studentIndices).map((o) => book.students[o.studentIndex]?.id);
 */
export function outlierStudents(summary: Summary, studentIndices: readonly number[]): OutlierStudent[] {
  return summary.outliers.map((o) => {
    const studentIndex = studentIndices[o.index];
    if (studentIndex === undefined) {
      throw new Error(`outlierStudents: outlier at value ${o.index} but only ${studentIndices.length} student indices; pass the indices of the same group`);
    }
    return { studentIndex, value: o.value, side: o.side };
  });
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
  return sectionStatisticsBy(book, results, options, describeGroup);
}

/** sectionStatistics with each group summarised by `summariseGroup` (which must equal describe()). */
export function sectionStatisticsBy(
  book: Gradebook,
  results: readonly StudentResult[],
  options: SectionStatisticsOptions,
  summariseGroup: GroupSummariser,
): SectionStatistics {
  const quantileType = options.quantileType ?? 7;
  const m = measureValues(book, results, options.measure);
  const course = summarise(m.observations, quantileType, summariseGroup);
  const bySection = new Map<string, Observation[]>();
  for (const o of m.observations) {
    const list = bySection.get(o.section);
    if (list === undefined) bySection.set(o.section, [o]);
    else list.push(o);
  }
  const sections = sectionsOf(book).map((section) => {
    const s = summarise(bySection.get(section) ?? [], quantileType, summariseGroup);
    return {
      section,
      summary: s.summary,
      values: s.values,
      names: s.names,
      studentIndices: s.studentIndices,
      leftOut: m.leftOutBySection[section] ?? [],
    };
  });
  return {
    label: m.label,
    course: course.summary,
    courseValues: course.values,
    courseNames: course.names,
    courseStudentIndices: course.studentIndices,
    leftOut: m.leftOut,
    sections,
  };
}
