/**
 * One student row of a planned sheet → a Student and its Scores, with every problem of the row
 * located (sheet, row, column letter, header, value). The ONE place the row rules live: the
 * whole-book import (buildGradebook), the row-at-a-time text import (textImport.ts) and the
 * command line's streaming import (stream.ts) all read their rows through `StudentRows`, so they
 * cannot drift apart.
 *
 * Decisions (see also buildGradebook.ts):
 * - A row with every cell blank is skipped; a row without an ID whose ID/name cell says "Total",
 *   "Average", "Mean" … is a summary row, skipped with a warning; any other row without an ID is
 *   an error, and so is an ID used before (on any sheet).
 * - Sheet per section: an assessment that is not on a student's sheet is `excused` for that
 *   student (it did not exist for them), with one warning per sheet; never `missing`.
 * - Scores above points possible are kept with a warning: whether they count is the plan's
 *   extra-credit decision, not the importer's.
 */
import type { ColumnLayout, ImportLayout, ImportProblem, SheetLayout } from '../../../renderer/bridge/contract';
import type { Assessment, Score, Student } from '../../../renderer/engine/model';
import { scoreReader, type ScoreReader } from '../../../renderer/engine/grading/parseScore';
import { stripNeutraliser } from '../export/neutralise';
import { columnLetter } from './columnLetter';
import { SUMMARY_ROW_LABEL } from './headerWords';
import { problemAt, quote } from './problems';
import { cellText, isBlank, type Cell } from './readBook';

export interface PlannedAssessment {
  readonly column: ColumnLayout;
  readonly id: string;
  /** Null when it could not be worked out (reported at the column; nothing is imported then). */
  readonly possible: number | null;
}

/** A sheet whose layout passed the sheet-level checks (buildGradebook's planGradebook). */
export interface PlannedSheet {
  /** The sheet's name (and its rows' section when sections come from sheet names). */
  readonly name: string;
  readonly layout: SheetLayout;
  readonly role: (r: 'id' | 'name' | 'firstName' | 'lastName' | 'section' | 'email') => ColumnLayout | undefined;
  readonly assessments: readonly PlannedAssessment[];
}

export interface StudentRow {
  readonly student: Student;
  /** In the gradebook's assessment order; a fresh array per row. */
  readonly scores: Score[];
}

/** Where a student ID was first seen, for the duplicate-ID message; shared by every sheet of a book. */
export type IdsSeen = Map<string, { readonly sheet: string; readonly row: number }>;

/** One assessment column of a sheet, with what every cell of it needs worked out once. */
interface CellPlan {
  readonly assessment: PlannedAssessment;
  /** Position in the gradebook's assessments (and so in each student's scores). */
  readonly index: number;
  /** The sheet column it is read from. */
  readonly column: number;
  readonly letter: string;
}

/**
 * Reads the student rows of one planned sheet, one row at a time, in sheet order. Problems are
 * pushed onto `problems` in the order the whole-book import has always produced them.
 */
export class StudentRows {
  /** 0-based index of the first row below the header (and the points-possible row). */
  readonly firstRow: number;
  private readonly idCol: ColumnLayout | undefined;
  private readonly idLetter: string;
  private readonly personCols: readonly ColumnLayout[];
  private readonly cells: readonly CellPlan[];
  /** Per cell plan: its sheet column, and its points possible (NaN when unknown). */
  private readonly columns: Int32Array;
  private readonly possible: Float64Array;
  private readonly inOrder: boolean;
  private readonly roles: { readonly name?: ColumnLayout; readonly firstName?: ColumnLayout; readonly lastName?: ColumnLayout; readonly section?: ColumnLayout; readonly email?: ColumnLayout };
  private readonly absent: readonly Assessment[];
  private readonly assessmentCount: number;
  private readonly read: ScoreReader;
  private absentReported = false;
  private students = 0;
  private errorCount = 0;

  constructor(
    private readonly p: PlannedSheet,
    private readonly layout: ImportLayout,
    assessments: readonly Assessment[],
    assessmentIndex: ReadonlyMap<string, { readonly index: number }>,
    private readonly idSeen: IdsSeen,
    private readonly problems: ImportProblem[],
  ) {
    const sl = p.layout;
    this.firstRow = Math.max(sl.headerRow, sl.possibleRow ?? -1) + 1;
    this.idCol = p.role('id');
    this.idLetter = this.idCol === undefined ? '' : columnLetter(this.idCol.index);
    this.personCols = [this.idCol, p.role('name'), p.role('firstName'), p.role('lastName')].filter((c): c is ColumnLayout => c !== undefined);
    const onSheet = new Set(p.assessments.map((a) => a.id));
    this.absent = assessments.filter((a) => !onSheet.has(a.id));
    this.assessmentCount = assessments.length;
    this.read = scoreReader(layout.tokens);
    const cells: CellPlan[] = [];
    for (const a of p.assessments) {
      const index = assessmentIndex.get(a.id)?.index;
      if (index !== undefined) cells.push({ assessment: a, index, column: a.column.index, letter: columnLetter(a.column.index) });
    }
    this.cells = cells;
    this.columns = Int32Array.from(cells, (c) => c.column);
    this.possible = Float64Array.from(cells, (c) => c.assessment.possible ?? Number.NaN);
    const roles: { -readonly [K in keyof StudentRows['roles']]: ColumnLayout } = {};
    for (const r of ['name', 'firstName', 'lastName', 'section', 'email'] as const) {
      const c = p.role(r);
      if (c !== undefined) roles[r] = c;
    }
    this.roles = roles;
    // The usual case (one sheet, or this sheet's columns in the gradebook's order): each student's
    // scores are pushed in order; otherwise they are placed by index over an all-excused row.
    this.inOrder = cells.length === assessments.length && cells.every((c, i) => c.index === i);
  }

  /** Student rows read so far (with or without problems in their scores). */
  get count(): number {
    return this.students;
  }

  /** Errors this reader has reported so far: any means nothing will be imported. */
  get errors(): number {
    return this.errorCount;
  }

  /**
   * Row `r` (0-based, at or below `firstRow`) → the student and scores, or null when the row is
   * skipped (blank, a summary row) or refused (blank or duplicate ID). A row whose cells have
   * errors still gives its student, with `missing` in those cells; `errors` counts them.
   */
  row(r: number, row: readonly Cell[]): StudentRow | null {
    const idCol = this.idCol;
    if (idCol === undefined || allBlank(row)) return null;
    const sheet = this.p.name;
    const problems = this.problems;
    const rowNo = r + 1;
    const id = identityText(row[idCol.index]);
    if (id === '' || SUMMARY_ROW_LABEL.test(id)) {
      const label = rowLabel(row, this.personCols);
      if (SUMMARY_ROW_LABEL.test(label)) {
        problems.push(problemAt('warning', 'summary-row-skipped', { sheet, row: rowNo, value: label }, `this row (${quote(label)}) looks like a summary of the students, not a student, and was skipped.`));
        return null;
      }
      if (id === '') {
        const idAt = { sheet, row: rowNo, column: this.idLetter, header: idCol.header, value: id };
        this.error(problemAt('error', 'blank-id', idAt, `the student ID is blank${label === '' ? '' : ` (row of ${quote(label)})`}. Fill in the ID or delete the row.`));
        return null;
      }
    }
    const dup = this.idSeen.get(id);
    if (dup !== undefined) {
      const idAt = { sheet, row: rowNo, column: this.idLetter, header: idCol.header, value: id };
      const where = dup.sheet === sheet ? `row ${dup.row}` : `sheet "${dup.sheet}", row ${dup.row}`;
      this.error(problemAt('error', 'duplicate-id', idAt, `student ID ${quote(id)} is already used on ${where}. Give each student one row with a unique ID.`));
      return null;
    }
    this.idSeen.set(id, { sheet, row: rowNo });

    const cells = this.cells;
    const read = this.read;
    let scores: Score[];
    if (this.inOrder) {
      const n = cells.length;
      const columns = this.columns;
      const possibles = this.possible;
      scores = new Array<Score>(n);
      for (let k = 0; k < n; k++) {
        const possible = possibles[k] as number;
        const cell = row[columns[k] as number] ?? null;
        // The usual cell, inline: a score within points possible and nothing to report (an
        // unknown points possible is NaN, so it never passes and `score` decides).
        const parsed = read(cell, possible === possible ? possible : 0);
        const score = parsed.ok ? parsed.score : null;
        scores[k] = score !== null && possible === possible && (score.kind !== 'earned' || score.points <= possible) ? score : this.score(cell, cells[k] as CellPlan, rowNo);
      }
    } else {
      scores = [];
      for (let i = 0; i < this.assessmentCount; i++) scores.push({ kind: 'excused' });
      for (const c of cells) scores[c.index] = this.score(row[c.column] ?? null, c, rowNo);
    }
    const absent = this.absent;
    if (absent.length > 0 && !this.absentReported) {
      this.absentReported = true;
      const one = absent.length === 1;
      problems.push(
        problemAt('warning', 'assessment-not-on-sheet', { sheet },
          `${absent.map((a) => quote(a.id)).join(', ')} ${one ? 'is' : 'are'} not on this sheet, so ${one ? 'it is' : 'they are'} marked excused for its students. Add the column${one ? '' : 's'} if that is wrong.`),
      );
    }
    this.students++;
    return { student: this.student(row, id), scores };
  }

  /** After the last row: a sheet without a single student row is an error (unless one is already reported). */
  finish(): void {
    const sheet = this.p.name;
    if (this.students === 0 && !this.problems.some((q) => q.severity === 'error' && q.at?.sheet === sheet)) {
      this.error(problemAt('error', 'no-students', { sheet }, `there are no student rows below the header on row ${this.p.layout.headerRow + 1}. Add the students or choose the right header row.`));
    }
  }

  private error(problem: ImportProblem): void {
    this.errorCount++;
    this.problems.push(problem);
  }

  /** One score cell; its place is built only when there is a problem to report. */
  private score(cell: Cell, c: CellPlan, row: number): Score {
    const a = c.assessment;
    if (a.possible === null) return { kind: 'missing' }; // reported once at the column; nothing is imported
    const sheet = this.p.name;
    const parsed = this.read(cell, a.possible);
    if (parsed.ok) {
      const score = parsed.score;
      if (score.kind !== 'earned' || score.points <= a.possible) return score;
      const text = cellText(cell);
      this.problems.push(
        problemAt('warning', 'above-possible', { sheet, row, column: c.letter, header: a.column.header, value: text },
          `${quote(text.trim())} is above the ${a.possible} points possible. It is kept as entered; it counts beyond full marks only if the grading plan marks this assessment as extra credit — otherwise correct the cell.`),
      );
      return score;
    }
    const text = cellText(cell);
    const at = { sheet, row, column: c.letter, header: a.column.header, value: text };
    const negative = (typeof cell === 'number' && cell < 0) || /^\s*[-−]\s*\d/.test(text);
    if (negative) this.error(problemAt('error', 'negative-score', at, `${quote(text.trim())} is negative; scores cannot be below 0. Correct the cell.`));
    else this.error(problemAt('error', 'unreadable-score', at, `${parsed.message} Correct the cell, or add the word to the score tokens.`));
    return { kind: 'missing' };
  }

  /** Names split over last/first-name columns are joined "Last, First"; only one filled → that one. */
  private student(row: readonly Cell[], id: string): Student {
    const roles = this.roles;
    const full = roleText(row, roles.name);
    const first = roleText(row, roles.firstName);
    const last = roleText(row, roles.lastName);
    const name = full !== '' ? full : last !== '' && first !== '' ? `${last}, ${first}` : last !== '' ? last : first;
    const section = this.layout.sectionFrom === 'sheetName' ? this.p.name : roleText(row, roles.section);
    const email = roleText(row, roles.email);
    return email === '' ? { id, name, section } : { id, name, section, email };
  }
}

export function allBlank(row: readonly Cell[]): boolean {
  const blank = isBlank; // one binding read, not one per cell (module getters under tsx)
  for (const cell of row) if (!blank(cell)) return false;
  return true;
}

/** How a row is named in messages: its first filled ID/name cell, else its first filled cell. */
function rowLabel(row: readonly Cell[], personCols: readonly ColumnLayout[]): string {
  for (const c of personCols) {
    const t = identityText(row[c.index]);
    if (t !== '') return t;
  }
  return cellText(row.find((cell) => !isBlank(cell))).trim();
}

function roleText(row: readonly Cell[], c: ColumnLayout | undefined): string {
  return c === undefined ? '' : identityText(row[c.index]);
}

/**
 * The text of an identity cell (ID, name, first/last name, section, e-mail): trimmed, then with
 * the `'` our own export put before formula-like text removed (OWASP "CSV Injection" defence,
 * export/neutralise.ts), so re-importing an export gives back the same roster. A number cell
 * (an ID stored as a number) reads as its digits.
 */
export function identityText(cell: Cell | undefined): string {
  return stripNeutraliser(cellText(cell).trim());
}
