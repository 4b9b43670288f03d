import jStat from 'jstat';
import { defined, notDefined, type Defined } from '../defined';
import { midRanks } from './ranks';
import { assertFiniteValues } from './validate';

/**
 * Kruskal–Wallis H test of k ≥ 2 independent groups, with tie correction.
 *
 *   H = [12 / (N(N + 1))] · Σ Rᵢ²/nᵢ − 3(N + 1),  divided by 1 − Σ(t³ − t)/(N³ − N)
 *   df = k − 1,  p = 1 − F_χ²(H; df)  (jstat `chisquare.cdf`)
 *
 * Sources: Kruskal & Wallis (1952) JASA 47:583–621; Hollander & Wolfe (1973) §6.1 (worked
 * example p. 116); matches R `kruskal.test` and @stdlib `stats/kruskal-test`.
 * Not defined with fewer than 2 groups, an empty group, or all values equal. Cost O(N log N).
 * @throws {Error} on NaN/infinite values
 * @example
 * kruskalWallis([[2.9, 3.0, 2.5, 2.6, 3.2], [3.8, 2.7, 4.0, 2.4], [2.8, 3.4, 3.7, 2.2, 2.0]]);
 * // => { h: 0.77143, df: 2, p: 0.68 }
 */
export function kruskalWallis(groups: readonly (readonly number[])[]): Defined<{ h: number; df: number; p: number }> {
  groups.forEach((g, i) => assertFiniteValues(`kruskalWallis (group ${i + 1})`, g));
  if (groups.length < 2) return notDefined(`Kruskal–Wallis needs at least 2 groups (${groups.length} given)`);
  const empty = groups.findIndex((g) => g.length === 0);
  if (empty >= 0) return notDefined(`group ${empty + 1} has no values`);
  const pooled = groups.flat();
  const n = pooled.length;
  const { ranks, tieTerm } = midRanks(pooled);
  const correction = 1 - tieTerm / (n * n * n - n);
  if (!(correction > 0)) return notDefined('all values are equal; the rank test has nothing to compare');
  let offset = 0;
  let sum = 0;
  for (const g of groups) {
    let r = 0;
    for (let i = 0; i < g.length; i++) r += ranks[offset + i] as number;
    sum += (r * r) / g.length;
    offset += g.length;
  }
  const h = ((12 / (n * (n + 1))) * sum - 3 * (n + 1)) / correction;
  const df = groups.length - 1;
  const p = Math.min(1, Math.max(0, 1 - jStat.chisquare.cdf(h, df)));
  return defined({ h, df, p });
}
