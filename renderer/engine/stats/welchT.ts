import jStat from 'jstat';
import { defined, notDefined, type Defined } from '../defined';
import { mean } from './mean';
import { assertFiniteValues } from './validate';
import { sampleVariance } from './variance';

/**
 * Welch's unequal-variances t test (two-sided), comparing the means of two independent groups.
 *
 *   t = (x̄₁ − x̄₂) / √(s₁²/n₁ + s₂²/n₂)
 *   df = (s₁²/n₁ + s₂²/n₂)² / ( (s₁²/n₁)²/(n₁ − 1) + (s₂²/n₂)²/(n₂ − 1) )   (Welch–Satterthwaite)
 *   p = 2·P(T_df ≤ −|t|)  (jstat `studentt.cdf`; the lower tail avoids 1 − cdf cancellation)
 *
 * Sources: Welch (1947) Biometrika 34:28–35; Satterthwaite (1946) Biometrics Bulletin 2:110–114
 * (page numbers from memory); matches R `t.test(x, y)` and @stdlib `stats/ttest2`.
 * Not defined when a group has fewer than 2 values or both groups have zero variance.
 * Cost O(n₁ + n₂).
 * @throws {Error} on NaN/infinite values
 * @example
 * welchT([0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0], [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4]);
 * // => { t: −1.8608, df: 17.776, p: 0.07939, meanDifference: −1.58 }  (R's sleep data)
 */
export function welchT(
  a: readonly number[],
  b: readonly number[],
): Defined<{ t: number; df: number; p: number; meanDifference: number }> {
  assertFiniteValues('welchT', a);
  assertFiniteValues('welchT', b);
  const ma = mean(a);
  const mb = mean(b);
  const va = sampleVariance(a);
  const vb = sampleVariance(b);
  if (!ma.defined || !va.defined) return notDefined(`first group: Welch's t needs at least 2 values (n = ${a.length})`);
  if (!mb.defined || !vb.defined) return notDefined(`second group: Welch's t needs at least 2 values (n = ${b.length})`);
  const ea = va.value / a.length;
  const eb = vb.value / b.length;
  const se2 = ea + eb;
  if (se2 === 0) return notDefined('both groups have zero variance (every value equal within each group)');
  const meanDifference = ma.value - mb.value;
  const t = meanDifference / Math.sqrt(se2);
  // Scaled by the larger term so that squaring tiny variances cannot underflow to 0/0.
  const big = Math.max(ea, eb);
  const ra = ea / big;
  const rb = eb / big;
  const df = ((ra + rb) * (ra + rb)) / ((ra * ra) / (a.length - 1) + (rb * rb) / (b.length - 1));
  const p = Math.min(1, 2 * jStat.studentt.cdf(-Math.abs(t), df));
  return defined({ t, df, p, meanDifference });
}
