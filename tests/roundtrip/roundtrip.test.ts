/**
 * The whole path a course takes, end to end through the real services: the demo spreadsheet (xlsx
 * and csv) → detectAndImport → a project with the demo plan → saveProject → loadProject → graded →
 * exportFinals (xlsx and csv) → the export read back. Nothing may change on the way: the loaded
 * gradebook equals the imported one score for score, the two source formats give the same
 * gradebook, the exported finals read back are exactly gradeCourse's, and the source file's bytes
 * (SHA-256) are untouched. The demo course is invented input here, not evidence for any grading
 * value: the expected finals come from the engine called directly.
 */
import { createHash } from 'node:crypto';
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { basename, join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CourseProject, ExportFormat, ExportRequest, ImportLayout } from '../../renderer/bridge/contract';
import type { Gradebook, GradingPlan } from '../../renderer/engine/model';
import { gradeCourse } from '../../renderer/engine/grading';
import { exportFinals } from '../../main/services/export';
import { loadPlanFile, loadProject, saveProject } from '../../main/services/project';
import { detectAndImport, importSpreadsheet, previewSpreadsheet, readColumn } from '../../main/services/spreadsheet';

const root = resolve(import.meta.dirname, '../..');
const sources = {
  xlsx: join(root, 'demo-data', 'glaciology-231.xlsx'),
  csv: join(root, 'demo-data', 'glaciology-231.csv'),
} as const;
const planPath = join(root, 'demo-data', 'glaciology-231.plan.json');

const sha256 = async (path: string) => createHash('sha256').update(await readFile(path)).digest('hex');

const columns: ExportRequest['columns'] = [
  { field: 'id', header: 'Student ID' },
  { field: 'name', header: 'Name' },
  { field: 'section', header: 'Section' },
  { field: 'final', header: 'Final %' },
  { field: 'letter', header: 'Letter' },
];

interface Course {
  readonly shaBefore: string;
  readonly imported: Gradebook;
  readonly project: CourseProject;
  readonly projectPath: string;
}

let work = '';
let plan: GradingPlan;
const courses = new Map<keyof typeof sources, Course>();

beforeAll(async () => {
  work = await mkdtemp(join(tmpdir(), 'wb-roundtrip-'));
  const loaded = await loadPlanFile(planPath);
  if (!loaded.ok) throw new Error(loaded.message);
  plan = loaded.value;
  for (const [kind, path] of Object.entries(sources) as [keyof typeof sources, string][]) {
    const shaBefore = await sha256(path);
    const imported = await detectAndImport(path);
    if (!imported.ok) throw new Error(imported.message);
    const { gradebook, layout } = imported.value;
    const project: CourseProject = {
      title: `Glaciology 231 (${kind})`,
      gradebook,
      plan,
      source: { path, fileName: basename(path), sha256: shaBefore, importedAt: '2025-01-15T09:00:00.000Z', layout },
      notes: '',
    };
    const projectPath = join(work, `course-${kind}.weighbridge`);
    const saved = await saveProject(projectPath, project);
    if (!saved.ok) throw new Error(saved.message);
    courses.set(kind, { shaBefore, imported: gradebook, project, projectPath });
  }
});

afterAll(async () => {
  await rm(work, { recursive: true, force: true });
});

function course(kind: keyof typeof sources): Course {
  const c = courses.get(kind);
  if (c === undefined) throw new Error(`no ${kind} course`);
  return c;
}

/** Student ID → final mark (null: no final), from the engine directly. */
function expectedFinals(book: Gradebook): Map<string, number | null> {
  const { students } = gradeCourse(book, plan);
  return new Map(students.map((r) => [r.studentId, r.final]));
}

/**
 * The layout a user marks in the preview for an export: its first sheet (the final marks), the
 * header in row 1, each exported column in its role, and "Final %" as an assessment out of 100.
 * (On an xlsx export with extras, detection proposes the Breakdown sheet, so it is not used here.)
 */
async function finalsAsAssessment(path: string): Promise<ImportLayout> {
  const preview = await previewSpreadsheet(path);
  if (!preview.ok) throw new Error(preview.message);
  const sheet = preview.value.sheets[0];
  if (sheet === undefined) throw new Error('the export has no sheet');
  expect(sheet.rows[0]).toEqual(columns.map((c) => c.header));
  const roles = { id: 'id', name: 'name', section: 'section', final: 'assessment', letter: 'ignore' } as const;
  return {
    sheets: [{
      sheet: sheet.name,
      headerRow: 0,
      possibleRow: null,
      columns: columns.map((c, index) => {
        const role = roles[c.field as keyof typeof roles];
        return role === 'assessment' ? { index, header: c.header, role, possible: 100 } : { index, header: c.header, role };
      }),
    }],
    sectionFrom: 'column',
    tokens: preview.value.detected.tokens,
  };
}

describe.each(['xlsx', 'csv'] as const)('demo %s: import → save → load', (kind) => {
  it('loads back the identical project, every score included', async () => {
    const c = course(kind);
    const loaded = await loadProject(c.projectPath);
    if (!loaded.ok) throw new Error(loaded.message);
    expect(loaded.value.gradebook).toEqual(c.imported);
    expect(loaded.value).toEqual(c.project);
    // Spelled out as well, so a failure names the student and assessment.
    const n = c.imported.students.length * c.imported.assessments.length;
    expect(n).toBeGreaterThan(0);
    c.imported.scores.forEach((row, i) => row.forEach((score, j) => expect([i, j, loaded.value.gradebook.scores[i]?.[j]]).toEqual([i, j, score])));
  });
});

describe('demo xlsx and csv', () => {
  it('give equal gradebooks', () => {
    expect(course('csv').imported).toEqual(course('xlsx').imported);
  });
});

describe.each(['xlsx', 'csv'] as const)('demo %s → export', (kind) => {
  describe.each(['xlsx', 'csv'] as ExportFormat[])('as %s', (format) => {
    it('reads back exactly the finals gradeCourse gives, and leaves the source untouched', async () => {
      const c = course(kind);
      const loaded = await loadProject(c.projectPath);
      if (!loaded.ok) throw new Error(loaded.message);
      const path = join(work, `finals-${kind}.${format}`);
      const written = await exportFinals({
        path,
        format,
        project: loaded.value,
        columns,
        include: { breakdown: true, sectionStatistics: true, assessmentStatistics: true },
        overwrite: false,
        projectPath: c.projectPath,
      });
      if (!written.ok) throw new Error(written.message);
      const expected = expectedFinals(c.imported);
      expect(written.value.rows).toBe(expected.size);

      // 1. The Final % column read with readColumn: value per student ID, blanks for "no final".
      const read = await readColumn(path, { column: 'Final %' });
      if (!read.ok) throw new Error(read.message);
      const back = new Map<string, number | null>(read.value.values.map((v) => [v.label, v.value]));
      for (const s of read.value.skipped) {
        expect(s.reason).toBe('blank');
        back.set(s.label, null);
      }
      expect(back.size).toBe(expected.size);
      for (const [id, final] of expected) expect([id, back.get(id)]).toEqual([id, final]);

      // 2. The export imported as a gradebook, Final % as an assessment out of 100.
      const imported = await importSpreadsheet(path, await finalsAsAssessment(path));
      if (!imported.ok) throw new Error(imported.message);
      const book = imported.value.gradebook;
      expect(book.students.map((s) => s.id)).toEqual(c.imported.students.map((s) => s.id));
      expect(book.students.map((s) => [s.name, s.section])).toEqual(c.imported.students.map((s) => [s.name, s.section]));
      book.students.forEach((s, i) => {
        const cell = book.scores[i]?.[0];
        const final = expected.get(s.id);
        expect([s.id, cell]).toEqual([s.id, final === null || final === undefined ? { kind: 'missing' } : { kind: 'earned', points: final }]);
      });

      expect(await sha256(sources[kind])).toBe(c.shaBefore);
    });
  });
});
