/**
 * The export's statistics sheets are the engine's analysis, not a second computation: on the demo
 * course (input only — invented data is not evidence for a value) every row of "Section
 * statistics" equals `sectionStatistics()` on final marks and every row of "Assessment statistics"
 * equals `sectionStatistics()` on that assessment plus `itemAnalysis()`. Outliers are named by
 * student ID and each one is checked against Tukey's rule (strictly beyond Q1 − 1.5·IQR or
 * Q3 + 1.5·IQR; Tukey 1977) on the student's own mark.
 */
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import * as XLSX from 'xlsx';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CourseProject } from '../../../renderer/bridge/contract';
import type { Defined } from '../../../renderer/engine/defined';
import { describeLeftOut, itemAnalysis, sectionsOf, sectionStatistics, type LeftOutCount } from '../../../renderer/engine/analysis';
import { gradeCourse } from '../../../renderer/engine/grading';
import type { Summary } from '../../../renderer/engine/stats';
import { exportFinals, gradeProject, sectionStatisticsTable } from '../../../main/services/export';
import { sampleProject } from '../project/sampleProject';
import { loadDemoCourse } from '../../../main/services/demo';

let dir: string;
let project: CourseProject;
let sheets: Record<string, (string | number | null)[][]>;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'wb-export-stats-'));
  const demo = await loadDemoCourse();
  if (!demo.ok) throw new Error(demo.message);
  project = demo.value;
  const path = join(dir, 'demo.xlsx');
  const written = await exportFinals({
    path,
    format: 'xlsx',
    project,
    columns: [{ field: 'id', header: 'Student ID' }],
    include: { breakdown: false, sectionStatistics: true, assessmentStatistics: true },
    overwrite: false,
  });
  if (!written.ok) throw new Error(written.message);
  const book = XLSX.read(await readFile(path), { type: 'buffer' });
  sheets = {};
  for (const name of ['Section statistics', 'Assessment statistics']) {
    const sheet = book.Sheets[name];
    if (!sheet) throw new Error(`no sheet ${name}; have ${book.SheetNames.join(', ')}`);
    sheets[name] = XLSX.utils.sheet_to_json<(string | number | null)[]>(sheet, { header: 1, defval: null, raw: true });
  }
});

afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

const v = (d: Defined<number>): number | null => (d.defined ? d.value : null);

/** The statistic cells in the sheet's column order (n … Upper fence), from a summary. */
function statNumbers(s: Summary): (number | null)[] {
  return [s.n, v(s.mean), v(s.median), v(s.sampleSd), v(s.populationSd), v(s.min), v(s.max), v(s.q1), v(s.q3), v(s.iqr), v(s.lowerFence), v(s.upperFence)];
}

/** "ID (value), ID (value)" from the sheet, as pairs. */
function outliersIn(cell: string | number | null): { id: string; value: number }[] {
  if (cell === null || cell === '') return [];
  return String(cell).split(', ').map((part) => {
    const m = /^(.+) \((-?[\d.e+-]+)\)$/.exec(part);
    if (!m) throw new Error(`outlier cell part "${part}" is not "ID (value)"`);
    return { id: m[1]!, value: Number(m[2]) };
  });
}

function expectTukeyOutlier(s: Summary, value: number) {
  // Tukey (1977): an outlier lies strictly beyond a fence.
  const lo = v(s.lowerFence);
  const hi = v(s.upperFence);
  expect(lo !== null && hi !== null && (value < lo || value > hi)).toBe(true);
}

function expectLeftOutNoted(notes: string | number | null, leftOut: readonly LeftOutCount[]) {
  if (leftOut.length === 0) return;
  expect(String(notes)).toContain(describeLeftOut(leftOut));
}

describe('export "Section statistics" sheet = sectionStatistics() on final marks (demo course)', () => {
  it('one row per section in the engine order, then the course; every figure equal', () => {
    const book = project.gradebook;
    const results = gradeCourse(book, project.plan).students;
    const stats = sectionStatistics(book, results, { measure: { kind: 'final' } });
    const [header, ...rows] = sheets['Section statistics']!;
    expect(header).toEqual(['Section', 'n', 'Mean', 'Median', 'Sample SD', 'Population SD', 'Min', 'Max', 'Q1', 'Q3', 'IQR', 'Lower fence', 'Upper fence', 'Outliers', 'Quantile method', 'Notes']);
    expect(rows.map((r) => r[0])).toEqual([...sectionsOf(book), 'All sections']);
    const groups = [
      ...stats.sections.map((g) => ({ summary: g.summary, indices: g.studentIndices, leftOut: g.leftOut })),
      { summary: stats.course, indices: stats.courseStudentIndices, leftOut: stats.leftOut },
    ];
    expect(rows).toHaveLength(groups.length);
    groups.forEach((g, k) => {
      const row = rows[k]!;
      expect(row.slice(1, 13)).toEqual(statNumbers(g.summary));
      expect(row[14]).toBe(g.summary.quantileMethod);
      // Outliers by student ID (the screen names them), the same students as the engine's.
      const shown = outliersIn(row[13] ?? null);
      const ids = g.summary.outliers.map((o) => book.students[g.indices[o.index]!]!.id);
      expect(shown.map((o) => o.id)).toEqual(ids);
      for (const o of shown) {
        const i = book.students.findIndex((s) => s.id === o.id);
        expect(results[i]!.final).toBe(o.value);
        expectTukeyOutlier(g.summary, o.value);
      }
      expectLeftOutNoted(row[15] ?? null, g.leftOut);
    });
    // Every student is in the n of the course or among its left-out count.
    const course = rows[rows.length - 1]!;
    const leftOut = stats.leftOut.reduce((n, c) => n + c.count, 0);
    expect(Number(course[1]) + leftOut).toBe(book.students.length);
    expect(Number(course[1])).toBe(results.filter((r) => r.final !== null).length);
  });
});

describe('export "Assessment statistics" sheet = sectionStatistics() per assessment + itemAnalysis() (demo course)', () => {
  it('one row per assessment: item-percent statistics, discrimination and cell counts', () => {
    const book = project.gradebook;
    const results = gradeCourse(book, project.plan).students;
    const items = itemAnalysis(book, project.plan);
    const [header, ...rows] = sheets['Assessment statistics']!;
    expect(header).toEqual([
      'Assessment', 'Points possible', 'n', 'Mean %', 'Median %', 'Sample SD %', 'Population SD %', 'Min %', 'Max %', 'Q1 %', 'Q3 %', 'IQR %',
      'Lower fence %', 'Upper fence %', 'Outliers', 'Quantile method', 'Notes', 'Discrimination', 'Missing', 'Excused', 'Pending',
    ]);
    expect(rows.map((r) => r[0])).toEqual(book.assessments.map((a) => a.name));
    items.forEach((item, k) => {
      const row = rows[k]!;
      const a = book.assessments[k]!;
      const stats = sectionStatistics(book, results, { measure: { kind: 'assessment', assessmentId: item.assessmentId } });
      expect(row[1]).toBe(a.possible);
      expect(row.slice(2, 14)).toEqual(statNumbers(stats.course));
      expect(row[15]).toBe(stats.course.quantileMethod);
      expect(row[17]).toBe(v(item.discrimination));
      if (!item.discrimination.defined) expect(String(row[16])).toContain(item.discrimination.reason);
      expect(row.slice(18, 21)).toEqual([item.missing, item.excused, item.pending]);
      // The two engine paths agree on who is left out, and with the cells themselves.
      const count = (reason: string) => stats.leftOut.find((c) => c.reason === reason)?.count ?? 0;
      expect([count('missing'), count('excused'), count('pending')]).toEqual([item.missing, item.excused, item.pending]);
      const kinds = book.students.map((_, i) => book.scores[i]?.[k]?.kind ?? 'missing');
      expect(row[2]).toBe(kinds.filter((x) => x === 'earned').length);
      expect(item.missing).toBe(kinds.filter((x) => x === 'missing').length);
      // The mean is the classical difficulty of the item analysis.
      if (item.meanPercent.defined) expect(row[3]).toBeCloseTo(item.meanPercent.value, 9);
      else expect(row[3]).toBeNull();
      for (const o of outliersIn(row[14] ?? null)) {
        const i = book.students.findIndex((s) => s.id === o.id);
        const cell = book.scores[i]?.[k];
        expect(cell?.kind === 'earned' ? (cell.points * 100) / a.possible : null).toBe(o.value);
        expectTukeyOutlier(stats.course, o.value);
      }
    });
  });
});

describe('export "Section statistics": students without a final mark', () => {
  it('are left out of n and named in Notes with the engine wording, per section and for the course', () => {
    const base = sampleProject();
    // S3 (section B) has nothing graded: no category counts for them, so no final mark.
    const pending = { kind: 'pending' } as const;
    const project = sampleProject({ gradebook: { ...base.gradebook, scores: [base.gradebook.scores[0]!, base.gradebook.scores[1]!, [pending, pending, pending]] } });
    const graded = gradeProject(project);
    expect(graded.results[2]!.final).toBeNull();
    const stats = sectionStatistics(project.gradebook, graded.results, { measure: { kind: 'final' } });
    expect(stats.leftOut).toEqual([{ reason: 'noMark', count: 1 }]);
    const rows = sectionStatisticsTable(project.gradebook, graded).rows;
    const b = rows.find((r) => r[0] === 'B')!;
    const all = rows.find((r) => r[0] === 'All sections')!;
    expect(b[1]).toBe(0);
    expect(all[1]).toBe(2);
    for (const row of [b, all]) expect(String(row[15])).toContain(describeLeftOut(stats.leftOut));
    expect(String(rows.find((r) => r[0] === 'A')![15])).not.toContain('left out');
  });
});
