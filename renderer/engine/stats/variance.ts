import { sampleVariance as ssSampleVariance, variance as ssVariance } from 'simple-statistics';
import { defined, notDefined, type Defined } from '../defined';
import { assertFiniteValues } from './validate';

/*
 * Two-pass variance: first the compensated mean x̄, then Σ (xᵢ − x̄)² (simple-statistics 7.12.1
 * `sumNthPowerDeviations`). The textbook one-pass Σx² − n·x̄² cancels catastrophically on the
 * NIST StRD NumAcc3/NumAcc4 sets; the two-pass form reaches the binary64 limit there (tests:
 * tests/engine/stats/nist-strd.test.ts). The second pass sums non-negative terms, so plain
 * summation loses at most ~n·ε relatively — far below the input's own representation error.
 */

/**
 * Sample variance (Bessel-corrected), s² = Σ (xᵢ − x̄)² / (n − 1).
 *
 * Source: NIST/SEMATECH e-Handbook of Statistical Methods §1.3.5.6; two-pass algorithm as in
 * Chan, Golub & LeVeque (1983) "Algorithms for computing the sample variance", Am. Stat. 37(3).
 * Cost O(n). Not defined for n < 2.
 * @throws {Error} if a value is NaN or infinite
 * @example
 * sampleVariance([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]); // => { defined: true, value: 9.1666… (55/6) }
 */
export function sampleVariance(values: readonly number[]): Defined<number> {
  assertFiniteValues('sampleVariance', values);
  if (values.length === 0) return notDefined('no values (n = 0)');
  if (values.length === 1) return notDefined('sample variance needs at least 2 values (n = 1)');
  return defined(ssSampleVariance(values as number[]));
}

/**
 * Population variance, σ² = Σ (xᵢ − x̄)² / n — the values are treated as the whole population
 * (e.g. every student of a section), not a sample of a larger one.
 *
 * Source: NIST/SEMATECH e-Handbook §1.3.5.6. Cost O(n). Not defined for n = 0 (0 for n = 1).
 * @throws {Error} if a value is NaN or infinite
 * @example
 * populationVariance([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]); // => { defined: true, value: 8.25 }
 */
export function populationVariance(values: readonly number[]): Defined<number> {
  assertFiniteValues('populationVariance', values);
  if (values.length === 0) return notDefined('no values (n = 0)');
  return defined(ssVariance(values as number[]));
}
