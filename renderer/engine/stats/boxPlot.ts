import { defined, notDefined, type Defined } from '../defined';
import { describe } from './describe';
import type { QuantileType } from './quantile';
import type { Outlier } from './tukeyFences';

/** Five-number summary, fences, whiskers, outliers and notches of one group. */
export interface BoxPlot {
  n: number;
  quantileMethod: string;
  min: number;
  q1: number;
  median: number;
  q3: number;
  max: number;
  iqr: number;
  lowerFence: number;
  upperFence: number;
  whiskerLow: Defined<number>;
  whiskerHigh: Defined<number>;
  outliers: readonly Outlier[];
  /** median ∓ 1.58·IQR/√n. */
  notchLow: number;
  notchHigh: number;
  /** √n, for widths proportional to √n when several boxes are drawn side by side. */
  relativeWidth: number;
}

/**
 * Box plot data: five-number summary (min, Q1, median, Q3, max), Tukey fences, whiskers and
 * outliers (Tukey 1977, Exploratory Data Analysis; rule as in R's boxplot.stats), plus
 * McGill–Tukey–Larsen notches median ± 1.58·IQR/√n and a relative width √n
 * (McGill, Tukey & Larsen 1978, "Variations of box plots", Am. Stat. 32:12–16; 1.58 is R's constant).
 *
 * Q1/Q3 use the chosen Hyndman & Fan type (default 7), named in `quantileMethod`. Whiskers end at
 * the most extreme data inside the fences; outliers are strictly beyond them.
 * Not defined for n = 0. Cost O(n log n).
 * @throws {Error} on NaN/infinite values
 * @example
 * boxPlot([47, 60, 62, 64, 65, 67, 69, 72, 73, 80]);
 * // => q1 62.5, median 66, q3 71.25, whiskers 60 / 80, one outlier 47
 */
export function boxPlot(
  values: readonly number[],
  options: { quantileType?: QuantileType; labels?: readonly string[] } = {},
): Defined<BoxPlot> {
  const s = describe(values, options);
  if (!(s.min.defined && s.max.defined && s.q1.defined && s.q3.defined && s.median.defined && s.iqr.defined && s.lowerFence.defined && s.upperFence.defined)) {
    return notDefined('no values (n = 0)');
  }
  const half = (1.58 * s.iqr.value) / Math.sqrt(s.n);
  return defined({
    n: s.n,
    quantileMethod: s.quantileMethod,
    min: s.min.value,
    q1: s.q1.value,
    median: s.median.value,
    q3: s.q3.value,
    max: s.max.value,
    iqr: s.iqr.value,
    lowerFence: s.lowerFence.value,
    upperFence: s.upperFence.value,
    whiskerLow: s.whiskerLow,
    whiskerHigh: s.whiskerHigh,
    outliers: s.outliers,
    notchLow: s.median.value - half,
    notchHigh: s.median.value + half,
    relativeWidth: Math.sqrt(s.n),
  });
}
