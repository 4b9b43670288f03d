import jStat from 'jstat';
import { defined, notDefined, type Defined } from '../defined';
import { mean } from './mean';
import { assertFiniteValues } from './validate';
import { sampleVariance } from './variance';

/**
 * Standardised mean difference: Cohen's d with the pooled SD, and Hedges' g (bias-corrected).
 *
 *   s_p = √( ((n₁ − 1)s₁² + (n₂ − 1)s₂²) / (n₁ + n₂ − 2) ),  d = (x̄₁ − x̄₂) / s_p
 *   g = J(df)·d,  df = n₁ + n₂ − 2,  J(df) = Γ(df/2) / ( √(df/2) · Γ((df − 1)/2) )  — exact,
 *   via jstat `gammaln`. The common approximation J ≈ 1 − 3/(4·df − 1) is returned as `gApprox`.
 *
 * Source: Hedges (1981) J. Educ. Stat. 6:107–128 (exact J and its approximation; from memory).
 * Not defined when a group has fewer than 2 values, df < 2 (J needs Γ((df−1)/2) with df > 1),
 * or s_p = 0. Cost O(n₁ + n₂).
 * @throws {Error} on NaN/infinite values
 * @example
 * hedgesG([0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0], [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4]);
 * // => { d: −0.832181, g: −0.79694 (exact J), gApprox: −0.79702, j: 0.957647, df: 18 }
 */
export function hedgesG(
  a: readonly number[],
  b: readonly number[],
): Defined<{ d: number; g: number; gApprox: number; j: number; df: number }> {
  assertFiniteValues('hedgesG', a);
  assertFiniteValues('hedgesG', b);
  const ma = mean(a);
  const mb = mean(b);
  const va = sampleVariance(a);
  const vb = sampleVariance(b);
  if (!ma.defined || !va.defined) return notDefined(`first group: the effect size needs at least 2 values (n = ${a.length})`);
  if (!mb.defined || !vb.defined) return notDefined(`second group: the effect size needs at least 2 values (n = ${b.length})`);
  const df = a.length + b.length - 2;
  const pooled = Math.sqrt(((a.length - 1) * va.value + (b.length - 1) * vb.value) / df);
  if (pooled === 0) return notDefined('the pooled SD is 0 (every value equal within each group)');
  const d = (ma.value - mb.value) / pooled;
  const j = Math.exp(jStat.gammaln(df / 2) - jStat.gammaln((df - 1) / 2)) / Math.sqrt(df / 2);
  return defined({ d, g: j * d, gApprox: (1 - 3 / (4 * df - 1)) * d, j, df });
}
