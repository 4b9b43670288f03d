/**
 * The quote-free line reader (main/services/spreadsheet/textLines.ts) beside papaparse, the
 * library the whole-book reader uses: on random texts without a '"' — any of the three
 * delimiters and line breaks, mixed line breaks, blank lines and cells, spaces, characters past
 * U+00FF and surrogate pairs, more distinct short cells than its shared-cell table has slots — the
 * rows it hands on from any row on are papaparse's rows of the whole text (blanks as null), in
 * UTF-8 and UTF-16.
 */
import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { readTextRows, type Cell, type ReadOverride, type TextTable } from '../../../main/services/spreadsheet/readBook';
import { QuoteFreeLines, quoteFreeBytes } from '../../../main/services/spreadsheet/textLines';

/** papaparse's rows with the reader's options, blanks as null: what readTextRows hands on. */
function papaRows(text: string): Cell[][] {
  const parsed = Papa.parse<string[]>(text, { delimiter: '', delimitersToGuess: [',', ';', '\t'], header: false, dynamicTyping: false, skipEmptyLines: false });
  return parsed.data.map((row) => row.map((c) => (c === '' ? null : c)));
}

/** The table readTextRows reports for the bytes (read up to its first row). */
function tableOf(bytes: Uint8Array, override: ReadOverride = {}): TextTable {
  const read = readTextRows(bytes, 't.csv', override, () => false);
  if (read === null || !read.ok) throw new Error('not read as text');
  return read.table;
}

function linesFrom(bytes: Uint8Array, first: number, override: ReadOverride = {}): Cell[][] | null {
  const lines = QuoteFreeLines.open(bytes, tableOf(bytes, override));
  if (lines === null) return null;
  const rows: Cell[][] = [];
  expect(lines.rowsFrom(first, (row) => rows.push([...row]) > 0)).toBe(true);
  return rows;
}

function utf16le(text: string): Uint8Array {
  const bytes = new Uint8Array(2 + text.length * 2);
  bytes[0] = 0xff;
  bytes[1] = 0xfe;
  for (let i = 0; i < text.length; i++) {
    bytes[2 + 2 * i] = text.charCodeAt(i) & 0xff;
    bytes[3 + 2 * i] = text.charCodeAt(i) >> 8;
  }
  return bytes;
}

const cell = fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom('', '7', '17.5', '12', 'EX', 'pending', ' ', ' 9 ', 'é', 'Ωmega', 'x\u0100', '😀', 'Lee Bo', 'B1000001', '1 234,5', '\u00a0') },
  { weight: 3, arbitrary: fc.array(fc.constantFrom('0', '5', '9', '.', 'a', 'Z', ' ', 'é', '\u0101', '\u00ff'), { maxLength: 9 }).map((cs) => cs.join('')) },
);
const text = fc
  .record({
    rows: fc.array(fc.array(cell, { maxLength: 8 }), { minLength: 1, maxLength: 30 }),
    delimiter: fc.constantFrom(',', ';', '\t'),
    newlines: fc.array(fc.constantFrom('\n', '\r\n', '\r', '\r\n', '\n'), { minLength: 1, maxLength: 30 }),
    trailing: fc.boolean(),
  })
  .map(({ rows, delimiter, newlines, trailing }) => {
    let out = '';
    rows.forEach((row, r) => {
      if (r > 0) out += newlines[r % newlines.length];
      out += row.join(delimiter);
    });
    return trailing ? out + (newlines[0] ?? '\n') : out;
  })
  .filter((t) => t.trim() !== '');

describe('quote-free lines equal papaparse', () => {
  it('from any row on, the rows of papaparse’s whole-text parse (UTF-8)', () => {
    fc.assert(
      fc.property(text, fc.nat(35), (source, first) => {
        const bytes = new TextEncoder().encode(source);
        expect(quoteFreeBytes(bytes)).toBe(true);
        expect(linesFrom(bytes, first)).toStrictEqual(papaRows(source).slice(first));
      }),
      { numRuns: 400 },
    );
  });

  it('the same in UTF-16LE', () => {
    fc.assert(
      fc.property(text, fc.nat(10), (source, first) => {
        const bytes = utf16le(source);
        fc.pre(quoteFreeBytes(bytes)); // a code unit such as U+2022 would hold a 0x22 byte
        expect(linesFrom(bytes, first)).toStrictEqual(papaRows(source).slice(first));
      }),
      { numRuns: 200 },
    );
  });

  it('more distinct short cells than the shared-cell table has slots, over the characters it packs', () => {
    // Cells of 1–7 characters from U+0020–U+017F (a seeded generator: ~24 000 cells, most distinct),
    // so cells that share a slot, or would share a key if the packing were not exact, follow each other.
    let x = 231;
    const next = (n: number) => {
      x = (Math.imul(x, 1103515245) + 12345) & 0x7fffffff;
      return x % n;
    };
    const short = () => Array.from({ length: 1 + next(7) }, () => String.fromCharCode(0x20 + next(0x160))).join('').replace(/[,;\t"]/g, 'q');
    const rows = Array.from({ length: 3000 }, () => Array.from({ length: 8 }, short));
    const source = rows.map((row) => row.join(',')).join('\n');
    expect(linesFrom(new TextEncoder().encode(source), 1)).toStrictEqual(papaRows(source).slice(1));
  });

  it('long cells that differ only in their last character stay apart', () => {
    const source = ['h,h', ...['ÿÿÿÿÿ', 'ÿÿÿÿÿÿ', 'ÿÿÿÿÿÿÿ', 'ÿÿÿÿÿÿÿÿ'].flatMap((stem) => ['a', 'b', 'c', 'b'].map((last) => `${stem}${last},${last}${stem}`))].join('\r\n');
    expect(linesFrom(new TextEncoder().encode(source), 1)).toStrictEqual(papaRows(source).slice(1));
  });

  it('a row the reading stops at ends it', () => {
    const bytes = new TextEncoder().encode('a,b\n1,2\n3,4\n5,6');
    const lines = QuoteFreeLines.open(bytes, tableOf(bytes));
    const seen: number[] = [];
    expect(lines?.rowsFrom(1, (_row, r) => seen.push(r) < 2)).toBe(false);
    expect(seen).toStrictEqual([1, 2]);
  });

  it('a quote anywhere: not read line-wise', () => {
    const bytes = new TextEncoder().encode('a,b\n1,"2"\n');
    expect(quoteFreeBytes(bytes)).toBe(false);
    expect(QuoteFreeLines.open(bytes, tableOf(bytes))).toBeNull();
  });
});
