/** Test fixtures made with the xlsx library itself, and temp files for the path-taking API. */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { afterAll } from 'vitest';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import * as XLSX from 'xlsx';

export type FixtureCell = string | number | null;
export interface FixtureSheet {
  readonly name: string;
  readonly rows: readonly (readonly FixtureCell[])[];
}

/** A workbook of the given sheets, written by SheetJS in the given format. */
export function workbookBytes(sheets: readonly FixtureSheet[], bookType: 'xlsx' | 'xls' | 'ods' = 'xlsx'): Uint8Array {
  const wb = XLSX.utils.book_new();
  for (const s of sheets) {
    XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet(s.rows.map((r) => [...r])), s.name);
  }
  const out: unknown = XLSX.write(wb, { type: 'buffer', bookType });
  if (!(out instanceof Uint8Array)) throw new Error('xlsx did not return bytes');
  return out;
}

const made: string[] = [];
// Fixture folders are removed after each test file that made them (this module is imported while
// the file is collected, so the hook belongs to that file).
afterAll(() => {
  for (const dir of made.splice(0)) rmSync(dir, { recursive: true, force: true });
});

export function tempDir(): string {
  const dir = mkdtempSync(join(tmpdir(), 'wb-import-'));
  made.push(dir);
  return dir;
}

export function writeTemp(dir: string, name: string, bytes: Uint8Array | string): string {
  const path = join(dir, name);
  writeFileSync(path, bytes);
  return path;
}

export function utf8(text: string): Uint8Array {
  return new TextEncoder().encode(text);
}

/** UTF-16LE bytes, optionally with the FF FE byte-order mark. */
export function utf16le(text: string, bom: boolean): Uint8Array {
  const out = new Uint8Array((bom ? 2 : 0) + text.length * 2);
  let o = 0;
  if (bom) {
    out[o++] = 0xff;
    out[o++] = 0xfe;
  }
  for (let i = 0; i < text.length; i++) {
    const code = text.charCodeAt(i);
    out[o++] = code & 0xff;
    out[o++] = code >> 8;
  }
  return out;
}

/**
 * Windows-1252 bytes for text whose characters are all in Latin-1's printable range (0xA0–0xFF
 * map to the same byte in Windows-1252 — WHATWG Encoding Standard, index-windows-1252) or ASCII.
 */
export function cp1252(text: string): Uint8Array {
  const out = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) {
    const code = text.charCodeAt(i);
    if (code > 0xff || (code >= 0x80 && code < 0xa0)) throw new Error(`not encodable here: ${text[i]}`);
    out[i] = code;
  }
  return out;
}
