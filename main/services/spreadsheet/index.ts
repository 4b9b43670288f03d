/**
 * Spreadsheet import: preview (with a proposed layout), import, detect-and-import (CLI) and the
 * re-import merge preview. Plain Node; the source file is only ever read.
 *
 * Every function returns a Result and never throws for bad input: an unreadable file, a wrong
 * type or any error-severity problem is `{ ok: false, code: 'bad-input', problems }`, and nothing
 * is partially imported.
 */
import { createHash } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import { basename } from 'node:path';
import type {
  CourseProject,
  ImportLayout,
  ImportProblem,
  Result,
  SheetPreview,
  TextEncoding,
  WorkbookPreview,
} from '../../../renderer/bridge/contract';
import type { Gradebook } from '../../../renderer/engine/model';
import { DEFAULT_TOKENS } from '../../../renderer/engine/grading/parseScore';
import { importLayoutSchema } from '../schemas';
import { buildGradebook, type BuildResult } from './buildGradebook';
import { detectLayout } from './detectLayout';
import { previewMergeBooks, type MergeDetails } from './merge';
import { hasErrors } from './problems';
import { cellText, readBook, type RawBook, type ReadOverride, type ReadResult } from './readBook';
import { readColumnBytes, type ColumnReading, type ColumnReadOptions } from './readColumn';
import { importTextRows } from './textImport';
import { isTextEncoding } from './textEncoding';

export { columnLetter } from './columnLetter';
export { previewMergeBooks, scoreWords, type MergeDetails } from './merge';
export { detectEncoding } from './textEncoding';
export type { ReadOverride } from './readBook';
export type { ColumnPlace, ColumnReading, ColumnReadOptions, ColumnValue, SkippedCell } from './readColumn';

/** Rows per sheet in a preview. */
export const PREVIEW_ROWS = 50;

export interface ImportOutcome {
  readonly gradebook: Gradebook;
  readonly problems: readonly ImportProblem[];
}

export async function previewSpreadsheet(path: string, override?: ReadOverride): Promise<Result<WorkbookPreview>> {
  const bytes = await readBytes(path);
  if (!bytes.ok) return bytes;
  const preview = previewWorkbookBytes(bytes.value, basename(path), override);
  return preview.ok ? { ok: true, value: { ...preview.value, path } } : preview;
}

/** Pure over the bytes; `path` in the result is the file name. */
export function previewWorkbookBytes(bytes: Uint8Array, fileName: string, override?: ReadOverride): Result<WorkbookPreview> {
  const checked = checkOverride(override);
  if (!checked.ok) return checked;
  const read = readBook(bytes, fileName, checked.value);
  if (!read.ok) return refuse([read.problem]);
  const book = read.book;
  const detection = detectLayout(book, DEFAULT_TOKENS);
  // A dry run of the import on the proposed layout, so row-level problems show before importing.
  const dryRun = detection.layout.sheets.length > 0 ? buildGradebook(book, detection.layout).problems : [];
  const sheets: SheetPreview[] = book.sheets.map((s) => ({
    name: s.name,
    rows: s.rows.slice(0, PREVIEW_ROWS).map((row) => row.map((cell) => cellText(cell))),
    totalRows: s.rows.length,
    totalColumns: s.width,
  }));
  return {
    ok: true,
    value: {
      path: fileName,
      fileName,
      format: book.format,
      sha256: sha256(bytes),
      ...(book.encoding !== undefined ? { encoding: book.encoding } : {}),
      ...(book.delimiter !== undefined ? { delimiter: book.delimiter } : {}),
      sheets,
      detected: detection.layout,
      problems: [...book.problems, ...detection.problems, ...dryRun],
    },
  };
}

export async function importSpreadsheet(path: string, layout: ImportLayout): Promise<Result<ImportOutcome>> {
  const bytes = await readBytes(path);
  if (!bytes.ok) return bytes;
  return importWorkbookBytes(bytes.value, basename(path), layout);
}

export function importWorkbookBytes(bytes: Uint8Array, fileName: string, layout: ImportLayout): Result<ImportOutcome> {
  const shape = checkLayoutShape(layout);
  if (!shape.ok) return shape;
  const override = layoutOverride(layout);
  if (!override.ok) return override;
  // A text table is read row by row when that is provably the same import (textImport.ts).
  const rowWise = importTextRows(bytes, fileName, override.value, layout);
  if (rowWise?.kind === 'built') return rowWise.built === null ? refuse(rowWise.earlier) : conclude(rowWise.built, rowWise.earlier);
  return importBook(rowWise?.kind === 'read' ? rowWise.read : readBook(bytes, fileName, override.value), layout);
}

/** importWorkbookBytes reading the whole book first, whatever the file: the reference the row-wise text import is tested against. */
export function importWorkbookWhole(bytes: Uint8Array, fileName: string, layout: ImportLayout): Result<ImportOutcome> {
  const shape = checkLayoutShape(layout);
  if (!shape.ok) return shape;
  const override = layoutOverride(layout);
  if (!override.ok) return override;
  return importBook(readBook(bytes, fileName, override.value), layout);
}

function importBook(read: ReadResult, layout: ImportLayout): Result<ImportOutcome> {
  if (!read.ok) return refuse([read.problem]);
  return finish(read.book, layout, []);
}

export async function detectAndImport(
  path: string,
): Promise<Result<{ gradebook: Gradebook; layout: ImportLayout; problems: readonly ImportProblem[] }>> {
  const bytes = await readBytes(path);
  if (!bytes.ok) return bytes;
  return detectAndImportBytes(bytes.value, basename(path));
}

type Detected = Result<{ gradebook: Gradebook; layout: ImportLayout; problems: readonly ImportProblem[] }>;

export function detectAndImportBytes(bytes: Uint8Array, fileName: string): Detected {
  // A text table is read row by row when that is provably the same import (textImport.ts).
  const rowWise = importTextRows(bytes, fileName, {}, null);
  if (rowWise?.kind === 'built') {
    // No usable sheet: the detection problems already say why; an import would only add noise.
    if (rowWise.built === null) return refuse(rowWise.earlier);
    const outcome = conclude(rowWise.built, rowWise.earlier);
    return outcome.ok ? { ok: true, value: { ...outcome.value, layout: rowWise.layout } } : outcome;
  }
  return detectAndImportBook(rowWise?.kind === 'read' ? rowWise.read : readBook(bytes, fileName));
}

/** detectAndImportBytes reading the whole book first, whatever the file: the reference the row-wise text import is tested against. */
export function detectAndImportWhole(bytes: Uint8Array, fileName: string): Detected {
  return detectAndImportBook(readBook(bytes, fileName));
}

function detectAndImportBook(read: ReadResult): Detected {
  if (!read.ok) return refuse([read.problem]);
  const detection = detectLayout(read.book, DEFAULT_TOKENS);
  // No usable sheet: the detection problems already say why; an import would only add noise.
  if (detection.layout.sheets.length === 0) return refuse([...read.book.problems, ...detection.problems]);
  const outcome = finish(read.book, detection.layout, [...read.book.problems, ...detection.problems]);
  return outcome.ok ? { ok: true, value: { ...outcome.value, layout: detection.layout } } : outcome;
}

/**
 * One numeric column of any spreadsheet (not only a gradebook), each value with its 1-based row
 * and a label (the row's student ID, else "row N"), optionally grouped by the text of a `by`
 * column. Blank cells and score tokens (EX, pending …) are skipped and listed; a cell that is not
 * a number is a located error (sheet, row, column letter, header, value). Which sheet, header row
 * and rows count is decided as written in readColumn.ts.
 *
 *   const r = await readColumn('marks.xlsx', { column: 'Final exam', by: 'Section' });
 *   if (r.ok) r.value.values // [{ value: 41, row: 3, label: 'S01', group: 'A' }, …]
 */
export async function readColumn(path: string, options: ColumnReadOptions): Promise<Result<ColumnReading>> {
  const bytes = await readBytes(path);
  if (!bytes.ok) return bytes;
  return readColumnBytes(bytes.value, basename(path), options);
}

export async function previewMerge(current: CourseProject, path: string, layout: ImportLayout): Promise<Result<MergeDetails & { problems: readonly ImportProblem[] }>> {
  const bytes = await readBytes(path);
  if (!bytes.ok) return bytes;
  const imported = importWorkbookBytes(bytes.value, basename(path), layout);
  if (!imported.ok) return imported;
  const merge = previewMergeBooks(current, imported.value.gradebook);
  const source = { path, fileName: basename(path), sha256: sha256(bytes.value), importedAt: new Date().toISOString(), layout };
  return { ok: true, value: { ...merge, merged: { ...merge.merged, source }, problems: imported.value.problems } };
}

function finish(book: RawBook, layout: ImportLayout, earlier: readonly ImportProblem[]): Result<ImportOutcome> {
  return conclude(buildGradebook(book, layout), earlier);
}

function conclude(built: BuildResult, earlier: readonly ImportProblem[]): Result<ImportOutcome> {
  const problems = [...earlier, ...built.problems];
  if (hasErrors(problems)) return refuse(problems);
  return { ok: true, value: { gradebook: built.gradebook, problems } };
}

/**
 * The layout may come from the UI over IPC: check its shape before use. A points possible ≤ 0 is
 * let through here because the import reports it at its column, in the user's words.
 */
function checkLayoutShape(layout: unknown): Result<null> {
  const parsed = importLayoutSchema.safeParse(layout);
  if (parsed.success) return { ok: true, value: null };
  const issue = parsed.error.issues.find((i) => i.path[i.path.length - 1] !== 'possible');
  if (issue === undefined) return { ok: true, value: null };
  return { ok: false, code: 'bad-input', message: `The import layout is malformed at ${issue.path.join('.') || 'its top level'}: ${issue.message}. Detect the layout again in the preview.` };
}

function layoutOverride(layout: ImportLayout): Result<ReadOverride> {
  return checkOverride({
    ...(layout.encoding !== undefined ? { encoding: layout.encoding } : {}),
    ...(layout.delimiter !== undefined ? { delimiter: layout.delimiter } : {}),
  });
}

function checkOverride(override: ReadOverride | undefined): Result<ReadOverride> {
  if (override === undefined) return { ok: true, value: {} };
  const out: { encoding?: TextEncoding; delimiter?: string } = {};
  if (override.encoding !== undefined) {
    if (!isTextEncoding(override.encoding)) {
      return { ok: false, code: 'bad-input', message: `The encoding ${JSON.stringify(override.encoding)} is not one Weighbridge reads; choose utf-8, utf-16le, utf-16be or windows-1252.` };
    }
    out.encoding = override.encoding;
  }
  if (override.delimiter !== undefined) {
    if (typeof override.delimiter !== 'string') return { ok: false, code: 'bad-input', message: 'The delimiter must be one character such as "," ";" or a tab.' };
    out.delimiter = override.delimiter;
  }
  return { ok: true, value: out };
}

function refuse(problems: readonly ImportProblem[]): Result<never> {
  const errors = problems.filter((p) => p.severity === 'error');
  const first = errors[0] ?? problems[0];
  const message =
    first === undefined
      ? 'The file could not be imported.'
      : errors.length <= 1
        ? first.message
        : `${errors.length} problems stop the import. The first: ${first.message}`;
  return { ok: false, code: 'bad-input', message, problems };
}

async function readBytes(path: string): Promise<Result<Uint8Array>> {
  try {
    return { ok: true, value: await readFile(path) };
  } catch (e) {
    const code = (e as NodeJS.ErrnoException | null)?.code;
    if (code === 'ENOENT') return { ok: false, code: 'not-found', message: `The file "${path}" does not exist. Check the path and try again.` };
    if (code === 'EISDIR') return { ok: false, code: 'bad-input', message: `"${path}" is a folder, not a file. Choose the gradebook file.` };
    return { ok: false, code: 'io', message: `The file "${path}" could not be read (${code ?? 'unknown error'}). Check that it is not open elsewhere and that you may read it.` };
  }
}

function sha256(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}
export { streamImportText, STREAM_PREFIX_BYTES, type StreamImportOutcome, type StreamSink } from './stream';
