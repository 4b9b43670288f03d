/**
 * Reading and rewriting the entries of a workbook's ZIP container with SheetJS's bundled CFB
 * library (XLSX.CFB; typed `any` upstream, narrowed here to what the tests use).
 */
import { inflateRawSync } from 'node:zlib';
import * as XLSX from 'xlsx';

interface Container {
  FullPaths: string[];
  FileIndex: { name: string; content: Uint8Array; type: number }[];
}
interface ContainerLib {
  read(data: Uint8Array, opts: { type: 'buffer' }): Container;
  write(c: Container, opts: { type: 'buffer'; fileType: 'zip'; compression?: boolean }): Uint8Array;
}
const CFB = XLSX.CFB as ContainerLib;

/** Entry path (without the container's root prefix) → content, for the file entries of a zip. */
export function zipEntries(bytes: Uint8Array): Map<string, Uint8Array> {
  // Copies (a Buffer's slice is a view): nothing here may change the caller's bytes.
  const zip = CFB.read(new Uint8Array(bytes), { type: 'buffer' });
  const out = new Map<string, Uint8Array>();
  zip.FullPaths.forEach((p, i) => {
    const e = zip.FileIndex[i];
    if (e !== undefined && e.type === 2) out.set(stripRoot(p), new Uint8Array(e.content));
  });
  return out;
}

/**
 * The same zip with some entries replaced (function of the old text) and, with `compression`,
 * deflated — so a small file can expand to a large one.
 */
export function rewriteZip(
  bytes: Uint8Array,
  edits: Readonly<Record<string, (xml: string) => string>>,
  compression = false,
): Uint8Array {
  const zip = CFB.read(new Uint8Array(bytes), { type: 'buffer' });
  for (const [path, edit] of Object.entries(edits)) {
    const i = zip.FullPaths.findIndex((p) => stripRoot(p) === path);
    const entry = zip.FileIndex[i];
    if (entry === undefined) throw new Error(`no entry ${path} in the zip`);
    entry.content = new TextEncoder().encode(edit(new TextDecoder().decode(entry.content)));
  }
  const out: unknown = CFB.write(zip, { type: 'buffer', fileType: 'zip', compression });
  if (!(out instanceof Uint8Array)) throw new Error('CFB.write did not return bytes');
  return out;
}

function stripRoot(p: string): string {
  const slash = p.indexOf('/');
  return slash >= 0 ? p.slice(slash + 1) : p;
}

export interface RawEntry {
  readonly name: string;
  /** 0 = stored, 8 = deflate (APPNOTE.TXT §4.4.5). */
  readonly method: 0 | 8;
  /** The bytes as they appear in the archive (already compressed for method 8). */
  readonly data: Uint8Array;
  /** Declared uncompressed size; defaults to the data's length. */
  readonly declaredSize?: number;
  /**
   * CRC-32 to record; defaults to the CRC of the unpacked bytes (for method 8, of what the data
   * inflates to — 0 when it does not inflate), as a well-behaved writer records it.
   */
  readonly crc?: number;
}

function unpackedCrc(e: RawEntry): number {
  if (e.method === 0) return crc32(e.data);
  try {
    return crc32(inflateRawSync(e.data));
  } catch {
    return 0;
  }
}

/**
 * A ZIP archive written byte by byte (APPNOTE.TXT §4.3: local headers, central directory, end
 * record), so a test can declare sizes and compressed data no well-behaved writer would.
 */
export function rawZip(entries: readonly RawEntry[]): Uint8Array {
  const chunks: Uint8Array[] = [];
  const central: Uint8Array[] = [];
  let offset = 0;
  for (const e of entries) {
    const name = new TextEncoder().encode(e.name);
    const crc = e.crc ?? unpackedCrc(e);
    const usize = e.declaredSize ?? e.data.length;
    const local = new DataView(new ArrayBuffer(30));
    local.setUint32(0, 0x04034b50, true);
    local.setUint16(4, 20, true);
    local.setUint16(8, e.method, true);
    local.setUint32(14, crc, true);
    local.setUint32(18, e.data.length, true);
    local.setUint32(22, usize >>> 0, true);
    local.setUint16(26, name.length, true);
    chunks.push(new Uint8Array(local.buffer), name, e.data);
    const cd = new DataView(new ArrayBuffer(46));
    cd.setUint32(0, 0x02014b50, true);
    cd.setUint16(4, 20, true);
    cd.setUint16(6, 20, true);
    cd.setUint16(10, e.method, true);
    cd.setUint32(16, crc, true);
    cd.setUint32(20, e.data.length, true);
    cd.setUint32(24, usize >>> 0, true);
    cd.setUint16(28, name.length, true);
    cd.setUint32(42, offset, true);
    central.push(new Uint8Array(cd.buffer), name);
    offset += 30 + name.length + e.data.length;
  }
  const cdSize = central.reduce((n, c) => n + c.length, 0);
  const end = new DataView(new ArrayBuffer(22));
  end.setUint32(0, 0x06054b50, true);
  end.setUint16(8, entries.length, true);
  end.setUint16(10, entries.length, true);
  end.setUint32(12, cdSize, true);
  end.setUint32(16, offset, true);
  const parts = [...chunks, ...central, new Uint8Array(end.buffer)];
  const out = new Uint8Array(parts.reduce((n, c) => n + c.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

/** CRC-32 (ISO 3309 / ITU-T V.42 polynomial 0xEDB88320, as APPNOTE.TXT §4.4.7 requires). */
function crc32(bytes: Uint8Array): number {
  let crc = 0xffffffff;
  for (const b of bytes) {
    crc ^= b;
    for (let k = 0; k < 8; k++) crc = crc & 1 ? (crc >>> 1) ^ 0xedb88320 : crc >>> 1;
  }
  return (crc ^ 0xffffffff) >>> 0;
}
