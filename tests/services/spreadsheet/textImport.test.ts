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
import type { ImportLayout } from '../../../renderer/bridge/contract';

const score = fc.oneof(
  { weight: 12, arbitrary: fc.integer({ min: 0, max: 20 }).map(String) },
  { weight: 2, arbitrary: fc.constantFrom('', ' ', 'EX', 'excused', '-', 'pending', 'M') },
  { weight: 1, arbitrary: fc.constantFrom('7,5', '7.25', '18/20', '85%', '1 234,5', '25', '99', '-3', ' -1', 'abc', '=1+1', '12 pts', '1,234', '3/0') },
);

const identity = fc.constantFrom('Ann', 'Lee, Bo', '"Quoted"', "'=cmd", ' spaced ', 'Total', 'Average', '');

interface Table {
  readonly rows: string[][];
  readonly delimiter: string;
  readonly newline: string;
  readonly quoteAll: boolean;
  readonly breakQuote: number | null;
}

const table: fc.Arbitrary<Table> = fc
  .record({
    assessments: fc.integer({ min: 1, max: 5 }),
    possibleRow: fc.boolean(),
    headerInWords: fc.boolean(),
    title: fc.boolean(),
    // Mostly past the rows the layout is detected on, where the two imports part ways.
    students: fc.oneof({ weight: 1, arbitrary: fc.integer({ min: 0, max: 40 }) }, { weight: 3, arbitrary: fc.integer({ min: HEAD_ROWS, max: HEAD_ROWS + 80 }) }),
    delimiter: fc.constantFrom(',', ';', '\t'),
    newline: fc.constantFrom('\n', '\r\n'),
    quoteAll: fc.boolean(),
    seed: fc.integer(),
    late: fc.constantFrom('none', 'none', 'new-column', 'empty-column', 'only-late-rows'),
    breakQuote: fc.option(fc.integer({ min: 0, max: HEAD_ROWS + 80 }), { freq: 8 }),
    cells: fc.array(score, { minLength: 64, maxLength: 64 }),
    // Clean tables import (and so return their layout and gradebook); the others are refused.
    clean: fc.boolean(),
    names: fc.array(identity, { minLength: 16, maxLength: 16 }),
  })
  .map((t) => {
    // A small deterministic generator over the drawn cells keeps the cases cheap to shrink.
    let x = t.seed | 0;
    const next = (n: number) => {
      x = (Math.imul(x ^ (x >>> 15), 2246822507) + 0x9e3779b9) | 0;
      return ((x >>> 0) % n);
    };
    const header = ['Student ID', 'Name', 'Section', ...Array.from({ length: t.assessments }, (_, i) => (t.headerInWords || t.possibleRow ? `Quiz ${i + 1}` : `Quiz ${i + 1} (20)`)), ''];
    const rows: string[][] = [];
    if (t.title) rows.push(['Chemistry — Term 2']);
    rows.push(header);
    if (t.possibleRow) rows.push(['Points possible', '', '', ...Array.from({ length: t.assessments }, () => '20')]);
    else if (t.headerInWords) rows[rows.length - 1] = header.map((h) => (h.startsWith('Quiz') ? `${h} (20)` : h));
    const valid = /^(\d+|\d+,\d|\d+\.\d+|\d+\/20|\d+%|| |EX|excused|-|pending|M)$/;
    const cellAt = (i: number) => {
      const c = t.cells[i] ?? '';
      return !t.clean || (valid.test(c) && !(Number(c) > 20)) ? c : '10';
    };
    const students = t.late === 'only-late-rows' ? 0 : t.students;
    for (let s = 0; s < students; s++) {
      const roll = next(100);
      if (roll < 3) {
        rows.push([]);
        continue;
      }
      const id = t.clean ? (roll < 4 ? 'Total' : `S${s}`) : roll < 5 ? '' : roll < 7 ? `S${next(Math.max(1, s))}` : roll < 8 ? 'Total' : `S${s}`;
      const row = [id, t.names[next(16)] ?? '', `A${next(3)}`, ...Array.from({ length: t.assessments }, () => cellAt(next(64)))];
      const late = rows.length >= HEAD_ROWS;
      if (late && t.late === 'new-column' && roll < 30) row.push('', 'x');
      if (late && t.late === 'empty-column' && roll < 30) row.push('7');
      rows.push(row);
    }
    if (t.late === 'only-late-rows') {
      // A head with no student in it, then students further down.
      while (rows.length < HEAD_ROWS + 5) rows.push([]);
      rows.push(['S9999', 'Late', 'A1', ...Array.from({ length: t.assessments }, () => '5')]);
    }
    if (next(4) === 0) rows.push([], []);
    return { rows, delimiter: t.delimiter, newline: t.newline, quoteAll: t.quoteAll, breakQuote: t.breakQuote };
  });

function text(t: Table): string {
  const field = (v: string) =>
    t.quoteAll || v.includes(t.delimiter) || v.includes('"') || v.includes('\n') || v.includes('\r') ? `"${v.replace(/"/g, '""')}"` : v;
  return t.rows
    .map((row, r) => {
      const line = row.map(field).join(t.delimiter);
      return t.breakQuote === r ? `${line}"x` : line;
    })
    .join(t.newline);
}

const bytesOf = (t: Table) => new TextEncoder().encode(text(t));

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
