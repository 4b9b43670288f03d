/**
 * RawBook + ImportLayout → Gradebook, with every problem located. Pure: the same inputs give the
 * same gradebook and the same problems, and nothing is returned half-built — the caller refuses the
 * whole import when any problem is an error.
 *
 * Decisions:
 * - Names split over last/first-name columns are joined "Last, First" (the order rosters sort by,
 *   and unambiguous to split again); only one of them filled → that one alone.
 * - A row with every cell blank is skipped; a row without an ID whose ID/name cell says "Total",
 *   "Average", "Mean" … is a summary row, skipped with a warning; any other row without an ID is
 *   an error.
 * - Sections: from the section column (blank cell → blank section) or from the sheet name; a
 *   single sheet without a section column puts everyone in the blank section.
 * - Sheet per section: an assessment that is not on a student's sheet is `excused` for that
 *   student (it did not exist for them), with a warning; never `missing`, which may count as zero.
 * - Scores above points possible are kept with a warning: whether they count is the plan's
 *   extra-credit decision, not the importer's.
 */
import type { ColumnLayout, ImportLayout, ImportProblem, SheetLayout } from '../../../renderer/bridge/contract';
import type { Assessment, Gradebook, Score, Student } from '../../../renderer/engine/model';
import { scoreReader, type ScoreReader } from '../../../renderer/engine/grading/parseScore';
import { columnLetter } from './columnLetter';
import { plainNumber } from './detectLayout';
import { stripNeutraliser } from '../export/neutralise';
import { possibleFromHeader, SUMMARY_ROW_LABEL } from './headerWords';
import { problemAt, quote } from './problems';
import { cellText, isBlank, type Cell, type RawBook, type RawSheet } from './readBook';

export interface BuildResult {
  readonly gradebook: Gradebook;
  readonly problems: readonly ImportProblem[];
}

interface PlannedAssessment {
  readonly column: ColumnLayout;
  readonly id: string;
  readonly possible: number | null;
}

interface PlannedSheet {
  readonly sheet: RawSheet;
  readonly layout: SheetLayout;
  readonly role: (r: 'id' | 'name' | 'firstName' | 'lastName' | 'section' | 'email') => ColumnLayout | undefined;
  readonly assessments: readonly PlannedAssessment[];
}

const ONE_PER_SHEET = ['id', 'name', 'firstName', 'lastName', 'section', 'email'] as const;

export function buildGradebook(book: RawBook, layout: ImportLayout): BuildResult {
  const problems: ImportProblem[] = [];
  const assessments: Assessment[] = [];
  const assessmentIndex = new Map<string, { index: number; sheet: string; column: string }>();
  const planned: PlannedSheet[] = [];

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

  const students: Student[] = [];
  const scores: Score[][] = [];
  const idSeen = new Map<string, { sheet: string; row: number }>();
  for (const p of planned) readStudents(p, layout, assessments, assessmentIndex, idSeen, students, scores, problems);

  return { gradebook: { students, assessments, scores }, problems };
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
  return { sheet, layout: sl, role: (r) => byRole.get(r), assessments };
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

/** One assessment column of a sheet, with what every cell of it needs worked out once. */
interface CellPlan {
  readonly assessment: PlannedAssessment;
  /** Position in the gradebook's assessments (and so in each student's scores). */
  readonly index: number;
  /** The sheet column it is read from. */
  readonly column: number;
  readonly letter: string;
}

function readStudents(
  p: PlannedSheet,
  layout: ImportLayout,
  assessments: readonly Assessment[],
  assessmentIndex: ReadonlyMap<string, { index: number }>,
  idSeen: Map<string, { sheet: string; row: number }>,
  students: Student[],
  scores: Score[][],
  problems: ImportProblem[],
): void {
  const { sheet, layout: sl } = p;
  const idCol = p.role('id');
  if (idCol === undefined) return;
  const onSheet = new Set(p.assessments.map((a) => a.id));
  const absent = assessments.filter((a) => !onSheet.has(a.id));
  const personCols = [idCol, p.role('name'), p.role('firstName'), p.role('lastName')].filter((c): c is ColumnLayout => c !== undefined);
  const start = Math.max(sl.headerRow, sl.possibleRow ?? -1) + 1;
  const read = scoreReader(layout.tokens);
  const cells: CellPlan[] = [];
  for (const a of p.assessments) {
    const index = assessmentIndex.get(a.id)?.index;
    if (index !== undefined) cells.push({ assessment: a, index, column: a.column.index, letter: columnLetter(a.column.index) });
  }
  // The usual case (one sheet, or this sheet's columns in the gradebook's order): each student's
  // scores are pushed in order; otherwise they are placed by index over an all-excused row.
  const inOrder = cells.length === assessments.length && cells.every((c, i) => c.index === i);
  const idLetter = columnLetter(idCol.index);
  let count = 0;
  let absentReported = false;

  for (let r = start; r < sheet.rows.length; r++) {
    const row = sheet.rows[r] ?? [];
    if (allBlank(row)) continue;
    const rowNo = r + 1;
    const id = identityText(row[idCol.index]);
    if (id === '' || SUMMARY_ROW_LABEL.test(id)) {
      const label = rowLabel(row, personCols);
      if (SUMMARY_ROW_LABEL.test(label)) {
        problems.push(problemAt('warning', 'summary-row-skipped', { sheet: sheet.name, row: rowNo, value: label }, `this row (${quote(label)}) looks like a summary of the students, not a student, and was skipped.`));
        continue;
      }
      if (id === '') {
        const idAt = { sheet: sheet.name, row: rowNo, column: idLetter, header: idCol.header, value: id };
        problems.push(problemAt('error', 'blank-id', idAt, `the student ID is blank${label === '' ? '' : ` (row of ${quote(label)})`}. Fill in the ID or delete the row.`));
        continue;
      }
    }
    const dup = idSeen.get(id);
    if (dup !== undefined) {
      const idAt = { sheet: sheet.name, row: rowNo, column: idLetter, header: idCol.header, value: id };
      const where = dup.sheet === sheet.name ? `row ${dup.row}` : `sheet "${dup.sheet}", row ${dup.row}`;
      problems.push(problemAt('error', 'duplicate-id', idAt, `student ID ${quote(id)} is already used on ${where}. Give each student one row with a unique ID.`));
      continue;
    }
    idSeen.set(id, { sheet: sheet.name, row: rowNo });

    let rowScores: Score[];
    if (inOrder) {
      rowScores = new Array<Score>(cells.length);
      for (let k = 0; k < cells.length; k++) {
        const c = cells[k] as CellPlan;
        const possible = c.assessment.possible;
        const cell = row[c.column] ?? null;
        // The usual cell, inline: a score within points possible and nothing to report.
        const parsed = possible === null ? null : read(cell, possible);
        rowScores[k] =
          parsed !== null && parsed.ok && (parsed.score.kind !== 'earned' || parsed.score.points <= (possible as number))
            ? parsed.score
            : readScore(cell, c, read, sheet.name, rowNo, problems);
      }
    } else {
      rowScores = [];
      for (let i = 0; i < assessments.length; i++) rowScores.push({ kind: 'excused' });
      for (const c of cells) rowScores[c.index] = readScore(row[c.column] ?? null, c, read, sheet.name, rowNo, problems);
    }
    if (absent.length > 0 && !absentReported) {
      absentReported = true;
      problems.push(
        problemAt('warning', 'assessment-not-on-sheet', { sheet: sheet.name },
          `${absent.map((a) => quote(a.id)).join(', ')} ${absent.length === 1 ? 'is' : 'are'} not on this sheet, so ${absent.length === 1 ? 'it is' : 'they are'} marked excused for its students. Add the column${absent.length === 1 ? '' : 's'} if that is wrong.`),
      );
    }
    students.push(makeStudent(p, row, id, layout));
    scores.push(rowScores);
    count++;
  }
  if (count === 0 && !problems.some((q) => q.severity === 'error' && q.at?.sheet === sheet.name)) {
    problems.push(problemAt('error', 'no-students', { sheet: sheet.name }, `there are no student rows below the header on row ${sl.headerRow + 1}. Add the students or choose the right header row.`));
  }
}

function allBlank(row: readonly Cell[]): boolean {
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

/** One score cell; its place is built only when there is a problem to report. */
function readScore(cell: Cell, c: CellPlan, read: ScoreReader, sheet: string, row: number, problems: ImportProblem[]): Score {
  const a = c.assessment;
  if (a.possible === null) return { kind: 'missing' }; // reported once at the column; nothing is imported
  const parsed = read(cell, a.possible);
  if (parsed.ok) {
    const score = parsed.score;
    if (score.kind !== 'earned' || score.points <= a.possible) return score;
    const text = cellText(cell);
    problems.push(
      problemAt('warning', 'above-possible', { sheet, row, column: c.letter, header: a.column.header, value: text },
        `${quote(text.trim())} is above the ${a.possible} points possible. It is kept as entered; it counts beyond full marks only if the grading plan marks this assessment as extra credit — otherwise correct the cell.`),
    );
    return score;
  }
  const text = cellText(cell);
  const at = { sheet, row, column: c.letter, header: a.column.header, value: text };
  const negative = (typeof cell === 'number' && cell < 0) || /^\s*[-−]\s*\d/.test(text);
  if (negative) problems.push(problemAt('error', 'negative-score', at, `${quote(text.trim())} is negative; scores cannot be below 0. Correct the cell.`));
  else problems.push(problemAt('error', 'unreadable-score', at, `${parsed.message} Correct the cell, or add the word to the score tokens.`));
  return { kind: 'missing' };
}

function makeStudent(p: PlannedSheet, row: readonly Cell[], id: string, layout: ImportLayout): Student {
  const full = roleText(row, p.role('name'));
  const first = roleText(row, p.role('firstName'));
  const last = roleText(row, p.role('lastName'));
  const name = full !== '' ? full : last !== '' && first !== '' ? `${last}, ${first}` : last !== '' ? last : first;
  const section = layout.sectionFrom === 'sheetName' ? p.sheet.name : roleText(row, p.role('section'));
  const email = roleText(row, p.role('email'));
  return email === '' ? { id, name, section } : { id, name, section, email };
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
