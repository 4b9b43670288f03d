import { defined, notDefined, type Defined } from '../defined';
import { mean } from './mean';
import { sampleSd } from './standardDeviation';

/**
 * Coefficient of variation, CV = s / x̄ — the sample standard deviation as a fraction of the mean
 * (0.25 means "the typical spread is a quarter of the mean"). Returned as a fraction, not a percent.
 *
 * Meaningful only on a ratio scale with a true zero (points, percent of possible marks): the
 * same temperatures give CV 79.06 % in °C and 41.85 % in °F. Source: Everitt & Skrondal,
 * Cambridge Dictionary of Statistics (CV); sample SD as in simple-statistics
 * `coefficientOfVariation` (jstat `coeffvar` uses the population SD instead).
 *
 * Not defined when n < 2 (no sample SD), when the mean is 0 or negative, or when the mean is
 * indistinguishable from 0: |x̄| ≤ n·ε·max|xᵢ| (ε = 2⁻⁵²), the rounding noise of the sum, where
 * s/x̄ would be noise blown up. When every value is equal and non-zero, CV = 0 (defined).
 *
 * Cost O(n).
 * @throws {Error} if a value is NaN or infinite
 * @example
 * coefficientOfVariation([0, 10, 20, 30, 40]); // => { defined: true, value: 0.7905694150420948 } (79.06 %)
 */
export function coefficientOfVariation(values: readonly number[]): Defined<number> {
  const m = mean(values);
  if (!m.defined) return m;
  const s = sampleSd(values);
  if (!s.defined) return notDefined(`CV needs the sample SD: ${s.reason}`);
  let maxAbs = 0;
  for (const v of values) maxAbs = Math.max(maxAbs, Math.abs(v));
  return cvOf(m.value, s.value, values.length, maxAbs);
}

/**
 * The CV rule once the mean and sample SD are known (n ≥ 2): s / mean, not defined when the mean
 * is 0 or within n·ε·max|x| of it (rounding noise), or negative. `maxAbs` is max |xᵢ|. Shared with
 * the fast statistics (fast/sectionFinalStatistics.ts), which compute mean and SD in one pass.
 */
export function cvOf(meanValue: number, sd: number, n: number, maxAbs: number): Defined<number> {
  const noise = n * Number.EPSILON * maxAbs;
  if (meanValue === 0 || Math.abs(meanValue) <= noise) {
    return notDefined('CV is not defined: the mean is 0 (or indistinguishable from 0)');
  }
  if (meanValue < 0) {
    return notDefined('CV is not defined: the mean is negative; CV needs ratio-scale data with a positive mean');
  }
  return defined(sd / meanValue);
}
