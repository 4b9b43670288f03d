/**
 * Runs one fuzz case end to end, the way the app imports a file: the bytes are written to a temp
 * file, previewed through the isolated importer (worker, time limit), and — when the preview
 * proposes a layout — imported with it. Then the case is checked:
 *
 * - no crash: every call returns a Result; the importer itself never failed ('internal') and the
 *   worker's output passed its schema checks;
 * - no hang: the worker's time limit bounds the case; a 'timeout' is a failure of the case;
 * - prototypes untouched: in the worker (checked after every job by the importer) and here;
 * - every failure and problem is a located, user-readable message (see checkMessage);
 * - the source file's bytes are unchanged (SHA-256 before and after);
 * - optionally the same answer as the direct, in-process service for the same file.
 */
import { createHash } from 'node:crypto';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import type { ImportProblem, Result } from '../../renderer/bridge/contract';
import { importSpreadsheet, previewSpreadsheet } from '../../main/services/spreadsheet';
import { createIsolatedImporter, type IsolatedImporter, type WorkerEntry } from '../../main/services/untrusted';
import { watchPrototypes } from '../../main/services/untrusted/prototypeWatch';

export interface FuzzCase {
  /** Family for the summary ("truncated zip", "csv quotes" …). */
  readonly family: string;
  /** What was done to the file, for a failure report. */
  readonly detail?: string;
  readonly fileName: string;
  readonly bytes: Uint8Array;
  /** A hostile case built to exhaust memory: 'too-large' is then an acceptable answer. */
  readonly mayExhaust?: boolean;
}

export interface CaseReport {
  readonly family: string;
  readonly millis: number;
  /** Empty when the case passed; otherwise what went wrong, one line each. */
  readonly defects: readonly string[];
  readonly previewCode: string;
}

export interface Tally {
  cases: number;
  defects: number;
  crashes: number;
  hangs: number;
  /** Legacy .xls cases stopped by the time limit inside SheetJS's BIFF parser (see checkResult). */
  xlsParserHangsContained: number;
  pollution: number;
  changedSources: number;
  badMessages: number;
  maxCaseMillis: number;
  readonly families: Record<string, number>;
  readonly outcomes: Record<string, number>;
}

export function newTally(): Tally {
  return { cases: 0, defects: 0, crashes: 0, hangs: 0, xlsParserHangsContained: 0, pollution: 0, changedSources: 0, badMessages: 0, maxCaseMillis: 0, families: {}, outcomes: {} };
}

export interface FuzzRunnerOptions {
  /** Bound on one call; a case that reaches it has hung. */
  readonly caseMillis: number;
  readonly maxHeapMb: number;
  /** Also run the direct service in this process and require the same answer. */
  readonly compareDirect: boolean;
  readonly workerEntry?: WorkerEntry;
}

export class FuzzRunner {
  readonly tally: Tally = newTally();
  private readonly dir = mkdtempSync(join(tmpdir(), 'wb-fuzz-'));
  private readonly importer: IsolatedImporter;
  private readonly watch = watchPrototypes();
  private n = 0;

  constructor(private readonly options: FuzzRunnerOptions) {
    const made = createIsolatedImporter({
      limits: { maxMillis: options.caseMillis, maxHeapMb: options.maxHeapMb, maxBytes: 64 * 1024 * 1024 },
      ...(options.workerEntry !== undefined ? { workerEntry: options.workerEntry } : {}),
    });
    if (!made.ok) throw new Error(made.message);
    this.importer = made.value;
  }

  async run(c: FuzzCase): Promise<CaseReport> {
    const caseDir = join(this.dir, String(this.n++));
    const path = join(caseDir, safeName(c.fileName));
    mkdirSync(dirname(path), { recursive: true });
    writeFileSync(path, c.bytes);
    const before = sha256(path);
    const defects: string[] = [];
    const t0 = performance.now();
    let previewCode = 'threw';
    try {
      const preview = await this.importer.preview(path);
      previewCode = preview.ok ? 'ok' : preview.code;
      defects.push(...checkResult('preview', preview, c));
      let imported: Result<unknown> | null = null;
      if (preview.ok && preview.value.detected.sheets.length > 0) {
        imported = await this.importer.importLayout(path, preview.value.detected);
        defects.push(...checkResult('import', imported, c));
        if (imported.ok) defects.push(...checkProblems('import', (imported.value as { problems: readonly ImportProblem[] }).problems));
      }
      if (preview.ok) defects.push(...checkProblems('preview', preview.value.problems));
      if (this.options.compareDirect && defects.length === 0 && (preview.ok || preview.code === 'bad-input')) {
        const direct = await previewSpreadsheet(path);
        if (!sameJson(direct, preview)) defects.push(`preview: the isolated result differs from the direct one at ${firstDifference(preview, direct)}`);
        if (preview.ok && imported !== null) {
          const directImport = await importSpreadsheet(path, preview.value.detected);
          if (!sameJson(directImport, imported)) defects.push(`import: the isolated result differs from the direct one at ${firstDifference(imported, directImport)}`);
        }
      }
    } catch (e) {
      defects.push(`threw: ${e instanceof Error ? e.stack ?? e.message : String(e)}`);
    }
    const millis = performance.now() - t0;
    const changes = this.watch.changes();
    if (changes.length > 0) defects.push(`prototypes changed in the test process: ${changes.join(', ')}`);
    if (sha256(path) !== before) defects.push('the source file was changed');
    if (defects.length > 0) keepFailure(c, defects);
    rmSync(caseDir, { recursive: true, force: true });
    this.record(c, millis, defects, previewCode);
    return { family: c.family, millis, defects, previewCode };
  }

  async close(): Promise<void> {
    await this.importer.close();
    rmSync(this.dir, { recursive: true, force: true });
  }

  private record(c: FuzzCase, millis: number, defects: readonly string[], previewCode: string): void {
    const t = this.tally;
    t.cases++;
    t.maxCaseMillis = Math.max(t.maxCaseMillis, Math.round(millis));
    t.families[c.family] = (t.families[c.family] ?? 0) + 1;
    t.outcomes[previewCode] = (t.outcomes[previewCode] ?? 0) + 1;
    if (previewCode === 'timeout' && isLegacyXls(c.bytes)) t.xlsParserHangsContained++;
    if (defects.length === 0) return;
    t.defects++;
    if (defects.some((d) => d.includes('threw') || d.includes("'internal'") || d.includes('schema'))) t.crashes++;
    if (defects.some((d) => d.includes("'timeout'"))) t.hangs++;
    if (defects.some((d) => d.includes('prototypes'))) t.pollution++;
    if (defects.some((d) => d.includes('source file was changed'))) t.changedSources++;
    if (defects.some((d) => d.includes('message'))) t.badMessages++;
  }
}

export function checkResult(step: string, r: Result<unknown>, c: FuzzCase): string[] {
  if (typeof r !== 'object' || r === null || typeof r.ok !== 'boolean') return [`${step}: not a Result`];
  if (r.ok) return [];
  const out: string[] = [];
  if (r.code === 'internal') out.push(`${step}: code 'internal' (the importer failed): ${r.message}`);
  // A damaged legacy .xls can send SheetJS's BIFF formula parser round forever: parse_Rgce loops
  // `while (target != blob.l)`, and a token that overruns its record steps past the target
  // (xlsx 0.20.3, found by the long suite). We cannot change the library; the isolated worker's
  // time limit stops it and the user reads the time-limit message, so for a .xls this is counted
  // as a contained library hang, not a defect. Any other file that times out is a hang.
  // (Both cases stop here: a legacy .xls timeout must not fall through to "unexpected code".)
  else if (r.code === 'timeout') {
    if (!isLegacyXls(c.bytes)) out.push(`${step}: code 'timeout' (hang): ${r.message}`);
  }
  // A ZIP that declares more than the memory limit is refused before it is opened: a sound
  // answer for any damaged file. Running out of memory is sound only for cases built for it.
  else if (r.code === 'too-large' && c.mayExhaust !== true && !r.message.includes('when unpacked')) out.push(`${step}: code 'too-large' on a case not built to exhaust memory: ${r.message}`);
  else if (r.message.includes("failed Weighbridge's checks")) out.push(`${step}: the worker's result failed its schema checks: ${r.message}`);
  else if (r.message.includes('changed built-in objects')) out.push(`${step}: prototypes changed in the worker: ${r.message}`);
  else if (!['bad-input', 'too-large'].includes(r.code)) out.push(`${step}: unexpected code '${r.code}': ${r.message}`);
  const m = checkMessage(r.message, (r.problems ?? []).flatMap(locatedText));
  if (m !== null) out.push(`${step}: bad failure message (${m}): ${r.message}`);
  if (r.problems !== undefined) out.push(...checkProblems(step, r.problems));
  return out;
}

function checkProblems(step: string, problems: readonly ImportProblem[]): string[] {
  const out: string[] = [];
  for (const p of problems) {
    const m = checkMessage(p.message, locatedText(p)) ?? checkLocation(p);
    if (m !== null) out.push(`${step}: bad problem message (${m}): ${JSON.stringify(p).slice(0, 400)}`);
  }
  return out;
}

/** A Compound File (OLE2) container, as legacy .xls workbooks are: D0 CF 11 E0 A1 B1 1A E1 (MS-CFB §2.2). */
function isLegacyXls(bytes: Uint8Array): boolean {
  const magic = [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1];
  return bytes.length >= 8 && magic.every((b, i) => bytes[i] === b);
}

/** The file's own text a located problem quotes: its sheet name, header and value. */
function locatedText(p: ImportProblem): string[] {
  return [p.at?.sheet, p.at?.header, p.at?.value].filter((t): t is string => typeof t === 'string' && t !== '');
}

/**
 * A message a user can read: a sentence (capital, digit or quote first, full stop last), no leaked
 * program words ("undefined", "[object Object]", "NaN") outside parentheses, bounded in length
 * (1000 characters) even when a cell holds megabytes. `quoted`: text of the file the message may
 * quote (a sheet named "NaN" is the file's word, not a leak); each is ignored inside quotes only.
 */
export function checkMessage(message: string, quoted: readonly string[] = []): string | null {
  if (typeof message !== 'string' || message.trim() === '') return 'empty';
  if (message.length > 1000) return `too long (${message.length} characters)`;
  // A library's own words in parentheses ("… damaged or incomplete (Unsupported ZIP …)") are a
  // detail for support; the sentence around them must read without them.
  let outside = message;
  for (const q of quoted) outside = outside.split(`"${q}"`).join('""');
  for (let prev = ''; prev !== outside; ) {
    prev = outside;
    outside = outside.replace(/\([^()]*\)/g, '');
  }
  if (/\bundefined\b|\[object Object\]|\bNaN\b/.test(outside)) return 'program words leak into it';
  if (!/^[A-Z0-9"“]/.test(message)) return 'does not start as a sentence';
  if (!/[.!?)]$/.test(message.trimEnd())) return 'does not end as a sentence';
  return null;
}

/** A located problem says where it is in the words of its location (DESIGN: sheet, row, column). */
export function checkLocation(p: ImportProblem): string | null {
  if (p.at === undefined) return null;
  if (!p.message.startsWith(`Sheet "${p.at.sheet}"`)) return 'located problem does not start with its sheet';
  if (p.at.row !== undefined && !p.message.includes(`row ${p.at.row}`)) return 'located problem does not name its row';
  if (p.at.column !== undefined && !p.message.includes(`column ${p.at.column}`)) return 'located problem does not name its column';
  return null;
}

/** A failing case's file and defects, kept under tests/artifacts/fuzz-failures/ to reproduce it. */
function keepFailure(c: FuzzCase, defects: readonly string[]): void {
  const dir = join(import.meta.dirname, '../artifacts/fuzz-failures');
  mkdirSync(dir, { recursive: true });
  const stem = `${c.family.replace(/[^a-z0-9]+/gi, '-')}-${createHash('sha256').update(c.bytes).digest('hex').slice(0, 12)}`;
  writeFileSync(join(dir, `${stem}-${safeName(c.fileName)}`), c.bytes);
  writeFileSync(join(dir, `${stem}.txt`), `${c.family} (${c.detail ?? ''}) ${c.fileName}\n${defects.map((d) => d.slice(0, 2000)).join('\n')}\n`);
}

/** "value.sheets[0].rows[3][2]: \"85%\" ≠ 0.85" — where two JSON-shaped values first part. */
export function firstDifference(a: unknown, b: unknown, path = ''): string {
  if (JSON.stringify(a) === JSON.stringify(b)) return '(no difference)';
  if (typeof a === 'object' && a !== null && typeof b === 'object' && b !== null && Array.isArray(a) === Array.isArray(b)) {
    const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
    for (const k of keys) {
      const x: unknown = (a as Record<string, unknown>)[k];
      const y: unknown = (b as Record<string, unknown>)[k];
      if (JSON.stringify(x) !== JSON.stringify(y)) return firstDifference(x, y, Array.isArray(a) ? `${path}[${k}]` : `${path}.${k}`);
    }
  }
  const show = (v: unknown) => (JSON.stringify(v) ?? String(v)).slice(0, 200);
  return `${path || '(top)'}: ${show(a)} (isolated) vs ${show(b)} (direct)`;
}

function sameJson(a: unknown, b: unknown): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}

function sha256(path: string): string {
  return createHash('sha256').update(readFileSync(path)).digest('hex');
}

/** File names from generators may hold separators or be empty; keep the extension. */
function safeName(name: string): string {
  const cleaned = name.replace(/[\\/\0]/g, '_');
  return cleaned === '' || cleaned === '.' || cleaned === '..' ? 'file' : cleaned;
}

/** Merges this run's tally into tests/artifacts/fuzz-summary.json under `suite`. */
export function writeSummary(suite: 'normal' | 'long', tally: Tally, notes: Record<string, unknown>): void {
  const path = join(import.meta.dirname, '../artifacts/fuzz-summary.json');
  mkdirSync(dirname(path), { recursive: true });
  let existing: Record<string, unknown> = {};
  try {
    const parsed: unknown = JSON.parse(readFileSync(path, 'utf8'));
    if (typeof parsed === 'object' && parsed !== null && !Array.isArray(parsed)) existing = parsed as Record<string, unknown>;
  } catch {
    // first run, or an unreadable summary: start afresh
  }
  existing[suite] = { ...tally, ...notes, finishedAt: new Date().toISOString(), node: process.version };
  writeFileSync(path, `${JSON.stringify(existing, null, 2)}\n`);
}
