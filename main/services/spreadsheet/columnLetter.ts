/**
 * Spreadsheet column letters, bijective base 26: 0 → "A", 25 → "Z", 26 → "AA", 701 → "ZZ",
 * 702 → "AAA" (the naming every spreadsheet program shows; common practice, no source).
 */
export function columnLetter(index: number): string {
  if (!Number.isInteger(index) || index < 0) return '?';
  let n = index + 1;
  let out = '';
  while (n > 0) {
    const rem = (n - 1) % 26;
    out = String.fromCharCode(65 + rem) + out;
    n = Math.floor((n - 1) / 26);
  }
  return out;
}
