/**
 * Row-at-a-time import of a text table (.csv/.tsv) held in memory: each row is parsed, converted
 * to a Student and typed Scores by `StudentRows` and its strings dropped, instead of holding the
 * whole grid of cells first (readBook → buildGradebook). Beside the whole-book import, not instead
 * of it: the result is the whole-book import's — the same gradebook, layout and problems in the
 * same order — and whenever that cannot be known from the rows seen, this returns null and the
 * caller imports the whole book (tests/services/spreadsheet/textImport.test.ts compares the two
 * on random tables).
 *
 * The head rows come from `readTextRows` (papaparse's step mode). When the file holds no quote
 * character, the reading stops there and the later rows are read from the text's lines
 * (textLines.ts): papaparse's rows for such a text, without its objects per row or a string per
 * score cell. Later rows are checked and converted, never kept (the line reader refills one row).
 *
 * Why the first rows decide the layout exactly:
 * - Detection (detectLayout.ts) reads at most rows 0–59 to find the header (row ≤ 29), three rows
 *   below it for points possible and 200 rows below those for each column's content: all inside
 *   the first HEAD_ROWS rows. What it reads from the rest of the sheet is whether any cell is
 *   filled below the header in each column (and so the sheet's width, and whether anything lies
 *   past column XFD) and whether any row below the header is filled. Those are checked on every
 *   later row; a later row that would change them gives null.
 * - Planning (planGradebook) reads only the rows down to the header and points-possible rows, and
 *   the sheet's row count only to check that those rows exist — true once a filled row below them
 *   has been read.
 */
import type { ImportLayout, ImportProblem } from '../../../renderer/bridge/contract';
import type { Gradebook, Score, Student } from '../../../renderer/engine/model';
import { DEFAULT_TOKENS } from '../../../renderer/engine/grading/parseScore';
import { planGradebook, type BuildResult } from './buildGradebook';
import { detectLayout, MAX_COLUMNS, ROWS_READ_FROM_TOP } from './detectLayout';
import { finishSheet, isBlank, readTextRows, type Cell, type RawBook, type ReadOverride, type ReadResult, type TextTable } from './readBook';
import { allBlank, StudentRows } from './studentRows';
import { QuoteFreeLines, quoteFreeBytes } from './textLines';

/** Rows read before the layout is detected: all detectLayout reads cell by cell from the top of a sheet. */
export const HEAD_ROWS = ROWS_READ_FROM_TOP;

export type TextImport =
  /** The file was read whole (it fits in the head, or could not be read): continue as for readBook. */
  | { readonly kind: 'read'; readonly read: ReadResult }
  /** Read row by row: `earlier` are the reading and detection problems, `built` null when no sheet was found. */
  | { readonly kind: 'built'; readonly layout: ImportLayout; readonly earlier: readonly ImportProblem[]; readonly built: BuildResult | null };

/**
 * `given` null: detect the layout (detectAndImportBytes); else import with that layout
 * (importWorkbookBytes; its shape already checked). Null: not a text table, or a layout the rows
 * seen cannot settle — import the whole book instead.
 */
export function importTextRows(bytes: Uint8Array, fileName: string, override: ReadOverride, given: ImportLayout | null): TextImport | null {
  const givenStart = given === null ? 0 : startRowOf(given);
  if (givenStart === null) return null;
  const head: Cell[][] = [];
  let reading: Reading | null = null;
  const onRow = (row: Cell[], r: number, table: TextTable): boolean => {
    trimRow(row);
    if (reading === null) {
      head.push(row);
      const ready = given === null ? head.length >= HEAD_ROWS : r >= givenStart && !allBlank(row);
      if (!ready) return true;
      reading = new Reading(headBook(table, head), given);
      for (let k = reading.firstRow; k < head.length; k++) reading.take(k, head[k] ?? []);
      head.length = 0;
      return true;
    }
    return reading.later(r, row);
  };
  // Without a quote in the file, the rows after the head are read from the text's lines
  // (textLines.ts: papaparse's own rows for such a text, without a string per cell).
  const lineWise = quoteFreeBytes(bytes);
  let linesFrom: number | null = null;
  const read = readTextRows(bytes, fileName, override, (row, r, table) => {
    if (!onRow(row, r, table)) return false;
    if (!lineWise || reading === null) return true;
    linesFrom = r + 1;
    return false;
  });
  if (read === null) return null;
  if (!read.ok) return { kind: 'read', read };
  const from = linesFrom as number | null; // assigned in the row callback
  if (from !== null) {
    const table = read.table;
    const lines = QuoteFreeLines.open(bytes, table);
    if (lines === null || !lines.rowsFrom(from, (row, r) => onRow(row, r, table))) return null;
  } else if (read.stopped) return null;
  const done = reading as Reading | null; // assigned in the row callback
  if (done === null) return { kind: 'read', read: { ok: true, book: headBook(read.table, head) } };
  return done.finish();
}

/** The row of a given layout below which students start; null when the whole-book import should judge the layout. */
function startRowOf(layout: ImportLayout): number | null {
  const sl = layout.sheets[0];
  if (sl === undefined || layout.sheets.length !== 1) return null;
  const row = (n: number) => Number.isInteger(n) && n >= 0;
  if (!row(sl.headerRow) || (sl.possibleRow !== null && (!row(sl.possibleRow) || sl.possibleRow === sl.headerRow))) return null;
  return Math.max(sl.headerRow, sl.possibleRow ?? -1) + 1;
}

function headBook(table: TextTable, rows: Cell[][]): RawBook {
  return { format: table.format, encoding: table.encoding, delimiter: table.delimiter, sheets: [finishSheet(table.sheet, rows.slice())], problems: table.problems };
}

/** Trailing blank cells removed, as finishSheet does. */
function trimRow(row: Cell[]): void {
  while (row.length > 0 && isBlank(row[row.length - 1])) row.pop();
}

/** The import once the head is planned: student rows read, later rows checked against the head. */
class Reading {
  readonly firstRow: number;
  private readonly layout: ImportLayout;
  private readonly earlier: readonly ImportProblem[];
  private readonly problems: ImportProblem[] = [];
  private readonly reader: StudentRows | null;
  private readonly assessments: BuildResult['gradebook']['assessments'];
  private readonly students: Student[] = [];
  private readonly scores: Score[][] = [];
  /** Detection only: the head's width (capped at XFD); null = nothing to check. */
  private readonly width: number | null;
  /** Detection only: the columns within `width` without a filled cell from the header down in the head. */
  private readonly unused: readonly number[];
  /** Detection only: the head holds a filled row at or below its first data row (or no header was found). */
  private readonly filledBelow: boolean;

  constructor(book: RawBook, given: ImportLayout | null) {
    const sheet = book.sheets[0];
    if (given === null) {
      const detection = detectLayout(book, DEFAULT_TOKENS);
      this.layout = detection.layout;
      this.earlier = [...book.problems, ...detection.problems];
      const sl = detection.layout.sheets[0];
      if (sheet === undefined || sheet.rows.length === 0) {
        this.width = null;
        this.unused = [];
        this.filledBelow = false; // an empty head: any filled row later changes everything
      } else if (sl === undefined) {
        this.width = null; // no header in the first rows: nothing further down is read
        this.unused = [];
        this.filledBelow = true;
      } else {
        const width = Math.min(sheet.width, MAX_COLUMNS);
        const used = new Array<boolean>(width).fill(false);
        for (let r = sl.headerRow; r < sheet.rows.length; r++) {
          const row = sheet.rows[r] ?? [];
          for (let c = 0; c < Math.min(row.length, width); c++) if (!isBlank(row[c])) used[c] = true;
        }
        this.width = width;
        this.unused = used.flatMap((u, c) => (u ? [] : [c]));
        const firstData = Math.max(sl.headerRow, sl.possibleRow ?? -1) + 1;
        let filled = false;
        for (let r = firstData; r < sheet.rows.length && !filled; r++) filled = !allBlank(sheet.rows[r] ?? []);
        this.filledBelow = filled;
      }
    } else {
      this.layout = given;
      this.earlier = [];
      this.width = null;
      this.unused = [];
      this.filledBelow = true;
    }
    const usable = this.layout.sheets.length > 0;
    const plan = usable ? planGradebook(book, this.layout, this.problems) : null;
    this.assessments = plan?.assessments ?? [];
    const p = plan?.sheets[0];
    this.reader = plan === null || p === undefined ? null : new StudentRows(p, this.layout, plan.assessments, plan.assessmentIndex, new Map(), this.problems);
    this.firstRow = this.reader?.firstRow ?? Number.MAX_SAFE_INTEGER;
  }

  /** A student row. */
  take(r: number, row: readonly Cell[]): void {
    const got = this.reader?.row(r, row);
    if (got === null || got === undefined) return;
    this.students.push(got.student);
    this.scores.push(got.scores);
  }

  /** A row after the head, not kept; false when it could change the detected layout (import the whole book). */
  later(r: number, row: Cell[]): boolean {
    if (!this.settled(row)) return false;
    if (r >= this.firstRow) this.take(r, row);
    return true;
  }

  private settled(row: readonly Cell[]): boolean {
    if (this.width !== null) {
      // Trimmed: a row longer than the head's width has a filled cell past it.
      if (row.length > this.width) return false;
      for (const c of this.unused) if (c < row.length && !isBlank(row[c])) return false;
    }
    return this.filledBelow || row.length === 0;
  }

  finish(): TextImport {
    if (this.layout.sheets.length === 0) return { kind: 'built', layout: this.layout, earlier: this.earlier, built: null };
    this.reader?.finish();
    const gradebook: Gradebook = { students: this.students, assessments: this.assessments, scores: this.scores };
    return { kind: 'built', layout: this.layout, earlier: this.earlier, built: { gradebook, problems: this.problems } };
  }
}
