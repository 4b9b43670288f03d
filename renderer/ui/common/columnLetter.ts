/** Spreadsheet column letters for a 0-based index: 0 → "A", 25 → "Z", 26 → "AA" (bijective base 26). */
export function columnLetter(index: number): string {
  if (!Number.isInteger(index) || index < 0) throw new RangeError(`columnLetter: ${index} is not a column index`);
  let n = index + 1;
  let out = '';
  while (n > 0) {
    const r = (n - 1) % 26;
    out = String.fromCharCode(65 + r) + out;
    n = Math.floor((n - 1) / 26);
  }
  return out;
}
