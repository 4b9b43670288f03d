/**
 * Streaming import of a text gradebook (.csv/.tsv) too large to hold as a grid of cells: the layout
 * is detected on the first rows, then the file is decoded and parsed row by row (papaparse step
 * mode) and each student row is handed to the caller as a Student and its Scores, with every
 * problem located exactly as the in-memory import locates it (sheet = file name, row, column
 * letter, header, value) and in the same order, so `detectAndImport` and this give the same
 * gradebook rows and the same problems (tested in tests/cli/streaming.test.ts).
 *
 * Why detection on a prefix gives the in-memory layout: detectLayout reads at most the first 60
 * rows for the header, three rows below it for points possible and 200 data rows for each
 * column's content; papaparse guesses the delimiter from the first 10 rows and the line break from
 * the first 1 MiB of text. The prefix holds 4 MiB of bytes and at least that many rows — else, or
 * whenever the prefix is unusual (a quoted field cut at its end, no data rows in it, any error in
 * the layout), `streamImportText` returns null and the caller imports in memory, which gives the
 * in-memory messages by construction.
 *
 * Encoding: a byte-order mark or the UTF-16 NUL pattern decide from the first 4 KiB as in
 * textEncoding.ts; otherwise the file is decoded as strict UTF-8 and, if a byte later in the file
 * is not UTF-8, read again from the start as Windows-1252 (what the whole-file detection decides).
 *
 * Memory: one row of cells at a time plus one entry per student ID (duplicate detection).
 */
import { createReadStream } from 'node:fs';
import { open, stat } from 'node:fs/promises';
import { basename } from 'node:path';
import { Readable } from 'node:stream';
import Papa from 'papaparse';
import type { ImportLayout, ImportProblem, Result, TextEncoding } from '../../../renderer/bridge/contract';
import type { Assessment, Score, Student } from '../../../renderer/engine/model';
import { DEFAULT_TOKENS } from '../../../renderer/engine/grading/parseScore';
import { planGradebook } from './buildGradebook';
import { detectLayout } from './detectLayout';
import { problemAt } from './problems';
import { baseName, isBlank, readBook, type Cell } from './readBook';
import { StudentRows, type PlannedSheet } from './studentRows';
import { detectEncoding } from './textEncoding';

/** Bytes read for layout detection, delimiter and line-break guessing. */
export const STREAM_PREFIX_BYTES = 4 * 1024 * 1024;
/** Rows the prefix must hold beyond the first data row (detectLayout samples 200). */
const DETECT_DATA_ROWS = 200;

export interface StreamSink {
  /** Called before the first row, and again (start over) if the file must be re-read as Windows-1252. */
  begin(assessments: readonly Assessment[], layout: ImportLayout): void;
  /** One student row without errors so far in it; `scores` is reused after the call returns. */
  row(student: Student, scores: readonly Score[]): void;
}

export interface StreamImportOutcome {
  readonly layout: ImportLayout;
  readonly assessments: readonly Assessment[];
  /** Every problem (warnings only: errors refuse the import), in the in-memory import's order. */
  readonly problems: readonly ImportProblem[];
  readonly students: number;
}

interface StreamStart {
  readonly layout: ImportLayout;
  readonly encoding: TextEncoding;
  /** UTF-8 decided on the prefix only: a later non-UTF-8 byte means Windows-1252. */
  readonly tentative: boolean;
  readonly delimiter: string;
  readonly newline: string;
  readonly sheet: string;
  readonly assessments: readonly Assessment[];
  readonly assessmentIndex: ReadonlyMap<string, { readonly index: number }>;
  readonly planned: PlannedSheet;
  readonly dataStart: number;
  readonly problems: readonly ImportProblem[];
}

/**
 * Streams `path` into `sink`. Null when the file should be imported in memory instead (not a
 * plain text table, or something in its first rows only the whole-file import reports exactly).
 * A failure is the in-memory import's refusal: the same message and problems.
 */
export async function streamImportText(path: string, sink: StreamSink): Promise<Result<StreamImportOutcome> | null> {
  const fileName = basename(path);
  let size: number;
  let prefix: Uint8Array;
  try {
    size = (await stat(path)).size;
    prefix = await readPrefix(path, Math.min(size, STREAM_PREFIX_BYTES));
  } catch {
    return null; // the in-memory import words the I/O failure
  }
  const complete = prefix.length >= size;
  let start = startFrom(prefix, fileName, complete, undefined);
  if (start === null) return null;
  let outcome = await readRows(path, start, sink);
  if (outcome === 'not-utf-8') {
    start = startFrom(prefix, fileName, complete, 'windows-1252');
    if (start === null) return null;
    outcome = await readRows(path, start, sink);
  }
  return outcome === 'not-utf-8' ? null : outcome;
}

async function readPrefix(path: string, length: number): Promise<Uint8Array> {
  const handle = await open(path, 'r');
  try {
    const buffer = Buffer.alloc(length);
    let read = 0;
    while (read < length) {
      const { bytesRead } = await handle.read(buffer, read, length - read, read);
      if (bytesRead === 0) break;
      read += bytesRead;
    }
    return buffer.subarray(0, read);
  } finally {
    await handle.close();
  }
}

function guessEncoding(prefix: Uint8Array, complete: boolean): { encoding: TextEncoding; tentative: boolean } {
  const head = detectEncoding(prefix.subarray(0, 4096));
  if (head === 'utf-16le' || head === 'utf-16be') return { encoding: head, tentative: false };
  if (prefix[0] === 0xef && prefix[1] === 0xbb && prefix[2] === 0xbf) return { encoding: 'utf-8', tentative: false };
  const whole = detectEncoding(complete ? prefix : prefix.subarray(0, cutAtLine(prefix, 'utf-8')));
  return { encoding: whole, tentative: whole === 'utf-8' && !complete };
}

/** End of the last whole line of the prefix (after its line feed) in the given encoding. */
function cutAtLine(bytes: Uint8Array, encoding: TextEncoding): number {
  if (encoding === 'utf-16le') {
    for (let i = bytes.length - 2; i >= 0; i--) if (i % 2 === 0 && bytes[i] === 0x0a && bytes[i + 1] === 0) return i + 2;
    return 0;
  }
  if (encoding === 'utf-16be') {
    for (let i = bytes.length - 1; i >= 1; i--) if (i % 2 === 1 && bytes[i] === 0x0a && bytes[i - 1] === 0) return i + 1;
    return 0;
  }
  return bytes.lastIndexOf(0x0a) + 1;
}

function startFrom(prefix: Uint8Array, fileName: string, complete: boolean, forced: TextEncoding | undefined): StreamStart | null {
  const guess = forced === undefined ? guessEncoding(prefix, complete) : { encoding: forced, tentative: false };
  const bytes = complete ? prefix : prefix.subarray(0, cutAtLine(prefix, guess.encoding));
  if (bytes.length === 0) return null;
  const read = readBook(bytes, fileName, { encoding: guess.encoding });
  if (!read.ok) return null;
  const book = read.book;
  const sheet = book.sheets[0];
  if (sheet === undefined || book.sheets.length !== 1 || book.delimiter === undefined) return null;
  const detection = detectLayout(book, DEFAULT_TOKENS);
  if (detection.problems.some((p) => p.severity === 'error')) return null;
  const sl = detection.layout.sheets[0];
  if (sl === undefined || detection.layout.sheets.length !== 1 || detection.layout.sectionFrom !== 'column') return null;
  const dataStart = Math.max(sl.headerRow, sl.possibleRow ?? -1) + 1;
  if (!complete) {
    if (sheet.rows.length < dataStart + DETECT_DATA_ROWS) return null;
    let anyRow = false;
    for (let r = dataStart; r < sheet.rows.length && !anyRow; r++) anyRow = (sheet.rows[r] ?? []).some((c) => !isBlank(c));
    if (!anyRow) return null;
  }
  // The sheet-level checks of the import (roles, points possible, duplicate headers) on the rows
  // above the students; 'no-students' is decided after the last row.
  const headOnly = { ...book, sheets: [{ ...sheet, rows: sheet.rows.slice(0, dataStart) }] };
  const sheetProblems: ImportProblem[] = [];
  const plan = planGradebook(headOnly, detection.layout, sheetProblems);
  const planned = plan.sheets[0];
  if (planned === undefined || sheetProblems.some((p) => p.severity === 'error')) return null;
  const text = new TextDecoder(guess.encoding).decode(bytes);
  const newline = Papa.parse<string[]>(text, { delimiter: book.delimiter, preview: 1 }).meta.linebreak;
  // book.problems would only say the prefix has replaced characters: the whole file decides that.
  return {
    layout: detection.layout,
    encoding: guess.encoding,
    tentative: guess.tentative,
    delimiter: book.delimiter,
    newline,
    sheet: sheet.name,
    assessments: plan.assessments,
    assessmentIndex: plan.assessmentIndex,
    planned,
    dataStart,
    problems: [...detection.problems, ...sheetProblems],
  };
}

async function readRows(path: string, start: StreamStart, sink: StreamSink): Promise<Result<StreamImportOutcome> | 'not-utf-8'> {
  const fileName = basename(path);
  const problems: ImportProblem[] = [];
  const reader = new StudentRows(start.planned, start.layout, start.assessments, start.assessmentIndex, new Map(), problems);
  sink.begin(start.assessments, start.layout);
  let notUtf8 = false;
  let replaced = false;
  let malformed: string | null = null;
  async function* text(): AsyncGenerator<string> {
    const decoder = new TextDecoder(start.encoding, { fatal: start.tentative });
    try {
      for await (const chunk of createReadStream(path, { highWaterMark: 1 << 20 })) {
        const s = decoder.decode(chunk as Buffer, { stream: true });
        if (!replaced && s.includes('\uFFFD')) replaced = true;
        yield s;
      }
      const last = decoder.decode();
      if (!replaced && last.includes('\uFFFD')) replaced = true;
      if (last !== '') yield last;
    } catch (e) {
      if (start.tentative && e instanceof TypeError) notUtf8 = true;
      else throw e;
    }
  }
  let r = 0;
  await new Promise<void>((resolve, reject) => {
    Papa.parse<string[]>(Readable.from(text()) as unknown as File, {
      delimiter: start.delimiter,
      newline: start.newline as '\r\n',
      header: false,
      dynamicTyping: false,
      skipEmptyLines: false,
      step: (result, parser) => {
        for (const err of result.errors) {
          if (err.type === 'Delimiter') continue;
          malformed = `Sheet "${baseName(fileName)}", row ${r + 1}: the file is not a well-formed delimited table (${err.message}). Check the quotes around that row or export the file again.`;
          parser.abort();
          return;
        }
        if (notUtf8) {
          parser.abort();
          return;
        }
        const cells = result.data as unknown as Cell[];
        for (let c = 0; c < cells.length; c++) if (cells[c] === '') cells[c] = null;
        if (r >= start.dataStart) {
          const got = reader.row(r, cells);
          // After any error nothing is imported: the rows are still read for their problems.
          if (got !== null && reader.errors === 0) sink.row(got.student, got.scores);
        }
        r++;
      },
      complete: () => resolve(),
      error: (e: Error) => reject(e),
    });
  });
  if (notUtf8) return 'not-utf-8';
  const readProblems: ImportProblem[] = [];
  if (replaced) {
    readProblems.push(problemAt('warning', 'replaced-characters', { sheet: start.sheet }, `some characters could not be decoded as ${start.encoding} and show as "\uFFFD". Choose another encoding in the preview.`));
  }
  if (malformed !== null) return { ok: false, code: 'bad-input', message: malformed, problems: [{ severity: 'error', code: 'malformed-text', message: malformed }] };
  reader.finish();
  const all = [...readProblems, ...start.problems, ...problems];
  const errors = all.filter((p) => p.severity === 'error');
  if (errors.length > 0) {
    const first = errors[0]!;
    const message = errors.length === 1 ? first.message : `${errors.length} problems stop the import. The first: ${first.message}`;
    return { ok: false, code: 'bad-input', message, problems: all };
  }
  const encodingLayout: ImportLayout = { ...start.layout, encoding: start.encoding };
  return { ok: true, value: { layout: encodingLayout, assessments: start.assessments, problems: all, students: reader.count } };
}
