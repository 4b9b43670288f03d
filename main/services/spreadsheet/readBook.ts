/**
 * Bytes → a plain grid per sheet, with the real file type decided from the bytes, not the name.
 *
 * Magic numbers: ZIP local-file header "PK\x03\x04" (APPNOTE.TXT §4.3.7) for .xlsx (ECMA-376 Part 2,
 * Open Packaging Conventions) and .ods (OpenDocument 1.2 Part 3 §3.3: an uncompressed first entry
 * "mimetype" holding "application/vnd.oasis.opendocument.spreadsheet"); Compound File Binary
 * D0 CF 11 E0 A1 B1 1A E1 ([MS-CFB] §2.2) for .xls ("Workbook"/"Book" stream, [MS-XLS] §2.1.2) and
 * for password-protected OOXML ("EncryptionInfo" + "EncryptedPackage" streams, [MS-OFFCRYPTO] §2.3.4).
 *
 * Nothing SheetJS returns is trusted as an object: sheets are looked up by own property only, and
 * every cell becomes a string, a finite number or null in arrays this module builds itself.
 */
import * as zlib from 'node:zlib';
import Papa from 'papaparse';
import * as XLSX from 'xlsx';
import type { ImportProblem, TextEncoding, WorkbookPreview } from '../../../renderer/bridge/contract';
import { fileProblem, problemAt } from './problems';
import { decodeText, detectAndDecode } from './textEncoding';
import { damagedZipEntry, declaredUnzippedBytes } from './zipCheck';

/**
 * The most a workbook may unpack to, declared or real. SheetJS allocates an entry's declared size
 * up front, and native inflate's output is otherwise unbounded; a gradebook is a few megabytes.
 */
const MAX_UNZIPPED_BYTES = 512 * 1024 * 1024;

/**
 * Node's zlib for SheetJS's ZIP entries, with an output bound. The ESM build of SheetJS otherwise
 * inflates in pure JS, which loops forever on a cut deflate stream (it never checks its bit offset
 * against the input length) and writes into Buffer.allocUnsafe memory of the declared size, so a
 * stream that ends early leaves stale memory — another file's text — to be parsed as sheet XML.
 * Native inflate fails fast on a cut stream and returns only the bytes it produced.
 */
class BoundedInflateRaw extends zlib.InflateRaw {
  constructor() {
    super({ maxOutputLength: MAX_UNZIPPED_BYTES });
  }
}
// SheetJS reads `bytesRead` (how much input the stream consumed); Node deprecates that name in
// favour of `bytesWritten` (DEP0108) and warns on first use, so answer it without the warning.
Object.defineProperty(BoundedInflateRaw.prototype, 'bytesRead', {
  get(this: zlib.InflateRaw): number {
    return this.bytesWritten;
  },
  configurable: true,
});
(XLSX.CFB as unknown as { utils: { use_zlib(z: unknown): void } }).utils.use_zlib({ ...zlib, InflateRaw: BoundedInflateRaw });

/** One cell as read: text, a number (only from a numeric workbook cell), or blank. */
export type Cell = string | number | null;

export interface RawSheet {
  readonly name: string;
  /** Rows without trailing blank rows; each row without trailing blank cells. */
  readonly rows: readonly (readonly Cell[])[];
  readonly width: number;
}

export interface RawBook {
  readonly format: WorkbookPreview['format'];
  readonly encoding?: TextEncoding;
  readonly delimiter?: string;
  readonly sheets: readonly RawSheet[];
  /** Non-fatal reading problems (a sheet that cannot be read safely, replaced characters …). */
  readonly problems: readonly ImportProblem[];
}

export interface ReadOverride {
  readonly encoding?: TextEncoding;
  readonly delimiter?: string;
}

export type ReadResult = { readonly ok: true; readonly book: RawBook } | { readonly ok: false; readonly problem: ImportProblem };

const FIX_SAVE_AGAIN = 'Open it in your spreadsheet program and save it again as .xlsx, .ods or .csv, or export a fresh copy.';
const SUPPORTED = '.xlsx, .xls, .ods, .csv or .tsv';
const TEXT_EXTENSIONS = new Set(['csv', 'tsv', 'txt', 'tab']);
const WORKBOOK_EXTENSIONS = new Set(['xlsx', 'xlsm', 'xls', 'ods']);

export function readBook(bytes: Uint8Array, fileName: string, override: ReadOverride = {}): ReadResult {
  const route = routeOf(bytes, fileName);
  switch (route.kind) {
    case 'refused':
      return route.result;
    case 'zip':
      return readZip(bytes, fileName);
    case 'compound':
      return readCompound(bytes, fileName);
    case 'text':
      return readText(bytes, fileName, route.ext, override);
  }
}

type Route = { kind: 'refused'; result: ReadResult } | { kind: 'zip' } | { kind: 'compound' } | { kind: 'text'; ext: string };

/** What the bytes are read as: decided from the bytes first, the name's extension second. */
function routeOf(bytes: Uint8Array, fileName: string): Route {
  const ext = extensionOf(fileName);
  if (bytes.length === 0 || isBlankText(bytes)) {
    return refused('empty-file', `The file "${fileName}" is empty. Choose the gradebook file that holds the scores.`);
  }
  if (startsWith(bytes, [0x50, 0x4b, 0x03, 0x04])) return { kind: 'zip' };
  if (startsWith(bytes, [0x50, 0x4b, 0x05, 0x06])) {
    return refused('empty-file', `The file "${fileName}" is an empty archive with nothing in it. Choose the gradebook file that holds the scores.`);
  }
  if (startsWith(bytes, [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1])) return { kind: 'compound' };
  if (WORKBOOK_EXTENSIONS.has(ext)) {
    return refused(
      'wrong-file-type',
      `The file "${fileName}" is named .${ext} but its contents are not a spreadsheet workbook (it may be damaged or renamed). Choose a ${SUPPORTED} file.`,
    );
  }
  if (!TEXT_EXTENSIONS.has(ext)) {
    return refused('wrong-file-type', `The file "${fileName}" is not a spreadsheet Weighbridge can import. Choose a ${SUPPORTED} file.`);
  }
  return { kind: 'text', ext };
}

function refused(code: string, message: string): Route {
  return { kind: 'refused', result: fail(code, message) };
}

function readZip(bytes: Uint8Array, fileName: string): ReadResult {
  const buf = asBuffer(bytes);
  // The end-of-central-directory record (PK 05 06) sits in the last 22 + 65 535 bytes (APPNOTE.TXT
  // §4.3.16); without it the archive was cut short.
  if (buf.lastIndexOf(Buffer.from([0x50, 0x4b, 0x05, 0x06])) < Math.max(0, buf.length - 65557)) {
    return corrupt(fileName);
  }
  const declared = declaredUnzippedBytes(buf);
  if (declared !== null && declared > MAX_UNZIPPED_BYTES) {
    return fail(
      'too-large',
      `The file "${fileName}" says it expands to ${Math.ceil(declared / (1024 * 1024))} MB when unpacked, more than the ${MAX_UNZIPPED_BYTES / (1024 * 1024)} MB a gradebook workbook may hold, so it was not opened. It is probably damaged: ${FIX_SAVE_AGAIN}`,
    );
  }
  const damaged = damagedZipEntry(buf, MAX_UNZIPPED_BYTES);
  if (damaged !== null) {
    return fail(
      'corrupt-file',
      `The file "${fileName}" is damaged: its part "${damaged.slice(0, 200)}" does not unpack to the contents its checksum records, so it was not read. ${FIX_SAVE_AGAIN}`,
    );
  }
  let format: 'xlsx' | 'ods';
  if (buf.indexOf('mimetypeapplication/vnd.oasis.opendocument.spreadsheet', 0, 'latin1') >= 0) format = 'ods';
  else if (buf.indexOf('xl/workbook.xml', 0, 'latin1') >= 0) format = 'xlsx';
  else if (buf.indexOf('xl/workbook.bin', 0, 'latin1') >= 0) {
    return fail('wrong-file-type', `The file "${fileName}" is a binary Excel workbook (.xlsb), which Weighbridge does not read. Save it as .xlsx and import that copy.`);
  } else {
    return fail('wrong-file-type', `The file "${fileName}" is a ZIP archive but not a spreadsheet workbook (for example a word-processor document). Choose a ${SUPPORTED} file.`);
  }
  return readWorkbook(buf, fileName, format);
}

function readCompound(bytes: Uint8Array, fileName: string): ReadResult {
  const buf = asBuffer(bytes);
  let names: string[];
  try {
    names = compoundStreamNames(buf);
  } catch {
    return corrupt(fileName);
  }
  if (names.includes('EncryptionInfo') || names.includes('EncryptedPackage')) return passwordProtected(fileName);
  if (!names.includes('Workbook') && !names.includes('Book')) {
    return fail('wrong-file-type', `The file "${fileName}" is an Office file but not a spreadsheet workbook (for example a word-processor document). Choose a ${SUPPORTED} file.`);
  }
  return readWorkbook(buf, fileName, 'xls');
}

/** Stream names of a compound file, read through SheetJS's bundled CFB reader (typed `any` upstream). */
function compoundStreamNames(buf: Buffer): string[] {
  const cfb: unknown = (XLSX.CFB as { read: (d: Buffer, o: { type: 'buffer' }) => unknown }).read(buf, { type: 'buffer' });
  const index = (cfb as { FileIndex?: unknown }).FileIndex;
  if (!Array.isArray(index)) throw new Error('no directory');
  const names: string[] = [];
  for (const entry of index as unknown[]) {
    const name = (entry as { name?: unknown } | null)?.name;
    if (typeof name === 'string') names.push(name);
  }
  return names;
}

function readWorkbook(buf: Buffer, fileName: string, format: 'xlsx' | 'xls' | 'ods'): ReadResult {
  let wb: XLSX.WorkBook;
  try {
    // raw: no text cell is reinterpreted ("7,5" stays text for parseScore); numeric cells stay
    // numbers. cellNF keeps the number format so a percent-formatted 0.85 can be read as "85%".
    wb = XLSX.read(buf, {
      type: 'buffer',
      dense: true,
      raw: true,
      cellDates: false,
      cellFormula: false,
      cellHTML: false,
      cellStyles: false,
      cellNF: true,
      cellText: true,
      bookVBA: false,
      WTF: false,
    });
  } catch (e) {
    if (/password|encrypt/i.test(errorText(e))) return passwordProtected(fileName);
    return corrupt(fileName);
  }
  const names: unknown = wb.SheetNames;
  if (!Array.isArray(names) || names.length === 0) return corrupt(fileName);
  const sheets: RawSheet[] = [];
  const problems: ImportProblem[] = [];
  const seen = new Set<string>();
  for (const name of names as unknown[]) {
    if (typeof name !== 'string') continue;
    const sheetsObj: unknown = wb.Sheets;
    const own = typeof sheetsObj === 'object' && sheetsObj !== null && Object.prototype.hasOwnProperty.call(sheetsObj, name);
    if (!own || seen.has(name)) {
      problems.push(
        problemAt('warning', 'sheet-unreadable', { sheet: name }, `this sheet could not be read safely (its name "${name}" clashes with a reserved word) and was left out. Rename the sheet and import again if it holds scores.`),
      );
      continue;
    }
    seen.add(name);
    const ws: unknown = Object.getOwnPropertyDescriptor(sheetsObj, name)?.value;
    sheets.push(sheetFromWorksheet(name, ws));
  }
  return { ok: true, book: { format, sheets, problems } };
}

function sheetFromWorksheet(name: string, ws: unknown): RawSheet {
  const data: unknown = typeof ws === 'object' && ws !== null ? Object.getOwnPropertyDescriptor(ws, '!data')?.value : undefined;
  const rows: Cell[][] = [];
  if (Array.isArray(data)) {
    const percent = new PercentFormats();
    for (let r = 0; r < data.length; r++) {
      const src: unknown = data[r];
      const row: Cell[] = [];
      if (Array.isArray(src)) {
        for (let c = 0; c < src.length; c++) row.push(cellFromSheetJs(src[c], percent));
      }
      rows.push(row);
    }
  }
  return finishSheet(name, rows);
}

/** Whether a number format shows a percent, remembered per format text (a sheet has few). */
class PercentFormats {
  private readonly seen = new Map<string, boolean>();
  isPercent(z: string): boolean {
    let known = this.seen.get(z);
    if (known === undefined) {
      known = z.replace(/"[^"]*"/g, '').includes('%');
      this.seen.set(z, known);
    }
    return known;
  }
}

/** A SheetJS cell object → Cell. Unknown shapes become blank rather than being trusted. */
function cellFromSheetJs(raw: unknown, percent: PercentFormats): Cell {
  if (typeof raw !== 'object' || raw === null) return null;
  const t = ownValue(raw, 't');
  const v = ownValue(raw, 'v');
  switch (t) {
    case 'n': {
      if (typeof v !== 'number' || !Number.isFinite(v)) return textOf(raw);
      const z = ownValue(raw, 'z');
      // A percent-formatted 0.85 is shown as 85% in the sheet: hand it on as the text the user sees.
      if (typeof z === 'string' && percent.isPercent(z)) return `${Number((v * 100).toPrecision(12))}%`;
      return v;
    }
    case 's':
    case 'str':
      return typeof v === 'string' ? (v === '' ? null : v) : textOf(raw);
    case 'b':
      return v === true ? 'TRUE' : v === false ? 'FALSE' : textOf(raw);
    case 'e':
      return textOf(raw) ?? '#ERROR';
    case 'd':
      return textOf(raw) ?? (v instanceof Date ? v.toISOString() : null);
    default:
      return null;
  }
}

/** The formatted text SheetJS gives a cell, when it is a string. */
function textOf(raw: object): string | null {
  const w = ownValue(raw, 'w');
  return typeof w === 'string' ? w : null;
}

/** A text file decoded and checked, ready to parse. */
interface TextStart {
  readonly text: string;
  readonly encoding: TextEncoding;
  readonly sheetName: string;
  readonly problems: readonly ImportProblem[];
  readonly delimiter: string;
  readonly ext: string;
}

function startText(bytes: Uint8Array, fileName: string, ext: string, override: ReadOverride): { ok: true; start: TextStart } | { ok: false; result: ReadResult } {
  let encoding: TextEncoding | undefined = override.encoding;
  let text: string;
  try {
    // Detection decodes the whole file once; that text is kept rather than decoded again.
    if (encoding === undefined) ({ encoding, text } = detectAndDecode(bytes));
    else text = decodeText(bytes, encoding);
  } catch (e) {
    return { ok: false, result: fail('bad-encoding', `The file "${fileName}" cannot be read as ${encoding ?? 'text'} (${errorText(e)}). Choose another encoding.`) };
  }
  if (looksBinary(text)) {
    return { ok: false, result: fail('wrong-file-type', `The file "${fileName}" does not hold text, so it is not a .${ext} table (it may be damaged or renamed). Choose a ${SUPPORTED} file.`) };
  }
  const sheetName = baseName(fileName);
  const problems: ImportProblem[] = [];
  if (text.includes('\uFFFD')) {
    problems.push(problemAt('warning', 'replaced-characters', { sheet: sheetName }, `some characters could not be decoded as ${encoding} and show as "\uFFFD". Choose another encoding in the preview.`));
  }
  const wanted = override.delimiter;
  if (wanted !== undefined && (wanted.length !== 1 || wanted === '"' || wanted === '\r' || wanted === '\n')) {
    return { ok: false, result: fail('bad-delimiter', `The delimiter ${JSON.stringify(wanted)} cannot be used: choose one character such as "," ";" or a tab.`) };
  }
  const delimiter = wanted ?? (ext === 'tsv' || ext === 'tab' ? '\t' : '');
  return { ok: true, start: { text, encoding, sheetName, problems, delimiter, ext } };
}

/** papaparse's options for every text table: the delimiter given, else guessed among , ; tab. */
function papaOptions(start: TextStart): Papa.ParseConfig<string[]> {
  return { delimiter: start.delimiter, delimitersToGuess: [',', ';', '\t'], header: false, dynamicTyping: false, skipEmptyLines: false };
}

/** The first parse error that stops the import (a one-column file has no delimiter to guess: not one). */
function malformed(start: TextStart, errors: readonly Papa.ParseError[], row: (e: Papa.ParseError) => number | undefined): ReadResult | null {
  for (const err of errors) {
    if (err.type === 'Delimiter') continue; // one column: nothing to guess, ',' is as good as any
    const at = row(err);
    return fail(
      'malformed-text',
      `Sheet "${start.sheetName}"${at === undefined ? '' : `, row ${at}`}: the file is not a well-formed delimited table (${err.message}). Check the quotes around that row or export the file again.`,
    );
  }
  return null;
}

function textFormat(start: TextStart, delimiter: string): RawBook['format'] {
  const ext = start.ext;
  return ext === 'tsv' || ext === 'tab' || (delimiter === '\t' && ext !== 'csv') ? 'tsv' : 'csv';
}

/** papaparse's row arrays are ours: blanks become null in place rather than in a copy. */
function cellsOf(src: unknown): Cell[] {
  if (!Array.isArray(src)) return [];
  const row = src as unknown[];
  for (let c = 0; c < row.length; c++) {
    const v = row[c];
    if (v === '' || typeof v !== 'string') row[c] = null;
  }
  return row as Cell[];
}

function readText(bytes: Uint8Array, fileName: string, ext: string, override: ReadOverride): ReadResult {
  const started = startText(bytes, fileName, ext, override);
  if (!started.ok) return started.result;
  const start = started.start;
  const parsed = Papa.parse<string[]>(start.text, papaOptions(start));
  const refusal = malformed(start, parsed.errors, (err) => (typeof err.row === 'number' ? err.row + 1 : undefined));
  if (refusal !== null) return refusal;
  const rows: Cell[][] = [];
  for (const src of parsed.data as unknown[]) rows.push(cellsOf(src));
  const delimiter = parsed.meta.delimiter;
  return { ok: true, book: { format: textFormat(start, delimiter), encoding: start.encoding, delimiter, sheets: [finishSheet(start.sheetName, rows)], problems: start.problems } };
}

/** A text table read by `readTextRows`: the book without its rows. */
export interface TextTable {
  readonly format: RawBook['format'];
  readonly encoding: TextEncoding;
  readonly delimiter: string;
  /** The name of its only sheet (the file name without extension). */
  readonly sheet: string;
  readonly problems: readonly ImportProblem[];
}

/**
 * Called with each row (0-based index `r`, blanks as null, trailing blanks not yet trimmed) as it
 * is parsed, and the table it belongs to (the same object every call); the row array is the
 * callee's. Returning false stops the reading (the result is then `stopped`).
 */
export type RowSink = (row: Cell[], r: number, table: TextTable) => boolean | void;

export type TextRowsResult =
  | { readonly ok: true; readonly table: TextTable; readonly rows: number; readonly stopped: boolean }
  | { readonly ok: false; readonly problem: ImportProblem };

/**
 * A text table (.csv/.tsv) read row by row: the same decoding, delimiter, rows and refusals as
 * `readBook` (papaparse's step mode over the same text and options; tested equal in
 * tests/services/spreadsheet/textRows.test.ts), without holding the grid. Null when `readBook`
 * would not read the bytes as text (a workbook, or refused before decoding): call readBook then.
 * Rows already handed on before a malformed row are not taken back: the caller discards them.
 */
export function readTextRows(bytes: Uint8Array, fileName: string, override: ReadOverride, onRow: RowSink): TextRowsResult | null {
  const route = routeOf(bytes, fileName);
  if (route.kind !== 'text') return null;
  const started = startText(bytes, fileName, route.ext, override);
  if (!started.ok) return started.result.ok ? null : started.result;
  const start = started.start;
  let r = 0;
  let refusal: ReadResult | null = null;
  let stopped = false;
  let table: TextTable | null = null;
  Papa.parse<string[]>(start.text, {
    ...papaOptions(start),
    step: (result, parser) => {
      // The errors of a step are those met while parsing its row (papaparse pushes each error
      // before the row it belongs to), so this row's number is the whole-text parse's err.row + 1.
      refusal = malformed(start, result.errors, () => r + 1);
      if (refusal !== null) {
        parser.abort();
        return;
      }
      // The delimiter given or guessed: papaparse decides it on the whole text before the first row.
      table ??= { format: textFormat(start, result.meta.delimiter), encoding: start.encoding, delimiter: result.meta.delimiter, sheet: start.sheetName, problems: start.problems };
      if (onRow(cellsOf(result.data), r, table) === false) {
        stopped = true;
        parser.abort();
        return;
      }
      r++;
    },
  });
  const refused: ReadResult | null = refusal;
  if (refused !== null) return refused;
  const read: TextTable | null = table;
  if (read === null) return fail('malformed-text', `Sheet "${start.sheetName}": the file has no rows to read. Export the file again.`); // not met: the text is not blank
  return { ok: true, table: read, rows: r, stopped };
}

/** Trailing blank cells and rows trimmed (in place), and the width worked out. */
export function finishSheet(name: string, rows: Cell[][]): RawSheet {
  for (const row of rows) while (row.length > 0 && isBlank(row[row.length - 1])) row.pop();
  while (rows.length > 0 && (rows[rows.length - 1]?.length ?? 0) === 0) rows.pop();
  let width = 0;
  for (const row of rows) width = Math.max(width, row.length);
  return { name, rows, width };
}

export function isBlank(cell: Cell | undefined): boolean {
  return cell === null || cell === undefined || (typeof cell === 'string' && cell.trim() === '');
}

/** What the cell shows, for previews and messages. */
export function cellText(cell: Cell | undefined): string {
  if (cell === null || cell === undefined) return '';
  return typeof cell === 'number' ? String(cell) : cell;
}

function passwordProtected(fileName: string): ReadResult {
  return fail(
    'password-protected',
    `The file "${fileName}" is password-protected. Open it in your spreadsheet program, remove the password (save a copy without encryption) and import that copy.`,
  );
}

/**
 * A fixed sentence: the library's exception text ("Cannot read properties of undefined …") reads
 * to a user as the program breaking, and says nothing they can act on.
 */
function corrupt(fileName: string): ReadResult {
  return fail('corrupt-file', `The file "${fileName}" could not be read: it looks damaged or incomplete (its parts could not be unpacked and read as a workbook). ${FIX_SAVE_AGAIN}`);
}

function fail(code: string, message: string): { readonly ok: false; readonly problem: ImportProblem } {
  return { ok: false, problem: fileProblem('error', code, message) };
}

function errorText(e: unknown): string {
  const text = e instanceof Error ? e.message : typeof e === 'string' ? e : 'unknown error';
  return text.length > 120 ? `${text.slice(0, 120)}…` : text;
}

/**
 * An own data property only, never one inherited from a (possibly polluted) prototype. SheetJS
 * builds plain objects by assignment, so an own property is a data property; read directly, as
 * this runs for every cell.
 */
function ownValue(obj: object, key: string): unknown {
  return Object.prototype.hasOwnProperty.call(obj, key) ? (obj as Record<string, unknown>)[key] : undefined;
}

function asBuffer(bytes: Uint8Array): Buffer {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}

function startsWith(bytes: Uint8Array, magic: readonly number[]): boolean {
  return magic.every((b, i) => bytes[i] === b);
}

/** Only whitespace, optionally after a UTF-8 or UTF-16 BOM (NULs of UTF-16 included). */
function isBlankText(bytes: Uint8Array): boolean {
  for (let i = 0; i < bytes.length; i++) {
    const b = bytes[i];
    if (b === 0x20 || b === 0x09 || b === 0x0a || b === 0x0d || b === 0x00) continue;
    if (i < 3 && (b === 0xef || b === 0xbb || b === 0xbf || b === 0xff || b === 0xfe)) continue;
    return false;
  }
  return true;
}

/** NULs or many control characters: not a text table whatever the extension says. */
function looksBinary(text: string): boolean {
  const sample = text.slice(0, 8192);
  let control = 0;
  for (let i = 0; i < sample.length; i++) {
    const code = sample.charCodeAt(i);
    if (code === 0) return true;
    if (code < 0x20 && code !== 0x09 && code !== 0x0a && code !== 0x0d && code !== 0x0c) control++;
  }
  return control > Math.max(2, sample.length * 0.05);
}

function extensionOf(fileName: string): string {
  const base = fileName.split(/[\\/]/).pop() ?? fileName;
  const dot = base.lastIndexOf('.');
  return dot > 0 ? base.slice(dot + 1).toLowerCase() : '';
}

/** "scores.csv" → "scores": the name a text file's only sheet goes by in messages. */
export function baseName(fileName: string): string {
  const base = fileName.split(/[\\/]/).pop() ?? fileName;
  const dot = base.lastIndexOf('.');
  return dot > 0 ? base.slice(0, dot) : base;
}
