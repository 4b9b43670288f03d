/**
 * The export's content as plain tables (header + rows of text, numbers or blanks), computed once
 * and written as xlsx sheets or CSV files. The figures come from the engine: finals from
 * `gradeCourse`, explanation sentences from `describeLine`, statistics from the engine's analysis
 * (`sectionStatistics`, `itemAnalysis`) — the same computation the Sections screen shows, so the
 * file cannot drift from the screen. Students are named by ID here (outliers included).
 */
import type { CourseProject, ExportColumn } from '../../../renderer/bridge/contract';
import type { Gradebook, GradingPlan, Student } from '../../../renderer/engine/model';
import type { StudentResult } from '../../../renderer/engine/results';
import { checkPlan, describeLine, gradeCourse } from '../../../renderer/engine/grading';
import { compileCourse, effectiveWeightsOf, gradeCompiled } from '../../../renderer/engine/fast';
import type { QuantileType, Summary } from '../../../renderer/engine/stats';
import { describeLeftOut, itemAnalysis, outlierStudents, sectionStatistics, type LeftOutCount } from '../../../renderer/engine/analysis';
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

/** The plain engine: finals with every explanation line (the breakdown table needs the lines). */
export function gradeProject(project: CourseProject): GradedCourse {
  const { students, planProblems } = gradeCourse(project.gradebook, project.plan);
  return { results: students, planProblems };
}

/**
 * The fast path (renderer/engine/fast: compileCourse + gradeCompiled, property-tested to give
 * gradeCourse's finals, letters, grade points, weighted/adjusted percents and effective weights
 * exactly) for every table that does not show explanation lines: each result's `lines` is empty.
 * Several times cheaper than gradeProject on a large course (no line objects, typed arrays).
 */
export function gradeProjectFinalsOnly(project: CourseProject): GradedCourse {
  const { gradebook: book, plan } = project;
  const course = compileCourse(book, plan);
  const grades = gradeCompiled(course);
  const { cutoffs } = course.compiled;
  const results: StudentResult[] = book.students.map((student, s) => {
    const final = grades.final[s]!;
    const cutoff = grades.letter[s]! >= 0 ? cutoffs[grades.letter[s]!] : undefined;
    const hasMark = final === final;
    return {
      studentId: student.id,
      section: student.section,
      weighted: grades.hasWeighted[s] === 1 ? grades.weighted[s]! : null,
      adjusted: hasMark ? grades.adjusted[s]! : null,
      final: hasMark ? final : null,
      letter: hasMark ? (cutoff?.letter ?? null) : null,
      gradePoints: hasMark ? (cutoff?.gradePoints ?? null) : null,
      effectiveWeights: effectiveWeightsOf(course, grades, s),
      lines: [],
    };
  });
  return { results, planProblems: [...checkPlan(book, plan), ...grades.problems] };
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

const STAT_HEADER = ['n', 'Mean', 'Median', 'Sample SD', 'Population SD', 'Min', 'Max', 'Q1', 'Q3', 'IQR', 'Lower fence', 'Upper fence', 'Outliers', 'Quantile method', 'Notes'];

/** Statistic columns that carry percents in the assessment table. */
const PERCENT_COLUMNS = new Set(['Mean', 'Median', 'Sample SD', 'Population SD', 'Min', 'Max', 'Q1', 'Q3', 'IQR', 'Lower fence', 'Upper fence']);

/** Roster-labelled outliers, "G2342370 (44)": the export names students by ID, never by name. */
function outlierText(book: Gradebook, summary: Summary, studentIndices: readonly number[]): string {
  return outlierStudents(summary, studentIndices)
    .map((o) => `${book.students[o.studentIndex]?.id ?? `row ${o.studentIndex + 1}`} (${o.value})`)
    .join(', ');
}

function statCells(summary: Summary, outliers: string, extraNotes: readonly string[]): CellValue[] {
  const fields = {
    mean: summary.mean, median: summary.median, sd: summary.sampleSd, populationSd: summary.populationSd,
    min: summary.min, max: summary.max, q1: summary.q1, q3: summary.q3, iqr: summary.iqr,
    lowerFence: summary.lowerFence, upperFence: summary.upperFence,
  };
  const notes = [undefinedReasons(fields), ...extraNotes].filter((s) => s !== '').join('; ');
  return [
    summary.n,
    value(summary.mean), value(summary.median), value(summary.sampleSd), value(summary.populationSd),
    value(summary.min), value(summary.max), value(summary.q1), value(summary.q3), value(summary.iqr),
    value(summary.lowerFence), value(summary.upperFence),
    outliers,
    summary.quantileMethod,
    notes,
  ];
}

/** "left out: 2 no final mark (no category counts yet)", or '' when nobody is left out. */
function leftOutNote(leftOut: readonly LeftOutCount[]): string {
  const words = describeLeftOut(leftOut);
  return words === '' ? '' : `left out: ${words}`;
}

/**
 * Final-mark statistics per section (natural order, as on the Sections screen) and for the whole
 * course: `sectionStatistics` on the final measure, the same numbers the screen shows.
 */
export function sectionStatisticsTable(book: Gradebook, graded: GradedCourse, quantileType: QuantileType = 7): Table {
  const stats = sectionStatistics(book, graded.results, { measure: { kind: 'final' }, quantileType });
  const rows = [
    ...stats.sections.map((g) => [g.section, ...statCells(g.summary, outlierText(book, g.summary, g.studentIndices), [leftOutNote(g.leftOut)])]),
    ['All sections', ...statCells(stats.course, outlierText(book, stats.course, stats.courseStudentIndices), [leftOutNote(stats.leftOut)])],
  ];
  return { name: 'Section statistics', header: ['Section', ...STAT_HEADER], rows };
}

/**
 * Per assessment: course statistics of the item percent (`sectionStatistics` on the assessment
 * measure: earned / possible × 100 of the earned cells), then the item analysis of the same
 * assessment — corrected item–total discrimination and the missing/excused/pending counts.
 */
export function assessmentStatisticsTable(book: Gradebook, plan: GradingPlan, graded: GradedCourse, quantileType: QuantileType = 7): Table {
  const rows = itemAnalysis(book, plan).map((item) => {
    const stats = sectionStatistics(book, graded.results, { measure: { kind: 'assessment', assessmentId: item.assessmentId }, quantileType });
    const discrimination = item.discrimination.defined ? [] : [`discrimination: ${item.discrimination.reason}`];
    return [
      item.name,
      item.possible,
      ...statCells(stats.course, outlierText(book, stats.course, stats.courseStudentIndices), [...discrimination, ...item.flags.map((f) => f.message)]),
      value(item.discrimination),
      item.missing,
      item.excused,
      item.pending,
    ];
  });
  return {
    name: 'Assessment statistics',
    header: ['Assessment', 'Points possible', ...STAT_HEADER.map((h) => (PERCENT_COLUMNS.has(h) ? `${h} %` : h)), 'Discrimination', 'Missing', 'Excused', 'Pending'],
    rows,
  };
}
