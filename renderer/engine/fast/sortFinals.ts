/**
 * Ascending sort of final marks, which are rounded to a known number of decimals and so sit on a
 * grid of step 10^−d with few distinct values: a counting sort on the grid index
 * k = round(v·10^d), O(n + range) instead of O(n log n), with the native numeric sort as the
 * answer whenever the grid does not fit.
 *
 * Why the result is exactly the native sort's: v ↦ round(v·10^d) is non-decreasing (a product by a
 * positive constant and Math.round both are, in floating point too), so a smaller index always
 * holds smaller values and the buckets come out in order. Values that share a bucket but differ
 * (possible only off the grid) are caught by the final check that the output is ascending, and then
 * the native sort decides. An ascending permutation of the values is unique, so the two agree.
 * Property-tested against Float64Array.prototype.sort (tests/engine/fast/sortFinals.test.ts).
 *
 * Falls back to the native sort for fewer than 64 values, for a grid range over 4·n + 1024, for
 * non-finite values and for more than 15 decimals.
 */
const POW10 = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];
const SMALL = 64;

/** A new array: the values ascending. `values` is not changed. */
export function sortFinals(values: Float64Array, decimals: number): Float64Array {
  const n = values.length;
  const scale = POW10[decimals];
  if (n < SMALL || scale === undefined) return values.slice().sort();
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < n; i++) {
    const k = Math.round(values[i]! * scale);
    if (k < lo) lo = k;
    if (k > hi) hi = k;
  }
  // NaN or ±∞ leave lo/hi non-finite; a wide grid would cost more than the sort.
  if (!(hi - lo <= 4 * n + 1024)) return values.slice().sort();
  const counts = new Int32Array(hi - lo + 2);
  for (let i = 0; i < n; i++) counts[Math.round(values[i]! * scale) - lo + 1]!++;
  for (let b = 1; b < counts.length; b++) counts[b] = counts[b]! + counts[b - 1]!;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[counts[Math.round(values[i]! * scale) - lo]!++] = values[i]!;
  for (let i = 1; i < n; i++) if (!(out[i - 1]! <= out[i]!)) return values.slice().sort();
  return out;
}
