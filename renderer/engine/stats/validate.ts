/**
 * Shared input checks for the statistics modules (private to `stats/`).
 *
 * Callers pass typed numbers only: the score parser has already decided what is missing, excused
 * or pending. A NaN or an infinity reaching a statistic is therefore a programming error, and we
 * fail loudly, in one stable format that names the function — never a silent NaN result.
 */

/** Throws unless every entry is a finite number. Cost O(n). */
export function assertFiniteValues(fn: string, values: readonly number[], what = 'value'): void {
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      throw new Error(`${fn}: ${what} at index ${i} is ${String(v)}; only finite numbers are accepted`);
    }
  }
}

/** Throws unless `x` is a finite number. */
export function assertFiniteNumber(fn: string, x: number, what: string): void {
  if (typeof x !== 'number' || !Number.isFinite(x)) {
    throw new Error(`${fn}: ${what} is ${String(x)}; a finite number is required`);
  }
}

/** A sorted copy (ascending); the input is never mutated. Cost O(n log n). */
export function sortedCopy(values: readonly number[]): number[] {
  return [...values].sort((a, b) => a - b);
}
