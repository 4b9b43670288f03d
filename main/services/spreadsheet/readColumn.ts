/**
 * One numeric column of any spreadsheet, with the place of every value, for descriptive
 * statistics outside a gradebook (`weighbridge stats`) and for reading back our own exports.
 *
 * Decisions:
 * - Sheet: the named one, else the first sheet with a header cell equal to the column (case and
 *   surrounding spaces ignored). Header row: the one detectLayout finds on that sheet when it
 *   holds the column, else the first of the top 50 rows that does.
 * - Rows below the header that are left out, not counted: blank rows, the detected
 *   points-possible row, and rows whose first filled cell says "Points possible", "Max", "Total",
 *   "Average" … (headerWords.ts).
 * - A cell counts when it is a numeric workbook cell or text that is a plain decimal number
 *   ("12", "-3", "7.5", "7,5"); a blank cell or a score token (EX, pending …, DEFAULT_TOKENS) is
 *   skipped and listed; anything else is an error at its sheet, row, column and value.
 * - Labels: the student ID of the row (the detected ID column, neutraliser stripped like any
 *   import) when the header row is the detected one, else "row N".
 */
import type { ImportProblem, Result } from '../../../renderer/bridge/contract';
import { DEFAULT_TOKENS } from '../../../renderer/engine/grading/parseScore';
import { identityText } from './buildGradebook';
import { columnLetter } from './columnLetter';
import { detectLayout } from './detectLayout';
import { POSSIBLE_ROW_LABEL, SUMMARY_ROW_LABEL } from './headerWords';
import { problemAt, quote } from './problems';
import { cellText, isBlank, readBook, type Cell, type RawSheet } from './readBook';

export interface ColumnReadOptions {
  /** Header of the numeric column (case and surrounding spaces ignored). */
  readonly column: string;
  /** Header of a column whose text groups the values (e.g. "Section"). */
  readonly by?: string;
  /** The sheet to read; default: the first sheet with the column. */
  readonly sheet?: string;
}

/** A column as the user sees it: letter and header text. */
export interface ColumnPlace {
  readonly index: number;
  readonly letter: string;
  readonly header: string;
}

export interface ColumnValue {
  readonly value: number;
  /** 1-based row number, as the spreadsheet program shows it. */
  readonly row: number;
  /** The student ID of the row, else "row N". */
  readonly label: string;
  /** The `by` column's text in this row (trimmed); null without `by`. */
  readonly group: string | null;
}

export interface SkippedCell {
  readonly row: number;
  readonly label: string;
  readonly reason: 'blank' | 'token';
  /** The cell as written ('' for blank). */
  readonly text: string;
}

export interface ColumnReading {
  readonly sheet: string;
  /** 1-based row of the header. */
  readonly headerRow: number;
  readonly column: ColumnPlace;
  readonly by: ColumnPlace | null;
  /** In sheet order. */
  readonly values: readonly ColumnValue[];
  readonly skipped: readonly SkippedCell[];
}

const HEADER_SEARCH_ROWS = 50;
const NUMBER_TEXT = /^[+-]?(\d+(?:[.,]\d+)?|[.,]\d+)$/;
const TOKENS = new Set([...DEFAULT_TOKENS.excused, ...DEFAULT_TOKENS.missing, ...DEFAULT_TOKENS.pending].map((t) => t.trim().toLowerCase()));

const norm = (s: string) => s.trim().toLowerCase();

/** Pure over the bytes; see `readColumn` in index.ts for the path-taking form. */
export function readColumnBytes(bytes: Uint8Array, fileName: string, options: ColumnReadOptions): Result<ColumnReading> {
  const read = readBook(bytes, fileName);
  if (!read.ok) return { ok: false, code: 'bad-input', message: read.problem.message, problems: [read.problem] };
  const book = read.book;
  const candidates = options.sheet === undefined ? book.sheets : book.sheets.filter((s) => s.name === options.sheet);
  if (candidates.length === 0) {
    return bad(`There is no sheet "${options.sheet ?? ''}" in "${fileName}"; its sheets are ${book.sheets.map((s) => `"${s.name}"`).join(', ')}. Name one of them.`);
  }
  for (const sheet of candidates) {
    // Detected on this sheet alone: on the whole book, detection keeps only the sheets a gradebook
    // import would take, and the sheet holding the column may not be one of them.
    const guess = detectLayout({ ...book, sheets: [sheet] }, DEFAULT_TOKENS).layout.sheets[0];
    const headerRow = headerRowOf(sheet, options.column, guess?.headerRow);
    if (headerRow === null) continue;
    const header = sheet.rows[headerRow] ?? [];
    const col = findHeader(header, options.column);
    const byCol = options.by === undefined ? -1 : findHeader(header, options.by);
    if (options.by !== undefined && byCol < 0) {
      // A few names are enough to show what the sheet holds; a wide header would flood the message.
      const filledHeaders = header.filter((c) => !isBlank(c));
      const names = filledHeaders.slice(0, 10).map((c) => quote(cellText(c).trim()));
      const more = filledHeaders.length > names.length ? ` and ${filledHeaders.length - names.length} more` : '';
      return bad(`Sheet "${sheet.name}", row ${headerRow + 1}: there is no column ${quote(options.by)} to group by. Its columns are ${names.join(', ')}${more}.`);
    }
    const detected = guess !== undefined && guess.headerRow === headerRow ? guess : undefined;
    const idCol = detected?.columns.find((c) => c.role === 'id')?.index ?? -1;
    const place = (index: number): ColumnPlace => ({ index, letter: columnLetter(index), header: cellText(header[index]).trim() });
    const column = place(col);
    const values: ColumnValue[] = [];
    const skipped: SkippedCell[] = [];
    const problems: ImportProblem[] = [];
    for (let r = headerRow + 1; r < sheet.rows.length; r += 1) {
      const row = sheet.rows[r] ?? [];
      if (row.every((c) => isBlank(c))) continue;
      if (detected?.possibleRow === r) continue;
      const first = cellText(row.find((c) => !isBlank(c))).trim();
      if (POSSIBLE_ROW_LABEL.test(first) || SUMMARY_ROW_LABEL.test(first)) continue;
      const id = idCol >= 0 ? identityText(row[idCol]) : '';
      const label = id !== '' ? id : `row ${r + 1}`;
      const cell = row[col];
      const parsed = numberOf(cell);
      if (parsed.kind === 'number') {
        values.push({ value: parsed.value, row: r + 1, label, group: byCol >= 0 ? cellText(row[byCol]).trim() : null });
      } else if (parsed.kind === 'skip') {
        skipped.push({ row: r + 1, label, reason: parsed.reason, text: cellText(cell) });
      } else {
        const text = cellText(cell).trim();
        problems.push(
          problemAt('error', 'not-a-number', { sheet: sheet.name, row: r + 1, column: column.letter, header: column.header, value: text },
            `${quote(text)} is not a number. Correct the cell, or choose a numeric column.`),
        );
      }
    }
    const firstProblem = problems[0];
    if (firstProblem !== undefined) {
      const message = problems.length === 1
        ? firstProblem.message
        : `${problems.length} cells of column ${column.letter} (${quote(column.header)}) are not numbers. The first: ${firstProblem.message}`;
      return { ok: false, code: 'bad-input', message, problems };
    }
    return { ok: true, value: { sheet: sheet.name, headerRow: headerRow + 1, column, by: byCol >= 0 ? place(byCol) : null, values, skipped } };
  }
  return bad(
    `No sheet of "${fileName}"${options.sheet === undefined ? '' : ` named "${options.sheet}"`} has a column headed "${options.column}" in its top ${HEADER_SEARCH_ROWS} rows. Check the header text.`,
  );
}

function findHeader(header: readonly Cell[], name: string): number {
  return header.findIndex((c) => !isBlank(c) && norm(cellText(c)) === norm(name));
}

/** The header row of `sheet` holding `column`: the detected one when it does, else the first such row. */
function headerRowOf(sheet: RawSheet, column: string, detected: number | undefined): number | null {
  const has = (r: number) => findHeader(sheet.rows[r] ?? [], column) >= 0;
  if (detected !== undefined && has(detected)) return detected;
  for (let r = 0; r < Math.min(sheet.rows.length, HEADER_SEARCH_ROWS); r += 1) if (has(r)) return r;
  return null;
}

type Parsed = { kind: 'number'; value: number } | { kind: 'skip'; reason: 'blank' | 'token' } | { kind: 'bad' };

function numberOf(cell: Cell | undefined): Parsed {
  if (typeof cell === 'number') return { kind: 'number', value: cell };
  if (isBlank(cell)) return { kind: 'skip', reason: 'blank' };
  const text = cellText(cell).trim();
  if (TOKENS.has(text.toLowerCase())) return { kind: 'skip', reason: 'token' };
  if (!NUMBER_TEXT.test(text)) return { kind: 'bad' };
  return { kind: 'number', value: Number(text.replace(',', '.')) };
}

function bad(message: string): Result<never> {
  return { ok: false, code: 'bad-input', message };
}
