/**
 * What a ZIP archive says its entries will expand to, read from its central directory
 * (APPNOTE.TXT §4.3.12 central file header, §4.3.16 end of central directory, §4.5.3 Zip64
 * extra field). SheetJS allocates each entry's declared uncompressed size up front, outside the
 * V8 heap (a Buffer), so a small file declaring 4 GiB would get 4 GiB however tight the heap
 * limit: readBook refuses such a file before parsing it, and so does the isolated worker against
 * its own memory limit (main/services/untrusted imports this module).
 *
 * A directory it cannot read returns null and the parser decides (it reports a damaged file in
 * the user's words).
 */
import { crc32, inflateRawSync } from 'node:zlib';

const EOCD = 0x06054b50;
const CENTRAL = 0x02014b50;

/**
 * The archive's central directory: where it starts and how many entries it lists, from the end
 * record (which is within the last 65 557 bytes: 22 + a comment of at most 65 535); null when
 * the bytes are not a ZIP or have no end record.
 */
function centralDirectory(bytes: Uint8Array): { view: DataView; start: number; count: number } | null {
  if (bytes.length < 22 || bytes[0] !== 0x50 || bytes[1] !== 0x4b) return null;
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  for (let i = bytes.length - 22; i >= Math.max(0, bytes.length - 65_557); i--) {
    if (view.getUint32(i, true) === EOCD) return { view, start: view.getUint32(i + 16, true), count: view.getUint16(i + 10, true) };
  }
  return null;
}

export function declaredUnzippedBytes(bytes: Uint8Array): number | null {
  const dir = centralDirectory(bytes);
  if (dir === null) return null;
  const { view, count } = dir;
  let at = dir.start;
  let total = 0;
  for (let n = 0; n < count; n++) {
    if (at + 46 > bytes.length || view.getUint32(at, true) !== CENTRAL) return total > 0 ? total : null;
    let size = view.getUint32(at + 24, true);
    const nameLen = view.getUint16(at + 28, true);
    const extraLen = view.getUint16(at + 30, true);
    const commentLen = view.getUint16(at + 32, true);
    // 0xFFFFFFFF defers to a Zip64 field when there is one; otherwise it is the size itself.
    if (size === 0xffffffff) size = zip64Size(view, at + 46 + nameLen, extraLen) ?? size;
    total += size;
    at += 46 + nameLen + extraLen + commentLen;
  }
  return total;
}

/** The uncompressed size from a Zip64 extended-information extra field (header id 0x0001). */
function zip64Size(view: DataView, start: number, length: number): number | null {
  let p = start;
  while (p + 4 <= start + length && p + 4 <= view.byteLength) {
    const id = view.getUint16(p, true);
    const len = view.getUint16(p + 2, true);
    if (id === 0x0001 && len >= 8 && p + 12 <= view.byteLength) return Number(view.getBigUint64(p + 4, true));
    p += 4 + len;
  }
  return null;
}

const LOCAL = 0x04034b50;

/**
 * The first entry whose unpacked bytes do not match the CRC-32 its central directory records
 * (APPNOTE.TXT §4.4.7), or that cannot be unpacked at all; null when every stored or deflated
 * entry checks out, or when the directory cannot be read (the parser then decides). SheetJS does
 * not check the CRCs, and a damaged deflate stream can inflate to XML of any shape — references to
 * millions of rows among it — which it then builds a sheet from; a failed checksum names the
 * damage before that. Entries are unpacked with native inflate, each bounded by `maxBytes`.
 *
 * Cost: one more inflate of every entry (native, a few ms per MB of sheet XML).
 */
export function damagedZipEntry(bytes: Uint8Array, maxBytes: number): string | null {
  const dir = centralDirectory(bytes);
  if (dir === null) return null;
  const { view, count } = dir;
  let at = dir.start;
  for (let n = 0; n < count; n++) {
    if (at + 46 > bytes.length || view.getUint32(at, true) !== CENTRAL) return null;
    const method = view.getUint16(at + 10, true);
    const crc = view.getUint32(at + 16, true);
    const compressed = view.getUint32(at + 20, true);
    const nameLen = view.getUint16(at + 28, true);
    const extraLen = view.getUint16(at + 30, true);
    const commentLen = view.getUint16(at + 32, true);
    const local = view.getUint32(at + 42, true);
    const name = new TextDecoder('utf-8', { fatal: false }).decode(bytes.subarray(at + 46, at + 46 + nameLen));
    at += 46 + nameLen + extraLen + commentLen;
    // Zip64 sizes or offsets, and methods other than stored and deflated, are left to the parser.
    if (compressed === 0xffffffff || local === 0xffffffff || (method !== 0 && method !== 8)) continue;
    if (local + 30 > bytes.length || view.getUint32(local, true) !== LOCAL) return name;
    const start = local + 30 + view.getUint16(local + 26, true) + view.getUint16(local + 28, true);
    if (start + compressed > bytes.length) return name;
    const data = bytes.subarray(start, start + compressed);
    let unpacked: Uint8Array;
    try {
      unpacked = method === 0 ? data : inflateRawSync(data, { maxOutputLength: maxBytes });
    } catch {
      return name;
    }
    if (crc32(unpacked) !== crc) return name;
  }
  return null;
}
