/**
 * Text-file encodings: detection from the bytes and decoding.
 *
 * Order of evidence: a byte-order mark (UTF-8 EF BB BF, UTF-16LE FF FE, UTF-16BE FE FF — Unicode
 * Standard §23.8 / RFC 3629 §6); then BOM-less UTF-16, recognised by its NUL pattern (ASCII text in
 * UTF-16LE has a zero in every odd byte, UTF-16BE in every even byte); then strict UTF-8 (a decoder
 * that refuses malformed sequences, so a Windows-1252 "é" (0xE9 alone) fails); else Windows-1252, the
 * usual encoding of CSV files saved by spreadsheet programs on Western-European Windows systems
 * (common practice, no source).
 */
import type { TextEncoding } from '../../../renderer/bridge/contract';

export const TEXT_ENCODINGS: readonly TextEncoding[] = ['utf-8', 'utf-16le', 'utf-16be', 'windows-1252'];

export function isTextEncoding(value: unknown): value is TextEncoding {
  return typeof value === 'string' && (TEXT_ENCODINGS as readonly string[]).includes(value);
}

export function detectEncoding(bytes: Uint8Array): TextEncoding {
  return detectAndDecode(bytes).encoding;
}

/**
 * `detectEncoding` and `decodeText` in one: the strict UTF-8 check already decodes the whole
 * file, and its text is the one `decodeText(bytes, 'utf-8')` gives (both drop a leading BOM).
 */
export function detectAndDecode(bytes: Uint8Array): { encoding: TextEncoding; text: string } {
  const b0 = bytes[0];
  const b1 = bytes[1];
  const b2 = bytes[2];
  const decoded = (encoding: TextEncoding): { encoding: TextEncoding; text: string } => ({ encoding, text: decodeText(bytes, encoding) });
  if (b0 === 0xef && b1 === 0xbb && b2 === 0xbf) return decoded('utf-8');
  if (b0 === 0xff && b1 === 0xfe) return decoded('utf-16le');
  if (b0 === 0xfe && b1 === 0xff) return decoded('utf-16be');
  const nul = utf16NulPattern(bytes);
  if (nul !== null) return decoded(nul);
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return decoded('windows-1252');
  }
  return { encoding: 'utf-8', text };
}

/** Decode; a leading BOM of the chosen encoding is removed (TextDecoder's default). */
export function decodeText(bytes: Uint8Array, encoding: TextEncoding): string {
  return new TextDecoder(encoding).decode(bytes);
}

/**
 * BOM-less UTF-16: in the first 4 KiB, at least 40 % of the byte pairs have a NUL on one side and
 * (almost) none on the other. Real 8-bit text has no NUL bytes at all.
 */
function utf16NulPattern(bytes: Uint8Array): 'utf-16le' | 'utf-16be' | null {
  const pairs = Math.floor(Math.min(bytes.length, 4096) / 2);
  if (pairs < 2) return null;
  let evenNul = 0;
  let oddNul = 0;
  for (let i = 0; i < pairs; i++) {
    if (bytes[2 * i] === 0) evenNul++;
    if (bytes[2 * i + 1] === 0) oddNul++;
  }
  if (oddNul >= pairs * 0.4 && evenNul <= pairs * 0.05) return 'utf-16le';
  if (evenNul >= pairs * 0.4 && oddNul <= pairs * 0.05) return 'utf-16be';
  return null;
}
