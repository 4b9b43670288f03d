import { mean as ssMean } from 'simple-statistics';
import { defined, notDefined, type Defined } from '../defined';
import { assertFiniteValues } from './validate';

/**
 * Arithmetic mean, x̄ = (Σ xᵢ) / n.
 *
 * The sum is compensated (Kahan–Babuška, via simple-statistics 7.12.1 `mean`), so the mean of the
 * NIST StRD NumAcc sets is exact to the last bit binary64 allows (NIST StRD, "Univariate Summary
 * Statistics"; Klein 2006, "A generalized Kahan–Babuška-summation-algorithm").
 *
 * Cost O(n). Not defined for n = 0.
 * @throws {Error} if a value is NaN or infinite
 * @example
 * mean([80, 90, 70]); // => { defined: true, value: 80 }
 */
export function mean(values: readonly number[]): Defined<number> {
  assertFiniteValues('mean', values);
  if (values.length === 0) return notDefined('no values (n = 0)');
  return defined(ssMean(values as number[]));
}
