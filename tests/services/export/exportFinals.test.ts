import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import * as XLSX from 'xlsx';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { CourseProject, ExportRequest } from '../../../renderer/bridge/contract';
import { gradeCourse } from '../../../renderer/engine/grading';
import { describe as describeStats } from '../../../renderer/engine/stats';
import { csvSiblingPath, exportFinals, stripNeutraliser, tableToCsv } from '../../../main/services/export';
import { saveProject } from '../../../main/services/project';
import { readBook, cellText } from '../../../main/services/spreadsheet/readBook';
import { sampleProject } from '../project/sampleProject';

let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(join(tmpdir(), 'wb-export-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

const allColumns: ExportRequest['columns'] = [
  { field: 'section', header: 'Sect.' },
  { field: 'id', header: 'Student number' },
  { field: 'name', header: 'Name' },
  { field: 'final', header: 'Final %' },
  { field: 'letter', header: 'Grade' },
  { field: 'gradePoints', header: 'GP' },
  { field: 'email', header: 'E-mail' },
];

function request(path: string, format: 'csv' | 'xlsx', project: CourseProject = sampleProject(), extra: Partial<ExportRequest> = {}): ExportRequest {
  return {
    path,
    format,
    project,
    columns: allColumns,
    include: { breakdown: true, sectionStatistics: true, assessmentStatistics: true },
    overwrite: false,
    ...extra,
  };
}

function readSheet(bytes: Buffer, name: string): XLSX.WorkSheet {
  const book = XLSX.read(bytes, { type: 'buffer' });
  const sheet = book.Sheets[name];
  if (!sheet) throw new Error(`no sheet ${name}; have ${book.SheetNames.join(', ')}`);
  return sheet;
}

describe('exportFinals: xlsx', () => {
  it('writes finals from gradeCourse as numeric cells in the chosen column order, plus the extra sheets', async () => {
    const path = join(dir, 'finals.xlsx');
    const project = sampleProject();
    const r = await exportFinals(request(path, 'xlsx', project));
    expect(r).toEqual({ ok: true, value: { path, rows: 3 } });
    const bytes = await readFile(path);
    expect(XLSX.read(bytes, { type: 'buffer' }).SheetNames).toEqual(['Final marks', 'Breakdown', 'Section statistics', 'Assessment statistics']);
    const sheet = readSheet(bytes, 'Final marks');
    expect(['A1', 'B1', 'C1', 'D1', 'E1', 'F1', 'G1'].map((a) => sheet[a]?.v)).toEqual(['Sect.', 'Student number', 'Name', 'Final %', 'Grade', 'GP', 'E-mail']);
    const expected = gradeCourse(project.gradebook, project.plan).students;
    project.gradebook.students.forEach((s, i) => {
      const row = i + 2;
      expect(sheet[`B${row}`]?.v).toBe(s.id);
      const final = expected[i]!.final;
      if (final === null) expect(sheet[`D${row}`]).toBeUndefined();
      else expect(sheet[`D${row}`]).toMatchObject({ t: 'n', v: final });
      expect(sheet[`E${row}`]?.v).toBe(expected[i]!.letter ?? undefined);
    });
    // The crafted name is neutralised in xlsx too.
    expect(sheet['C3']?.v).toBe('\'=HYPERLINK("x")');
  });

  it('keeps negative numbers numeric (assessment statistics of a negative mark)', async () => {
    const path = join(dir, 'finals.xlsx');
    await exportFinals(request(path, 'xlsx'));
    const sheet = readSheet(await readFile(path), 'Assessment statistics');
    const rows = XLSX.utils.sheet_to_json<Record<string, unknown>>(sheet);
    const exam = rows.find((r) => r['Assessment'] === 'Exam');
    // Exam: 41/50, 30/50, −2/50 → percents 82, 60, −4; minimum −4 % (arithmetic from the fixture).
    expect(exam?.['Min %']).toBe(-4);
    const minCell = Object.entries(sheet).find(([, c]) => (c as XLSX.CellObject).v === -4);
    expect((minCell?.[1] as XLSX.CellObject | undefined)?.t).toBe('n');
  });

  it('section statistics equal describe() on the finals of each section', async () => {
    const path = join(dir, 'finals.xlsx');
    const project = sampleProject();
    await exportFinals(request(path, 'xlsx', project));
    const rows = XLSX.utils.sheet_to_json<Record<string, unknown>>(readSheet(await readFile(path), 'Section statistics'));
    const results = gradeCourse(project.gradebook, project.plan).students;
    const finalsOf = (section: string | null) =>
      results.filter((r) => section === null || r.section === section).flatMap((r) => (r.final === null ? [] : [r.final]));
    for (const [label, section] of [['A', 'A'], ['B', 'B'], ['All sections', null]] as const) {
      const row = rows.find((r) => r['Section'] === label);
      const s = describeStats(finalsOf(section));
      expect(row?.['n']).toBe(s.n);
      expect(row?.['Mean']).toBe(s.mean.defined ? s.mean.value : undefined);
      expect(row?.['Sample SD']).toBe(s.sampleSd.defined ? s.sampleSd.value : undefined);
      if (!s.sampleSd.defined) expect(String(row?.['Notes'])).toContain(s.sampleSd.reason);
    }
  });
});

describe('exportFinals: csv', () => {
  it('writes UTF-8 with BOM, CRLF, neutralised quoted text and plain numbers; siblings for the extras', async () => {
    const path = join(dir, 'finals.csv');
    const project = sampleProject();
    expect((await exportFinals(request(path, 'csv', project))).ok).toBe(true);
    const bytes = await readFile(path);
    expect([...bytes.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const text = bytes.toString('utf8').slice(1);
    const lines = text.split('\r\n');
    expect(lines[0]).toBe('Sect.,Student number,Name,Final %,Grade,GP,E-mail');
    expect(lines[1]).toContain('Zoë Ångström');
    expect(lines[2]).toContain('"\'=HYPERLINK(""x"")"');
    const finals = gradeCourse(project.gradebook, project.plan).students;
    expect(lines[1]!.split(',')[3]).toBe(String(finals[0]!.final));
    for (const suffix of ['breakdown', 'sections', 'assessments'] as const) {
      const sibling = await readFile(csvSiblingPath(path, suffix), 'utf8');
      expect(sibling.startsWith('\uFEFF')).toBe(true);
    }
    expect(csvSiblingPath(path, 'breakdown')).toBe(join(dir, 'finals.breakdown.csv'));
  });

  it('writes negative numbers as numbers and negative-looking text as neutralised text', () => {
    const csv = tableToCsv({ name: 't', header: ['n', 't'], rows: [[-5, '-5'], [3.25, '@x'], [null, '\tx']] });
    expect(csv).toBe('\uFEFFn,t\r\n-5,"\'-5"\r\n3.25,"\'@x"\r\n,"\'\tx"\r\n');
  });

  it('round trip: the re-imported export, neutraliser stripped, gives back names and finals', async () => {
    const path = join(dir, 'finals.csv');
    const project = sampleProject();
    await exportFinals(request(path, 'csv', project, { include: { breakdown: false, sectionStatistics: false, assessmentStatistics: false } }));
    const read = readBook(await readFile(path), 'finals.csv');
    expect(read.ok).toBe(true);
    if (!read.ok) return;
    const rows = read.book.sheets[0]!.rows;
    const results = gradeCourse(project.gradebook, project.plan).students;
    project.gradebook.students.forEach((s, i) => {
      const row = rows[i + 1]!;
      expect(stripNeutraliser(cellText(row[2]))).toBe(s.name);
      expect(cellText(row[3])).toBe(results[i]!.final === null ? '' : String(results[i]!.final));
    });
  });
});

describe('exportFinals: refusals', () => {
  it('refuses to replace an existing file unless confirmed', async () => {
    const path = join(dir, 'finals.csv');
    await writeFile(path, 'old');
    const r = await exportFinals(request(path, 'csv'));
    expect(!r.ok && r.code).toBe('exists');
    expect(await readFile(path, 'utf8')).toBe('old');
    expect((await exportFinals(request(path, 'csv', undefined, { overwrite: true }))).ok).toBe(true);
  });

  it('refuses an existing sibling before writing anything', async () => {
    const path = join(dir, 'finals.csv');
    await writeFile(csvSiblingPath(path, 'sections'), 'mine');
    const r = await exportFinals(request(path, 'csv'));
    expect(!r.ok && r.code).toBe('exists');
    await expect(readFile(path)).rejects.toThrow();
  });

  it('never writes the source spreadsheet, even when overwrite is confirmed', async () => {
    const sheet = join(dir, 'scores.csv');
    await writeFile(sheet, 'source bytes');
    const project = sampleProject({
      source: { path: sheet, fileName: 'scores.csv', sha256: 'b'.repeat(64), importedAt: '2025-01-01T00:00:00Z', layout: { sheets: [], sectionFrom: 'column', tokens: { excused: [], missing: [], pending: [] } } },
    });
    const r = await exportFinals(request(sheet, 'csv', project, { overwrite: true }));
    expect(!r.ok && r.code).toBe('bad-input');
    if (!r.ok) expect(r.message).toContain('source spreadsheet');
    expect(await readFile(sheet, 'utf8')).toBe('source bytes');
  });

  it('never replaces a project file (by path or by content)', async () => {
    const projectPath = join(dir, 'course.csv');
    await saveProject(projectPath, sampleProject());
    const before = await readFile(projectPath);
    const byPath = await exportFinals(request(projectPath, 'csv', undefined, { overwrite: true, projectPath }));
    expect(!byPath.ok && byPath.message).toContain('open project file');
    const byContent = await exportFinals(request(projectPath, 'csv', undefined, { overwrite: true }));
    expect(!byContent.ok && byContent.message).toContain('Weighbridge project or plan file');
    expect(await readFile(projectPath)).toEqual(before);
  });

  it('refuses a file name that does not match the format, and invalid requests', async () => {
    const r = await exportFinals(request(join(dir, 'finals.xlsx'), 'csv'));
    expect(!r.ok && r.code).toBe('bad-input');
    const bad = await exportFinals({ ...request(join(dir, 'f.csv'), 'csv'), columns: [] });
    expect(!bad.ok && bad.message).toContain('request.columns');
  });
});
