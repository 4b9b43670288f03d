/**
 * Mid-ranks of pooled data (ties share the mean of the ranks they span) and the tie term
 * Σ (t³ − t) over tie groups of size t — shared by Mann–Whitney U and Kruskal–Wallis
 * (Hollander & Wolfe 1973, Nonparametric Statistical Methods, §4.1 and §6.1).
 *
 * Cost O(N log N).
 * @example
 * midRanks([10, 20, 20, 30]); // => { ranks: [1, 2.5, 2.5, 4], tieTerm: 6, hasTies: true }
 */
export function midRanks(values: readonly number[]): { ranks: number[]; tieTerm: number; hasTies: boolean } {
  const order = values.map((v, i) => ({ v, i })).sort((a, b) => a.v - b.v);
  const ranks = new Array<number>(values.length).fill(0);
  let tieTerm = 0;
  let start = 0;
  while (start < order.length) {
    let end = start + 1;
    while (end < order.length && (order[end] as { v: number }).v === (order[start] as { v: number }).v) end++;
    const t = end - start;
    const rank = (start + 1 + end) / 2; // mean of ranks start+1 … end
    for (let k = start; k < end; k++) ranks[(order[k] as { i: number }).i] = rank;
    tieTerm += t * t * t - t;
    start = end;
  }
  return { ranks, tieTerm, hasTies: tieTerm > 0 };
}
