/**
 * The rows of a text table without a single quote character, read straight from its decoded text:
 * beside papaparse, not instead of it, for the row-at-a-time import (textImport.ts) once the rows
 * that decide the layout have been read through `readTextRows`.
 *
 * Why it gives papaparse's rows: papaparse reads a text without its quote character in "fast
 * mode" — "Fast mode will automatically be enabled if no " characters appear in the input"
 * (papaparse.com/docs, config `fastMode`) — which is `text.split(newline)`, then
 * `line.split(delimiter)` for each line, with no errors (papaparse.js 5.7.1, Parser.parse; no
 * comments or preview are configured). The newline is the one papaparse guesses for the same text
 * (asked of papaparse itself), the delimiter the one `readTextRows` reports. Tested equal to
 * papaparse's rows on random quote-free texts (tests/services/spreadsheet/textLines.test.ts).
 *
 * What it saves: papaparse's objects per row, and one string per cell. A column holds few distinct
 * values (17, 17.5, EX …), so a short cell equal to one seen recently is handed the same string
 * instead of a new one; a text table of 20 000 rows × 60 columns then allocates thousands of cell
 * strings, not 1.2 million. Strings are values: which copy a row holds cannot be told apart.
 */
import Papa from 'papaparse';
import type { Cell, TextTable } from './readBook';
import { decodeText } from './textEncoding';

/**
 * True when no byte of the file is 0x22: then its text holds no '"' whichever encoding it is read
 * as (UTF-8, UTF-16LE/BE and Windows-1252 all write '"' with a 0x22 byte), and papaparse reads it
 * in fast mode. A file with such a byte may still hold no quote; it is simply not read line-wise.
 */
export function quoteFreeBytes(bytes: Uint8Array): boolean {
  return bytes.indexOf(0x22) === -1;
}

/**
 * Cells of up to this many characters below U+0100 are shared between rows, looked up by their
 * characters packed into one number (1, then 8 bits a character: at most 49 bits, exact).
 */
const SHARED_MAX = 6;
/** Slots of the shared-cell table (a prime: slot = packed key mod SLOTS). */
const SLOTS = 4093;

export class QuoteFreeLines {
  private readonly keys = new Float64Array(SLOTS);
  private readonly shared: string[] = new Array<string>(SLOTS).fill('');
  private readonly delimiterCode: number;
  /** The one row array handed on, refilled for each line. */
  private readonly scratch: Cell[] = [];

  private constructor(
    private readonly text: string,
    private readonly newline: string,
    delimiter: string,
  ) {
    this.delimiterCode = delimiter.charCodeAt(0);
  }

  /**
   * The lines of `bytes`, decoded as `readTextRows` decoded them for `table` (the same encoding
   * gives the same text). Null when the text holds a quote after all, or the delimiter is not one
   * character: papaparse's reading is then not this one.
   */
  static open(bytes: Uint8Array, table: TextTable): QuoteFreeLines | null {
    if (table.delimiter.length !== 1) return null;
    const text = decodeText(bytes, table.encoding);
    if (text.includes('"')) return null;
    // papaparse guesses the line break from the text alone (the delimiter and preview do not enter).
    const newline = Papa.parse<string[]>(text, { delimiter: table.delimiter, preview: 1, header: false }).meta.linebreak;
    return new QuoteFreeLines(text, newline, table.delimiter);
  }

  /**
   * Hands on row `first` and every row after it (0-based, as papaparse numbers them; blanks as
   * null, as `readTextRows` gives them). False when `onRow` returned false (the reading stopped).
   * The row array is the same one for every line, refilled: `onRow` may change it but must not
   * keep it (20 000 rows of 60 cells then allocate no row arrays at all).
   */
  rowsFrom(first: number, onRow: (row: Cell[], r: number) => boolean): boolean {
    const text = this.text;
    const newline = this.newline;
    let start = 0;
    for (let r = 0; r < first; r++) {
      const at = text.indexOf(newline, start);
      if (at < 0) return true; // fewer rows than that
      start = at + newline.length;
    }
    for (let r = first; ; r++) {
      const at = text.indexOf(newline, start);
      const end = at < 0 ? text.length : at;
      if (!onRow(this.row(start, end), r)) return false;
      if (at < 0) return true;
      start = at + newline.length;
    }
  }

  /** The line text[start, end) split at the delimiter: papaparse's `line.split(delimiter)`, '' as null. */
  private row(start: number, end: number): Cell[] {
    const text = this.text;
    const delimiter = this.delimiterCode;
    const row = this.scratch;
    let n = 0;
    let from = start;
    let key = 1; // 0 once the cell is too long or holds a character from U+0100 on: not shared
    for (let i = start; ; i++) {
      const code = i === end ? -1 : text.charCodeAt(i);
      if (code === delimiter || code === -1) {
        row[n++] = i === from ? null : key === 0 ? text.slice(from, i) : this.cell(from, i, key);
        if (code === -1) {
          row.length = n;
          return row;
        }
        from = i + 1;
        key = 1;
      } else if (key !== 0) {
        key = code < 0x100 && i - from < SHARED_MAX ? key * 256 + code : 0;
      }
    }
  }

  /** text[from, to), whose packed characters are `key`: the string already handed out for them, if any. */
  private cell(from: number, to: number, key: number): string {
    const slot = key % SLOTS;
    if (this.keys[slot] === key) return this.shared[slot] as string;
    const fresh = this.text.slice(from, to);
    this.keys[slot] = key;
    this.shared[slot] = fresh;
    return fresh;
  }
}
