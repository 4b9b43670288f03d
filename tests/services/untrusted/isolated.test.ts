/**
 * The isolated import (main/services/untrusted): same answers as the direct spreadsheet service on
 * good and bad files, from source and from the bundled worker; the size, time and memory limits;
 * the checks on what the worker sends back; the source file's bytes never change.
 */
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { copyFileSync, mkdtempSync, openSync, closeSync, ftruncateSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { detectAndImport, importSpreadsheet, previewMerge, previewSpreadsheet } from '../../../main/services/spreadsheet';
import {
  createIsolatedImporter,
  DEFAULT_IMPORT_LIMITS,
  detectAndImportIsolated,
  importSpreadsheetIsolated,
  previewMergeIsolated,
  previewSpreadsheetIsolated,
  type IsolatedImporter,
  type WorkerEntry,
} from '../../../main/services/untrusted';
import { watchPrototypes } from '../../../main/services/untrusted/prototypeWatch';
import { rewriteZip } from '../../fuzz/zip';
import { bundledWorkerEntry } from './bundle';

const DEMO = join(import.meta.dirname, '../../../demo-data');
const dir = mkdtempSync(join(tmpdir(), 'wb-isolated-'));

function sha(path: string): string {
  return createHash('sha256').update(readFileSync(path)).digest('hex');
}

function book(sheets: Record<string, (string | number | null)[][]>, bookType: 'xlsx' | 'ods' | 'xls' = 'xlsx'): Uint8Array {
  const wb = XLSX.utils.book_new();
  for (const [name, rows] of Object.entries(sheets)) XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet(rows), name);
  return XLSX.write(wb, { type: 'buffer', bookType }) as Uint8Array;
}

function file(name: string, bytes: Uint8Array | string): string {
  const path = join(dir, name);
  writeFileSync(path, bytes);
  return path;
}

/** Good files of every kind the service reads, and a few it refuses. */
function corpus(): string[] {
  const course = {
    Scores: [
      ['Weighbridge test course', null, null],
      ['ID', 'Name', 'Section', 'Quiz 1 (10)', 'Exam (50)'],
      ['s1', 'Ann', 'A', 8, 41.5],
      ['s2', 'Bo', 'B', 'EX', 38],
      ['s3', 'Cy', 'A', '9/10', '85%'],
    ],
  };
  const paths = ['glaciology-231.xlsx', 'glaciology-231.csv', 'glaciology-231-sections.xlsx'].map((n) => {
    const p = join(dir, n);
    copyFileSync(join(DEMO, n), p);
    return p;
  });
  paths.push(file('course.xlsx', book(course)), file('course.ods', book(course, 'ods')), file('course.xls', book(course, 'xls')));
  paths.push(file('semi.csv', 'ID;Name;Quiz (10)\ns1;Ann;7,5\ns2;Bo;EX\n'));
  paths.push(file('dup.csv', 'ID,Name,Quiz (10)\ns1,Ann,7\ns1,Bo,8\n'));
  paths.push(file('junk.xlsx', new Uint8Array([1, 2, 3, 4, 5, 0, 0, 255])));
  paths.push(file('empty.csv', ''));
  paths.push(join(dir, 'does-not-exist.xlsx'));
  return paths;
}

let files: string[] = [];
let bundled: WorkerEntry;

beforeAll(async () => {
  files = corpus();
  bundled = await bundledWorkerEntry();
});

describe.each([
  ['from source (tsx loader in the worker)', (): WorkerEntry | undefined => undefined],
  ['from the esbuild bundle', (): WorkerEntry | undefined => bundled],
] as const)('same results as the direct service, worker %s', (_label, entry) => {
  let importer: IsolatedImporter;
  beforeAll(() => {
    const e = entry();
    const made = createIsolatedImporter(e === undefined ? {} : { workerEntry: e });
    if (!made.ok) throw new Error(made.message);
    importer = made.value;
  });
  afterAll(() => importer.close());

  it('preview, import with the detected layout, and detect-and-import agree on every file; bytes unchanged', async () => {
    for (const path of files) {
      const before = statSafeSha(path);
      const direct = await previewSpreadsheet(path);
      const isolated = await importer.preview(path);
      expect(isolated, path).toEqual(direct);
      if (direct.ok) {
        expect(await importer.importLayout(path, direct.value.detected), path).toEqual(await importSpreadsheet(path, direct.value.detected));
      }
      expect(await importer.detectAndImport(path), path).toEqual(await detectAndImport(path));
      expect(statSafeSha(path), `${path} was changed`).toBe(before);
    }
  });
});

function statSafeSha(path: string): string | null {
  try {
    return sha(path);
  } catch {
    return null;
  }
}

describe('one-shot calls', () => {
  it('previewSpreadsheetIsolated / importSpreadsheetIsolated / detectAndImportIsolated / previewMergeIsolated', async () => {
    const path = join(dir, 'glaciology-231.xlsx');
    const before = sha(path);
    const p = await previewSpreadsheetIsolated(path);
    expect(p).toEqual(await previewSpreadsheet(path));
    if (!p.ok) throw new Error(p.message);
    const imported = await importSpreadsheetIsolated(path, p.value.detected);
    expect(imported).toEqual(await importSpreadsheet(path, p.value.detected));
    expect(await detectAndImportIsolated(path)).toEqual(await detectAndImport(path));
    if (!imported.ok) throw new Error(imported.message);
    // A re-import of a changed export: the same merge as the direct service (importedAt aside).
    const current = { title: 'T', gradebook: imported.value.gradebook, plan: emptyPlan(), source: null, notes: '' };
    const changed = join(dir, 'course-newer.csv');
    writeFileSync(changed, 'ID,Name,Section,Quiz 1 (10)\ns1,Ann,A,9\nnew1,Dee,C,4\n');
    const layout = await previewSpreadsheet(changed);
    if (!layout.ok) throw new Error(layout.message);
    const viaWorker = await previewMergeIsolated(current, changed, layout.value.detected);
    const direct = await previewMerge(current, changed, layout.value.detected);
    expect(stripImportedAt(viaWorker)).toEqual(stripImportedAt(direct));
    expect(sha(path)).toBe(before);
  });

  it('refuses limits that are not positive numbers', async () => {
    const r = await previewSpreadsheetIsolated(join(dir, 'course.xlsx'), { limits: { maxMillis: -1 } });
    expect(r).toMatchObject({ ok: false, code: 'bad-input' });
    expect(!r.ok && r.message).toContain('maxMillis');
  });
});

function stripImportedAt(r: Awaited<ReturnType<typeof previewMerge>>): unknown {
  if (!r.ok) return r;
  const source = r.value.merged.source;
  return { ...r.value, merged: { ...r.value.merged, source: source === null ? null : { ...source, importedAt: 'x' } } };
}

function emptyPlan() {
  return {
    categories: [],
    items: {},
    sectionWaivers: [],
    studentWaivers: [],
    markMode: 'current' as const,
    scale: { name: 'Pass/fail', cutoffs: [{ letter: 'P', minPercent: 50 }] },
    rounding: { decimals: 1 },
    adjustments: [],
  };
}

describe('size limit', () => {
  it('refuses a file above the limit from its size alone: a 64 GiB sparse file is answered at once', async () => {
    const path = join(dir, 'huge.xlsx');
    const fd = openSync(path, 'w');
    ftruncateSync(fd, 64 * 1024 ** 3); // sparse: no data blocks, so the test itself stays small
    closeSync(fd);
    // Reading 64 GiB into memory is impossible here (a Uint8Array that size cannot be allocated),
    // so a 'too-large' answer shows the file was refused before it was read.
    const r = await previewSpreadsheetIsolated(path);
    expect(r).toMatchObject({ ok: false, code: 'too-large' });
    expect(!r.ok && r.message).toBe(
      'The file "huge.xlsx" is 65536 MB, larger than the import size limit of 50 MB. A gradebook is rarely this large: check that it is the right file, or raise the size limit in the import limits and try again.',
    );
  });

  it('the limit is the user\'s to raise: one byte over is refused, at the limit is read', async () => {
    const path = join(dir, 'glaciology-231.csv');
    const size = statSync(path).size;
    const over = await previewSpreadsheetIsolated(path, { limits: { maxBytes: size - 1 }, raiseHint: 'with --max-megabytes' });
    expect(over).toMatchObject({ ok: false, code: 'too-large' });
    expect(!over.ok && over.message).toMatch(/raise the size limit with --max-megabytes\.$/);
    const at = await previewSpreadsheetIsolated(path, { limits: { maxBytes: size } });
    expect(at.ok).toBe(true);
  });

  it('refuses what is not an ordinary file (a device that never ends, a pipe, a folder)', async () => {
    const devZero = await previewSpreadsheetIsolated('/dev/zero');
    expect(devZero).toMatchObject({ ok: false, code: 'bad-input' });
    expect(!devZero.ok && devZero.message).toContain('not an ordinary file');
    const fifo = join(dir, 'pipe.csv');
    execFileSync('mkfifo', [fifo]);
    // No writer ever opens the pipe: a blocking open would wait for ever.
    const pipe = await previewSpreadsheetIsolated(fifo);
    expect(pipe).toMatchObject({ ok: false, code: 'bad-input' });
    const folder = await previewSpreadsheetIsolated(dir);
    expect(folder).toMatchObject({ ok: false, code: 'bad-input' });
    expect(!folder.ok && folder.message).toContain('is a folder');
  });
});

describe('time limit', () => {
  it('terminates a parse that does not finish in time and says which limit to raise; the next import works', async () => {
    const made = createIsolatedImporter({ limits: { maxMillis: 400 }, testOnly: { testOnlyBusyMillis: 600_000 } });
    if (!made.ok) throw new Error(made.message);
    const path = join(dir, 'course.xlsx');
    const r = await made.value.preview(path);
    expect(r).toEqual({
      ok: false,
      code: 'timeout',
      message: 'Reading "course.xlsx" took longer than 400 ms and was stopped. The file may be damaged or far larger than a gradebook; if it is the right file, raise the time limit in the import limits and try again.',
    });
    await made.value.close();
    // A fresh importer with the default limit and no busy hook reads the same file.
    const again = await previewSpreadsheetIsolated(path);
    expect(again.ok).toBe(true);
  });

  it('after a timeout the same importer starts a new worker for the next call', async () => {
    // The busy hook applies to every job of this importer, so the second call times out too —
    // but it does run (a terminated worker is replaced rather than reused).
    const made = createIsolatedImporter({ limits: { maxMillis: 300 }, testOnly: { testOnlyBusyMillis: 600_000 } });
    if (!made.ok) throw new Error(made.message);
    const path = join(dir, 'course.csv');
    writeFileSync(path, 'ID,Name\n1,a\n');
    expect(await made.value.preview(path)).toMatchObject({ code: 'timeout' });
    expect(await made.value.preview(path)).toMatchObject({ code: 'timeout' });
    await made.value.close();
  });

  it('the default is 30 s, 50 MB, 1024 MB of heap', () => {
    expect(DEFAULT_IMPORT_LIMITS).toEqual({ maxBytes: 50 * 1024 * 1024, maxMillis: 30_000, maxHeapMb: 1024 });
  });
});

describe('memory limit', () => {
  it('a decompression bomb (a 1.5 M-cell sheet deflated to a small file) exhausts the worker, not the app: too-large', async () => {
    const base = book({ S: [['ID', 'Score'], ['a', 1]] });
    const row = `<row>${'<c><v>1</v></c>'.repeat(1000)}</row>`;
    const bomb = rewriteZip(base, { 'xl/worksheets/sheet1.xml': (xml) => xml.replace(/<sheetData>.*<\/sheetData>/s, `<sheetData>${row.repeat(1500)}</sheetData>`) }, true);
    const path = file('bomb.xlsx', bomb);
    expect(bomb.length).toBeLessThan(DEFAULT_IMPORT_LIMITS.maxBytes / 10);
    const before = sha(path);
    const r = await previewSpreadsheetIsolated(path, { limits: { maxHeapMb: 48, maxMillis: 120_000 } });
    expect(r).toMatchObject({ ok: false, code: 'too-large' });
    expect(!r.ok && r.message).toBe(
      'Reading "bomb.xlsx" needed more than 48 MB of memory and was stopped. The file may be damaged or expand to far more data than its size suggests (a compressed workbook can); if it is the right file, raise the memory limit in the import limits and try again.',
    );
    expect(sha(path)).toBe(before);
    // This process is alive and its own prototypes are untouched.
    expect(Object.getOwnPropertyNames(Object.prototype)).not.toContain('polluted');
  });
});

/** A stand-in worker speaking the protocol: what a compromised parser could send back. */
function fakeWorker(reply: string): WorkerEntry {
  const code = `
    const { parentPort } = require('node:worker_threads');
    parentPort.on('message', (job) => { ${reply} });
    parentPort.postMessage({ type: 'ready' });`;
  return { kind: 'eval', code };
}

describe('what comes back from the worker is checked', () => {
  const path = () => join(dir, 'course.xlsx');

  it('a result with an extra key (here __proto__) is refused, not passed on', async () => {
    const entry = fakeWorker(`
      const value = JSON.parse('{"gradebook":{"students":[],"assessments":[],"scores":[]},"problems":[],"__proto__":{"polluted":1}}');
      parentPort.postMessage({ type: 'reply', id: job.id, outcome: 'done', result: { ok: true, value }, pollution: [] });`);
    const r = await importSpreadsheetIsolated(path(), { sheets: [], sectionFrom: 'column', tokens: { excused: [], missing: [], pending: [] } }, { workerEntry: entry });
    expect(r).toMatchObject({ ok: false, code: 'bad-input' });
    expect(!r.ok && r.message).toContain("failed Weighbridge's checks");
    expect(({} as Record<string, unknown>)['polluted']).toBeUndefined();
  });

  it('a gradebook whose grid does not match its students is refused with the place named', async () => {
    const entry = fakeWorker(`
      const value = { gradebook: { students: [{ id: 's1', name: 'A', section: '' }], assessments: [], scores: [] }, problems: [] };
      parentPort.postMessage({ type: 'reply', id: job.id, outcome: 'done', result: { ok: true, value }, pollution: [] });`);
    const r = await detectAndImportIsolated(path(), { workerEntry: entry });
    expect(r).toMatchObject({ ok: false, code: 'bad-input' });
    expect(!r.ok && r.message).toContain('result.value');
  });

  it('a worker that reports changed prototypes is discarded with its result', async () => {
    const entry = fakeWorker(`
      parentPort.postMessage({ type: 'reply', id: job.id, outcome: 'done', result: { ok: false, code: 'bad-input', message: 'x' }, pollution: ['Object.prototype.polluted (added)'] });`);
    const r = await previewSpreadsheetIsolated(path(), { workerEntry: entry });
    expect(r).toMatchObject({ ok: false, code: 'bad-input' });
    expect(!r.ok && r.message).toContain('changed built-in objects of the program (Object.prototype.polluted (added))');
  });

  it('a worker that throws or dies gives an internal failure, not an exception', async () => {
    const threw = await previewSpreadsheetIsolated(path(), {
      workerEntry: fakeWorker(`parentPort.postMessage({ type: 'reply', id: job.id, outcome: 'threw', error: 'RangeError: boom', pollution: [] });`),
    });
    expect(threw).toMatchObject({ ok: false, code: 'internal' });
    expect(!threw.ok && threw.message).toContain('RangeError: boom');
    const died = await previewSpreadsheetIsolated(path(), { workerEntry: fakeWorker('process.exit(3);') });
    expect(died).toMatchObject({ ok: false, code: 'internal' });
    expect(!died.ok && died.message).toContain('exit code 3');
    const missing = await previewSpreadsheetIsolated(path(), { workerEntry: { kind: 'file', path: join(dir, 'no-such-worker.mjs') } });
    expect(missing).toMatchObject({ ok: false, code: 'internal' });
  });
});

describe('watchPrototypes', () => {
  it('reports a key added to Object.prototype and a replaced Array.prototype method', () => {
    const watch = watchPrototypes();
    expect(watch.changes()).toEqual([]);
    const originalMap = Array.prototype.map;
    try {
      Object.defineProperty(Object.prototype, 'wbPolluted', { value: 1, configurable: true, writable: true });
      Array.prototype.map = function () {
        return [];
      };
      expect(watch.changes().sort()).toEqual(['Array.prototype.map (changed)', 'Object.prototype.wbPolluted (added)']);
    } finally {
      delete (Object.prototype as Record<string, unknown>)['wbPolluted'];
      Array.prototype.map = originalMap;
    }
    expect(watch.changes()).toEqual([]);
  });
});
