/**
 * CSV/formula injection defence, after OWASP "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection):
 * a cell whose text begins with `=`, `+`, `-`, `@`, tab (0x09), carriage return (0x0D) or line feed
 * (0x0A) may be evaluated as a formula by a spreadsheet program, so such text is prefixed with a
 * single quote `'` (and the CSV writer quotes the field, doubling embedded quotes). Spreadsheet
 * programs also skip leading spaces and quote characters before deciding that a cell is a formula,
 * so text is checked after those too (" =1", "\"=1").
 *
 * Only text is neutralised: real numbers are written as numbers, so a negative mark stays numeric.
 */

/** Leading spaces/quotes, then a character that can start a formula. */
const DANGEROUS = /^[ "']*[=+\-@\t\r\n]/;

/** True when `text` could be read as a formula by a spreadsheet program. */
export function needsNeutralising(text: string): boolean {
  return DANGEROUS.test(text);
}

/** `'` + text when the text could start a formula; the text unchanged otherwise. */
export function neutraliseCell(text: string): string {
  return needsNeutralising(text) ? `'${text}` : text;
}

/**
 * The inverse, for re-importing an export: removes the `'` that `neutraliseCell` added, and only
 * that — a leading quote on text that would not have needed one is the user's and is kept.
 */
export function stripNeutraliser(text: string): string {
  return text.startsWith("'") && needsNeutralising(text.slice(1)) ? text.slice(1) : text;
}
