/**
 * The row-at-a-time text import (main/services/spreadsheet/textImport.ts) beside the whole-book
 * import it stands in for: on random delimited tables — long enough to pass the rows the layout
 * is detected on, with blank rows, summary rows, blank and repeated IDs, every kind of score cell,
 * quoted fields, broken quotes, and cells that appear only far down in columns the first rows
 * leave empty — both give the same Result, compared deeply (toStrictEqual: every value ===, the
 * same problems in the same order). readTextRows is compared with papaparse's whole-text parse,
 * the library the whole-book reader uses.
 */
import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import {
  detectAndImportBytes,
  detectAndImportWhole,
  importWorkbookBytes,
  importWorkbookWhole,
} from '../../../main/services/spreadsheet';
import { readTextRows } from '../../../main/services/spreadsheet/readBook';
import { HEAD_ROWS, importTextRows } from '../../../main/services/spreadsheet/textImport';
import { bytesOf, table, text, type Table } from './randomTables';
import type { ImportLayout } from '../../../renderer/bridge/contract';

describe('row-at-a-time text import equals the whole-book import', () => {
  it('detect and import: the same Result on random tables', () => {
    fc.assert(
      fc.property(table, fc.constantFrom('t.csv', 't.tsv', 't.txt'), (t, name) => {
        const bytes = bytesOf(t);
        expect(detectAndImportBytes(bytes, name)).toStrictEqual(detectAndImportWhole(bytes, name));
      }),
      { numRuns: 150 },
    );
  });

  it('the random tables mostly take the row-wise path (else the test above compares the whole-book import with itself)', () => {
    // A fixed sample, so the count does not depend on the run's seed.
    const sample = fc.sample(table, { numRuns: 200, seed: 231 });
    const rowWise = sample.filter((t) => importTextRows(bytesOf(t), 't.csv', {}, null)?.kind === 'built').length;
    expect(rowWise).toBeGreaterThan(sample.length / 8); // 48 of 200 with this seed
  });

  it('import with a layout: the detected one and altered ones give the same Result', () => {
    fc.assert(
      fc.property(table, fc.integer({ min: -1, max: 4 }), fc.boolean(), (t, shift, dropPossible) => {
        const bytes = bytesOf(t);
        const detected = detectAndImportWhole(bytes, 't.csv');
        const base: ImportLayout | null = detected.ok ? detected.value.layout : null;
        if (base === null) return;
        expect(importWorkbookBytes(bytes, 't.csv', base)).toStrictEqual(importWorkbookWhole(bytes, 't.csv', base));
        const sl = base.sheets[0]!;
        const altered: ImportLayout = {
          ...base,
          sheets: [{ ...sl, headerRow: sl.headerRow + shift, possibleRow: dropPossible ? null : sl.possibleRow, columns: sl.columns.map((c) => (c.role === 'assessment' && dropPossible ? { ...c, possible: 20 } : c)) }],
        };
        expect(importWorkbookBytes(bytes, 't.csv', altered)).toStrictEqual(importWorkbookWhole(bytes, 't.csv', altered));
      }),
      { numRuns: 100 },
    );
  });

  // Without a quote in the file, the rows below the head are read from the text's lines
  // (textLines.ts) instead of papaparse's steps: the same comparisons on such tables.
  const quoteFree = (t: Table): Table => ({
    ...t,
    quoteAll: false,
    breakQuote: null,
    rows: t.rows.map((row) => row.map((c) => c.split('"').join('').split(t.delimiter).join(''))),
  });

  it('quote-free tables (read line-wise below the head): the same Result, detected and with a layout', () => {
    fc.assert(
      fc.property(table.map(quoteFree), fc.constantFrom('t.csv', 't.tsv'), (t, name) => {
        const bytes = bytesOf(t);
        expect(bytes.includes(0x22)).toBe(false);
        const whole = detectAndImportWhole(bytes, name);
        expect(detectAndImportBytes(bytes, name)).toStrictEqual(whole);
        if (whole.ok) expect(importWorkbookBytes(bytes, name, whole.value.layout)).toStrictEqual(importWorkbookWhole(bytes, name, whole.value.layout));
      }),
      { numRuns: 150 },
    );
  });

  it('the quote-free tables mostly read rows past the head line-wise', () => {
    const sample = fc.sample(table.map(quoteFree), { numRuns: 200, seed: 231 });
    const lineWise = sample.filter((t) => t.rows.length > HEAD_ROWS && importTextRows(bytesOf(t), 't.csv', {}, null)?.kind === 'built').length;
    expect(lineWise).toBeGreaterThan(sample.length / 8); // 85 of 200 with this seed
  });

  it('a late cell in a column the first rows leave empty sends the import to the whole book, with the same result', () => {
    const rows = [['Student ID', 'Name', 'Quiz 1 (10)', ''], ...Array.from({ length: HEAD_ROWS + 10 }, (_, i) => [`S${i}`, 'N', '5'])];
    rows.push(['S-late', 'N', '5', 'note']);
    const bytes = new TextEncoder().encode(rows.map((r) => r.join(',')).join('\n'));
    expect(importTextRows(bytes, 'late.csv', {}, null)).toBeNull();
    const whole = detectAndImportWhole(bytes, 'late.csv');
    expect(whole.ok && whole.value.layout.sheets[0]!.columns.some((c) => c.index === 3)).toBe(true);
    expect(detectAndImportBytes(bytes, 'late.csv')).toStrictEqual(whole);
  });

  it('readTextRows hands on the rows of papaparse’s whole-text parse, or its first error', () => {
    fc.assert(
      fc.property(table, (t) => {
        const source = text(t);
        const bytes = new TextEncoder().encode(source);
        const rows: (string | number | null)[][] = [];
        const read = readTextRows(bytes, 't.csv', {}, (row) => void rows.push([...row]));
        // The reference: papaparse on the same text with the reader's options, blanks as null.
        const whole = Papa.parse<string[]>(source, { delimiter: '', delimitersToGuess: [',', ';', '\t'], header: false, dynamicTyping: false, skipEmptyLines: false });
        const firstError = whole.errors.find((e) => e.type !== 'Delimiter');
        if (firstError !== undefined) {
          expect(read?.ok).toBe(false);
          if (read !== null && !read.ok) expect(read.problem.message).toContain(`row ${(firstError.row ?? 0) + 1}:`);
          return;
        }
        expect(read?.ok).toBe(true);
        expect(rows).toStrictEqual(whole.data.map((row) => row.map((c) => (c === '' ? null : c))));
        if (read?.ok) expect(read.table.delimiter).toBe(whole.meta.delimiter);
      }),
      { numRuns: 150 },
    );
  });
});
