/**
 * The head-and-check rule: how a text table (.csv/.tsv) read one row at a time is known to give
 * the whole-book import's layout, plan and problems. Its first rows (the head) decide the layout;
 * every later row is checked, and one that could change what the head decided stops the reading,
 * so the caller imports the whole book instead. The ONE place this is decided: the in-memory
 * row-at-a-time import (textImport.ts) and the command line's file stream (stream.ts) both feed
 * their rows, in order from row 0, to a `TextHead`.
 *
 * Which rows decide the layout:
 * - Detected (no layout given): the first HEAD_ROWS rows. Detection (detectLayout.ts) reads at
 *   most rows 0–59 to find the header (row ≤ 29), three rows below it for points possible and 200
 *   rows below those for each column's content: all inside the head (ROWS_READ_FROM_TOP).
 * - Given (the preview's layout): the rows down to the first filled row below the header and
 *   points-possible rows. Planning (planGradebook) reads only the rows down to those two, and the
 *   sheet's row count only to check that they exist — true once a filled row below them is read.
 *
 * Which later row could change it (detected layouts only): what detection reads below the head is
 * whether any cell is filled from the header down in each column (and so the sheet's width, and
 * whether anything lies past column XFD) and whether any row below the header is filled. A later
 * row changes neither unless it has a filled cell past the head's width or in a column the head
 * leaves empty from the header down, or is filled when the head has no filled row below its first
 * data row (or is empty). Such a row is the one `take` refuses.
 *
 * Rows below the head are handed on as students (StudentRows, the row rules) and never kept.
 */
import type { ImportLayout, ImportProblem } from '../../../renderer/bridge/contract';
import type { Assessment } from '../../../renderer/engine/model';
import { DEFAULT_TOKENS } from '../../../renderer/engine/grading/parseScore';
import { planGradebook } from './buildGradebook';
import { detectLayout, MAX_COLUMNS, ROWS_READ_FROM_TOP } from './detectLayout';
import { finishSheet, isBlank, type Cell, type RawBook, type TextTable } from './readBook';
import { allBlank, StudentRows, type StudentRow } from './studentRows';

/** Rows read before the layout is detected: all detectLayout reads cell by cell from the top of a sheet. */
export const HEAD_ROWS = ROWS_READ_FROM_TOP;

/** What the head decided, planned. */
export interface HeadPlan {
  /** Detected on the head, or the one given. */
  readonly layout: ImportLayout;
  /** The table's reading problems and detection's (none when the layout was given): they come first. */
  readonly earlier: readonly ImportProblem[];
  /** Planning's problems, then each student row's as it is read: the whole-book import's order. */
  readonly problems: readonly ImportProblem[];
  readonly assessments: readonly Assessment[];
  /** Null when no sheet could be planned (the layout has none, or planning refused it). */
  readonly reader: StudentRows | null;
}

export interface HeadSink {
  /** Called once, when the head has decided the layout, before any student; false stops the reading. */
  planned(plan: HeadPlan): boolean;
  /** A student row, in sheet order: the head's from its first student row, then the later rows'. */
  student(got: StudentRow): void;
}

/** What later rows are checked against: the head's width and used columns (detected layouts only). */
interface LaterRowCheck {
  /** The head's width (capped at XFD); null = no column to check. */
  readonly width: number | null;
  /** The columns within `width` without a filled cell from the header down in the head. */
  readonly unused: readonly number[];
  /** The head holds a filled row at or below its first data row (or no header was found). */
  readonly filledBelow: boolean;
}

/** A given layout, or a head without a header: no later row changes what detection read. */
const NOTHING_TO_CHECK: LaterRowCheck = { width: null, unused: [], filledBelow: true };

export class TextHead {
  private readonly rows: Cell[][] = [];
  private plan: (HeadPlan & { readonly problems: ImportProblem[] }) | null = null;
  private check: LaterRowCheck = NOTHING_TO_CHECK;
  /** The plan's reader, kept in a field: read once per row. */
  private reader: StudentRows | null = null;
  /**
   * The reader's first student row (0 without a reader: `read` then reads nothing). A small
   * integer, never a sentinel such as MAX_SAFE_INTEGER: V8 would keep the field, and the row
   * numbers counted from it, as doubles — and every student's "first seen on row" record
   * (StudentRows' IdsSeen) would then hold a boxed number, 16 bytes a student.
   */
  private firstRow = 0;

  private constructor(
    private readonly given: ImportLayout | null,
    /** Given layouts: the row below which students start. */
    private readonly start: number,
    private readonly sink: HeadSink,
  ) {}

  /** The layout detected on the head. */
  static detecting(sink: HeadSink): TextHead {
    return new TextHead(null, 0, sink);
  }

  /** `given` null: detect the layout on the head. Null: a given layout whose rows the whole-book import should judge. */
  static open(given: ImportLayout | null, sink: HeadSink): TextHead | null {
    if (given === null) return TextHead.detecting(sink);
    const start = startRowOf(given);
    return start === null ? null : new TextHead(given, start, sink);
  }

  /** The plan once the head has decided the layout; null while the head is being read. */
  get planned(): HeadPlan | null {
    return this.plan;
  }

  /** Errors reported so far (any means nothing will be imported). */
  get errors(): number {
    return this.reader?.errors ?? 0;
  }

  /**
   * Row `r` (0-based; every row in order from row 0; trailing blank cells trimmed here, in place).
   * The row is not kept once the head has decided, so a reader may refill the same array. False
   * stops the reading: the row could change the layout the head decided (import the whole book),
   * or the sink's `planned` said so.
   */
  take(row: Cell[], r: number, table: TextTable): boolean {
    const blank = isBlank; // one binding read, not one per call (module getters under tsx)
    while (row.length > 0 && blank(row[row.length - 1])) row.pop();
    if (this.plan === null) {
      this.rows.push(row);
      const ready = this.given === null ? this.rows.length >= HEAD_ROWS : r >= this.start && !allBlank(row);
      return ready ? this.decide(table) : true;
    }
    if (!this.settled(row)) return false;
    if (r >= this.firstRow) this.read(r, row);
    return true;
  }

  /**
   * The table ended: if it did so inside the head, the layout is decided on every row read — the
   * whole table, so detection and planning see all they would. False when the sink's `planned`
   * stopped the reading.
   */
  end(table: TextTable): boolean {
    return this.plan !== null || this.decide(table);
  }

  /** The rows read as the table's book (for a table that ended inside the head). */
  book(table: TextTable): RawBook {
    return { format: table.format, encoding: table.encoding, delimiter: table.delimiter, sheets: [finishSheet(table.sheet, this.rows.slice())], problems: table.problems };
  }

  /** After the last row: a sheet without a single student row is an error (StudentRows.finish). */
  finish(): void {
    this.plan?.reader?.finish();
  }

  private decide(table: TextTable): boolean {
    const book = this.book(table);
    const sheet = book.sheets[0];
    let layout: ImportLayout;
    let earlier: readonly ImportProblem[] = [];
    if (this.given === null) {
      const detection = detectLayout(book, DEFAULT_TOKENS);
      layout = detection.layout;
      earlier = [...book.problems, ...detection.problems];
      this.check = laterRowCheck(layout, sheet?.rows ?? [], sheet?.width ?? 0);
    } else {
      layout = this.given;
    }
    const problems: ImportProblem[] = [];
    const plan = layout.sheets.length > 0 ? planGradebook(book, layout, problems) : null;
    const p = plan?.sheets[0];
    const reader = plan === null || p === undefined ? null : new StudentRows(p, layout, plan.assessments, plan.assessmentIndex, new Map(), problems);
    this.plan = { layout, earlier, problems, assessments: plan?.assessments ?? [], reader };
    this.reader = reader;
    this.firstRow = reader?.firstRow ?? 0;
    if (!this.sink.planned(this.plan)) return false;
    const rows = this.rows;
    for (let k = this.firstRow; k < rows.length; k++) this.read(k, rows[k] ?? []);
    rows.length = 0;
    return true;
  }

  private read(r: number, row: readonly Cell[]): void {
    const got = this.reader?.row(r, row);
    if (got !== null && got !== undefined) this.sink.student(got);
  }

  private settled(row: readonly Cell[]): boolean {
    const check = this.check;
    if (check.width !== null) {
      // Trimmed: a row longer than the head's width has a filled cell past it.
      if (row.length > check.width) return false;
      for (const c of check.unused) if (c < row.length && !isBlank(row[c])) return false;
    }
    return check.filledBelow || row.length === 0;
  }
}

/** What detection read from the head's rows below its header, for `settled`. */
function laterRowCheck(layout: ImportLayout, rows: readonly (readonly Cell[])[], sheetWidth: number): LaterRowCheck {
  if (rows.length === 0) return { width: null, unused: [], filledBelow: false }; // an empty head: any filled row later changes everything
  const sl = layout.sheets[0];
  if (sl === undefined) return NOTHING_TO_CHECK; // no header in the first rows: nothing further down is read
  const width = Math.min(sheetWidth, MAX_COLUMNS);
  const used = new Array<boolean>(width).fill(false);
  for (let r = sl.headerRow; r < rows.length; r++) {
    const row = rows[r] ?? [];
    for (let c = 0; c < Math.min(row.length, width); c++) if (!isBlank(row[c])) used[c] = true;
  }
  const firstData = Math.max(sl.headerRow, sl.possibleRow ?? -1) + 1;
  let filled = false;
  for (let r = firstData; r < rows.length && !filled; r++) filled = !allBlank(rows[r] ?? []);
  return { width, unused: used.flatMap((u, c) => (u ? [] : [c])), filledBelow: filled };
}

/** The row of a given layout below which students start; null when the whole-book import should judge the layout. */
function startRowOf(layout: ImportLayout): number | null {
  const sl = layout.sheets[0];
  if (sl === undefined || layout.sheets.length !== 1) return null;
  const row = (n: number) => Number.isInteger(n) && n >= 0;
  if (!row(sl.headerRow) || (sl.possibleRow !== null && (!row(sl.possibleRow) || sl.possibleRow === sl.headerRow))) return null;
  return Math.max(sl.headerRow, sl.possibleRow ?? -1) + 1;
}
