import { medianSorted } from 'simple-statistics';
import { defined, notDefined, type Defined } from '../defined';
import { coefficientOfVariation } from './coefficientOfVariation';
import { extent } from './extent';
import { mean } from './mean';
import { modes } from './modes';
import { QUANTILE_METHODS, quantileSorted, type QuantileType } from './quantile';
import { populationSd, sampleSd } from './standardDeviation';
import { tukeyFences, type Outlier } from './tukeyFences';
import { assertFiniteValues, sortedCopy } from './validate';
import { populationVariance, sampleVariance } from './variance';
import { weightedMean } from './weightedMean';

/**
 * Descriptive summary of one set of marks (a section, the course, one assessment).
 *
 * - Sample (n − 1) and population (n) variance/SD are both given and labelled (NIST/SEMATECH
 *   e-Handbook §1.3.5.6); two-pass, certified against NIST StRD.
 * - `median` is the usual middle value (mean of the two middle values when n is even) whatever the
 *   quantile type; `q1`/`q3` use the chosen Hyndman & Fan (1996) type, named in `quantileMethod`.
 * - `cv` = sample SD / mean as a fraction (0.25 = 25 %); ratio-scale data only (see
 *   coefficientOfVariation).
 * - Fences Q1 ∓ 1.5·IQR, whiskers at the most extreme data inside, outliers strictly beyond
 *   (Tukey 1977).
 * - `weightedMean` is defined only when weights are given.
 */
export interface Summary {
  n: number;
  quantileType: QuantileType;
  quantileMethod: string;
  mean: Defined<number>;
  weightedMean: Defined<number>;
  median: Defined<number>;
  modes: Defined<number[]>;
  min: Defined<number>;
  max: Defined<number>;
  range: Defined<number>;
  sampleVariance: Defined<number>;
  sampleSd: Defined<number>;
  populationVariance: Defined<number>;
  populationSd: Defined<number>;
  /** Sample SD divided by the mean, as a fraction; meaningful only on a ratio scale. */
  cv: Defined<number>;
  q1: Defined<number>;
  q3: Defined<number>;
  iqr: Defined<number>;
  lowerFence: Defined<number>;
  upperFence: Defined<number>;
  whiskerLow: Defined<number>;
  whiskerHigh: Defined<number>;
  outliers: readonly Outlier[];
}

export interface DescribeOptions {
  /** Hyndman & Fan type for Q1/Q3 (default 7). */
  quantileType?: QuantileType;
  /** One label per value (e.g. student name) used in `outliers`; default "#1", "#2", … */
  labels?: readonly string[];
  /** One non-negative weight per value, for `weightedMean`. */
  weights?: readonly number[];
}

/**
 * Every descriptive statistic of DESIGN.md "Statistics" in one pass over a sorted copy.
 *
 * Cost O(n log n) (one sort).
 * @throws {Error} on NaN/infinite values or weights, or labels/weights of the wrong length
 * @example
 * describe([47, 60, 62, 64, 65, 67, 69, 72, 73, 80]).outliers;
 * // => [{ index: 0, label: '#1', value: 47, side: 'low' }]  (type 7: fences 49.375 / 84.375)
 */
export function describe(values: readonly number[], options: DescribeOptions = {}): Summary {
  assertFiniteValues('describe', values);
  const quantileType = options.quantileType ?? 7;
  const { labels, weights } = options;
  if (labels !== undefined && labels.length !== values.length) {
    throw new Error(`describe: ${values.length} values but ${labels.length} labels; give one label per value`);
  }
  const n = values.length;
  const sorted = sortedCopy(values);
  const none = notDefined('no values (n = 0)');
  const ext = extent(values);
  const pick = <T>(f: (e: { min: number; max: number; range: number }) => T): Defined<T> =>
    ext.defined ? defined(f(ext.value)) : ext;

  let q1: Defined<number> = none;
  let q3: Defined<number> = none;
  let iqr: Defined<number> = none;
  let lowerFence: Defined<number> = none;
  let upperFence: Defined<number> = none;
  let whiskerLow: Defined<number> = none;
  let whiskerHigh: Defined<number> = none;
  let outliers: readonly Outlier[] = [];
  if (n > 0) {
    const lo = quantileSorted(sorted, 0.25, quantileType);
    const hi = quantileSorted(sorted, 0.75, quantileType);
    const fences = tukeyFences(values, lo, hi, labels);
    q1 = defined(lo);
    q3 = defined(hi);
    iqr = defined(hi - lo);
    lowerFence = defined(fences.lowerFence);
    upperFence = defined(fences.upperFence);
    whiskerLow = fences.whiskerLow;
    whiskerHigh = fences.whiskerHigh;
    outliers = fences.outliers;
  }

  return {
    n,
    quantileType,
    quantileMethod: QUANTILE_METHODS[quantileType].name,
    mean: mean(values),
    weightedMean: weights === undefined ? notDefined('no weights given') : weightedMean(values, weights),
    median: n > 0 ? defined(medianSorted(sorted)) : none,
    modes: modes(values),
    min: pick((e) => e.min),
    max: pick((e) => e.max),
    range: pick((e) => e.range),
    sampleVariance: sampleVariance(values),
    sampleSd: sampleSd(values),
    populationVariance: populationVariance(values),
    populationSd: populationSd(values),
    cv: coefficientOfVariation(values),
    q1,
    q3,
    iqr,
    lowerFence,
    upperFence,
    whiskerLow,
    whiskerHigh,
    outliers,
  };
}
