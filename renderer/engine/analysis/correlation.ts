/**
 * Pearson's product-moment correlation, r = Σ(xᵢ − x̄)(yᵢ − ȳ) / ((n − 1)·s_x·s_y)
 * (Pearson 1896; any statistics handbook, e.g. NIST/SEMATECH e-Handbook §1.3.5.x — from memory),
 * computed by simple-statistics `sampleCorrelation` (two-pass: sample covariance over the product
 * of sample SDs).
 *
 * Not defined — rather than NaN — for fewer than MIN_PAIRS pairs or when either variable has no
 * spread (every value equal), since r is then 0/0. Cost O(n).
 */
import { sampleCorrelation, sampleStandardDeviation } from 'simple-statistics';
import { defined, notDefined, type Defined } from '../defined';

/** Fewer pairs than this give no correlation worth showing (with 2 pairs r is always ±1). */
export const MIN_PAIRS = 3;

/**
 * @throws {Error} when x and y differ in length
 * @example
 * pearson([1, 2, 3, 4], [2, 4, 5, 9]); // => defined ≈ 0.9594
 */
export function pearson(x: readonly number[], y: readonly number[]): Defined<number> {
  if (x.length !== y.length) throw new Error(`pearson: ${x.length} x values but ${y.length} y values; give one pair per student`);
  if (x.length < MIN_PAIRS) return notDefined(`only ${x.length} pair${x.length === 1 ? '' : 's'} (at least ${MIN_PAIRS} needed)`);
  if (sampleStandardDeviation([...x]) === 0) return notDefined('the item has no spread (every score equal)');
  if (sampleStandardDeviation([...y]) === 0) return notDefined('the rest of the mark has no spread (every value equal)');
  const r = sampleCorrelation([...x], [...y]);
  // Rounding can push |r| a hair past 1 for perfectly collinear data.
  return defined(Math.max(-1, Math.min(1, r)));
}
