/**
 * Bounds that keep a hostile or damaged file from crashing, hanging or flooding the importer
 * (found by tests/fuzz; these pin each fix down with a small input).
 */
import { deflateRawSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { importWorkbookBytes, previewWorkbookBytes } from '../../../main/services/spreadsheet';
import { readBook } from '../../../main/services/spreadsheet/readBook';
import { zipEntries, rawZip } from '../../fuzz/zip';
import { utf8, workbookBytes } from './fixtures';

function preview(bytes: Uint8Array, name: string) {
  const r = previewWorkbookBytes(bytes, name);
  if (!r.ok) throw new Error(r.message);
  return r.value;
}

/** The course's workbook with its sheet entry replaced (stored entries otherwise). */
function withSheetEntry(entry: (name: string, data: Uint8Array) => Parameters<typeof rawZip>[0][number]): Uint8Array {
  const base = workbookBytes([{ name: 'Scores', rows: [['ID', 'Name', 'Quiz (10)'], ['s1', 'Ann', 7]] }]);
  return rawZip([...zipEntries(base)].map(([name, data]) => (/^xl\/worksheets\/sheet/.test(name) ? entry(name, data) : { name, method: 0 as const, data })));
}

describe('column warnings are summarised', () => {
  it('keeps ten unrecognised-column warnings and counts the rest in one', () => {
    // 25 text columns whose headers name nothing: not scores, so each is ignored.
    const notes = Array.from({ length: 25 }, (_, i) => `Colour ${i}`);
    const csv = `ID,Name,Quiz (10),${notes.join(',')}\ns1,Ann,7,${notes.map(() => 'late').join(',')}\n`;
    const unrecognised = preview(utf8(csv), 'wide.csv').problems.filter((p) => p.code === 'unrecognised-column');
    expect(unrecognised).toHaveLength(11);
    expect(unrecognised[10]?.message).toBe(
      'Sheet "wide", row 1: … and 15 more columns were ignored the same way. Check their roles in the preview if any of them matter.',
    );
  });
});

describe('columns beyond XFD', () => {
  // XFD = column 16 384, the most a worksheet has (ECMA-376 Part 1 §18.3.1.4 cell reference;
  // Excel's documented limit of 16 384 columns).
  it('are left out of the proposed layout with one warning, and the layout imports', () => {
    const csv = `ID,Name,Quiz (10)\ns1,Ann,7${','.repeat(16_384)}x\n`;
    const bytes = utf8(csv);
    const p = preview(bytes, 'far.csv');
    const indexes = p.detected.sheets.flatMap((s) => s.columns.map((c) => c.index));
    expect(Math.max(...indexes)).toBeLessThanOrEqual(16_383);
    const far = p.problems.filter((problem) => problem.code === 'too-many-columns');
    expect(far).toHaveLength(1);
    expect(far[0]?.message).toMatch(/^Sheet "far": cells to the right of column XFD/);
    const imported = importWorkbookBytes(bytes, 'far.csv', p.detected);
    expect(imported.ok).toBe(true);
  });
});

describe('long cell text in messages', () => {
  it('shortens a long header in the message and in the location', () => {
    const header = `Quiz ${'x'.repeat(5000)}`;
    const csv = `ID,Name,${header}\ns1,Ann,abc\ns2,Bo,def\n`;
    const problems = preview(utf8(csv), 'long.csv').problems;
    const located = problems.filter((q) => q.at?.header !== undefined && q.at.header.startsWith('Quiz'));
    expect(located.length).toBeGreaterThan(0);
    for (const q of located) {
      expect(q.message.length).toBeLessThanOrEqual(1000);
      expect(q.at?.header).toBe(`${header.slice(0, 200)}…`);
      expect(q.message).toContain(`column C ("${header.slice(0, 80)}…")`);
    }
  });
});

describe('damaged ZIP entries', () => {
  it('a cut deflate stream is reported as damaged, without the library’s words', () => {
    // 0x02: a fixed-Huffman block header with no data after it (RFC 1951 §3.2.3).
    const bytes = withSheetEntry((name) => ({ name, method: 8, data: Uint8Array.from([0x02]) }));
    const r = readBook(bytes, 'cut.xlsx');
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.problem.code).toBe('corrupt-file');
    expect(r.problem.message).toBe(
      'The file "cut.xlsx" is damaged: its part "xl/worksheets/sheet1.xml" does not unpack to the contents its checksum records, so it was not read. Open it in your spreadsheet program and save it again as .xlsx, .ods or .csv, or export a fresh copy.',
    );
  });

  it('an entry whose bytes do not match its recorded CRC-32 is refused, naming the part (APPNOTE.TXT §4.4.7)', () => {
    // Found by the long fuzz suite: one flipped byte in the demo workbook's deflated sheet inflated
    // to XML that SheetJS built a sheet of 2 GB from; the CRC shows the damage first.
    const bytes = withSheetEntry((name, data) => ({ name, method: 8, data: deflateRawSync(data), declaredSize: data.length, crc: 0x12345678 }));
    const r = readBook(bytes, 'flipped.xlsx');
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.problem.code).toBe('corrupt-file');
    expect(r.problem.message).toContain('its part "xl/worksheets/sheet1.xml" does not unpack to the contents its checksum records');
  });

  it('a stored entry with a wrong CRC-32 is refused too', () => {
    const bytes = withSheetEntry((name, data) => ({ name, method: 0, data, crc: 1 }));
    const r = readBook(bytes, 'stored.xlsx');
    expect(r.ok).toBe(false);
  });

  it('an intact deflated sheet still reads', () => {
    const bytes = withSheetEntry((name, data) => ({ name, method: 8, data: deflateRawSync(data), declaredSize: data.length }));
    const r = readBook(bytes, 'deflated.xlsx');
    expect(r.ok && r.book.sheets[0]?.rows).toEqual([['ID', 'Name', 'Quiz (10)'], ['s1', 'Ann', 7]]);
  });

  it('an entry declaring 4 GiB is refused before it is unpacked', () => {
    const bytes = withSheetEntry((name, data) => ({ name, method: 0, data, declaredSize: 0xffffffff }));
    const r = readBook(bytes, 'huge.xlsx');
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.problem.code).toBe('too-large');
    expect(r.problem.message).toMatch(/^The file "huge\.xlsx" says it expands to \d+ MB when unpacked/);
  });
});
