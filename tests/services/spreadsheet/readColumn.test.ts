/**
 * readColumn: one numeric column of any spreadsheet, each value with its place. The statistics of
 * the values are the engine's concern (tests/engine/stats, tests/cli against Hyndman & Fan); here
 * only which cells are read, skipped or refused, and where a refusal points. The layout words
 * ("Points possible", "Average", EX) are common practice, no source.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { rmSync } from 'node:fs';
import { readColumn } from '../../../main/services/spreadsheet';
import { tempDir, workbookBytes, writeTemp } from './fixtures';

const dir = tempDir();
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const BOOK = [
  'Student ID,Name,Section,Mark',
  'Points possible,,,20',
  'S1,Ana,A,12',
  'S2,Ben,B,EX',
  'S3,Chloé,A,',
  '',
  "'=S4,Dev,B,\"7,5\"",
  'Average,,,9.75',
].join('\n');

describe('readColumn', () => {
  it('reads numbers with their row and student ID, skipping the possible row, blanks, tokens and summaries', async () => {
    const path = writeTemp(dir, 'book.csv', BOOK);
    const r = await readColumn(path, { column: ' mark ', by: 'section' });
    if (!r.ok) throw new Error(r.message);
    expect(r.value.sheet).toBe('book');
    expect(r.value.headerRow).toBe(1);
    expect(r.value.column).toEqual({ index: 3, letter: 'D', header: 'Mark' });
    expect(r.value.by).toEqual({ index: 2, letter: 'C', header: 'Section' });
    expect(r.value.values).toEqual([
      { value: 12, row: 3, label: 'S1', group: 'A' },
      // A decimal comma reads as a decimal point; the ID loses the `'` our export puts before "=".
      { value: 7.5, row: 7, label: '=S4', group: 'B' },
    ]);
    expect(r.value.skipped).toEqual([
      { row: 4, label: 'S2', reason: 'token', text: 'EX' },
      { row: 5, label: 'S3', reason: 'blank', text: '' },
    ]);
  });

  it('names sheet, row, column letter, header and value of every cell that is not a number', async () => {
    const path = writeTemp(dir, 'bad.csv', 'ID,Mark\nA,1\nB,two\nC,3 points\n');
    const r = await readColumn(path, { column: 'Mark' });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.message).toContain('2 cells of column B ("Mark") are not numbers');
    expect(r.problems?.map((p) => p.at)).toEqual([
      { sheet: 'bad', row: 3, column: 'B', header: 'Mark', value: 'two' },
      { sheet: 'bad', row: 4, column: 'B', header: 'Mark', value: '3 points' },
    ]);
  });

  it('takes the first sheet with the column, or the one named, and says when there is none', async () => {
    const path = writeTemp(dir, 'two.xlsx', workbookBytes([
      { name: 'Notes', rows: [['Remark'], ['late']] },
      { name: 'Sec A', rows: [['ID', 'Exam'], ['a1', 40]] },
      { name: 'Sec B', rows: [['ID', 'Exam'], ['b1', 30], ['b2', -2]] },
    ]));
    const first = await readColumn(path, { column: 'Exam' });
    expect(first.ok && first.value.sheet).toBe('Sec A');
    const named = await readColumn(path, { column: 'Exam', sheet: 'Sec B' });
    expect(named.ok && named.value.values.map((v) => [v.label, v.value])).toEqual([['b1', 30], ['b2', -2]]);
    const noSheet = await readColumn(path, { column: 'Exam', sheet: 'Sec C' });
    expect(!noSheet.ok && noSheet.message).toContain('There is no sheet "Sec C"');
    const noColumn = await readColumn(path, { column: 'Height' });
    expect(!noColumn.ok && noColumn.message).toContain('has a column headed "Height"');
    const noBy = await readColumn(path, { column: 'Exam', by: 'Group' });
    expect(!noBy.ok && noBy.message).toContain('Sheet "Sec A", row 1: there is no column "Group"');
  });

  it('passes on a missing file as not-found', async () => {
    const r = await readColumn(`${dir}/absent.csv`, { column: 'Mark' });
    expect(r).toMatchObject({ ok: false, code: 'not-found' });
  });
});
