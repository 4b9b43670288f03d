/**
 * Formula-injection defence survives our own round trip. Source: OWASP, "CSV Injection"
 * (owasp.org/www-community/attacks/CSV_Injection): a field beginning with `=`, `+`, `-`, `@`,
 * tab (0x09), carriage return (0x0D) or line feed (0x0A) is prefixed with a single quote `'` (and
 * the CSV field quoted), and spreadsheet programs look past leading spaces and quotes before
 * deciding a cell is a formula. The export does that (main/services/export/neutralise.ts); the
 * import must take the `'` off identity cells again, so exporting a roster and importing the
 * export gives back the same IDs, names, sections and e-mails. Numbers are never prefixed, so a
 * negative number stays numeric.
 */
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import * as XLSX from 'xlsx';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CourseProject, ExportRequest, ImportLayout } from '../../renderer/bridge/contract';
import type { Score, Student } from '../../renderer/engine/model';
import { exportFinals, neutraliseCell, tableToCsv, tablesToXlsx } from '../../main/services/export';
import { detectAndImportBytes, importSpreadsheet, previewSpreadsheet } from '../../main/services/spreadsheet';

/** Every OWASP trigger, bare, after spaces and after a quote, plus text that looks like a number. */
const CASES = ['=1+1', '+SUM(A1)', '-2+3', '@cmd', '\t=x', '\r=x', '\n=x', '  =x', '"=x', ' "@x', "'=x", '-5', '=HYPERLINK("http://example.invalid","y")'];

function student(text: string, i: number): Student {
  // IDs must be unique: the i-th case, and a copy of the next one so that every case also appears as an ID.
  return { id: text, name: CASES[(i + 1) % CASES.length] ?? text, section: CASES[(i + 2) % CASES.length] ?? text, email: `${CASES[(i + 3) % CASES.length] ?? ''}@example.invalid` };
}

const students = CASES.map(student);
const scores: Score[][] = CASES.map((_, i) => [{ kind: 'earned', points: i % 11 }]);

const project: CourseProject = {
  title: 'Injection round trip',
  gradebook: { students, assessments: [{ id: 'q', name: 'Quiz', possible: 10 }], scores },
  plan: {
    categories: [{ id: 'c', name: 'Quizzes', weight: 100, combine: 'totalPoints', dropLowest: 0, missingAs: 'zero', capPercent: null, droppedForCourse: false }],
    items: { q: { categoryId: 'c', extraCredit: false } },
    sectionWaivers: [],
    studentWaivers: [],
    markMode: 'current',
    scale: { name: 'Pass/fail', cutoffs: [{ letter: 'P', minPercent: 50 }, { letter: 'F', minPercent: 0 }] },
    rounding: { decimals: 2 },
    adjustments: [],
  },
  source: null,
  notes: '',
};

const columns: ExportRequest['columns'] = [
  { field: 'id', header: 'Student ID' },
  { field: 'name', header: 'Name' },
  { field: 'section', header: 'Section' },
  { field: 'email', header: 'E-mail' },
  { field: 'final', header: 'Final %' },
];

let dir = '';
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'wb-inject-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

/** The detected layout, with "Final %" marked as an assessment out of 100 (what the user does in the preview). */
async function layoutFor(path: string): Promise<ImportLayout> {
  const preview = await previewSpreadsheet(path);
  if (!preview.ok) throw new Error(preview.message);
  const detected = preview.value.detected;
  return {
    ...detected,
    sheets: detected.sheets.map((s) => ({
      ...s,
      columns: s.columns.map((c) => (c.header === 'Final %' ? { ...c, role: 'assessment' as const, possible: 100 } : c)),
    })),
  };
}

describe.each(['csv', 'xlsx'] as const)('OWASP CSV Injection round trip through %s', (format) => {
  it('exports every trigger neutralised and re-imports the identical roster', async () => {
    const path = join(dir, `finals.${format}`);
    const written = await exportFinals({ path, format, project, columns, include: { breakdown: false, sectionStatistics: false, assessmentStatistics: false }, overwrite: true });
    expect(written.ok).toBe(true);

    // The file really holds the neutralised text (so the import below has something to undo).
    if (format === 'csv') {
      const text = await readFile(path, 'utf8');
      expect(text).toContain(`"'=1+1"`);
      expect(text).toContain(`"'\t=x"`);
      expect(text).toContain(`"'-5"`); // the ID "-5" is text, so it is neutralised like text
    } else {
      const sheet = XLSX.read(await readFile(path), { type: 'buffer' }).Sheets['Final marks'];
      expect(sheet?.['A2']).toMatchObject({ t: 's', v: "'=1+1" });
    }

    const imported = await importSpreadsheet(path, await layoutFor(path));
    if (!imported.ok) throw new Error(imported.message);
    const back = imported.value.gradebook.students;
    expect(back.map((s) => s.id)).toEqual(students.map((s) => s.id));
    expect(back.map((s) => s.name)).toEqual(students.map((s) => s.name));
    expect(back.map((s) => s.section)).toEqual(students.map((s) => s.section));
    expect(back.map((s) => s.email)).toEqual(students.map((s) => s.email));
  });
});

describe('split name columns', () => {
  it('take the neutraliser off first and last names too, and keep a quote that was not one', () => {
    const csv = [
      'Student ID,Last name,First name,Quiz (10)',
      `"${neutraliseCell('=a')}","${neutraliseCell('+b')}","${neutraliseCell('@c')}",7`,
      `S2,'tis,O'Neil,8`,
    ].join('\n');
    const r = detectAndImportBytes(new TextEncoder().encode(csv), 'names.csv');
    if (!r.ok) throw new Error(r.message);
    expect(r.value.gradebook.students.map((s) => [s.id, s.name])).toEqual([['=a', '+b, @c'], ['S2', "'tis, O'Neil"]]);
  });
});

describe('numbers are never neutralised', () => {
  const table = { name: 'T', header: ['Value', 'Text'], rows: [[-2.5, '-2.5'], [-40, '=1+1']] };

  it('csv: a negative number is written bare, the same characters as text are prefixed and quoted', () => {
    const lines = tableToCsv(table).replace(/^\uFEFF/, '').split('\r\n');
    expect(lines[1]).toBe(`-2.5,"'-2.5"`);
    expect(lines[2]).toBe(`-40,"'=1+1"`);
  });

  it('xlsx: a negative number is a numeric cell', () => {
    const sheet = XLSX.read(tablesToXlsx([table]), { type: 'buffer' }).Sheets['T'];
    expect(sheet?.['A2']).toMatchObject({ t: 'n', v: -2.5 });
    expect(sheet?.['B2']).toMatchObject({ t: 's', v: neutraliseCell('-2.5') });
  });
});
