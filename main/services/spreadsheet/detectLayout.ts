/**
 * Proposes an ImportLayout for a workbook; the user corrects it in the preview.
 *
 * Heuristics (common practice in exported gradebooks, no source):
 * - Header row: among the first 30 rows, a row with at least two non-blank cells, at least 80 %
 *   of them text that is not a number, and at least half as many cells as the widest row near the
 *   top (so a one-cell title such as "Chemistry 101 — Term 2" is skipped). The first such row
 *   that names an ID or name column wins; otherwise the first such row.
 * - Roles from header words (headerWords.ts); a header naming nothing is an assessment when at
 *   least 60 % of its non-blank cells read as scores (parseScore) and one is points — or, when
 *   points possible is known for it ("Quiz 5 (10)", or the points-possible row), when any cell is
 *   a score or token, or all are blank; else it is ignored with a warning.
 * - Points-possible row: within the three rows below the header, a row whose first non-blank cell
 *   says "Points possible", "Max", "Out of" …; or the row right below the header when its ID and
 *   name cells are blank and every assessment cell in it is a positive number. Failing a row, the
 *   header text ("Quiz 1 (20)", "Quiz 1 /20", "Quiz 1 out of 20") gives points possible.
 * - Sections: several sheets with identical header rows and no section column are one sheet per
 *   section (sectionFrom 'sheetName'); otherwise the first usable sheet, sections from its section
 *   column (or blank when it has none).
 */
import type { ColumnLayout, ColumnRole, ImportLayout, ImportProblem, ScoreTokens, SheetLayout } from '../../../renderer/bridge/contract';
import { parseScore } from '../../../renderer/engine/grading/parseScore';
import { columnLetter } from './columnLetter';
import { possibleFromHeader, POSSIBLE_ROW_LABEL, roleFromHeader, normaliseHeader } from './headerWords';
import { problemAt } from './problems';
import { cellText, isBlank, type Cell, type RawBook, type RawSheet } from './readBook';

const HEADER_SEARCH_ROWS = 30;
/** XFD, the last column a workbook can have (ECMA-376 Part 1 §18.3.1.4 `c@r`; Excel's limit). The import refuses an index past it. */
export const MAX_COLUMNS = 16_384;
/** Column warnings of one kind shown per sheet before the rest are counted in one summary. */
const COLUMN_WARNINGS_SHOWN = 10;
const CONTENT_SAMPLE_ROWS = 200;

/**
 * How many rows from the top of a sheet detection may read cell by cell: the header is found in
 * rows < HEADER_SEARCH_ROWS (the widest row among the first 2·HEADER_SEARCH_ROWS), points possible
 * at most 3 rows below it, and each column's content sampled over CONTENT_SAMPLE_ROWS rows from the
 * first data row. Below these rows detection only asks which columns and rows are filled at all.
 * The head-and-check rule of the row-at-a-time text imports (textHead.ts) detects on this many rows.
 */
export const ROWS_READ_FROM_TOP = Math.max(2 * HEADER_SEARCH_ROWS, HEADER_SEARCH_ROWS + 3 + CONTENT_SAMPLE_ROWS);
const NO_TOKENS: ScoreTokens = { excused: [], missing: [], pending: [] };

export interface Detection {
  readonly layout: ImportLayout;
  readonly problems: readonly ImportProblem[];
}

interface SheetGuess {
  readonly layout: SheetLayout;
  readonly usable: boolean;
  readonly shape: string;
  readonly hasSection: boolean;
  readonly problems: readonly ImportProblem[];
}

export function detectLayout(book: RawBook, tokens: ScoreTokens): Detection {
  const problems: ImportProblem[] = [];
  const guesses: SheetGuess[] = [];
  const nonEmpty = book.sheets.filter((s) => s.rows.length > 0);
  const headerless: RawSheet[] = [];
  for (const sheet of book.sheets) {
    if (sheet.rows.length === 0) {
      problems.push(problemAt('warning', 'empty-sheet', { sheet: sheet.name }, 'this sheet is empty and was left out.'));
      continue;
    }
    const guess = guessSheet(sheet, tokens);
    if (guess === null) headerless.push(sheet);
    else guesses.push(guess);
  }

  const chosen = chooseSheets(guesses);
  for (const sheet of headerless) {
    problems.push(
      problemAt(
        chosen.length > 0 ? 'warning' : 'error',
        'no-header',
        { sheet: sheet.name },
        `no header row was found in the first ${HEADER_SEARCH_ROWS} rows (a row of column titles such as "ID", "Name", "Quiz 1")` +
          (chosen.length > 0 ? ', so the sheet was left out. Add a header row if it holds scores.' : '. Add a header row above the students, or choose the header row in the preview.'),
      ),
    );
  }
  if (nonEmpty.length === 0) {
    problems.push({ severity: 'error', code: 'empty-file', message: 'The file has no cells with data in any sheet. Choose the gradebook file that holds the scores.' });
  }
  // One push per problem: spreading a huge array into push() exceeds V8's argument limit.
  for (const g of chosen) for (const p of g.problems) problems.push(p);
  const sheetName = chosen.length >= 2 && !chosen.some((g) => g.hasSection);
  const layout: ImportLayout = {
    sheets: chosen.map((g) => g.layout),
    sectionFrom: sheetName ? 'sheetName' : 'column',
    tokens,
    ...(book.encoding !== undefined ? { encoding: book.encoding } : {}),
    ...(book.delimiter !== undefined ? { delimiter: book.delimiter } : {}),
  };
  return { layout, problems };
}

function chooseSheets(guesses: readonly SheetGuess[]): SheetGuess[] {
  const usable = guesses.filter((g) => g.usable);
  const first = usable[0];
  if (first === undefined) return guesses.slice(0, 1);
  const sameShape = usable.filter((g) => g.shape === first.shape);
  // Take the largest group of same-shaped sheets (first one on ties).
  let best = sameShape;
  for (const g of usable) {
    const group = usable.filter((o) => o.shape === g.shape);
    if (group.length > best.length) best = group;
  }
  return best.length >= 2 ? best : [first];
}

function guessSheet(sheet: RawSheet, tokens: ScoreTokens): SheetGuess | null {
  const headerRow = findHeaderRow(sheet);
  if (headerRow === null) return null;
  const header = sheet.rows[headerRow] ?? [];
  const width = Math.min(sheet.width, MAX_COLUMNS);
  const roles: (ColumnRole | null)[] = [];
  for (let c = 0; c < width; c++) roles.push(isBlank(header[c]) ? null : roleFromHeader(cellText(header[c]).trim()));
  keepFirstOfEachRole(roles);

  const possibleRow = findPossibleRow(sheet, headerRow, roles);
  const firstData = Math.max(headerRow, possibleRow ?? -1) + 1;
  const problems: ImportProblem[] = [];
  const warnings = new ColumnWarnings(problems);
  const columns: ColumnLayout[] = [];
  const used = columnsWithData(sheet, headerRow, width);
  for (let c = 0; c < width; c++) {
    const text = cellText(header[c]).trim();
    let role = roles[c] ?? null;
    // A filled cell in the points-possible row wins over the header; a bad one is left for the
    // import to report at its cell.
    const rowCell = possibleRow === null ? null : (sheet.rows[possibleRow]?.[c] ?? null);
    const possible = !isBlank(rowCell) ? (plainPositive(rowCell) ?? undefined) : possibleFromHeader(text)?.possible;
    if (role === null) {
      const content = contentKind(sheet, c, firstData, possible ?? 100, tokens);
      const at = { sheet: sheet.name, row: headerRow + 1, column: columnLetter(c), header: text };
      if (text === '') {
        if (content !== 'blank') {
          warnings.add(problemAt('warning', 'unnamed-column', at, 'this column has no header, so it is ignored. Give it a header, or mark it as an assessment in the preview.'));
        }
        role = 'ignore';
      } else if (content === 'scores' || (possible !== undefined && (content === 'tokens' || content === 'some-scores'))) {
        role = 'assessment';
      } else if (content === 'blank' && possible !== undefined) {
        role = 'assessment';
        if (hasRowsFrom(sheet, firstData)) warnings.add(
          problemAt('warning', 'no-scores-yet', at, 'this assessment has no scores yet, so every student reads as missing. Mark it as ignored in the preview if it is not yet due.'),
        );
      } else {
        warnings.add(
          problemAt(
            'warning',
            'unrecognised-column',
            at,
            content === 'blank'
              ? 'this column has no scores yet, so it is ignored. Mark it as an assessment in the preview if it is one.'
              : 'the cells of this column are not scores and the header names no known column, so it is ignored. Choose its role in the preview if it matters.',
          ),
        );
        role = 'ignore';
      }
    }
    if (text === '' && role === 'ignore' && used[c] !== true) continue;
    columns.push({ index: c, header: text, role, ...(role === 'assessment' && possible !== undefined ? { possible } : {}) });
  }
  warnings.summarise(sheet.name, headerRow + 1);
  if (sheet.width > MAX_COLUMNS && hasCellsBeyond(sheet, MAX_COLUMNS)) {
    problems.push(
      problemAt(
        'warning',
        'too-many-columns',
        { sheet: sheet.name },
        `cells to the right of column XFD (column ${MAX_COLUMNS}, the last a workbook can have) were ignored. Move any scores there into columns A to XFD and import again.`,
      ),
    );
  }
  const hasId = columns.some((col) => col.role === 'id');
  const hasAssessment = columns.some((col) => col.role === 'assessment');
  return {
    layout: { sheet: sheet.name, headerRow, possibleRow, columns },
    usable: hasId && hasAssessment,
    shape: columns.map((col) => normaliseHeader(col.header)).join('\u0000'),
    hasSection: columns.some((col) => col.role === 'section'),
    problems,
  };
}

/**
 * Keeps the first few column warnings of each kind and counts the rest: a sheet of a million
 * unnamed columns must not make a million warnings no one reads.
 */
class ColumnWarnings {
  private readonly extra = new Map<string, number>();
  private readonly shown = new Map<string, number>();
  constructor(private readonly problems: ImportProblem[]) {}

  add(problem: ImportProblem): void {
    const n = this.shown.get(problem.code) ?? 0;
    if (n < COLUMN_WARNINGS_SHOWN) {
      this.shown.set(problem.code, n + 1);
      this.problems.push(problem);
    } else {
      this.extra.set(problem.code, (this.extra.get(problem.code) ?? 0) + 1);
    }
  }

  summarise(sheet: string, headerRow: number): void {
    for (const [code, n] of this.extra) {
      const one = n === 1;
      const what =
        code === 'unnamed-column'
          ? one ? 'column without a header was ignored' : 'columns without a header were ignored'
          : code === 'no-scores-yet'
            ? one ? 'assessment has no scores yet' : 'assessments have no scores yet'
            : one ? 'column was ignored the same way' : 'columns were ignored the same way';
      this.problems.push(
        problemAt('warning', code, { sheet, row: headerRow }, `… and ${n} more ${what}. Check their roles in the preview if any of them matter.`),
      );
    }
  }
}

/** Whether any row holds a non-blank cell at or past column `from` (0-based). */
function hasCellsBeyond(sheet: RawSheet, from: number): boolean {
  for (const row of sheet.rows) {
    for (let c = from; c < row.length; c++) if (!isBlank(row[c])) return true;
  }
  return false;
}

/** Two columns claiming one role (two "Name" columns): the first keeps it, the rest decide by content. */
function keepFirstOfEachRole(roles: (ColumnRole | null)[]): void {
  const seen = new Set<ColumnRole>();
  for (let c = 0; c < roles.length; c++) {
    const role = roles[c];
    if (role === null || role === undefined || role === 'ignore' || role === 'assessment') continue;
    if (seen.has(role)) roles[c] = 'ignore';
    else seen.add(role);
  }
}

function findHeaderRow(sheet: RawSheet): number | null {
  const limit = Math.min(sheet.rows.length, HEADER_SEARCH_ROWS);
  let widest = 0;
  for (let r = 0; r < Math.min(sheet.rows.length, HEADER_SEARCH_ROWS * 2); r++) widest = Math.max(widest, filled(sheet.rows[r] ?? []));
  let firstCandidate: number | null = null;
  for (let r = 0; r < limit; r++) {
    const row = sheet.rows[r] ?? [];
    const n = filled(row);
    if (n < 2 || n < widest / 2) continue;
    let text = 0;
    for (const cell of row) if (!isBlank(cell) && typeof cell === 'string' && plainNumber(cell) === null) text++;
    if (text < n * 0.8) continue;
    if (firstCandidate === null) firstCandidate = r;
    if (row.some((cell) => !isBlank(cell) && ['id', 'name', 'firstName', 'lastName'].includes(roleFromHeader(cellText(cell).trim()) ?? ''))) return r;
  }
  return firstCandidate;
}

function findPossibleRow(sheet: RawSheet, headerRow: number, roles: readonly (ColumnRole | null)[]): number | null {
  const idCol = roles.indexOf('id');
  const personCols = roles.flatMap((role, c) => (role === 'id' || role === 'name' || role === 'firstName' || role === 'lastName' ? [c] : []));
  for (let r = headerRow + 1; r <= Math.min(headerRow + 3, sheet.rows.length - 1); r++) {
    const row = sheet.rows[r] ?? [];
    const firstCell = row.find((cell) => !isBlank(cell));
    if (firstCell === undefined) continue;
    if (typeof firstCell === 'string' && POSSIBLE_ROW_LABEL.test(firstCell.trim())) return r;
    if (idCol >= 0 && !isBlank(row[idCol])) break; // a student: the possible row would have come first
  }
  const next = sheet.rows[headerRow + 1];
  if (next === undefined || personCols.length === 0 || personCols.some((c) => !isBlank(next[c]))) return null;
  const others = roles.flatMap((role, c) => (role === null ? [c] : []));
  const cells = others.filter((c) => !isBlank(next[c]));
  if (cells.length === 0) return null;
  return cells.every((c) => plainPositive(next[c]) !== null) ? headerRow + 1 : null;
}

/**
 * 'scores': at least 60 % score cells, some of them points; 'tokens': only states (EX, pending …);
 * 'some-scores': fewer than 60 % but at least one score cell; 'text': no score cell.
 */
function contentKind(
  sheet: RawSheet,
  col: number,
  firstData: number,
  possible: number,
  tokens: ScoreTokens,
): 'scores' | 'tokens' | 'some-scores' | 'text' | 'blank' {
  let nonBlank = 0;
  let scores = 0;
  let earned = 0;
  const end = Math.min(sheet.rows.length, firstData + CONTENT_SAMPLE_ROWS);
  for (let r = firstData; r < end; r++) {
    const cell = sheet.rows[r]?.[col] ?? null;
    if (isBlank(cell)) continue;
    nonBlank++;
    const parsed = parseScore(cell, possible, tokens);
    if (parsed.ok) {
      scores++;
      if (parsed.score.kind === 'earned') earned++;
    } else if (/^\s*[-−]\s*\d/.test(cellText(cell))) {
      scores++; // a negative score is still a score column; the import reports the cell
    }
  }
  if (nonBlank === 0) return 'blank';
  if (scores < nonBlank * 0.6) return scores > 0 ? 'some-scores' : 'text';
  return earned > 0 ? 'scores' : 'tokens';
}

function hasRowsFrom(sheet: RawSheet, from: number): boolean {
  for (let r = from; r < sheet.rows.length; r++) if (filled(sheet.rows[r] ?? []) > 0) return true;
  return false;
}

/** One pass over the sheet: which columns hold anything from `from` down. */
function columnsWithData(sheet: RawSheet, from: number, width: number): boolean[] {
  const used: boolean[] = new Array<boolean>(width).fill(false);
  const blank = isBlank; // one binding read, not one per cell (module getters under tsx)
  for (let r = from; r < sheet.rows.length; r++) {
    const row = sheet.rows[r] ?? [];
    const end = Math.min(row.length, width);
    for (let c = 0; c < end; c++) if (!used[c] && !blank(row[c])) used[c] = true;
  }
  return used;
}

function filled(row: readonly Cell[]): number {
  let n = 0;
  for (const cell of row) if (!isBlank(cell)) n++;
  return n;
}

/** A plain number (numeric cell, or text such as "20" or "7,5"); fractions, percents and tokens are not. */
export function plainNumber(cell: Cell | undefined): number | null {
  if (cell === null || cell === undefined) return null;
  if (typeof cell === 'number') return Number.isFinite(cell) ? cell : null;
  const text = cell.trim();
  if (text === '' || text.includes('%') || text.includes('/')) return null;
  const negative = /^[-−]/.test(text);
  const parsed = parseScore(negative ? text.slice(1) : text, 1, NO_TOKENS);
  if (!parsed.ok || parsed.score.kind !== 'earned') return null;
  return negative ? -parsed.score.points : parsed.score.points;
}

function plainPositive(cell: Cell | undefined): number | null {
  const n = plainNumber(cell);
  return n !== null && n > 0 ? n : null;
}
