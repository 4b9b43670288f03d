/**
 * The export's content as plain tables (header + rows of text, numbers or blanks), computed once
 * and written as xlsx sheets or CSV files. The figures come from the engine: finals from
 * `gradeCourse`, explanation sentences from `describeLine`, statistics from `describe`.
 */
import type { CourseProject, ExportColumn } from '../../../renderer/bridge/contract';
import type { Gradebook, Student } from '../../../renderer/engine/model';
import type { StudentResult } from '../../../renderer/engine/results';
import { describeLine, gradeCourse } from '../../../renderer/engine/grading';
import { describe, type QuantileType, type Summary } from '../../../renderer/engine/stats';
import type { Defined } from '../../../renderer/engine/defined';

export type CellValue = string | number | null;

export interface Table {
  /** Sheet name (xlsx) or file-name suffix (csv). */
  readonly name: string;
  readonly header: readonly string[];
  readonly rows: readonly (readonly CellValue[])[];
}

export interface GradedCourse {
  readonly results: readonly StudentResult[];
  readonly planProblems: readonly string[];
}

export function gradeProject(project: CourseProject): GradedCourse {
  const { students, planProblems } = gradeCourse(project.gradebook, project.plan);
  return { results: students, planProblems };
}

function fieldValue(column: ExportColumn, student: Student, result: StudentResult | undefined): CellValue {
  switch (column.field) {
    case 'id':
      return student.id;
    case 'name':
      return student.name;
    case 'section':
      return student.section;
    case 'email':
      return student.email ?? null;
    case 'final':
      return result?.final ?? null;
    case 'letter':
      return result?.letter ?? null;
    case 'gradePoints':
      return result?.gradePoints ?? null;
  }
}

export function finalsTable(book: Gradebook, graded: GradedCourse, columns: readonly ExportColumn[]): Table {
  return {
    name: 'Final marks',
    header: columns.map((c) => c.header),
    rows: book.students.map((s, i) => columns.map((c) => fieldValue(c, s, graded.results[i]))),
  };
}

export function breakdownTable(project: CourseProject, graded: GradedCourse): Table {
  const categories = new Map(project.plan.categories.map((c) => [c.id, c.name]));
  const assessments = new Map(project.gradebook.assessments.map((a) => [a.id, a.name]));
  const names = {
    category: (id: string) => categories.get(id) ?? id,
    assessment: (id: string) => assessments.get(id) ?? id,
  };
  const rows: CellValue[][] = [];
  project.gradebook.students.forEach((s, i) => {
    const result = graded.results[i];
    (result?.lines ?? []).forEach((line, k) => rows.push([s.id, s.name, s.section, k + 1, describeLine(line, names)]));
  });
  return { name: 'Breakdown', header: ['Student ID', 'Name', 'Section', 'Step', 'Explanation'], rows };
}

const value = (d: Defined<number>): number | null => (d.defined ? d.value : null);

/** Reasons of the statistics that are not defined, "sd: n = 1 …", for the notes column. */
export function undefinedReasons(fields: Readonly<Record<string, Defined<unknown>>>): string {
  const seen = new Map<string, string[]>();
  for (const [name, d] of Object.entries(fields)) {
    if (!d.defined) seen.set(d.reason, [...(seen.get(d.reason) ?? []), name]);
  }
  return [...seen.entries()].map(([reason, names]) => `${names.join(', ')}: ${reason}`).join('; ');
}

export interface GroupSummary {
  /** Section name, or null for the whole course. */
  readonly section: string | null;
  readonly summary: Summary;
  /** Students in the group without a final mark (left out of the statistics). */
  readonly withoutMark: number;
}

/** `describe` on the final marks of each section (in roster order of first appearance) and the course. */
export function sectionSummaries(book: Gradebook, results: readonly StudentResult[], quantileType: QuantileType = 7): GroupSummary[] {
  const sections: string[] = [];
  for (const s of book.students) if (!sections.includes(s.section)) sections.push(s.section);
  const group = (section: string | null): GroupSummary => {
    const values: number[] = [];
    const labels: string[] = [];
    let withoutMark = 0;
    book.students.forEach((s, i) => {
      if (section !== null && s.section !== section) return;
      const final = results[i]?.final ?? null;
      if (final === null) withoutMark += 1;
      else {
        values.push(final);
        labels.push(s.id);
      }
    });
    return { section, summary: describe(values, { quantileType, labels }), withoutMark };
  };
  return [...sections.map((s) => group(s)), group(null)];
}

const STAT_HEADER = ['n', 'Mean', 'Median', 'Sample SD', 'Population SD', 'Min', 'Max', 'Q1', 'Q3', 'IQR', 'Lower fence', 'Upper fence', 'Outliers', 'Quantile method', 'Notes'];

/** Statistic columns that carry percents in the assessment table. */
const PERCENT_COLUMNS = new Set(['Mean', 'Median', 'Sample SD', 'Population SD', 'Min', 'Max', 'Q1', 'Q3', 'IQR', 'Lower fence', 'Upper fence']);

function statCells(summary: Summary, extraNote: string): CellValue[] {
  const fields = {
    mean: summary.mean, median: summary.median, sd: summary.sampleSd, populationSd: summary.populationSd,
    min: summary.min, max: summary.max, q1: summary.q1, q3: summary.q3, iqr: summary.iqr,
    lowerFence: summary.lowerFence, upperFence: summary.upperFence,
  };
  const notes = [undefinedReasons(fields), extraNote].filter((s) => s !== '').join('; ');
  return [
    summary.n,
    value(summary.mean), value(summary.median), value(summary.sampleSd), value(summary.populationSd),
    value(summary.min), value(summary.max), value(summary.q1), value(summary.q3), value(summary.iqr),
    value(summary.lowerFence), value(summary.upperFence),
    summary.outliers.map((o) => `${o.label} (${o.value})`).join(', '),
    summary.quantileMethod,
    notes,
  ];
}

export function sectionStatisticsTable(book: Gradebook, graded: GradedCourse): Table {
  const rows = sectionSummaries(book, graded.results).map((g) => [
    g.section ?? 'All sections',
    ...statCells(g.summary, g.withoutMark > 0 ? `${g.withoutMark} without a final mark, left out` : ''),
  ]);
  return { name: 'Section statistics', header: ['Section', ...STAT_HEADER], rows };
}

/** Per assessment: statistics of the earned percents (earned / possible × 100), and the cell states. */
export function assessmentStatisticsTable(book: Gradebook): Table {
  const rows = book.assessments.map((a, j) => {
    const values: number[] = [];
    const labels: string[] = [];
    const counts = { missing: 0, excused: 0, pending: 0 };
    book.students.forEach((s, i) => {
      const cell = book.scores[i]?.[j];
      if (cell === undefined) return;
      if (cell.kind === 'earned') {
        values.push((cell.points / a.possible) * 100);
        labels.push(s.id);
      } else counts[cell.kind] += 1;
    });
    const summary = describe(values, { labels });
    return [a.name, a.possible, ...statCells(summary, ''), counts.missing, counts.excused, counts.pending];
  });
  return {
    name: 'Assessment statistics',
    header: ['Assessment', 'Points possible', ...STAT_HEADER.map((h) => (PERCENT_COLUMNS.has(h) ? `${h} %` : h)), 'Missing', 'Excused', 'Pending'],
    rows,
  };
}
