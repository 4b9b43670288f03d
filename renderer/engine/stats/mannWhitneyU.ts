import jStat from 'jstat';
import { defined, notDefined, type Defined } from '../defined';
import { midRanks } from './ranks';
import { assertFiniteValues } from './validate';

/**
 * Mann–Whitney U / Wilcoxon rank-sum test (two-sided), as R's `wilcox.test(x, y)` defaults.
 *
 *   W = R₁ − n₁(n₁ + 1)/2  (R's W: the U statistic of the first sample; R₁ = its mid-rank sum)
 *   U = min(W, n₁n₂ − W)
 *
 * Exact p (n₁ < 50, n₂ < 50 and no ties — R's rule): the null distribution of the rank sum is
 * counted by dynamic programming over subsets of {1…N} of size n₁ (additions only, so no
 * cancellation); p = min(1, 2·P(W ≤ w)) if w ≤ n₁n₂/2, else min(1, 2·P(W ≥ w)).
 * Otherwise the normal approximation with tie and continuity correction:
 *   z = (W − n₁n₂/2 − ½·sign(W − n₁n₂/2)) / σ,
 *   σ² = (n₁n₂/12)·((N + 1) − Σ(t³ − t)/(N(N − 1))),  p = 2·P(Z ≥ |z|)  (jstat `normal.cdf`).
 * Sources: Hollander & Wolfe (1973) Nonparametric Statistical Methods §4.1; R documentation of
 * wilcox.test (formula details of R's implementation from memory).
 * Not defined when a group is empty or all N values are equal (σ = 0). Cost O(n₁²·N²) for the
 * exact distribution (≈ 2·10⁷ additions at n₁ = n₂ = 49), O(N log N) otherwise.
 * @throws {Error} on NaN/infinite values
 * @example
 * mannWhitneyU([0.80, 0.83, 1.89, 1.04, 1.45, 1.38, 1.91, 1.64, 0.73, 1.46], [1.15, 0.88, 0.90, 0.74, 1.21]);
 * // => { u: 15, w: 35, p: 0.2544, method: 'exact' }  (Hollander & Wolfe Example 4.1)
 */
export function mannWhitneyU(
  a: readonly number[],
  b: readonly number[],
): Defined<{ u: number; w: number; p: number; method: 'exact' | 'normal' }> {
  assertFiniteValues('mannWhitneyU', a);
  assertFiniteValues('mannWhitneyU', b);
  const n1 = a.length;
  const n2 = b.length;
  if (n1 === 0) return notDefined('first group has no values');
  if (n2 === 0) return notDefined('second group has no values');
  const { ranks, tieTerm, hasTies } = midRanks([...a, ...b]);
  let r1 = 0;
  for (let i = 0; i < n1; i++) r1 += ranks[i] as number;
  const w = r1 - (n1 * (n1 + 1)) / 2;
  const u = Math.min(w, n1 * n2 - w);
  const centre = (n1 * n2) / 2;

  if (n1 < 50 && n2 < 50 && !hasTies) {
    const dist = rankSumCounts(n1, n2);
    const total = dist.reduce((acc, c) => acc + c, 0);
    // Sum the tail directly (no 1 − cdf cancellation); w is an integer here (no ties).
    let tailCount = 0;
    if (w > centre) for (let i = w; i < dist.length; i++) tailCount += dist[i] as number;
    else for (let i = 0; i <= w; i++) tailCount += dist[i] as number;
    const tail = tailCount / total;
    return defined({ u, w, p: Math.min(1, 2 * tail), method: 'exact' });
  }

  const n = n1 + n2;
  const sigma = Math.sqrt(((n1 * n2) / 12) * (n + 1 - tieTerm / (n * (n - 1))));
  if (!(sigma > 0)) return notDefined('all values are equal; the rank test has nothing to compare');
  const diff = w - centre;
  const z = (diff - 0.5 * Math.sign(diff)) / sigma;
  const p = Math.min(1, 2 * jStat.normal.cdf(-Math.abs(z), 0, 1));
  return defined({ u, w, p, method: 'normal' });
}

/**
 * Null distribution of W = R₁ − n₁(n₁+1)/2 with no ties: counts[w] = number of size-n₁ subsets of
 * ranks {1…n₁+n₂} whose sum is w + n₁(n₁+1)/2. Subset-sum DP, additions only.
 */
export function rankSumCounts(n1: number, n2: number): number[] {
  const n = n1 + n2;
  const maxSum = (n1 * (2 * n - n1 + 1)) / 2;
  // ways[k][s]: subsets of size k with sum s, over the ranks processed so far.
  const ways: Float64Array[] = Array.from({ length: n1 + 1 }, () => new Float64Array(maxSum + 1));
  (ways[0] as Float64Array)[0] = 1;
  for (let r = 1; r <= n; r++) {
    for (let k = Math.min(r, n1); k >= 1; k--) {
      const to = ways[k] as Float64Array;
      const from = ways[k - 1] as Float64Array;
      for (let s = maxSum; s >= r; s--) to[s] = (to[s] as number) + (from[s - r] as number);
    }
  }
  const offset = (n1 * (n1 + 1)) / 2;
  return Array.from((ways[n1] as Float64Array).subarray(offset, offset + n1 * n2 + 1));
}
