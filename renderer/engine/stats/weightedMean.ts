import { sum } from 'simple-statistics';
import { defined, notDefined, type Defined } from '../defined';
import { assertFiniteValues } from './validate';

/**
 * Weighted arithmetic mean, x̄_w = Σ wᵢ·xᵢ / Σ wᵢ.
 *
 * Weights need not sum to 1: [0.5, 0.3, 0.2] and [50, 30, 20] give the same mean. Both sums are
 * compensated (Kahan–Babuška, simple-statistics `sum`). Source: NIST/SEMATECH e-Handbook
 * §1.3.5.1 (weighted mean); standard definition.
 *
 * Cost O(n). Not defined for n = 0 or when every weight is 0.
 * @throws {Error} if lengths differ, or a value/weight is NaN, infinite, or a weight is negative
 * @example
 * weightedMean([80, 90, 70], [0.5, 0.3, 0.2]); // => { defined: true, value: 81 }
 */
export function weightedMean(values: readonly number[], weights: readonly number[]): Defined<number> {
  assertFiniteValues('weightedMean', values);
  assertFiniteValues('weightedMean', weights, 'weight');
  if (weights.length !== values.length) {
    throw new Error(`weightedMean: ${values.length} values but ${weights.length} weights; give one weight per value`);
  }
  weights.forEach((w, i) => {
    if (w < 0) throw new Error(`weightedMean: weight at index ${i} is ${w}; weights must be ≥ 0`);
  });
  if (values.length === 0) return notDefined('no values (n = 0)');
  const totalWeight = sum(weights as number[]);
  if (totalWeight === 0) return notDefined('every weight is 0');
  const weighted = sum(values.map((x, i) => x * (weights[i] as number)));
  return defined(weighted / totalWeight);
}
