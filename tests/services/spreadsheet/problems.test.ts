import { describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import type { ImportLayout, ImportProblem, Result } from '../../../renderer/bridge/contract';
import { DEFAULT_TOKENS, parseScore } from '../../../renderer/engine/grading/parseScore';
import { detectAndImportBytes, importWorkbookBytes, previewWorkbookBytes } from '../../../main/services/spreadsheet';
import { utf8, workbookBytes, type FixtureSheet } from './fixtures';

/** The problems of a refused import (failing the test if it was not refused). */
function refused(r: Result<unknown>): readonly ImportProblem[] {
  expect(r.ok).toBe(false);
  if (r.ok) return [];
  expect(r.code).toBe('bad-input');
  expect('value' in r).toBe(false); // nothing partially imported
  return r.problems ?? [];
}

function importSheets(sheets: FixtureSheet[]) {
  return detectAndImportBytes(workbookBytes(sheets), 'course.xlsx');
}

const HEADER = ['ID', 'Name', 'Quiz 1 (10)'];

describe('located problems', () => {
  it('duplicate IDs: error at the second row, naming the first', () => {
    const p = refused(importSheets([{ name: 'S', rows: [HEADER, ['7', 'Ann', 5], ['8', 'Bo', 6], [7, 'Cy', 7]] }]));
    expect(p).toEqual([
      {
        severity: 'error',
        code: 'duplicate-id',
        message: 'Sheet "S", row 4, column A ("ID"): student ID "7" is already used on row 2. Give each student one row with a unique ID.',
        at: { sheet: 'S', row: 4, column: 'A', header: 'ID', value: '7' },
      },
    ]);
  });

  it('blank ID: error naming the row by the student’s name', () => {
    const p = refused(importSheets([{ name: 'S', rows: [HEADER, ['1', 'Ann', 5], [null, 'Bo Chen', 6]] }]));
    expect(p.map((x) => [x.code, x.message])).toEqual([
      ['blank-id', 'Sheet "S", row 3, column A ("ID"): the student ID is blank (row of "Bo Chen"). Fill in the ID or delete the row.'],
    ]);
  });

  it('score above points possible: a warning that names extra credit, and the import goes ahead', () => {
    const r = importSheets([{ name: 'S', rows: [HEADER, ['1', 'Ann', 12]] }]);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.gradebook.scores).toEqual([[{ kind: 'earned', points: 12 }]]);
    expect(r.value.problems).toEqual([
      {
        severity: 'warning',
        code: 'above-possible',
        message:
          'Sheet "S", row 2, column C ("Quiz 1 (10)"): "12" is above the 10 points possible. It is kept as entered; it counts beyond full marks only if the grading plan marks this assessment as extra credit — otherwise correct the cell.',
        at: { sheet: 'S', row: 2, column: 'C', header: 'Quiz 1 (10)', value: '12' },
      },
    ]);
  });

  it('negative scores, numeric or text: error', () => {
    const p = refused(importSheets([{ name: 'S', rows: [HEADER, ['1', 'Ann', -2], ['2', 'Bo', '-3,5'], ['3', 'Cy', 4]] }]));
    expect(p.map((x) => [x.code, x.message])).toEqual([
      ['negative-score', 'Sheet "S", row 2, column C ("Quiz 1 (10)"): "-2" is negative; scores cannot be below 0. Correct the cell.'],
      ['negative-score', 'Sheet "S", row 3, column C ("Quiz 1 (10)"): "-3,5" is negative; scores cannot be below 0. Correct the cell.'],
    ]);
  });

  it('unreadable cells: the grading engine’s message, located', () => {
    const p = refused(importSheets([{ name: 'S', rows: [HEADER, ['1', 'Ann', 5], ['2', 'Bo', 'abs'], ['3', 'Cy', 6], ['4', 'Di', 7]] }]));
    const why = parseScore('abs', 10, DEFAULT_TOKENS);
    expect(why.ok).toBe(false);
    if (why.ok) return;
    expect(p).toEqual([
      {
        severity: 'error',
        code: 'unreadable-score',
        message: `Sheet "S", row 3, column C ("Quiz 1 (10)"): ${why.message} Correct the cell, or add the word to the score tokens.`,
        at: { sheet: 'S', row: 3, column: 'C', header: 'Quiz 1 (10)', value: 'abs' },
      },
    ]);
    expect(p[0]?.message).toContain('"abs" is not a score');
  });

  it('a spreadsheet error value (#DIV/0!) is an unreadable cell', () => {
    const ws = XLSX.utils.aoa_to_sheet([HEADER, ['1', 'Ann', 5], ['2', 'Bo', 6]]);
    ws['C3'] = { t: 'e', v: 0x07, w: '#DIV/0!' };
    const wb = XLSX.utils.book_new();
    XLSX.utils.book_append_sheet(wb, ws, 'S');
    const p = refused(detectAndImportBytes(XLSX.write(wb, { type: 'buffer', bookType: 'xlsx' }) as Uint8Array, 'e.xlsx'));
    expect(p.map((x) => [x.code, x.at])).toEqual([['unreadable-score', { sheet: 'S', row: 3, column: 'C', header: 'Quiz 1 (10)', value: '#DIV/0!' }]]);
  });

  it('empty file, and a file of blanks', () => {
    for (const bytes of [new Uint8Array(0), utf8(' \r\n\r\n')]) {
      const r = previewWorkbookBytes(bytes, 'scores.csv');
      expect(refused(r)).toEqual([
        { severity: 'error', code: 'empty-file', message: 'The file "scores.csv" is empty. Choose the gradebook file that holds the scores.' },
      ]);
    }
  });

  it('a workbook whose sheets are all empty', () => {
    const p = refused(importSheets([{ name: 'Blank', rows: [] }]));
    expect(p.map((x) => [x.severity, x.code, x.message])).toEqual([
      ['warning', 'empty-sheet', 'Sheet "Blank": this sheet is empty and was left out.'],
      ['error', 'empty-file', 'The file has no cells with data in any sheet. Choose the gradebook file that holds the scores.'],
    ]);
  });

  it('an empty sheet chosen for import', () => {
    const bytes = workbookBytes([{ name: 'Scores', rows: [HEADER, ['1', 'Ann', 5]] }, { name: 'Later', rows: [] }]);
    const layout: ImportLayout = {
      sheets: [{ sheet: 'Later', headerRow: 0, possibleRow: null, columns: [] }],
      sectionFrom: 'column',
      tokens: DEFAULT_TOKENS,
    };
    expect(refused(importWorkbookBytes(bytes, 'b.xlsx', layout)).map((x) => [x.code, x.message])).toEqual([
      ['empty-sheet', 'Sheet "Later": this sheet is empty. Choose the sheet that holds the students and their scores.'],
    ]);
  });

  it('no header row', () => {
    const p = refused(importSheets([{ name: 'Numbers', rows: [[1, 2, 3], [4, 5, 6]] }]));
    expect(p.map((x) => [x.code, x.message])).toEqual([
      [
        'no-header',
        'Sheet "Numbers": no header row was found in the first 30 rows (a row of column titles such as "ID", "Name", "Quiz 1"). Add a header row above the students, or choose the header row in the preview.',
      ],
    ]);
  });

  it('no assessment columns', () => {
    const p = refused(importSheets([{ name: 'Roster', rows: [['ID', 'Name', 'Section'], ['1', 'Ann', 'A']] }]));
    expect(p.map((x) => [x.code, x.message])).toEqual([
      ['no-assessments', 'Sheet "Roster", row 1: no assessment columns were found beside the header on row 1. Mark the score columns as assessments in the preview.'],
    ]);
  });

  it('no student ID column', () => {
    const p = refused(importSheets([{ name: 'S', rows: [['Name', 'Quiz (10)'], ['Ann', 5]] }]));
    expect(p.map((x) => [x.code, x.message])).toEqual([
      [
        'no-id-column',
        'Sheet "S", row 1: no column is marked as the student ID, which identifies each student (and matches them on re-import). Mark the ID column in the preview.',
      ],
    ]);
  });

  it('points possible ≤ 0 in the points-possible row', () => {
    const p = refused(importSheets([{ name: 'S', rows: [['ID', 'Name', 'Quiz 1', 'Quiz 2'], ['Max', null, 0, 10], ['1', 'Ann', 5, 6]] }]));
    expect(p).toEqual([
      {
        severity: 'error',
        code: 'possible-not-positive',
        message: 'Sheet "S", row 2, column C ("Quiz 1"): points possible "0" must be greater than 0. Correct the points-possible row.',
        at: { sheet: 'S', row: 2, column: 'C', header: 'Quiz 1', value: '0' },
      },
    ]);
  });

  it('points possible ≤ 0 set in the layout', () => {
    const bytes = workbookBytes([{ name: 'S', rows: [HEADER, ['1', 'Ann', 5]] }]);
    const layout: ImportLayout = {
      sheets: [
        {
          sheet: 'S',
          headerRow: 0,
          possibleRow: null,
          columns: [
            { index: 0, header: 'ID', role: 'id' },
            { index: 2, header: 'Quiz 1 (10)', role: 'assessment', possible: -5 },
          ],
        },
      ],
      sectionFrom: 'column',
      tokens: DEFAULT_TOKENS,
    };
    expect(refused(importWorkbookBytes(bytes, 'b.xlsx', layout)).map((x) => [x.code, x.message])).toEqual([
      ['possible-not-positive', 'Sheet "S", row 1, column C ("Quiz 1 (10)"): points possible "-5" must be a number greater than 0. Set points possible for this assessment.'],
    ]);
  });

  it('points possible unknown', () => {
    const p = refused(importSheets([{ name: 'S', rows: [['ID', 'Name', 'Quiz 1'], ['1', 'Ann', 5]] }]));
    expect(p.map((x) => [x.code, x.message])).toEqual([
      [
        'unknown-possible',
        'Sheet "S", row 1, column C ("Quiz 1"): points possible for this assessment is not known. Add a points-possible row, write it in the header like "Quiz 1 (20)", or set it in the preview.',
      ],
    ]);
  });

  it('every problem is reported at once, not only the first', () => {
    const r = importSheets([{ name: 'S', rows: [HEADER, ['1', 'Ann', 'x'], ['1', 'Bo', 5], [null, 'Cy', 4], ['4', 'Di', 3]] }]);
    const p = refused(r);
    expect(p.map((x) => [x.code, x.at?.row])).toEqual([
      ['unreadable-score', 2],
      ['duplicate-id', 3],
      ['blank-id', 4],
    ]);
    expect(!r.ok && r.message.startsWith('3 problems stop the import. The first: Sheet "S", row 2')).toBe(true);
  });

  it('a malformed layout is refused, not thrown', () => {
    const bytes = workbookBytes([{ name: 'S', rows: [HEADER, ['1', 'Ann', 5]] }]);
    const bad = { sheets: 'all', sectionFrom: 'column', tokens: DEFAULT_TOKENS } as unknown as ImportLayout;
    const r = importWorkbookBytes(bytes, 'b.xlsx', bad);
    expect(r.ok).toBe(false);
    expect(!r.ok && r.message.startsWith('The import layout is malformed at sheets:')).toBe(true);
  });

  it('a layout with no sheet chosen', () => {
    const bytes = workbookBytes([{ name: 'S', rows: [HEADER, ['1', 'Ann', 5]] }]);
    const layout: ImportLayout = { sheets: [], sectionFrom: 'column', tokens: DEFAULT_TOKENS };
    expect(refused(importWorkbookBytes(bytes, 'b.xlsx', layout)).map((x) => [x.code, x.message])).toEqual([
      ['nothing-to-import', 'No sheet is chosen for import. Choose the sheet that holds the students and their scores.'],
    ]);
  });

  it('a layout naming a sheet that is not in the file', () => {
    const bytes = workbookBytes([{ name: 'S', rows: [HEADER, ['1', 'Ann', 5]] }]);
    const layout: ImportLayout = { sheets: [{ sheet: 'T', headerRow: 0, possibleRow: null, columns: [] }], sectionFrom: 'column', tokens: DEFAULT_TOKENS };
    expect(refused(importWorkbookBytes(bytes, 'b.xlsx', layout)).map((x) => x.message)).toEqual([
      'Sheet "T": there is no sheet of this name in the file. Choose one of the sheets shown in the preview.',
    ]);
  });

  it('a header with no students below it', () => {
    const p = refused(detectAndImportBytes(utf8('ID,Name,Quiz (10)\n'), 'empty-roster.csv'));
    expect(p.map((x) => [x.code, x.message])).toEqual([
      ['no-students', 'Sheet "empty-roster": there are no student rows below the header on row 1. Add the students or choose the right header row.'],
    ]);
  });

  it('two assessment columns with the same header', () => {
    const p = refused(importSheets([{ name: 'S', rows: [['ID', 'Quiz (10)', 'Quiz (10)'], ['1', 5, 6]] }]));
    expect(p.map((x) => [x.code, x.message])).toEqual([
      ['duplicate-assessment', 'Sheet "S", row 1, column C ("Quiz (10)"): this header is also the header of column B; two assessments cannot share a name. Rename one of them.'],
    ]);
  });

  it('two columns marked with one role, and points possible that disagree between sheets', () => {
    const bytes = workbookBytes([
      { name: 'A', rows: [['ID', 'Quiz'], ['1', 5]] },
      { name: 'B', rows: [['ID', 'Alt ID', 'Quiz'], ['2', 'x', 6]] },
    ]);
    const layout: ImportLayout = {
      sheets: [
        { sheet: 'A', headerRow: 0, possibleRow: null, columns: [{ index: 0, header: 'ID', role: 'id' }, { index: 1, header: 'Quiz', role: 'assessment', possible: 10 }] },
        { sheet: 'B', headerRow: 0, possibleRow: null, columns: [{ index: 0, header: 'ID', role: 'id' }, { index: 1, header: 'Alt ID', role: 'id' }, { index: 2, header: 'Quiz', role: 'assessment', possible: 20 }] },
      ],
      sectionFrom: 'sheetName',
      tokens: DEFAULT_TOKENS,
    };
    expect(refused(importWorkbookBytes(bytes, 'b.xlsx', layout)).map((x) => [x.code, x.message])).toEqual([
      ['duplicate-role', 'Sheet "B", row 1, column B ("Alt ID"): this column and column A are both marked as the student ID column. Mark only one.'],
    ]);
    const fixed: ImportLayout = { ...layout, sheets: [layout.sheets[0]!, { ...layout.sheets[1]!, columns: layout.sheets[1]!.columns.filter((c) => c.header !== 'Alt ID') }] };
    expect(refused(importWorkbookBytes(bytes, 'b.xlsx', fixed)).map((x) => [x.code, x.message])).toEqual([
      ['possible-mismatch', 'Sheet "B", column C ("Quiz"): points possible is 20 here but 10 for the same assessment on sheet "A", column B. Make them agree.'],
    ]);
  });

  it('an assessment missing from one section’s sheet is excused there, with a warning', () => {
    const bytes = workbookBytes([
      { name: 'A', rows: [['ID', 'Quiz (10)', 'Lab (5)'], ['1', 5, 4]] },
      { name: 'B', rows: [['ID', 'Quiz (10)'], ['2', 6]] },
    ]);
    const layout: ImportLayout = {
      sheets: [
        { sheet: 'A', headerRow: 0, possibleRow: null, columns: [{ index: 0, header: 'ID', role: 'id' }, { index: 1, header: 'Quiz (10)', role: 'assessment', possible: 10 }, { index: 2, header: 'Lab (5)', role: 'assessment', possible: 5 }] },
        { sheet: 'B', headerRow: 0, possibleRow: null, columns: [{ index: 0, header: 'ID', role: 'id' }, { index: 1, header: 'Quiz (10)', role: 'assessment', possible: 10 }] },
      ],
      sectionFrom: 'sheetName',
      tokens: DEFAULT_TOKENS,
    };
    const r = importWorkbookBytes(bytes, 'b.xlsx', layout);
    if (!r.ok) throw new Error(r.message);
    expect(r.value.gradebook.scores).toEqual([
      [{ kind: 'earned', points: 5 }, { kind: 'earned', points: 4 }],
      [{ kind: 'earned', points: 6 }, { kind: 'excused' }],
    ]);
    expect(r.value.problems.map((x) => x.message)).toEqual([
      'Sheet "B": "Lab (5)" is not on this sheet, so it is marked excused for its students. Add the column if that is wrong.',
    ]);
  });
});
