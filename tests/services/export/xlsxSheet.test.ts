/**
 * tablesToXlsx writes each table as a dense SheetJS worksheet built straight from its rows. The
 * reference is the sheet the export used to build and SheetJS documents as its usual form: one
 * "A1"-keyed cell object per filled cell (utils.encode_cell) and a `!ref` range. SheetJS must
 * write the same parts for both; the ZIP's entries are compared byte for byte (their content, so
 * the archive's timestamps do not matter), and the file is read back with SheetJS as an
 * independent check that numbers stay numbers and formula-like text stays neutralised text.
 */
import fc from 'fast-check';
import * as XLSX from 'xlsx';
import { describe, expect, it } from 'vitest';
import { neutraliseCell } from '../../../main/services/export';
import { tablesToXlsx, type CellValue, type Table } from '../../../main/services/export';

function referenceXlsx(tables: readonly Table[]): Buffer {
  const book = XLSX.utils.book_new();
  for (const table of tables) {
    const grid: (readonly CellValue[])[] = [table.header, ...table.rows];
    const sheet: XLSX.WorkSheet = {};
    let width = 0;
    grid.forEach((row, r) => {
      row.forEach((v, c) => {
        if (v !== null) sheet[XLSX.utils.encode_cell({ r, c })] = typeof v === 'number' ? { t: 'n', v } : { t: 's', v: neutraliseCell(v) };
      });
      width = Math.max(width, row.length);
    });
    sheet['!ref'] = XLSX.utils.encode_range({ s: { r: 0, c: 0 }, e: { r: Math.max(grid.length - 1, 0), c: Math.max(width - 1, 0) } });
    XLSX.utils.book_append_sheet(book, sheet, table.name);
  }
  return XLSX.write(book, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer;
}

/** Each ZIP entry's path and content. */
function entries(buf: Buffer): Record<string, string> {
  // SheetJS's bundled CFB/ZIP reader (typed loosely upstream).
  const zip = (XLSX.CFB as unknown as { read(d: Buffer, o: { type: 'buffer' }): { FileIndex: { type: number; content?: unknown }[]; FullPaths: string[] } }).read(buf, { type: 'buffer' });
  const out: Record<string, string> = {};
  zip.FileIndex.forEach((f, i) => {
    if (f.type === 2 && f.content !== undefined) out[zip.FullPaths[i] ?? String(i)] = Buffer.from(f.content as Uint8Array).toString('latin1');
  });
  return out;
}

const value: fc.Arbitrary<CellValue> = fc.oneof(
  fc.constant(null),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer({ min: -100, max: 100 }),
  fc.constantFrom('S01', '=1+1', '+x', '-3', '@SUM(A1)', ' =cmd', '"=x', 'Lee, Bo', 'É', '', '<tag>&'),
  fc.string({ maxLength: 8 }),
);
const tableArb: fc.Arbitrary<Table> = fc.record({
  name: fc.constantFrom('Final marks', 'Breakdown', 'Section statistics'),
  header: fc.array(fc.string({ maxLength: 6 }), { minLength: 1, maxLength: 5 }),
  rows: fc.array(fc.array(value, { maxLength: 6 }), { maxLength: 25 }),
});

describe('tablesToXlsx', () => {
  it('writes the same workbook parts as the A1-keyed sheet', () => {
    fc.assert(
      fc.property(fc.uniqueArray(tableArb, { minLength: 1, maxLength: 3, selector: (t) => t.name }), (tables) => {
        expect(entries(tablesToXlsx(tables))).toStrictEqual(entries(referenceXlsx(tables)));
      }),
      { numRuns: 150 },
    );
  });

  it('reads back with numbers as numbers and formula-like text neutralised', () => {
    const table: Table = { name: 'Final marks', header: ['ID', 'Final %'], rows: [['=HYPERLINK("x")', 91.5], ['S2', -3], ['S3', null]] };
    const ws = XLSX.read(tablesToXlsx([table]), { type: 'buffer' }).Sheets['Final marks']!;
    expect(ws['A2']).toMatchObject({ t: 's', v: "'=HYPERLINK(\"x\")" });
    expect(ws['B2']).toMatchObject({ t: 'n', v: 91.5 });
    expect(ws['B3']).toMatchObject({ t: 'n', v: -3 });
    expect(ws['B4']).toBeUndefined();
  });
});
