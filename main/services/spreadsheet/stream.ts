/**
 * Streaming import of a text gradebook (.csv/.tsv) too large to hold as a grid of cells: the file
 * is decoded and parsed row by row (papaparse step mode) and each student row is handed to the
 * caller as a Student and its Scores, with every problem located exactly as the in-memory import
 * locates it (sheet = file name, row, column letter, header, value) and in the same order, so
 * `detectAndImport` and this give the same gradebook rows and the same problems (tested in
 * tests/services/spreadsheet/stream.test.ts and tests/cli/streaming.test.ts).
 *
 * The layout: the rows go through a `TextHead` (textHead.ts), the head-and-check rule of the
 * in-memory row-at-a-time import — its first rows decide the layout, and a later row that could
 * change it stops the stream: `streamImportText` returns null and the caller imports in memory,
 * which gives the in-memory result by construction. So does a head the stream does not import
 * (any error in its detection or planning, no sheet, sections from sheet names).
 *
 * The reading: the first STREAM_PREFIX_BYTES of the file decide what the whole-file reader
 * decides from the start of the text — the encoding (below), the delimiter (papaparse guesses it
 * from the first 10 rows) and the line break (from the first 1 MiB of text). The prefix must hold
 * those (and have no malformed row among them), or be the whole file; else null (import in memory).
 *
 * Encoding: a byte-order mark or the UTF-16 NUL pattern decide from the first 4 KiB as in
 * textEncoding.ts; otherwise the file is decoded as strict UTF-8 and, if a byte later in the file
 * is not UTF-8, read again from the start as Windows-1252 (what the whole-file detection decides).
 *
 * Memory: the head's rows, then one row of cells at a time plus one entry per student ID
 * (duplicate detection).
 */
import { createReadStream } from 'node:fs';
import { open, stat } from 'node:fs/promises';
import { basename } from 'node:path';
import { Readable } from 'node:stream';
import Papa from 'papaparse';
import type { ImportLayout, ImportProblem, Result, TextEncoding } from '../../../renderer/bridge/contract';
import type { Assessment, Score, Student } from '../../../renderer/engine/model';
import { fileProblem, hasErrors, problemAt } from './problems';
import { baseName, readTextRows, type Cell, type TextTable } from './readBook';
import { detectEncoding, decodeText } from './textEncoding';
import { TextHead, type HeadPlan } from './textHead';

/** Bytes read to guess the encoding, delimiter and line break as the whole-file reader does. */
export const STREAM_PREFIX_BYTES = 4 * 1024 * 1024;
/** Rows papaparse's delimiter guess reads (guessDelimiter: a Parser with `preview: 10`, papaparse 5.7.1). */
const DELIMITER_GUESS_ROWS = 10;
/** Characters papaparse's line-break guess reads (guessLineEndings: `input.substring(0, 1024 * 1024)`). */
const LINE_BREAK_GUESS_CHARS = 1024 * 1024;

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
  readonly encoding: TextEncoding;
  /** UTF-8 decided on the prefix only: a later non-UTF-8 byte means Windows-1252. */
  readonly tentative: boolean;
  /** The table as the whole-file reader names it (format, encoding, delimiter, sheet); its problems are the whole file's to decide. */
  readonly table: TextTable;
  readonly newline: string;
}

/**
 * Streams `path` into `sink`. Null when the file should be imported in memory instead: not a
 * plain text table, a prefix that does not settle the reading, a head the stream does not import,
 * or a later row that could change the layout (the head-and-check rule). A failure is the
 * in-memory import's refusal: the same message and problems.
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
  // The delimiter: the reader's own, on the prefix; the rows papaparse guesses it from must be in it.
  const read = readTextRows(bytes, fileName, { encoding: guess.encoding }, (_row, r) => r < DELIMITER_GUESS_ROWS);
  if (read === null || !read.ok || (!complete && !read.stopped)) return null;
  const text = decodeText(bytes, guess.encoding);
  if (!complete && text.length < LINE_BREAK_GUESS_CHARS) return null;
  const newline = Papa.parse<string[]>(text, { delimiter: read.table.delimiter, preview: 1 }).meta.linebreak;
  // The prefix's problems would only say it has replaced characters: the whole file decides that.
  return { encoding: guess.encoding, tentative: guess.tentative, table: { ...read.table, problems: [] }, newline };
}

/** What the stream imports: one planned sheet without errors so far, sections from its column; else import in memory. */
function streamable(plan: HeadPlan): boolean {
  return plan.reader !== null && plan.layout.sheets.length === 1 && plan.layout.sectionFrom === 'column' && !hasErrors(plan.earlier) && !hasErrors(plan.problems);
}

/**
 * Every row of the file through a TextHead. Null when the head-and-check rule or the head's plan
 * sends the import to memory; 'not-utf-8' when a tentative UTF-8 decoding met a byte that is not.
 */
async function readRows(path: string, start: StreamStart, sink: StreamSink): Promise<Result<StreamImportOutcome> | 'not-utf-8' | null> {
  const fileName = basename(path);
  const table = start.table;
  const head = TextHead.detecting({
    planned(plan) {
      if (!streamable(plan)) return false;
      sink.begin(plan.assessments, plan.layout);
      return true;
    },
    student(got) {
      // After any error nothing is imported: the rows are still read for their problems.
      if (head.errors === 0) sink.row(got.student, got.scores);
    },
  });
  let notUtf8 = false;
  let replaced = false;
  let malformed: ImportProblem | null = null;
  let stopped = false;
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
      delimiter: table.delimiter,
      newline: start.newline as '\r\n',
      header: false,
      dynamicTyping: false,
      skipEmptyLines: false,
      step: (result, parser) => {
        for (const err of result.errors) {
          if (err.type === 'Delimiter') continue;
          malformed = fileProblem('error', 'malformed-text', `Sheet "${baseName(fileName)}", row ${r + 1}: the file is not a well-formed delimited table (${err.message}). Check the quotes around that row or export the file again.`);
          parser.abort();
          return;
        }
        if (notUtf8) {
          parser.abort();
          return;
        }
        const cells = result.data as unknown as Cell[];
        for (let c = 0; c < cells.length; c++) if (cells[c] === '') cells[c] = null;
        if (!head.take(cells, r, table)) {
          stopped = true;
          parser.abort();
          return;
        }
        r++;
      },
      complete: () => resolve(),
      error: (e: Error) => reject(e),
    });
  });
  if (notUtf8) return 'not-utf-8';
  const refused = malformed as ImportProblem | null; // assigned in the step callback
  if (refused !== null) return { ok: false, code: 'bad-input', message: refused.message, problems: [refused] };
  // A later row could change the layout, or the head is not one the stream imports: in memory.
  if (stopped || !head.end(table)) return null;
  head.finish();
  const plan = head.planned;
  if (plan === null) return null; // not met: end() decided the head
  const readProblems: ImportProblem[] = [];
  if (replaced) {
    readProblems.push(problemAt('warning', 'replaced-characters', { sheet: table.sheet }, `some characters could not be decoded as ${start.encoding} and show as "\uFFFD". Choose another encoding in the preview.`));
  }
  const all = [...readProblems, ...plan.earlier, ...plan.problems];
  const errors = all.filter((p) => p.severity === 'error');
  if (errors.length > 0) {
    const first = errors[0]!;
    const message = errors.length === 1 ? first.message : `${errors.length} problems stop the import. The first: ${first.message}`;
    return { ok: false, code: 'bad-input', message, problems: all };
  }
  const encodingLayout: ImportLayout = { ...plan.layout, encoding: start.encoding };
  return { ok: true, value: { layout: encodingLayout, assessments: plan.assessments, problems: all, students: plan.reader?.count ?? 0 } };
}
