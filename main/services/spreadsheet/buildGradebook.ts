/**
 * RawBook + ImportLayout → Gradebook, with every problem located. Pure: the same inputs give the
 * same gradebook and the same problems, and nothing is returned half-built — the caller refuses the
 * whole import when any problem is an error.
 *
 * Two steps: `planGradebook` checks the layout against the rows above the students (roles, points
 * possible, duplicate headers, one assessment list for the book), then each planned sheet's rows
 * are read by `StudentRows` (studentRows.ts, where the row rules and their decisions are written),
 * the same reader the row-at-a-time imports use.
 *
 * Decisions:
 * - Sections: from the section column (blank cell → blank section) or from the sheet name; a
 *   single sheet without a section column puts everyone in the blank section.
 * - An assessment on several sheets (sheet per section) is one assessment; its points possible
 *   must agree.
 */
import type { ColumnLayout, ImportLayout, ImportProblem, SheetLayout } from '../../../renderer/bridge/contract';
import type { Assessment, Gradebook, Score, Student } from '../../../renderer/engine/model';
import { columnLetter } from './columnLetter';
import { plainNumber } from './detectLayout';
import { possibleFromHeader } from './headerWords';
import { problemAt, quote } from './problems';
import { cellText, isBlank, type RawBook, type RawSheet } from './readBook';
import { StudentRows, type IdsSeen, type PlannedAssessment, type PlannedSheet } from './studentRows';

export { identityText } from './studentRows';

export interface BuildResult {
  readonly gradebook: Gradebook;
  readonly problems: readonly ImportProblem[];
}

/** The layout checked against the rows above the students: what reading the rows needs. */
export interface GradebookPlan {
  readonly assessments: readonly Assessment[];
  readonly assessmentIndex: ReadonlyMap<string, { readonly index: number }>;
  /** The sheets to read, in layout order (a sheet with errors in its layout is left out). */
  readonly sheets: readonly PlannedSheet[];
  /** The sheets' rows, by sheet name, as given in the book. */
  readonly rowsOf: (sheet: PlannedSheet) => RawSheet['rows'];
}

const ONE_PER_SHEET = ['id', 'name', 'firstName', 'lastName', 'section', 'email'] as const;

export function buildGradebook(book: RawBook, layout: ImportLayout): BuildResult {
  const problems: ImportProblem[] = [];
  const plan = planGradebook(book, layout, problems);
  const students: Student[] = [];
  const scores: Score[][] = [];
  const idSeen: IdsSeen = new Map();
  for (const p of plan.sheets) {
    const reader = new StudentRows(p, layout, plan.assessments, plan.assessmentIndex, idSeen, problems);
    const rows = plan.rowsOf(p);
    for (let r = reader.firstRow; r < rows.length; r++) {
      const got = reader.row(r, rows[r] ?? []);
      if (got === null) continue;
      students.push(got.student);
      scores.push(got.scores);
    }
    reader.finish();
  }
  return { gradebook: { students, assessments: plan.assessments, scores }, problems };
}

/**
 * The sheet-level checks of the import; problems are pushed onto `problems`. Reads only the rows
 * up to the header and points-possible rows (and the sheets' row counts), so a book holding just
 * those rows of a sheet plans it as the whole book does — what the row-at-a-time imports rely on.
 */
export function planGradebook(book: RawBook, layout: ImportLayout, problems: ImportProblem[]): GradebookPlan {
  const assessments: Assessment[] = [];
  const assessmentIndex = new Map<string, { index: number; sheet: string; column: string }>();
  const planned: PlannedSheet[] = [];
  const rows = new Map<PlannedSheet, RawSheet['rows']>();

  if (layout.sheets.length === 0) {
    problems.push({ severity: 'error', code: 'nothing-to-import', message: 'No sheet is chosen for import. Choose the sheet that holds the students and their scores.' });
  }
  const usedSheets = new Set<string>();
  for (const sl of layout.sheets) {
    const sheet = book.sheets.find((s) => s.name === sl.sheet);
    if (sheet === undefined) {
      problems.push(problemAt('error', 'sheet-not-found', { sheet: sl.sheet }, 'there is no sheet of this name in the file. Choose one of the sheets shown in the preview.'));
      continue;
    }
    if (usedSheets.has(sl.sheet)) {
      problems.push(problemAt('error', 'duplicate-sheet', { sheet: sl.sheet }, 'this sheet is chosen twice. Choose each sheet once.'));
      continue;
    }
    usedSheets.add(sl.sheet);
    const p = planSheet(sheet, sl, problems);
    if (p === null) continue;
    planned.push(p);
    rows.set(p, sheet.rows);
    for (const a of p.assessments) {
      const seen = assessmentIndex.get(a.id);
      const letter = columnLetter(a.column.index);
      if (seen === undefined) {
        assessmentIndex.set(a.id, { index: assessments.length, sheet: sheet.name, column: letter });
        assessments.push({ id: a.id, name: possibleFromHeader(a.id)?.name ?? a.id, possible: a.possible ?? 0 });
        continue;
      }
      const before = assessments[seen.index];
      if (before !== undefined && a.possible !== null && before.possible !== a.possible && before.possible > 0) {
        problems.push(
          problemAt(
            'error',
            'possible-mismatch',
            { sheet: sheet.name, column: letter, header: a.column.header },
            `points possible is ${a.possible} here but ${before.possible} for the same assessment on sheet "${seen.sheet}", column ${seen.column}. Make them agree.`,
          ),
        );
      }
    }
  }
  return { assessments, assessmentIndex, sheets: planned, rowsOf: (p) => rows.get(p) ?? [] };
}

function planSheet(sheet: RawSheet, sl: SheetLayout, problems: ImportProblem[]): PlannedSheet | null {
  const at = { sheet: sheet.name };
  if (sheet.rows.length === 0) {
    problems.push(problemAt('error', 'empty-sheet', at, 'this sheet is empty. Choose the sheet that holds the students and their scores.'));
    return null;
  }
  if (!isRowIndex(sl.headerRow, sheet) || (sl.possibleRow !== null && (!isRowIndex(sl.possibleRow, sheet) || sl.possibleRow === sl.headerRow))) {
    problems.push(problemAt('error', 'bad-layout', at, `the header row or points-possible row chosen is not a row of this sheet (it has ${sheet.rows.length} rows). Choose them again in the preview.`));
    return null;
  }
  const columns: ColumnLayout[] = [];
  const indexes = new Set<number>();
  for (const col of sl.columns) {
    if (!Number.isInteger(col.index) || col.index < 0 || col.index > 16383 || indexes.has(col.index)) {
      problems.push(problemAt('error', 'bad-layout', at, `column number ${String(col.index)} is not a usable column or is listed twice. Choose the columns again in the preview.`));
      return null;
    }
    indexes.add(col.index);
    columns.push(col);
  }
  const headerRowNo = sl.headerRow + 1;
  const byRole = new Map<string, ColumnLayout>();
  let ok = true;
  for (const role of ONE_PER_SHEET) {
    const matching = columns.filter((c) => c.role === role);
    const first = matching[0];
    if (first !== undefined) byRole.set(role, first);
    const second = matching[1];
    if (second !== undefined) {
      problems.push(
        problemAt('error', 'duplicate-role', { sheet: sheet.name, row: headerRowNo, column: columnLetter(second.index), header: second.header },
          `this column and column ${columnLetter(first?.index ?? 0)} are both marked as the ${roleWords(role)} column. Mark only one.`),
      );
      ok = false;
    }
  }
  if (!byRole.has('id')) {
    problems.push(problemAt('error', 'no-id-column', { sheet: sheet.name, row: headerRowNo }, 'no column is marked as the student ID, which identifies each student (and matches them on re-import). Mark the ID column in the preview.'));
    ok = false;
  }
  const assessments: PlannedAssessment[] = [];
  const ids = new Map<string, ColumnLayout>();
  for (const col of columns) {
    if (col.role !== 'assessment') continue;
    const letter = columnLetter(col.index);
    const id = col.header.trim() === '' ? `Column ${letter}` : col.header.trim();
    const where = { sheet: sheet.name, row: headerRowNo, column: letter, header: col.header };
    const twin = ids.get(id);
    if (twin !== undefined) {
      problems.push(problemAt('error', 'duplicate-assessment', where, `this header is also the header of column ${columnLetter(twin.index)}; two assessments cannot share a name. Rename one of them.`));
      ok = false;
      continue;
    }
    ids.set(id, col);
    assessments.push({ column: col, id, possible: resolvePossible(sheet, sl, col, problems) });
  }
  if (assessments.length === 0) {
    problems.push(problemAt('error', 'no-assessments', { sheet: sheet.name, row: headerRowNo }, `no assessment columns were found beside the header on row ${headerRowNo}. Mark the score columns as assessments in the preview.`));
    ok = false;
  }
  if (!ok) return null;
  return { name: sheet.name, layout: sl, role: (r) => byRole.get(r), assessments };
}

/** Points possible: the layout's value, else the points-possible row, else an error naming the fix. */
function resolvePossible(sheet: RawSheet, sl: SheetLayout, col: ColumnLayout, problems: ImportProblem[]): number | null {
  const letter = columnLetter(col.index);
  if (col.possible !== undefined) {
    if (Number.isFinite(col.possible) && col.possible > 0) return col.possible;
    problems.push(
      problemAt('error', 'possible-not-positive', { sheet: sheet.name, row: sl.headerRow + 1, column: letter, header: col.header, value: String(col.possible) },
        `points possible ${quote(String(col.possible))} must be a number greater than 0. Set points possible for this assessment.`),
    );
    return null;
  }
  if (sl.possibleRow !== null) {
    const cell = sheet.rows[sl.possibleRow]?.[col.index] ?? null;
    if (!isBlank(cell)) {
      const at = { sheet: sheet.name, row: sl.possibleRow + 1, column: letter, header: col.header, value: cellText(cell) };
      const n = plainNumber(cell);
      if (n === null) {
        problems.push(problemAt('error', 'unreadable-possible', at, `points possible ${quote(cellText(cell))} is not a number. Write the points possible as a number such as 20.`));
        return null;
      }
      if (n <= 0) {
        problems.push(problemAt('error', 'possible-not-positive', at, `points possible ${quote(cellText(cell))} must be greater than 0. Correct the points-possible row.`));
        return null;
      }
      return n;
    }
  }
  problems.push(
    problemAt('error', 'unknown-possible', { sheet: sheet.name, row: sl.headerRow + 1, column: letter, header: col.header },
      'points possible for this assessment is not known. Add a points-possible row, write it in the header like "Quiz 1 (20)", or set it in the preview.'),
  );
  return null;
}

function isRowIndex(n: number, sheet: RawSheet): boolean {
  return Number.isInteger(n) && n >= 0 && n < sheet.rows.length;
}

function roleWords(role: (typeof ONE_PER_SHEET)[number]): string {
  switch (role) {
    case 'id':
      return 'student ID';
    case 'name':
      return 'name';
    case 'firstName':
      return 'first-name';
    case 'lastName':
      return 'last-name';
    case 'section':
      return 'section';
    case 'email':
      return 'e-mail';
  }
}
