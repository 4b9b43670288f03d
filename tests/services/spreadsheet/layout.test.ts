import { describe, expect, it } from 'vitest';
import type { ImportLayout } from '../../../renderer/bridge/contract';
import { DEFAULT_TOKENS } from '../../../renderer/engine/grading/parseScore';
import { columnLetter, detectAndImportBytes, importWorkbookBytes, previewWorkbookBytes } from '../../../main/services/spreadsheet';
import { roleFromHeader } from '../../../main/services/spreadsheet/headerWords';
import { workbookBytes, type FixtureSheet } from './fixtures';

function preview(sheets: FixtureSheet[], name = 'book.xlsx') {
  const r = previewWorkbookBytes(workbookBytes(sheets), name);
  if (!r.ok) throw new Error(r.message);
  return r.value;
}

function imported(sheets: FixtureSheet[]) {
  const r = detectAndImportBytes(workbookBytes(sheets), 'book.xlsx');
  if (!r.ok) throw new Error(`${r.message}\n${JSON.stringify(r.problems, null, 1)}`);
  return r.value;
}

describe('columnLetter', () => {
  // Excel's last column is XFD, the 16 384th (Microsoft, "Excel specifications and limits").
  it.each([
    [0, 'A'],
    [25, 'Z'],
    [26, 'AA'],
    [51, 'AZ'],
    [52, 'BA'],
    [701, 'ZZ'],
    [702, 'AAA'],
    [16383, 'XFD'],
  ])('%i → %s', (index, letter) => {
    expect(columnLetter(index)).toBe(letter);
  });
});

describe('roles from header words (common practice, no source)', () => {
  it.each([
    ['Student ID', 'id'],
    ['Student #', 'id'],
    ['ID number', 'id'],
    ['Matric No.', 'id'],
    ['Name', 'name'],
    ['Student name', 'name'],
    ['First name', 'firstName'],
    ['Surname', 'lastName'],
    ['Section', 'section'],
    ['Class', 'section'],
    ['Lab group', 'section'],
    ['E-mail', 'email'],
    ['Email address', 'email'],
    ['Total', 'ignore'],
    ['Final grade', 'ignore'],
    ['Comments', 'ignore'],
    ['Due date', 'ignore'],
    ['%', 'ignore'],
    // Left to the cells: these are usually assessments.
    ['Final exam', null],
    ['Class participation', null],
    ['Lab', null],
    ['Lab 1', null],
    ['Quiz 1 (20)', null],
  ] as const)('%s → %s', (header, role) => {
    expect(roleFromHeader(header)).toBe(role);
  });
});

describe('layout detection', () => {
  it('skips title rows, finds a labelled points-possible row and ignores totals, comments and dates', () => {
    const p = preview([
      {
        name: 'Term 2',
        rows: [
          ['Chemistry 101 — scores'],
          ['Exported 2026-05-01'],
          [],
          ['Student ID', 'Name', 'Quiz 1', 'Lab report', 'Total', 'Comments', 'Submitted date'],
          ['Points possible', null, 10, 25, 35],
          [1001, 'Ann Lee', 9, 20, 29, 'fine', 46000],
          [1002, 'Bo Chen', 7.5, 'EX', 7.5, null, 46001],
          [],
          ['Class average', null, 8.25, 20],
        ],
      },
    ]);
    const sheet = p.detected.sheets[0];
    expect(sheet).toEqual({
      sheet: 'Term 2',
      headerRow: 3,
      possibleRow: 4,
      columns: [
        { index: 0, header: 'Student ID', role: 'id' },
        { index: 1, header: 'Name', role: 'name' },
        { index: 2, header: 'Quiz 1', role: 'assessment', possible: 10 },
        { index: 3, header: 'Lab report', role: 'assessment', possible: 25 },
        { index: 4, header: 'Total', role: 'ignore' },
        { index: 5, header: 'Comments', role: 'ignore' },
        { index: 6, header: 'Submitted date', role: 'ignore' },
      ],
    });
    expect(p.detected.sectionFrom).toBe('column');
    expect(p.problems).toEqual([
      {
        severity: 'warning',
        code: 'summary-row-skipped',
        message: 'Sheet "Term 2", row 9: this row ("Class average") looks like a summary of the students, not a student, and was skipped.',
        at: { sheet: 'Term 2', row: 9, value: 'Class average' },
      },
    ]);
    const r = importWorkbookBytes(workbookBytes([{ name: 'Term 2', rows: [] }]), 'x.xlsx', p.detected);
    expect(r.ok).toBe(false);
  });

  it('imports the detected layout into a gradebook', () => {
    const v = imported([
      {
        name: 'Term 2',
        rows: [
          ['Chemistry 101 — scores'],
          [],
          ['Student ID', 'Name', 'Quiz 1', 'Lab report', 'Total'],
          ['Points possible', null, 10, 25, 35],
          [1001, 'Ann Lee', 9, 20, 29],
          [1002, 'Bo Chen', 7.5, 'EX', 7.5],
        ],
      },
    ]);
    expect(v.gradebook).toEqual({
      students: [
        { id: '1001', name: 'Ann Lee', section: '' },
        { id: '1002', name: 'Bo Chen', section: '' },
      ],
      assessments: [
        { id: 'Quiz 1', name: 'Quiz 1', possible: 10 },
        { id: 'Lab report', name: 'Lab report', possible: 25 },
      ],
      scores: [
        [{ kind: 'earned', points: 9 }, { kind: 'earned', points: 20 }],
        [{ kind: 'earned', points: 7.5 }, { kind: 'excused' }],
      ],
    });
    expect(v.problems).toEqual([]);
  });

  it('reads an unlabelled numeric row right below the header as points possible', () => {
    const p = preview([
      {
        name: 'S',
        rows: [
          ['ID', 'Name', 'HW 1', 'HW 2'],
          [null, null, 5, 8],
          ['a1', 'Ann', 5, 6],
        ],
      },
    ]);
    expect(p.detected.sheets[0]?.possibleRow).toBe(1);
    expect(p.detected.sheets[0]?.columns.map((c) => c.possible)).toEqual([undefined, undefined, 5, 8]);
  });

  it('takes points possible from the header text when there is no points-possible row', () => {
    const headers = ['Quiz 1 (20)', 'Quiz 2 /15', 'Quiz 3 out of 12', 'Quiz 4 [8]', 'Quiz 5 - 30 pts', 'Essay (out of 40)'];
    const v = imported([{ name: 'S', rows: [['ID', 'Name', ...headers], ['a1', 'Ann', 1, 2, 3, 4, 5, 6]] }]);
    expect(v.gradebook.assessments).toEqual([
      { id: 'Quiz 1 (20)', name: 'Quiz 1', possible: 20 },
      { id: 'Quiz 2 /15', name: 'Quiz 2', possible: 15 },
      { id: 'Quiz 3 out of 12', name: 'Quiz 3', possible: 12 },
      { id: 'Quiz 4 [8]', name: 'Quiz 4', possible: 8 },
      { id: 'Quiz 5 - 30 pts', name: 'Quiz 5', possible: 30 },
      { id: 'Essay (out of 40)', name: 'Essay', possible: 40 },
    ]);
  });

  it('uses a section column on a single sheet', () => {
    const v = imported([
      {
        name: 'All',
        rows: [
          ['ID', 'Name', 'Section', 'E-mail', 'Quiz (10)'],
          ['1', 'Ann', 'A', 'ann@example.edu', 8],
          ['2', 'Bo', 'B', null, 9],
        ],
      },
    ]);
    expect(v.layout.sectionFrom).toBe('column');
    expect(v.gradebook.students).toEqual([
      { id: '1', name: 'Ann', section: 'A', email: 'ann@example.edu' },
      { id: '2', name: 'Bo', section: 'B' },
    ]);
  });

  it('reads several sheets with the same header as one sheet per section', () => {
    const header = ['ID', 'Name', 'Quiz (10)', 'Exam (50)'];
    const v = imported([
      { name: 'Section 01', rows: [header, ['1', 'Ann', 8, 40]] },
      { name: 'Section 02', rows: [header, ['2', 'Bo', 9, 45], ['3', 'Cy', 'pending', '']] },
      { name: 'Notes', rows: [['Remember to check late work']] },
    ]);
    expect(v.layout.sectionFrom).toBe('sheetName');
    expect(v.layout.sheets.map((s) => s.sheet)).toEqual(['Section 01', 'Section 02']);
    expect(v.gradebook.students).toEqual([
      { id: '1', name: 'Ann', section: 'Section 01' },
      { id: '2', name: 'Bo', section: 'Section 02' },
      { id: '3', name: 'Cy', section: 'Section 02' },
    ]);
    expect(v.gradebook.scores[2]).toEqual([{ kind: 'pending' }, { kind: 'missing' }]);
    // The notes sheet has no header: a warning, not an error, since other sheets were usable.
    expect(v.problems.map((p) => [p.severity, p.code, p.at?.sheet])).toEqual([['warning', 'no-header', 'Notes']]);
  });

  it('finds duplicate IDs across section sheets', () => {
    const header = ['ID', 'Name', 'Quiz (10)'];
    const r = detectAndImportBytes(
      workbookBytes([
        { name: 'A', rows: [header, ['1', 'Ann', 8]] },
        { name: 'B', rows: [header, ['1', 'Ann again', 9]] },
      ]),
      'book.xlsx',
    );
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.problems?.map((p) => p.message)).toEqual([
      'Sheet "B", row 2, column A ("ID"): student ID "1" is already used on sheet "A", row 2. Give each student one row with a unique ID.',
    ]);
  });

  it('joins first- and last-name columns as "Last, First"', () => {
    const v = imported([
      {
        name: 'S',
        rows: [
          ['Matric No', 'First name', 'Surname', 'Quiz (10)'],
          ['m1', 'Zoë', 'Ångström', 8],
          ['m2', null, 'Okafor', 7],
        ],
      },
    ]);
    expect(v.layout.sheets[0]?.columns.map((c) => c.role)).toEqual(['id', 'firstName', 'lastName', 'assessment']);
    expect(v.gradebook.students.map((s) => s.name)).toEqual(['Ångström, Zoë', 'Okafor']);
  });

  it('reads score tokens (EX, blank, pending, fractions, percents) and a percent-formatted number', () => {
    const v = imported([
      {
        name: 'S',
        rows: [
          ['ID', 'Name', 'A (20)', 'B (20)', 'C (20)', 'D (20)', 'E (20)'],
          ['1', 'Ann', 'EX', null, 'pending', '18/20', '75%'],
          ['2', 'Bo', 'excused', '-', 'TBD', '7,5', 10],
        ],
      },
    ]);
    expect(v.gradebook.scores).toEqual([
      [{ kind: 'excused' }, { kind: 'missing' }, { kind: 'pending' }, { kind: 'earned', points: 18 }, { kind: 'earned', points: 15 }],
      [{ kind: 'excused' }, { kind: 'missing' }, { kind: 'pending' }, { kind: 'earned', points: 7.5 }, { kind: 'earned', points: 10 }],
    ]);
  });

  it.each(['xlsx', 'ods', 'xls'] as const)('reads a numeric cell formatted as a percent as that percent of points possible (%s)', async (bookType) => {
    const XLSX = await import('xlsx');
    const ws = XLSX.utils.aoa_to_sheet([['ID', 'Name', 'Quiz (20)'], ['1', 'Ann', 0.85]]);
    const cell: unknown = ws['C2'];
    if (typeof cell === 'object' && cell !== null) Object.assign(cell, { z: '0%' });
    const wb = XLSX.utils.book_new();
    XLSX.utils.book_append_sheet(wb, ws, 'S');
    const bytes = XLSX.write(wb, { type: 'buffer', bookType }) as Uint8Array;
    const r = detectAndImportBytes(bytes, `p.${bookType}`);
    expect(r.ok && r.value.gradebook.scores[0]).toEqual([{ kind: 'earned', points: 17 }]);
  });

  it('honours user tokens from the layout', () => {
    const bytes = workbookBytes([{ name: 'S', rows: [['ID', 'Name', 'Quiz (10)'], ['1', 'Ann', 'abs'], ['2', 'Bo', 'later'], ['3', 'Cy', 7], ['4', 'Di', 8], ['5', 'Ed', 9]] }]);
    const p = previewWorkbookBytes(bytes, 'b.xlsx');
    if (!p.ok) throw new Error(p.message);
    const layout: ImportLayout = { ...p.value.detected, tokens: { excused: ['abs'], missing: [''], pending: ['later'] } };
    const r = importWorkbookBytes(bytes, 'b.xlsx', layout);
    expect(r.ok && r.value.gradebook.scores.slice(0, 3)).toEqual([[{ kind: 'excused' }], [{ kind: 'pending' }], [{ kind: 'earned', points: 7 }]]);
    // With the default tokens the same file does not import: "abs" is not a score.
    expect(importWorkbookBytes(bytes, 'b.xlsx', p.value.detected).ok).toBe(false);
  });

  it('lets the user correct a role and points possible', () => {
    const bytes = workbookBytes([{ name: 'S', rows: [['Code', 'Who', 'Participation'], ['x1', 'Ann', 'yes'], ['x2', 'Bo', 3]] }]);
    const layout: ImportLayout = {
      sheets: [
        {
          sheet: 'S',
          headerRow: 0,
          possibleRow: null,
          columns: [
            { index: 0, header: 'Code', role: 'id' },
            { index: 1, header: 'Who', role: 'name' },
            { index: 2, header: 'Participation', role: 'assessment', possible: 5 },
          ],
        },
      ],
      sectionFrom: 'column',
      tokens: { ...DEFAULT_TOKENS, excused: ['yes'] },
    };
    const r = importWorkbookBytes(bytes, 'b.xlsx', layout);
    expect(r.ok && r.value.gradebook.scores).toEqual([[{ kind: 'excused' }], [{ kind: 'earned', points: 3 }]]);
  });
});
