/**
 * Random delimited text tables for the row-at-a-time imports' tests (textImport.test.ts,
 * stream.test.ts): long enough to pass the rows the layout is detected on, with blank rows,
 * summary rows, blank and repeated IDs, every kind of score cell, quoted fields, broken quotes,
 * and cells that appear only far down in columns the first rows leave empty. Invented data: the
 * tests compare two imports of the same table, never the table with typed-in results.
 */
import fc from 'fast-check';
import { HEAD_ROWS } from '../../../main/services/spreadsheet/textHead';

const score = fc.oneof(
  { weight: 12, arbitrary: fc.integer({ min: 0, max: 20 }).map(String) },
  { weight: 2, arbitrary: fc.constantFrom('', ' ', 'EX', 'excused', '-', 'pending', 'M') },
  { weight: 1, arbitrary: fc.constantFrom('7,5', '7.25', '18/20', '85%', '1 234,5', '25', '99', '-3', ' -1', 'abc', '=1+1', '12 pts', '1,234', '3/0') },
);

const identity = fc.constantFrom('Ann', 'Lee, Bo', '"Quoted"', "'=cmd", ' spaced ', 'Total', 'Average', '');

export interface Table {
  readonly rows: string[][];
  readonly delimiter: string;
  readonly newline: string;
  readonly quoteAll: boolean;
  readonly breakQuote: number | null;
  /** What the rows past the head add: nothing, a cell past the head's width, a cell in the head's blank trailing column, or the only students. */
  readonly late: 'none' | 'new-column' | 'empty-column' | 'only-late-rows';
}

export const table: fc.Arbitrary<Table> = fc
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
    late: fc.constantFrom<Table['late']>('none', 'none', 'new-column', 'empty-column', 'only-late-rows'),
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
    return { rows, delimiter: t.delimiter, newline: t.newline, quoteAll: t.quoteAll, breakQuote: t.breakQuote, late: t.late };
  });

export function text(t: Table): string {
  const field = (v: string) =>
    t.quoteAll || v.includes(t.delimiter) || v.includes('"') || v.includes('\n') || v.includes('\r') ? `"${v.replace(/"/g, '""')}"` : v;
  return t.rows
    .map((row, r) => {
      const line = row.map(field).join(t.delimiter);
      return t.breakQuote === r ? `${line}"x` : line;
    })
    .join(t.newline);
}

export const bytesOf = (t: Table) => new TextEncoder().encode(text(t));
