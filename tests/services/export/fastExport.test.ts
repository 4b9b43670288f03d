/**
 * The export's split: exportFinals validates, writeExport trusts an already-valid request; finals
 * without explanation lines come from the engine's fast path; a CSV written in blocks
 * (exportCsvRows, the streamed CLI) has tableToCsv's bytes. The reference throughout is the plain
 * engine's gradeCourse (the specification the fast path is property-tested against in
 * tests/engine/fast) and the one-table writer.
 */
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { CourseProject, ExportRequest } from '../../../renderer/bridge/contract';
import { gradeCourse } from '../../../renderer/engine/grading';
import { exportCsvRows, exportFinals, finalsTable, gradeProject, gradeProjectFinalsOnly, tableToCsv, writeExport } from '../../../main/services/export';
import { sampleProject } from '../project/sampleProject';

let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(join(tmpdir(), 'wb-export-fast-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

const columns: ExportRequest['columns'] = [
  { field: 'id', header: 'Student ID' },
  { field: 'name', header: 'Name' },
  { field: 'final', header: 'Final %' },
  { field: 'letter', header: 'Letter' },
  { field: 'gradePoints', header: 'GP' },
];

function request(path: string, project: CourseProject, breakdown = false): ExportRequest {
  return { path, format: 'csv', project, columns, include: { breakdown, sectionStatistics: true, assessmentStatistics: true }, overwrite: false };
}

describe('fast finals for the export', () => {
  it('gradeProjectFinalsOnly gives gradeCourse’s results except the explanation lines', () => {
    const project = sampleProject();
    const fast = gradeProjectFinalsOnly(project);
    const plain = gradeCourse(project.gradebook, project.plan);
    expect(fast.planProblems).toEqual(plain.planProblems);
    expect(fast.results.map((r) => ({ ...r, lines: [] }))).toEqual(plain.students.map((r) => ({ ...r, lines: [] })));
    expect(fast.results.every((r) => r.lines.length === 0)).toBe(true);
  });

  it('writeExport (trusted request) and exportFinals (validated) write the same files as with the plain engine', async () => {
    const project = sampleProject();
    const a = join(dir, 'a.csv');
    const b = join(dir, 'b.csv');
    const c = join(dir, 'c.csv');
    expect((await exportFinals(request(a, project))).ok).toBe(true);
    expect((await writeExport(request(b, project))).ok).toBe(true);
    expect((await writeExport(request(c, project), gradeProject(project))).ok).toBe(true);
    for (const suffix of ['', '.sections', '.assessments']) {
      const bytes = await readFile(join(dir, `a${suffix}.csv`));
      expect(await readFile(join(dir, `b${suffix}.csv`))).toEqual(bytes);
      expect(await readFile(join(dir, `c${suffix}.csv`))).toEqual(bytes);
    }
  });

  it('exportFinals still refuses a malformed request; writeExport is for requests validated before', async () => {
    const project = sampleProject();
    const bad = { ...request(join(dir, 'x.csv'), project), columns: [{ field: 'shoeSize', header: 'x' }] } as unknown as ExportRequest;
    const r = await exportFinals(bad);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/^The export was not written/);
  });
});

describe('exportCsvRows (blocks of rows)', () => {
  it('writes tableToCsv’s bytes for the same rows, including formula-like text and more rows than one block', async () => {
    const project = sampleProject();
    const graded = gradeProject(project);
    const base = finalsTable(project.gradebook, graded, columns);
    // 5 000 rows crosses the 2 000-row block boundary; "=SUM(A1)" must be neutralised (OWASP CSV injection).
    const rows = Array.from({ length: 5000 }, (_, i) => base.rows[i % base.rows.length]!.map((v, c) => (c === 1 && i % 997 === 0 ? '=SUM(A1)' : v)));
    const path = join(dir, 'rows.csv');
    const r = await exportCsvRows({ path, sourcePath: null, projectPath: null, overwrite: false }, base.header, rows.length, (i) => rows[i]!);
    expect(r.ok && r.value.rows).toBe(5000);
    expect(await readFile(path, 'utf8')).toBe(tableToCsv({ name: 'x', header: base.header, rows }));
    expect(await readFile(path, 'utf8')).toContain(`"'=SUM(A1)"`);
  });

  it('refuses an existing file without overwrite, the source gradebook and a plan file', async () => {
    const path = join(dir, 'exists.csv');
    await writeFile(path, 'old');
    const target = { path, sourcePath: null, projectPath: null, overwrite: false };
    const r = await exportCsvRows(target, ['a'], 1, () => [1]);
    expect(r.ok ? null : r.code).toBe('exists');
    expect(await readFile(path, 'utf8')).toBe('old');
    const src = await exportCsvRows({ ...target, sourcePath: path, overwrite: true }, ['a'], 1, () => [1]);
    expect(src.ok ? null : src.message).toMatch(/source spreadsheet/);
    const planPath = join(dir, 'p.csv');
    await writeFile(planPath, '{"format": "weighbridge-plan"}');
    const plan = await exportCsvRows({ ...target, path: planPath, overwrite: true }, ['a'], 1, () => [1]);
    expect(plan.ok ? null : plan.message).toMatch(/project or plan file/);
    const ok = await exportCsvRows({ ...target, overwrite: true }, ['a'], 1, () => [1]);
    expect(ok.ok).toBe(true);
    expect(await readFile(path, 'utf8')).toBe('\uFEFFa\r\n1\r\n');
  });
});
