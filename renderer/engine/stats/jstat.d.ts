/**
 * Minimal typing for jstat 1.9.6 (the package ships no types). Only what this project uses:
 * the distribution functions in `stats/` and the reference functions the tests compare against
 * (`quantiles`, `percentileOfScore`).
 */
declare module 'jstat' {
  interface JStatStatic {
    /** Standard normal-family CDF, P(X ≤ x) for X ~ N(mean, std²). */
    normal: { cdf(x: number, mean: number, std: number): number };
    /** Student t CDF, P(T ≤ x) for T ~ t(dof). */
    studentt: { cdf(x: number, dof: number): number };
    /** Chi-square CDF, P(X ≤ x) for X ~ χ²(dof). */
    chisquare: { cdf(x: number, dof: number): number };
    /** ln Γ(x). */
    gammaln(x: number): number;
    /** scipy-style quantiles with plotting-position parameters (alphap, betap). */
    quantiles(arr: readonly number[], ps: readonly number[], alphap?: number, betap?: number): number[];
    /** Fraction of arr ≤ score ('weak', the default) or < score ('strict'). */
    percentileOfScore(arr: readonly number[], score: number, kind?: 'weak' | 'strict'): number;
  }
  const jStat: JStatStatic;
  export default jStat;
}
