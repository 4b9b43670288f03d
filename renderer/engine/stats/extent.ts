import { defined, notDefined, type Defined } from '../defined';
import { assertFiniteValues } from './validate';

/**
 * Minimum, maximum and range (max − min) of the values.
 *
 * Standard definitions (NIST/SEMATECH e-Handbook §1.3.5.6 for the range). Cost O(n), one pass.
 * Not defined for n = 0.
 * @throws {Error} if a value is NaN or infinite
 * @example
 * extent([47, 80, 62]); // => { defined: true, value: { min: 47, max: 80, range: 33 } }
 */
export function extent(values: readonly number[]): Defined<{ min: number; max: number; range: number }> {
  assertFiniteValues('extent', values);
  if (values.length === 0) return notDefined('no values (n = 0)');
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return defined({ min: lo, max: hi, range: hi - lo });
}
