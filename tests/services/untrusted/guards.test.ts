/**
 * The worker's own guards: the ZIP declared-size check (APPNOTE.TXT §4.3.12/§4.3.16) and the
 * reply-size estimate, and their effect through the importer.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { previewSpreadsheetIsolated } from '../../../main/services/untrusted';
import { estimateReplyBytes } from '../../../main/services/untrusted/replySize';
import { declaredUnzippedBytes } from '../../../main/services/spreadsheet/zipCheck';
import { rawZip, zipEntries } from '../../fuzz/zip';

function course(): Uint8Array {
  const wb = XLSX.utils.book_new();
  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet([['ID', 'Name', 'Quiz (10)'], ['s1', 'Ann', 7]]), 'Scores');
  return XLSX.write(wb, { type: 'buffer', bookType: 'xlsx' }) as Uint8Array;
}

describe('declaredUnzippedBytes', () => {
  it('sums the uncompressed sizes the central directory declares', () => {
    const entries = [...zipEntries(course())];
    const zip = rawZip(entries.map(([name, data]) => ({ name, method: 0, data })));
    expect(declaredUnzippedBytes(zip)).toBe(entries.reduce((n, [, d]) => n + d.length, 0));
    const lying = rawZip(entries.map(([name, data]) => ({ name, method: 0, data, declaredSize: name.endsWith('sheet1.xml') ? 0xfffffffe : data.length })));
    expect(declaredUnzippedBytes(lying)).toBeGreaterThan(0xfffffffe);
  });

  it('answers null for what is not a readable zip (the parser then reports it)', () => {
    expect(declaredUnzippedBytes(new TextEncoder().encode('ID,Name\n1,a\n'))).toBeNull();
    expect(declaredUnzippedBytes(Uint8Array.from([0x50, 0x4b, 0x03, 0x04, 1, 2, 3]))).toBeNull();
    const truncated = course().slice(0, 200);
    expect(declaredUnzippedBytes(truncated)).toBeNull();
  });

  it('through the importer: a 4 GiB declaration is refused as too large, before any parse', async () => {
    const entries = [...zipEntries(course())];
    const zip = rawZip(entries.map(([name, data]) => ({ name, method: 0, data, declaredSize: name.endsWith('sheet1.xml') ? 0xffffffff : data.length })));
    const path = join(mkdtempSync(join(tmpdir(), 'wb-guards-')), 'declared.xlsx');
    writeFileSync(path, zip);
    const r = await previewSpreadsheetIsolated(path);
    expect(r).toMatchObject({ ok: false, code: 'too-large' });
    expect(!r.ok && r.message).toBe(
      'The file "declared.xlsx" says it expands to 4096 MB when unpacked, more than the memory limit of 1024 MB, so it was not opened. It may be damaged; if it is the right file, raise the memory limit in the import limits and try again.',
    );
  });
});

describe('estimateReplyBytes', () => {
  it('counts two bytes a character, also for text repeated by reference', () => {
    const header = 'Q'.repeat(1000);
    const problems = Array.from({ length: 100 }, () => ({ message: header }));
    // 100 × 1000 characters × 2 bytes, plus keys and per-value overhead.
    const n = estimateReplyBytes({ problems }, Number.MAX_SAFE_INTEGER);
    expect(n).toBeGreaterThanOrEqual(200_000);
    expect(n).toBeLessThan(210_000);
  });

  it('stops counting once over the budget', () => {
    const big = Array.from({ length: 100_000 }, () => 'x'.repeat(100));
    expect(estimateReplyBytes(big, 1000)).toBeLessThan(2000);
  });
});
