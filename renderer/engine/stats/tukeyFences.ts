import { defined, notDefined, type Defined } from '../defined';

/**
 * Tukey's fences, whiskers and outliers (Tukey 1977, Exploratory Data Analysis; as documented for
 * R's boxplot.stats):
 *   lower fence = Q1 − 1.5·IQR,  upper fence = Q3 + 1.5·IQR,  IQR = Q3 − Q1;
 *   whiskers end at the most extreme data values inside the fences (fences included);
 *   outliers are the points strictly beyond a fence — a point exactly ON a fence is not one.
 * Q1/Q3 come from the caller's quantile method, which can change the verdict (see describe()).
 *
 * Cost O(n) on sorted data plus O(k log k) to order k outliers.
 */

export interface Outlier {
  /** Position in the caller's original array (e.g. the student's row). */
  index: number;
  label: string;
  value: number;
  side: 'low' | 'high';
}

export interface TukeyFences {
  lowerFence: number;
  upperFence: number;
  whiskerLow: Defined<number>;
  whiskerHigh: Defined<number>;
  /** Low outliers first, each side in ascending value (ties by index). */
  outliers: Outlier[];
}

/** The Tukey multiplier 1.5 (Tukey 1977). */
export const TUKEY_K = 1.5;

/**
 * @example
 * tukeyFences([-1, 2, 3, 4, 7], 2, 4); // fences −1 / 7; whiskers −1 / 7; no outliers (on the fence)
 */
export function tukeyFences(
  values: readonly number[],
  q1: number,
  q3: number,
  labels?: readonly string[] | ((index: number) => string),
): TukeyFences {
  const labelOf = (index: number): string =>
    (typeof labels === 'function' ? labels(index) : labels?.[index]) ?? `#${index + 1}`;
  const iqr = q3 - q1;
  const lowerFence = q1 - TUKEY_K * iqr;
  const upperFence = q3 + TUKEY_K * iqr;
  let lo = Infinity;
  let hi = -Infinity;
  const outliers: Outlier[] = [];
  for (let index = 0; index < values.length; index++) {
    const value = values[index]!;
    if (value < lowerFence) outliers.push({ index, label: labelOf(index), value, side: 'low' });
    else if (value > upperFence) outliers.push({ index, label: labelOf(index), value, side: 'high' });
    else {
      if (value < lo) lo = value;
      if (value > hi) hi = value;
    }
  }
  const side = (o: Outlier): number => (o.side === 'low' ? 0 : 1);
  outliers.sort((a, b) => side(a) - side(b) || a.value - b.value || a.index - b.index);
  const inside = lo <= hi;
  const none = 'no data inside the fences';
  return {
    lowerFence,
    upperFence,
    whiskerLow: inside ? defined(lo) : notDefined(none),
    whiskerHigh: inside ? defined(hi) : notDefined(none),
    outliers,
  };
}
