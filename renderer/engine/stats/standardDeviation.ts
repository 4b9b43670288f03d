import { defined, type Defined } from '../defined';
import { populationVariance, sampleVariance } from './variance';

/**
 * Sample standard deviation, s = √( Σ (xᵢ − x̄)² / (n − 1) ).
 *
 * Source: NIST/SEMATECH e-Handbook §1.3.5.6; certified against NIST StRD univariate sets.
 * Cost O(n). Not defined for n < 2.
 * @throws {Error} if a value is NaN or infinite
 * @example
 * sampleSd([10000001, 10000003, 10000002]); // => { defined: true, value: 1 } (NIST NumAcc1)
 */
export function sampleSd(values: readonly number[]): Defined<number> {
  const v = sampleVariance(values);
  return v.defined ? defined(Math.sqrt(v.value)) : v;
}

/**
 * Population standard deviation, σ = √( Σ (xᵢ − x̄)² / n ).
 *
 * Source: NIST/SEMATECH e-Handbook §1.3.5.6. Cost O(n). Not defined for n = 0.
 * @throws {Error} if a value is NaN or infinite
 * @example
 * populationSd([2, 4, 4, 4, 5, 5, 7, 9]); // => { defined: true, value: 2 }
 */
export function populationSd(values: readonly number[]): Defined<number> {
  const v = populationVariance(values);
  return v.defined ? defined(Math.sqrt(v.value)) : v;
}
