import { assertFiniteNumber, assertFiniteValues, sortedCopy } from './validate';

/**
 * Empirical cumulative distribution function, F(t) = #{xᵢ ≤ t} / n — a right-continuous step
 * function that jumps by (multiplicity)/n at each distinct value (standard definition, e.g.
 * van der Vaart 1998, Asymptotic Statistics §19.1; matches jstat `percentileOfScore(arr, t,
 * 'weak')`). Note: simple-statistics `quantileRank` uses mid-ranks for ties and is not the ECDF.
 */

export interface EcdfStep {
  /** A distinct data value. */
  x: number;
  /** F(x): the fraction of values ≤ x (the height just after the jump at x). */
  p: number;
}

export interface Ecdf {
  /** One step per distinct value, ascending; plain data for charts and export. */
  steps: readonly EcdfStep[];
  /** F(t). */
  at(t: number): number;
}

/**
 * F(t) from ascending `sorted` data by binary search. Cost O(log n).
 * @throws {Error} if sorted is empty or t is not finite
 * @example
 * ecdfAt([1, 2, 2, 3], 2); // => 0.75
 */
export function ecdfAt(sorted: readonly number[], t: number): number {
  if (sorted.length === 0) throw new Error('ecdfAt requires at least one data point');
  assertFiniteNumber('ecdfAt', t, 't');
  let lo = 0;
  let hi = sorted.length; // first index with sorted[i] > t
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((sorted[mid] as number) <= t) lo = mid + 1;
    else hi = mid;
  }
  return lo / sorted.length;
}

/**
 * The distinct-value steps of the ECDF. Cost O(n log n).
 * @example
 * ecdfSteps([2, 1, 2]); // => [{ x: 1, p: 1/3 }, { x: 2, p: 1 }]
 */
export function ecdfSteps(values: readonly number[]): EcdfStep[] {
  assertFiniteValues('ecdf', values);
  const sorted = sortedCopy(values);
  const n = sorted.length;
  const steps: EcdfStep[] = [];
  sorted.forEach((x, i) => {
    if (i + 1 === n || (sorted[i + 1] as number) !== x) steps.push({ x, p: (i + 1) / n });
  });
  return steps;
}

/**
 * ECDF of the values: its steps and F(t).
 * @throws {Error} if values is empty (F is not defined for n = 0) or holds NaN/infinite values
 * @example
 * ecdf([70, 80, 80, 90]).at(80); // => 0.75
 */
export function ecdf(values: readonly number[]): Ecdf {
  assertFiniteValues('ecdf', values);
  if (values.length === 0) throw new Error('ecdf requires at least one data point');
  const sorted = sortedCopy(values);
  return { steps: ecdfSteps(sorted), at: (t: number) => ecdfAt(sorted, t) };
}
