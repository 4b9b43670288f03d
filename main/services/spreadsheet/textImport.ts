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
 * Which first rows decide the layout, and which later row could change it (and so sends the
 * import to the whole book): the head-and-check rule of textHead.ts, which the command line's file
 * stream (stream.ts) follows too.
 */
import type { ImportLayout, ImportProblem } from '../../../renderer/bridge/contract';
import type { Score, Student } from '../../../renderer/engine/model';
import type { BuildResult } from './buildGradebook';
import { readTextRows, type ReadOverride, type ReadResult } from './readBook';
import { TextHead } from './textHead';
import { QuoteFreeLines, quoteFreeBytes } from './textLines';

export { HEAD_ROWS } from './textHead';

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
  const students: Student[] = [];
  const scores: Score[][] = [];
  const head = TextHead.open(given, {
    planned: () => true,
    student: (got) => {
      students.push(got.student);
      scores.push(got.scores);
    },
  });
  if (head === null) return null;
  // Without a quote in the file, the rows after the head are read from the text's lines
  // (textLines.ts: papaparse's own rows for such a text, without a string per cell).
  const lineWise = quoteFreeBytes(bytes);
  let linesFrom: number | null = null;
  const read = readTextRows(bytes, fileName, override, (row, r, table) => {
    if (!head.take(row, r, table)) return false;
    if (!lineWise || head.planned === null) return true;
    linesFrom = r + 1;
    return false;
  });
  if (read === null) return null;
  if (!read.ok) return { kind: 'read', read };
  const from = linesFrom as number | null; // assigned in the row callback
  if (from !== null) {
    const table = read.table;
    const lines = QuoteFreeLines.open(bytes, table);
    if (lines === null || !lines.rowsFrom(from, (row, r) => head.take(row, r, table))) return null;
  } else if (read.stopped) return null;
  const plan = head.planned;
  if (plan === null) return { kind: 'read', read: { ok: true, book: head.book(read.table) } };
  if (plan.layout.sheets.length === 0) return { kind: 'built', layout: plan.layout, earlier: plan.earlier, built: null };
  head.finish();
  const gradebook = { students, assessments: plan.assessments, scores };
  return { kind: 'built', layout: plan.layout, earlier: plan.earlier, built: { gradebook, problems: plan.problems } };
}
